"""The ACI 318-19 provisions: φ, strength, limits, minimum steel, detailing, scope and Chapter 18.

`checks.check` is the engine's main entry point. Each module names its
clauses: φ and the strain class (Table 21.2.2, `strength_reduction`), Mn with
φ (22.2, `flexure`), the reinforcement limits (9.3.3.1, 9.6.1.2, `limits`),
the least As for Mu (`required_steel`), the capacity curve against ρ
(`curve`), redistribution (6.6.5), moment–curvature with Mcr and 6.6.5
(`moment_curvature`), detailing (25.2, 24.3.2, 9.7.2.3), scope and section
warnings, the effective flange width (Table 6.3.2.1) and the special moment
frame rules of Chapter 18 (`special_frame`). Imports only from `mechanics`,
`section` and itself.
"""
