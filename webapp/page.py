"""The Rhoscope page: one `Viewer` holding the inputs, the views that draw the result.

Inputs are typed parameters; every change runs one engine check (`_refresh`)
and the views only draw its result. The plot follows a slider's `value` while
it moves; the share link follows `value_throttled`, so the browser history
gets one entry per settled change. A link's values are read when the page is
built and again whenever the browser reports the URL (in the Pyodide worker
that happens only after the first render).
"""

from __future__ import annotations

import math

import panel as pn
import param

import engine

from . import summary
from .plot import CapacityPlot, LimitSweepPlot
from .state import (DEFAULTS, NUMBER_FIELDS, SLIDER_SPANS, Inputs, convert_inputs,
                    default_inputs, parse_query, unit_label)
from .theme import SIDEBAR_CSS, TEXT_CSS

SLIDER_FIELDS = ("fc", "fy", "b", "d", "As")
LABELS = {"fc": "f'c, concrete strength", "fy": "fy, steel yield strength",
          "b": "b, web width", "d": "d, depth to tension steel", "As": "As, tension steel area",
          "Mu": "Mu, factored moment (blank: none)"}
UNIT_OPTIONS = {"US customary": "us", "SI": "si"}
_AS_PAST_BALANCED = 1.6  # the As slider runs to 1.6 As,b of the current section

COPY_JS = """
const url = window.location.href;
const done = (text) => { source.label = text; setTimeout(() => { source.label = 'Copy link'; }, 1800); };
const fallback = () => {
  const area = document.createElement('textarea');
  area.value = url; document.body.appendChild(area); area.select();
  try { document.execCommand('copy'); done('Link copied'); } catch (e) { done('Copy failed'); }
  area.remove();
};
if (navigator.clipboard && window.isSecureContext) {
  navigator.clipboard.writeText(url).then(() => done('Link copied'), fallback);
} else { fallback(); }
"""


def _nice_ceiling(value: float, step: float) -> float:
    """`value` rounded up to a whole number of `step`s."""
    return round(math.ceil(value / step) * step, 12)


class BeamCheckPage(pn.viewable.Viewer):
    """A singly reinforced rectangular beam, its inputs, its check and its plots."""

    units = param.Selector(objects=["us", "si"], default="us", doc="unit system of all inputs")
    fc = param.Number(default=DEFAULTS["us"]["fc"], doc="f'c in psi or MPa")
    fy = param.Number(default=DEFAULTS["us"]["fy"], doc="fy in psi or MPa")
    b = param.Number(default=DEFAULTS["us"]["b"], doc="b in in or mm")
    d = param.Number(default=DEFAULTS["us"]["d"], doc="d in in or mm")
    As = param.Number(default=DEFAULTS["us"]["As"], doc="As in in² or mm²")
    Mu = param.Number(default=DEFAULTS["us"]["Mu"], allow_None=True,
                      doc="Mu in kip·ft or kN·m; None for none")
    link_messages = param.List(default=[], doc="problems with the opened link's values")

    def __init__(self, **params) -> None:
        super().__init__(**params)
        self.result: engine.FlexuralCheck | None = None
        self._written_search: str | None = None
        self._switch_memo: tuple[Inputs, Inputs] | None = None
        self._applying = False
        self._cached_curve: tuple[tuple, engine.CapacityCurve] | None = None
        self.unit_switch = pn.widgets.RadioButtonGroup(
            label="Units", options=UNIT_OPTIONS, value=self.units, color="primary",
            variant="outline", sizing_mode="stretch_width")
        self.unit_switch.param.watch(self._on_unit_switch, "value")
        self.sliders: dict[str, pn.widgets.EditableFloatSlider] = {}
        for name in SLIDER_FIELDS:
            slider = pn.widgets.EditableFloatSlider(
                label=self._label(name), value=getattr(self, name), start=0.0, end=1.0,
                step=0.01, sizing_mode="stretch_width", format="0[.][0000]",
                bar_color="#0d6b70", css_classes=[f"rs-input-{name}"])
            slider.param.watch(self._on_widget_value, "value")
            slider.param.watch(self._on_settled, "value_throttled")
            self.sliders[name] = slider
        self.mu_input = pn.widgets.FloatInput(
            label=self._label("Mu"), value=self.Mu, start=0.0, step=1.0,
            placeholder="none", sizing_mode="stretch_width", format="0[.][0000]",
            css_classes=["rs-input-Mu"])
        self.mu_input.param.watch(self._on_mu_widget, "value")
        self.copy_button = pn.widgets.Button(label="Copy link", color="primary",
                                             icon="link", sizing_mode="stretch_width")
        self.copy_button.js_on_click(code=COPY_JS)
        self.header = pn.pane.HTML(summary.header_html(), stylesheets=[TEXT_CSS],
                                   sizing_mode="stretch_width", margin=(4, 8))
        self.link_pane = pn.pane.HTML("", stylesheets=[TEXT_CSS], sizing_mode="stretch_width",
                                      margin=(0, 10))
        self.input_pane = pn.pane.HTML("", stylesheets=[TEXT_CSS], sizing_mode="stretch_width",
                                       margin=(0, 10))
        self.cards = pn.pane.HTML("", stylesheets=[TEXT_CSS], sizing_mode="stretch_width",
                                  margin=(4, 8))
        self.details = pn.pane.HTML("", stylesheets=[TEXT_CSS], sizing_mode="stretch_width",
                                    margin=(4, 12))
        self.capacity_plot = CapacityPlot()
        self.sweep_plot = LimitSweepPlot()
        # The results area: the check's own tab first; other views add theirs (add_view).
        self.views = pn.Tabs(
            ("Check", pn.Column(
                pn.Row(pn.pane.Bokeh(self.capacity_plot.figure, sizing_mode="stretch_width",
                                     min_width=380),
                       pn.pane.Bokeh(self.sweep_plot.figure, width=320),
                       sizing_mode="stretch_width"),
                self.details, sizing_mode="stretch_width")),
            dynamic=False, sizing_mode="stretch_width", margin=(0, 0))
        self._set_spans(self.units, self.inputs())
        location = pn.state.location
        if location is not None:
            location.param.watch(self._on_search, "search")
            if location.search:
                self.apply_link(location.search)
        self._refresh()

    # -- state -----------------------------------------------------------

    def inputs(self) -> Inputs:
        """The current inputs."""
        return Inputs(units=self.units, fc=self.fc, fy=self.fy, b=self.b, d=self.d,
                      As=self.As, Mu=self.Mu)

    def apply(self, inputs: Inputs) -> None:
        """Show and check `inputs` (values used exactly; slider spans widen to fit)."""
        self._applying = True
        try:
            self._set_spans(inputs.units, inputs)
            self.unit_switch.value = inputs.units
            for name in SLIDER_FIELDS:
                self.sliders[name].label = self._label(name, inputs.units)
            self.mu_input.label = self._label("Mu", inputs.units)
            self.param.update(**{"units": inputs.units,
                                 **{name: getattr(inputs, name) for name in NUMBER_FIELDS}})
        finally:
            self._applying = False

    def apply_link(self, search: str) -> None:
        """Apply a share link's query string; its problems go to `link_messages`."""
        inputs, messages = parse_query(search)
        self._switch_memo = None
        self.apply(inputs)
        self.link_messages = list(messages)
        self._written_search = search

    def share_query(self) -> str:
        """The query string of the current inputs."""
        return self.inputs().to_query()

    # -- hooks for other views (stable names) ---------------------------

    def current_inputs(self) -> dict:
        """The `engine.check` keywords of the current check, Mu included (None for none)."""
        return self.inputs().engine_kwargs()

    def share_url(self) -> str:
        """The current share link as the browser shows it (base address + query)."""
        location = pn.state.location
        href = getattr(location, "href", "") if location is not None else ""
        base = href.split("?", 1)[0].split("#", 1)[0] if href else ""
        return (base or "http://localhost:5006/") + self.share_query()

    def add_view(self, title: str, viewable) -> None:
        """Append `viewable` as a tab named `title` after the check's own tab."""
        self.views.append((title, viewable))

    def _label(self, name: str, units: str | None = None) -> str:
        return f"{LABELS[name]} ({unit_label(units or self.units, name)})"

    def _set_spans(self, units: str, inputs: Inputs) -> None:
        """Slider spans for `units`, widened to hold `inputs` exactly."""
        for name in SLIDER_FIELDS:
            start, end, step = SLIDER_SPANS[units][name]
            value = getattr(inputs, name)
            if name == "As":
                end = self._as_end(inputs, step, end)
            slider = self.sliders[name]
            slider.param.update(start=min(start, value), end=max(end, value), step=step)

    def _as_end(self, inputs: Inputs, step: float, floor: float) -> float:
        """The As slider's end: past As,b of the section, or `floor` if it has none."""
        try:
            As_b = engine.check(**inputs.section_kwargs()).limits.As_b
        except engine.InputError:
            return floor
        return min(_nice_ceiling(_AS_PAST_BALANCED * As_b, step * 10), inputs.b * inputs.d)

    # -- widget events ---------------------------------------------------

    def _on_widget_value(self, event) -> None:
        if self._applying or event.new is None:
            return
        # A dragged slider reports its steps with float noise (5.819999999999999);
        # 12 significant figures drop the noise and keep anything a person types.
        value = float(f"{float(event.new):.12g}")
        for name, slider in self.sliders.items():
            if slider is event.obj:
                setattr(self, name, value)

    def _on_mu_widget(self, event) -> None:
        self.Mu = None if event.new is None else float(event.new)
        if not self._applying:
            self._write_link()

    def _on_settled(self, event) -> None:
        if not self._applying:
            self._write_link()

    def _on_unit_switch(self, event) -> None:
        if self._applying or event.new == self.units:
            return
        current = self.inputs()
        if self._switch_memo is not None and self._switch_memo[0] == current:
            target = self._switch_memo[1]  # switching straight back restores the exact values
        else:
            target = convert_inputs(current, event.new)
        self._switch_memo = (target, current)
        self.apply(target)
        self._write_link()

    def _on_search(self, event) -> None:
        if event.new == self._written_search:
            return
        self.apply_link(event.new or "")

    def _write_link(self) -> None:
        location = pn.state.location
        query = self.share_query()
        self._written_search = query
        if location is not None and location.search != query:
            location.search = query

    # -- params -> widgets and views -------------------------------------

    @param.depends("fc", "fy", "b", "d", "As", "Mu", "units", watch=True)
    def _refresh(self) -> None:
        # One document message per update instead of one per changed property.
        with pn.io.hold():
            self._redraw()

    def _redraw(self) -> None:
        for name in SLIDER_FIELDS:
            value = getattr(self, name)
            slider = self.sliders[name]
            if slider.value != value:
                if value < slider.start or value > slider.end:
                    slider.param.update(start=min(slider.start, value),
                                        end=max(slider.end, value))
                slider.value = value
        if self.mu_input.value != self.Mu:
            self.mu_input.value = self.Mu
        inputs = self.inputs()
        try:
            result = engine.check(**inputs.engine_kwargs())
            curve = self._curve(inputs, result)
        except (engine.InputError, ArithmeticError) as error:
            text = str(error) if isinstance(error, engine.InputError) else (
                f"the engine could not compute these inputs ({type(error).__name__})")
            self.input_pane.object = summary.messages_html(
                [f"{text}. The results show the last inputs that could be checked."])
            return
        self.input_pane.object = ""
        self.result = result
        self._update_as_end(inputs)
        self.cards.object = summary.cards_html(result)
        self.details.object = summary.details_html(result)
        self.capacity_plot.update(curve, result)
        fc_slider = self.sliders["fc"]
        self.sweep_plot.update(result, (fc_slider.start, fc_slider.end), inputs.section_kwargs())

    def _curve(self, inputs: Inputs, result: engine.FlexuralCheck) -> engine.CapacityCurve:
        """The capacity curve, recomputed only when more than As changed.

        The curve depends on the section and materials, not on As, so a drag of
        the As slider reuses it (and sends no new curve data to the browser)
        as long as the section's ρ stays within it.
        """
        key = tuple(v for k, v in inputs.section_kwargs().items() if k != "As")
        cached = self._cached_curve
        if cached is not None and cached[0] == key and result.rho <= cached[1].rho[-1]:
            return cached[1]
        curve = engine.capacity_curve(**inputs.section_kwargs())
        self._cached_curve = (key, curve)
        return curve

    def _update_as_end(self, inputs: Inputs) -> None:
        start, end, step = SLIDER_SPANS[inputs.units]["As"]
        slider = self.sliders["As"]
        new_end = max(self._as_end(inputs, step, end), inputs.As)
        if slider.end != new_end:
            slider.end = new_end

    @param.depends("link_messages", watch=True)
    def _show_link_messages(self) -> None:
        messages = self.link_messages
        if messages:
            self.link_pane.object = (
                summary.messages_html(["The shared link had values that could not be used:"]
                                      + list(messages)))
        else:
            self.link_pane.object = ""

    # -- layout ----------------------------------------------------------

    def __panel__(self):
        sidebar = pn.Column(
            pn.pane.HTML('<h3 style="margin:4px 0">Beam section</h3>'
                         '<div class="rs-note">Demo: Harbourline Depot, beam B-204</div>',
                         stylesheets=[TEXT_CSS], margin=(4, 10)),
            self.unit_switch,
            *self.sliders.values(),
            self.mu_input,
            self.input_pane,
            self.copy_button,
            self.link_pane,
            width=330, min_width=280, stylesheets=[SIDEBAR_CSS], margin=(6, 8),
        )
        main = pn.Column(
            self.cards,
            self.views,
            sizing_mode="stretch_width", min_width=340, styles={"flex": "1 1 600px"},
        )
        return pn.Column(
            self.header,
            pn.FlexBox(sidebar, main, flex_wrap="wrap", align_items="flex-start",
                       sizing_mode="stretch_width"),
            sizing_mode="stretch_width", styles={"background": "#f7f6f2"},
        )
