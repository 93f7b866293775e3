"""Nominal flexural strength of a beam section by strain compatibility.

ACI 318-19 22.2: plane sections (22.2.1.2), εcu = 0.003 at the extreme
compression fibre (22.2.2.1), concrete tension neglected (22.2.2.2), the
equivalent rectangular block 0.85 f'c over a = β1·c (22.2.2.4.1), and each
layer's stress from its strain (20.2.2.1). Yield is never assumed: c comes
from `equilibrium.solve_neutral_axis` for every section. Values are in the
section's base units (force·length for moments); strains and stresses are
reported tension positive, as engineers quote εt and fs.
"""

from __future__ import annotations

from dataclasses import dataclass

from ..mechanics.equilibrium import in_block, layer_force, solve_neutral_axis
from ..mechanics.stress_block import block_force
from ..section.beam import BeamSection, Role, SteelLayer
from ..section.materials import EPS_CU, beta1, steel_stress, yield_strain
from .strength_reduction import SectionClass, phi_flexure, section_class


@dataclass(frozen=True)
class LayerState:
    """One steel layer at nominal strength; strain and stress tension positive."""

    layer: SteelLayer
    strain: float
    stress: float
    yields: bool


@dataclass(frozen=True)
class FlexuralState:
    """The section at nominal strength (εcu at the top fibre)."""

    beta1: float
    eps_ty: float
    a: float
    c: float
    eps_s: float  # strain at the tension steel centroid d
    fs: float  # steel stress at d, from εs (20.2.2.1): the layer's own with one layer
    eps_t: float  # net tensile strain at dt
    fs_t: float  # steel stress at dt, from εt (20.2.2.1): the extreme tension layer's
    steel_yields: bool  # every tension layer has yielded
    Mn_base: float  # nominal moment, base units (lb·in or N·mm)
    phi: float
    section_class: SectionClass
    layers: tuple[LayerState, ...]
    residual: float  # net axial force left by the solver, base units


@dataclass(frozen=True)
class CapacityPoint:
    """The few values a capacity curve needs, without the per-layer detail."""

    Mn_base: float
    phi: float
    eps_t: float
    section_class: SectionClass


def nominal_moment(section: BeamSection, c: float, b1: float) -> float:
    """Mn for neutral-axis depth c: every force's moment about the tension centroid.

    With equilibrium the reference depth does not matter; about d a single
    layer drops out and this is the textbook C·(d − a/2).
    """
    d = section.d
    concrete, concrete_depth = block_force(section, b1 * c)
    Mn = concrete * (d - concrete_depth)
    for layer in section.layers:
        inside = in_block(layer.depth, c, b1)
        Mn += layer_force(section, layer.depth, layer.area, c, inside) * (d - layer.depth)
    return Mn


def capacity_point(section: BeamSection) -> CapacityPoint:
    """Mn, φ, εt and the class: `analyse` without the detail, for dense curves."""
    b1 = beta1(section.fc, section.system)
    eps_ty = yield_strain(section.fy, section.es)
    c = solve_neutral_axis(section, b1).c
    eps_t = EPS_CU * (section.dt - c) / c
    return CapacityPoint(nominal_moment(section, c, b1), phi_flexure(eps_t, eps_ty, section.spiral),
                         eps_t, section_class(eps_t, eps_ty))


def analyse(section: BeamSection) -> FlexuralState:
    """The section's state at nominal flexural strength, ACI 318-19 22.2."""
    b1 = beta1(section.fc, section.system)
    eps_ty = yield_strain(section.fy, section.es)
    root = solve_neutral_axis(section, b1)
    c = root.c
    layers = []
    for layer in section.layers:
        strain = EPS_CU * (layer.depth - c) / c
        stress = steel_stress(strain, section.fy, section.es)
        layers.append(LayerState(layer, strain, stress, abs(stress) >= section.fy))
    tension = [state for state in layers if state.layer.role is Role.TENSION]
    eps_t = EPS_CU * (section.dt - c) / c  # linear strain profile, 22.2.1.2
    eps_s = EPS_CU * (section.d - c) / c
    return FlexuralState(
        beta1=b1,
        eps_ty=eps_ty,
        a=b1 * c,
        c=c,
        eps_s=eps_s,
        fs=steel_stress(eps_s, section.fy, section.es),
        eps_t=eps_t,
        fs_t=steel_stress(eps_t, section.fy, section.es),
        steel_yields=all(state.yields and state.stress > 0 for state in tension),
        Mn_base=nominal_moment(section, c, b1),
        phi=phi_flexure(eps_t, eps_ty, section.spiral),
        section_class=section_class(eps_t, eps_ty),
        layers=tuple(layers),
        residual=root.residual,
    )
