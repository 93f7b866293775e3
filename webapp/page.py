"""The Rhoscope page: one `Viewer` holding the inputs, the views that draw the result.

Inputs are typed parameters; every change runs one engine check (`_refresh`)
and the views only draw its result. The plot follows a slider's `value` while
it moves; the share link follows `value_throttled`, so the browser history
gets one entry per settled change. A link's values are read when the page is
built and again whenever the browser reports the URL (in the Pyodide worker
that happens only after the first render).
"""

from __future__ import annotations

import logging
import math
import sys
from dataclasses import replace
from html import escape

import panel as pn
import param

import engine
from engine.section.bar_groups import bar_group

from . import summary
from .design_view import SizeBarsView, design_kwargs, matching_option
from .ductility_view import DuctilityView
from .plot import CapacityPlot, LimitSweepPlot
from .schedule_view import ScheduleView
from .sheet_view import SheetView
from .sketch import SectionSketch, section_drawing
from .location_guard import page_location
from .state import (DEFAULTS, INPUT_FIELDS, MAX_EXTRA_LAYERS, NUMBER_FIELDS, QUANTITY,
                    SECTION_DEFAULTS, SLIDER_SPANS, Inputs, convert_inputs, default_inputs,
                    drawn_groups, is_demo, parse_query, rounded_inputs, same_group,
                    slab_flange_width, unit_label, with_drawn_areas, without_stale_drawn)
from .number_box import number_box, read_number, shown_number, shows
from .widget_sync import ServerSetValues, resend_values
from .theme import ENTRY_CSS, SIDEBAR_CSS, TEXT_CSS

SLIDER_FIELDS = ("fc", "fy", "b", "d", "As")
LABELS = {"fc": "f'c, concrete strength", "fy": "fy, steel yield strength",
          "b": "b, web width", "d": "d, depth to tension steel", "As": "As, tension steel area",
          "Mu": "Mu, factored moment (blank: none)"}
UNIT_OPTIONS = {"US customary": "us", "SI": "si"}
SHAPE_OPTIONS = {"Rectangle": "rect", "T-beam": "T", "L-beam": "L"}
FLANGE_SOURCES = {"bf given": "direct", "from the slab": "slab"}
# Optional typed inputs of the section card: (field, label); blank means none.
SECTION_ENTRIES = (("h", "h, overall depth"), ("dt", "dt, extreme layer"),
                   ("bf", "bf, flange width"), ("hf", "hf, flange thickness"),
                   ("sw", "sw, clear web spacing"), ("ln", "ln, clear span"),
                   ("asc", "A's, compression steel"), ("dc", "d', depth to A's"),
                   ("es", "Es, steel modulus"), ("top_As", "top As, top steel"),
                   ("top_d", "top d, from bottom face"))
FRAME_OPTIONS = {"Ordinary": False, "Special moment frame": True}
SPIRAL_OPTIONS = {"Ties or other": False, "Spirals": True}  # transverse steel, Table 21.2.2
DEMO_NOTE = '<div class="rs-note" data-q="demo">Demo: Harbourline Depot, beam B-204</div>'
SETTLE_MS = 300  # quiet time after the last input before every widget is re-sent its value
LOG = logging.getLogger(__name__)
OTHER_FIELDS = tuple(f for f in INPUT_FIELDS if f not in ("units",) + NUMBER_FIELDS)
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


def _outcome(inputs: Inputs) -> tuple | None:
    """What a reader takes from the check of `inputs`: each check passed or not, and the
    class; None when the engine refuses them."""
    try:
        result = engine.check(**inputs.engine_kwargs())
    except (engine.InputError, ArithmeticError):
        return None
    return (tuple((item.clause, item.passed) for item in result.checks),
            result.state.section_class)


def on_server(doc) -> bool:
    """Whether `doc` belongs to a Panel server session, whose event loop runs scheduled callbacks.

    In the static site's Pyodide worker Panel gives the document a stand-in
    session context, but nothing ever runs callbacks added to it: there the
    page redraws at once (the page sends the worker one change at a time).
    """
    return doc is not None and doc.session_context is not None and sys.platform != "emscripten"


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
    dt = param.Number(default=None, allow_None=True, doc="dt; None: the deepest layer")
    h = param.Number(default=None, allow_None=True, doc="overall depth h; None: not given")
    shape = param.Selector(objects=["rect", "T", "L"], default="rect")
    bf = param.Number(default=None, allow_None=True, doc="flange width bf")
    hf = param.Number(default=None, allow_None=True, doc="flange thickness hf")
    sw = param.Number(default=None, allow_None=True, doc="clear distance to the next web")
    ln = param.Number(default=None, allow_None=True, doc="clear span, for bf (Table 6.3.2.1)")
    asc = param.Number(default=None, allow_None=True, doc="compression steel A's")
    dc = param.Number(default=None, allow_None=True, doc="depth d' of A's")
    layers = param.Parameter(default=(), doc="extra tension layers, a tuple of (area, depth)")
    cover = param.Number(default=None, allow_None=True, doc="clear cover to the stirrup")
    stirrup = param.String(default=None, allow_None=True)
    agg = param.Number(default=None, allow_None=True)
    nlayers = param.Integer(default=None, allow_None=True)
    span = param.Number(default=None, allow_None=True)
    support = param.String(default=None, allow_None=True)
    order = param.String(default=None, allow_None=True, doc="bar options' ranking; None: practical")
    waiver = param.Boolean(default=False, doc="9.6.1.3 may stand in for As,min in bar sizing")
    bars = param.String(default=None, allow_None=True, doc="chosen arrangement, e.g. #8:4,2")
    drawn = param.Parameter(default=(), doc="bars as drawn per tension layer, e.g. ('4x9', None)")
    es = param.Number(default=None, allow_None=True,
                      doc="Es in psi or MPa; None: ACI 318-19 20.2.2.2's value")
    spiral = param.Boolean(default=False, doc="spiral transverse reinforcement (φ, Table 21.2.2)")
    frame = param.Boolean(default=False, doc="a beam of a special moment frame (ACI 318-19 Ch. 18)")
    top_As = param.Number(default=None, allow_None=True, doc="top steel, for the frame checks")
    top_d = param.Number(default=None, allow_None=True, doc="its depth from the bottom face")
    link_messages = param.List(default=[], doc="problems with the opened link's values")
    refusals = param.Dict(default={}, doc="typed text that could not be read, by field: its error")

    def __init__(self, **params) -> None:
        super().__init__(**params)
        self.result: engine.FlexuralCheck | None = None
        self._details_markup = ""
        self._written_search: str | None = None
        self._switch_memo: tuple[Inputs, Inputs] | None = None
        self._applying = False
        self._cached_curve: tuple[tuple, engine.CapacityCurve] | None = None
        self._redraw_pending = False
        self._input_count = 0  # input events seen; the settle check compares it
        # A layer being added: [area, depth] as typed so far (None: blank). It is
        # not an input until both are filled, so adding a row changes nothing.
        self._draft_layer: list | None = None
        self._last_edited: str | None = None  # the field a person changed last, for messages
        self._link_from_slider = False  # a slider's value_throttled wrote the link
        self._layer_bars_boxes: list = []  # filled with the layer rows
        # Widgets that show a quantity belong to one unit system for their whole
        # life (`_widget_units`): a unit switch builds new ones, so an event the
        # browser sent from an old one before it saw the switch is known to be in
        # the old units and is converted, never read in the new ones.
        self._widget_units = self.units
        if on_server(pn.state.curdoc):
            ServerSetValues.of(pn.state.curdoc)  # from the start: a link applies before any input
        self.unit_switch = pn.widgets.RadioButtonGroup(
            label="Units", options=UNIT_OPTIONS, value=self.units, color="primary",
            variant="outline", sizing_mode="stretch_width")
        self.unit_switch.param.watch(self._on_unit_switch, "value")
        self.quantity_inputs = pn.Column(sizing_mode="stretch_width", margin=0)
        self.flange_entries = pn.Column(sizing_mode="stretch_width", margin=0)
        self.depth_entries = pn.Column(sizing_mode="stretch_width", margin=0)
        self.frame_entries = pn.Column(sizing_mode="stretch_width", margin=0)
        self._build_quantity_inputs(self.units)
        self.copy_button = pn.widgets.Button(label="Copy link", color="primary",
                                             sizing_mode="stretch_width")
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
        self.frame_pane = pn.pane.HTML("", stylesheets=[TEXT_CSS], sizing_mode="stretch_width",
                                       margin=(4, 12))
        self._build_section_widgets()
        self.capacity_plot = CapacityPlot()
        self.sweep_plot = LimitSweepPlot()
        self.sketch = SectionSketch()
        # Named only while the demo's own inputs are on screen: an edited beam is not B-204.
        self.demo_note = pn.pane.HTML(DEMO_NOTE, stylesheets=[TEXT_CSS], margin=(0, 10))
        self.sketch_note = pn.pane.HTML("", stylesheets=[TEXT_CSS], width=300, margin=(0, 8))
        self.plot_note = pn.pane.HTML("", stylesheets=[TEXT_CSS], sizing_mode="stretch_width",
                                      margin=(0, 8))
        self.size_bars = SizeBarsView(self)
        # The results area: the check's own tab first; other views add theirs (add_view).
        self.check_tab = pn.Column(
            self.plot_note,
            # FlexBoxes wrap: side by side on a wide screen, one under the other on a phone.
            pn.FlexBox(pn.pane.Bokeh(self.capacity_plot.figure, sizing_mode="stretch_width",
                                     css_classes=["rs-capacity-plot"], min_width=300,
                                     styles={"flex": "1 1 380px"}),
                       pn.Column(pn.pane.Bokeh(self.sketch.figure, width=300),
                                 self.sketch_note, width=310),
                       flex_wrap="wrap", sizing_mode="stretch_width"),
            pn.FlexBox(pn.pane.Bokeh(self.sweep_plot.figure, width=320),
                       pn.Column(self.details, self.frame_pane, sizing_mode="stretch_width",
                                 min_width=300,
                                 styles={"flex": "1 1 320px"}),
                       flex_wrap="wrap", sizing_mode="stretch_width"),
            sizing_mode="stretch_width")
        self.views = pn.Tabs(
            ("Check", self.check_tab),
            ("Size the bars", self.size_bars.__panel__()),
            dynamic=False, sizing_mode="stretch_width", margin=(0, 0))
        self._set_spans(self.units, self.inputs())
        location = page_location()
        if location is not None:
            location.param.watch(self._on_search, "search")
            if location.search:
                self.apply_link(location.search)
        self._redraw_now()
        self.sheet_view = SheetView.attach(self, "Calculation sheet")
        self.schedule_view = ScheduleView.attach(self, "Beam schedule")
        self.ductility_view = DuctilityView.attach(self, "Ductility")

    # -- state -----------------------------------------------------------

    def inputs(self) -> Inputs:
        """The current inputs (bf found from the slab when sw and ln are set)."""
        values = {name: getattr(self, name) for name in OTHER_FIELDS}
        values["layers"] = tuple(tuple(layer) for layer in self.layers)
        if self.shape in ("T", "L") and None not in (self.sw, self.ln, self.hf):
            try:
                values["bf"] = slab_flange_width(self.shape, self.b, self.hf, self.sw, self.ln)
            except engine.InputError:
                pass  # the previous bf stays; `_redraw` shows the message
        return Inputs(units=self.units, fc=self.fc, fy=self.fy, b=self.b, d=self.d,
                      As=self.As, Mu=self.Mu, **values)

    def set_inputs(self, **changes) -> None:
        """Change some inputs (Inputs field names), check, and write the link once."""
        self._switch_memo = None
        self.apply(replace(self.inputs(), **changes))
        self._write_link()

    def apply(self, inputs: Inputs) -> None:
        """Show and check `inputs` (values used exactly; slider spans widen to fit)."""
        self._applying = True
        self._draft_layer = None  # a half-typed new layer belongs to the inputs being replaced
        try:
            if inputs.units != self._widget_units:
                self._build_quantity_inputs(inputs.units, inputs)
            self._set_spans(inputs.units, inputs)
            self.unit_switch.value = inputs.units
            # One update: the check runs once, on the whole new set of values.
            self.param.update(**{"units": inputs.units, "refusals": {},
                                 **{name: getattr(inputs, name) for name in NUMBER_FIELDS},
                                 **{name: getattr(inputs, name) for name in OTHER_FIELDS}})
        finally:
            self._applying = False

    def apply_link(self, search: str) -> None:
        """Apply a share link's query string; its problems go to `link_messages`."""
        inputs, messages = parse_query(search)
        self._switch_memo = None
        self.apply(inputs)
        self.link_messages = list(messages)
        self._written_search = search
        if messages:
            self._write_link()  # the address bar shows what is used, once

    def share_query(self) -> str:
        """The query string of the current inputs."""
        return self.inputs().to_query()

    # -- hooks for other views (stable names) ---------------------------

    def current_inputs(self) -> dict:
        """The `engine.check` keywords of the current check, Mu included (None for none)."""
        return self.inputs().engine_kwargs()

    def share_url(self) -> str:
        """The current share link as the browser shows it (base address + query)."""
        location = page_location()
        href = getattr(location, "href", "") if location is not None else ""
        base = href.split("?", 1)[0].split("#", 1)[0] if href else ""
        return (base or "http://localhost:5006/") + self.share_query()

    def open_check(self, query: str) -> None:
        """Open a share query (another view's beam) as a link would: inputs, address bar, Check tab."""
        self.apply_link(query)
        self._write_link()
        self.views.active = 0

    def add_view(self, title: str, viewable) -> None:
        """Append `viewable` as a tab named `title` after the check's own tab."""
        self.views.append((title, viewable))

    def _build_quantity_inputs(self, units: str, inputs: Inputs | None = None) -> None:
        """The sliders, Mu and the section's number entries for `units`, in place of any old ones."""
        inputs = inputs or self.inputs()
        self._widget_units = units
        self.sliders: dict[str, pn.widgets.EditableFloatSlider] = {}
        for name in SLIDER_FIELDS:
            slider = pn.widgets.EditableFloatSlider(
                label=self._label(name, units), value=getattr(inputs, name), start=0.0,
                end=max(1.0, getattr(inputs, name)), step=0.01, sizing_mode="stretch_width",
                format="0[.][0000]", bar_color="#0d6b70", css_classes=[f"rs-input-{name}"])
            slider.param.watch(lambda event, name=name: self._on_slider(name, units, event),
                               "value")
            slider.param.watch(self._on_settled, "value_throttled")
            self.sliders[name] = slider
        self.bars_input = pn.widgets.TextInput(
            label="As as bars drawn (count and size)", placeholder="e.g. 4 #9" if units == "us"
            else "e.g. 4 No. 25", sizing_mode="stretch_width", css_classes=["rs-input-bars"])
        self.bars_input.param.watch(lambda event: self._on_bars(0, units, event.new), "value")
        self.mu_input = number_box(self._label("Mu", units), inputs.Mu, "rs-input-Mu",
                                   placeholder="none", sizing_mode="stretch_width")
        self.mu_input.param.watch(lambda event: self._on_typed("Mu", units, event.new), "value")
        self.entries: dict[str, pn.widgets.TextInput] = {}
        for name, label in SECTION_ENTRIES:
            entry = number_box(label, getattr(inputs, name), f"rs-input-{name}",
                               placeholder="none", sizing_mode="stretch_width", align="end",
                               stylesheets=[ENTRY_CSS])
            entry.param.watch(lambda event, name=name: self._on_typed(name, units, event.new),
                              "value")
            self.entries[name] = entry
        self._label_entries(units)
        self.quantity_inputs.objects = [*self.sliders.values(), self.bars_input, self.mu_input]
        self.flange_entries.objects = [pn.Row(self.entries["bf"], self.entries["hf"]),
                                       pn.Row(self.entries["sw"], self.entries["ln"])]
        self.frame_entries.objects = [pn.Row(self.entries["top_As"], self.entries["top_d"])]
        self.depth_entries.objects = [pn.Row(self.entries["h"], self.entries["dt"]),
                                      pn.Row(self.entries["asc"], self.entries["dc"]),
                                      pn.Row(self.entries["es"])]
        self._shown_layers = None  # the layer rows are rebuilt in the new units too

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
        except (engine.InputError, ArithmeticError):
            return floor
        if As_b is None or not math.isfinite(As_b):
            return floor  # no steel area reaches the balanced strain
        return min(_nice_ceiling(_AS_PAST_BALANCED * As_b, step * 10), inputs.b * inputs.d)

    # -- widget events ---------------------------------------------------

    def _in_use_units(self, name: str, value, units: str):
        """`value` of quantity `name` from a widget of `units`, in the units in use."""
        if value is None or units == self.units:
            return value
        # A widget built before the last unit switch: the browser sent this
        # before it showed the switch, so the number is in the old units.
        system = engine.unit_system
        return engine.convert(value, QUANTITY[name], system(units), system(self.units))

    def _on_slider(self, name: str, units: str, event) -> None:
        if self._applying or event.new is None:
            return
        self._input_count += 1
        self._last_edited = name
        # A dragged slider reports its steps with float noise (5.819999999999999);
        # 12 significant figures drop the noise and keep anything a person types.
        value = float(f"{self._in_use_units(name, float(event.new), units):.12g}")
        setattr(self, name, value)

    def _on_typed(self, name: str, units: str, text: str) -> None:
        """Text typed into the number box of `name` (a box built for `units`)."""
        if self._applying:
            return
        self._input_count += 1
        self._last_edited = name
        try:
            typed = read_number(name, text)
        except engine.InputError as error:
            # Not read, so not used: the check says "Not checked" and why, and the
            # box keeps the text until it is corrected.
            self.refusals = {**self.refusals, name: error}
            return
        if name in self.refusals:
            self.refusals = {key: error for key, error in self.refusals.items() if key != name}
        self.set_inputs(**{name: self._in_use_units(name, typed, units)})

    def _on_settled(self, event) -> None:
        if self._applying:
            return
        self._write_link()
        # A slider's value_throttled can arrive before its last value (arrow keys in a
        # row): the settle check writes the link again from the values in use. Only
        # then: a drag that pauses mid-way must not add a history entry of its own.
        self._link_from_slider = True

    def _on_unit_switch(self, event) -> None:
        if self._applying or event.new == self.units:
            return
        self._input_count += 1
        current = self.inputs()
        if self._switch_memo is not None and self._switch_memo[0] == current:
            target = self._switch_memo[1]  # switching straight back restores the exact values
        else:
            exact = convert_inputs(current, event.new)
            target = rounded_inputs(exact)
            if _outcome(target) != _outcome(exact):
                target = exact  # rounding moved a value across a limit: keep it unrounded
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

    @param.depends("fc", "fy", "b", "d", "As", "Mu", "units", "refusals", *OTHER_FIELDS,
                   watch=True)
    def _refresh(self) -> None:
        if not on_server(pn.state.curdoc):
            self._redraw_now()  # tests, and the Pyodide worker (one change at a time): at once
            return
        # On a server, changes the browser sent in a burst are queued; each sets
        # its parameter, and one redraw (after them all) shows the last state
        # instead of replaying every intermediate one.
        if not self._redraw_pending:
            self._redraw_pending = True
            pn.state.execute(self._scheduled_redraw, schedule=True)

    def _scheduled_redraw(self) -> None:
        self._redraw_pending = False
        self._redraw_now()
        doc = pn.state.curdoc
        if on_server(doc):
            count = self._input_count
            doc.add_timeout_callback(lambda: self._resend_if_settled(count), SETTLE_MS)

    def _resend_if_settled(self, count: int) -> None:
        """Once input has stopped, send the input widgets the server set their values again.

        While a person drags or types, the browser and the server can cross
        messages (the browser shows a value the server has already replaced);
        Panel then believes the browser shows what it sent. Sending those values
        again once nothing new has come in makes what is shown the value in use
        (`widget_sync`).
        """
        if count != self._input_count or self._redraw_pending:
            return
        with pn.io.hold():
            resend_values(self.input_widgets())
            # The link follows a slider's value_throttled, which can be handled before
            # the slider's last value (arrow keys in a row left fc=4100 in the address
            # bar while 4250 was checked); once input settles it is written from the
            # values in use (no change, no write).
            if self._link_from_slider:
                self._link_from_slider = False
                self._write_link()

    def input_widgets(self) -> list:
        """Every widget of the page that holds an input."""
        widgets = [self.unit_switch, *self.sliders.values(), self.mu_input,
                   *self.entries.values(), self.spiral_switch, self.frame_switch,
                   self.shape_switch,
                   self.flange_source]
        for row in self.layer_rows.objects[1:]:
            if isinstance(row, (pn.Row, pn.FlexBox)):
                widgets += [box for box in row.objects if isinstance(box, pn.widgets.TextInput)]
        return widgets + self.size_bars.input_widgets()

    def _redraw_now(self) -> None:
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
        if "Mu" not in self.refusals and not shows(self.mu_input, self.Mu):
            self._applying = True
            try:
                self.mu_input.value = shown_number(self.Mu)
            finally:
                self._applying = False
        inputs = self.inputs()
        current = without_stale_drawn(inputs)
        if current.drawn != inputs.drawn:
            with param.discard_events(self):
                self.drawn = current.drawn  # an area was changed away from its bars
            inputs = current
        self.demo_note.visible = is_demo(inputs)
        self._sync_section_widgets(inputs)
        self._show_bars(inputs)  # after the layer rows are rebuilt: their boxes show the bars
        self.flange_note.object = self._flange_note(inputs)
        if self.refusals:
            self._show_unchecked(inputs, next(iter(self.refusals.values())))
            return
        try:
            result = engine.check(**inputs.engine_kwargs())
        except (engine.InputError, ArithmeticError) as error:
            self._show_unchecked(inputs, error)
            return
        except Exception as error:  # an engine fault must not blank the page
            LOG.exception("engine.check failed for %r", inputs)
            self._show_unchecked(inputs, error)
            return
        self.input_pane.object = ""
        self.check_tab.styles = {}
        self.result = result
        self._draw_view("the As slider's range", self.cards, lambda: self._update_as_end(inputs))
        self._draw_view("the verdict", self.cards,
                        lambda: setattr(self.cards, "object", summary.cards_html(result)))
        self._details_markup = ""
        self._draw_view("the table of values", self.details, lambda: self._draw_details(result))
        self.frame_pane.object = ""
        if inputs.frame:
            self._draw_view("the special moment frame checks", self.frame_pane,
                            lambda: setattr(self.frame_pane, "object", summary.frame_html(
                                engine.special_frame_check(**inputs.special_frame_kwargs()))))
        self.plot_note.object = ""
        self._draw_view("the capacity plot", self.plot_note, lambda: self.capacity_plot.update(
            self._curve(inputs, result), result))
        fc_slider = self.sliders["fc"]
        self._draw_view("the plot of limits against f'c", self.plot_note,
                        lambda: self.sweep_plot.update(result, (fc_slider.start, fc_slider.end),
                                                       inputs.section_kwargs()))
        self._draw_view("the bar sizing", self.size_bars.message,
                        lambda: self.size_bars.update(inputs))
        option = matching_option(self.size_bars.result, inputs)
        if option is None and inputs.bars is not None:
            with param.discard_events(self):
                self.bars = None  # the bars were edited away from the chosen arrangement
            inputs = replace(inputs, bars=None)
        self._draw_view("the section sketch", self.sketch_note,
                        lambda: self._draw_sketch(inputs, result, option))

    def _draw_details(self, result: engine.FlexuralCheck) -> None:
        self._details_markup = summary.details_html(result)
        self.details.object = self._details_markup

    def _draw_view(self, what: str, place: pn.pane.HTML, draw) -> None:
        """Run `draw`; if it fails, say so in `place` (the view's own pane) instead.

        A view that cannot draw the current inputs must never take the page
        down with it: the rest of the page still shows the check.
        """
        try:
            draw()
        except Exception as error:
            LOG.exception("could not draw %s", what)
            place.object = summary.messages_html([
                f"{what[0].upper()}{what[1:]} cannot be drawn for these inputs "
                f"({type(error).__name__}: {error}). The check above is not affected."])

    def _show_unchecked(self, inputs: Inputs, error: Exception) -> None:
        """Say plainly, at the top, that `inputs` were not checked, and why."""
        text = str(error) if isinstance(error, engine.InputError) else (
            f"the engine could not compute these inputs ({type(error).__name__})")
        edited = self._last_edited
        if isinstance(error, engine.InputError) and edited and edited != error.field:
            # The engine names the field whose range the new value broke (d = 30 with
            # h = 24 is refused as h); name the one just changed as well.
            text += (f". This follows from the change to {edited}: change {edited} or "
                     f"{error.field}")
        self.input_pane.object = summary.messages_html(
            [f"Not checked. {text}. The plots and tables below are not updated: they show "
             f"the last inputs that could be checked."])
        self.cards.object = summary.unchecked_cards_html(summary.refused_reason(error),
                                                         inputs.units)
        self.details.object = summary.stale_html(self._details_markup)
        self.check_tab.styles = {"opacity": "0.5"}  # the plots are of the last checked inputs
        self.size_bars.show_unchecked(text)

    def _draw_sketch(self, inputs: Inputs, result, option) -> None:
        if option is not None:
            section = self.size_bars.result.section
            drawing = section_drawing(inputs, result, option.arrangement, section.stirrup,
                                      section.cover)
        else:
            drawing = section_drawing(inputs, result)
        self.sketch.update(drawing, inputs.units)
        length = engine.unit_system(inputs.units).length
        self.sketch_note.object = (
            f'<div class="rs-note"><span style="color:#0d6b70">▨ compression block</span> '
            f'a = <span data-q="sketch_a">{summary.fmt(drawing.a)}</span> {escape(length)} · '
            f'<span style="color:#c8402f">-- neutral axis</span> c = '
            f'<span data-q="sketch_c">{summary.fmt(drawing.c)}</span> {escape(length)}</div>'
            f'<div class="rs-note" data-q="sketch_note">{escape(drawing.note)}</div>')

    # -- section inputs --------------------------------------------------

    def _build_section_widgets(self) -> None:
        self.shape_switch = pn.widgets.RadioButtonGroup(
            options=SHAPE_OPTIONS, value=self.shape, color="primary",
            variant="outline", sizing_mode="stretch_width", css_classes=["rs-input-shape"])
        self.shape_switch.param.watch(self._on_shape, "value")
        self.flange_source = pn.widgets.RadioButtonGroup(
            options=FLANGE_SOURCES, value="direct",
            sizing_mode="stretch_width", css_classes=["rs-input-flange-source"])
        self.flange_source.param.watch(self._on_flange_source, "value")
        self.spiral_switch = pn.widgets.RadioButtonGroup(
            options=SPIRAL_OPTIONS, value=self.spiral, sizing_mode="stretch_width",
            css_classes=["rs-input-spiral"])
        self.spiral_switch.param.watch(self._on_spiral, "value")
        self.flange_note = pn.pane.HTML("", stylesheets=[TEXT_CSS], sizing_mode="stretch_width",
                                        margin=(0, 10))
        self.layer_rows = pn.Column(sizing_mode="stretch_width", margin=0)
        self.add_layer_button = pn.widgets.Button(label="Add a tension layer",
                                                  sizing_mode="stretch_width",
                                                  css_classes=["rs-add-layer"])
        self.add_layer_button.on_click(lambda event: self._add_layer())
        self.layer_note = pn.pane.HTML("", stylesheets=[TEXT_CSS], sizing_mode="stretch_width",
                                       margin=(0, 10))
        self.flange_box = pn.Column(
            self.flange_source, self.flange_entries, self.flange_note,
            sizing_mode="stretch_width", margin=0, visible=False)
        self.frame_switch = pn.widgets.RadioButtonGroup(
            options=FRAME_OPTIONS, value=self.frame, sizing_mode="stretch_width",
            css_classes=["rs-input-frame"])
        self.frame_switch.param.watch(self._on_frame, "value")
        self.frame_box = pn.Column(
            pn.pane.HTML('<div class="rs-note">Top steel for the negative-moment checks '
                         '(18.6.3.1, 18.6.3.2); its depth is measured from the bottom face.'
                         '</div>', stylesheets=[TEXT_CSS], margin=(0, 10)),
            self.frame_entries, sizing_mode="stretch_width", margin=0, visible=False)
        self.section_card = pn.Card(
            self.shape_switch, self.flange_box, self.depth_entries,
            pn.pane.HTML('<div class="rs-note">Transverse reinforcement (φ, ACI 318-19 '
                         'Table 21.2.2)</div>', stylesheets=[TEXT_CSS], margin=(0, 10)),
            self.spiral_switch,
            pn.pane.HTML('<div class="rs-note">Tension layers. The As and d sliders set the '
                         'first layer; each extra layer keeps the area and depth typed here '
                         '(As in the results is their total, d their centroid).</div>',
                         stylesheets=[TEXT_CSS], margin=(0, 10)),
            self.layer_rows, self.add_layer_button, self.layer_note,
            pn.pane.HTML('<div class="rs-note">Frame (ACI 318-19 Chapter 18)</div>',
                         stylesheets=[TEXT_CSS], margin=(0, 10)),
            self.frame_switch, self.frame_box,
            title="Section shape, A's and layers", collapsed=False,
            sizing_mode="stretch_width", margin=(4, 6), css_classes=["rs-section-card"])

    def _label_entries(self, units: str) -> None:
        for name, label in SECTION_ENTRIES:
            self.entries[name].label = f"{label} ({unit_label(units, name)})"
        default_es = engine.unit_system(units).default_es
        self.entries["es"].placeholder = f"{default_es:,.0f} (ACI 20.2.2.2)"

    def _on_spiral(self, event) -> None:
        if self._applying or event.new == self.spiral:
            return
        self._input_count += 1
        self.set_inputs(spiral=bool(event.new))

    def _on_frame(self, event) -> None:
        if self._applying or event.new == self.frame:
            return
        self._input_count += 1
        self.set_inputs(frame=bool(event.new))

    def _on_shape(self, event) -> None:
        if self._applying or event.new == self.shape:
            return
        changes = {"shape": event.new}
        base = SECTION_DEFAULTS[self.units]
        if event.new != "rect":
            if self.hf is None:
                changes["hf"] = base["hf"]
            if self.bf is None:
                changes["bf"] = max(self.b, base["bf"])
        self.set_inputs(**changes)

    def _on_flange_source(self, event) -> None:
        if self._applying:
            return
        base = SECTION_DEFAULTS[self.units]
        if event.new == "slab":
            self.set_inputs(sw=self.sw or base["sw"], ln=self.ln or base["ln"])
        else:
            self.set_inputs(sw=None, ln=None, bf=self.inputs().bf)

    def _add_layer(self) -> None:
        if len(self.layers) >= MAX_EXTRA_LAYERS:
            # The button is disabled at the limit; a click already on its way is refused aloud.
            self.layer_note.object = summary.messages_html([
                f"layer: at most {MAX_EXTRA_LAYERS} extra tension layers; this one is not "
                f"added."])
            return
        if self._draft_layer is None:
            self._draft_layer = [None, None]
            self.layer_rows.objects = self._layer_row_widgets(self.inputs())

    def _remove_layer(self, index: int) -> None:
        if index >= len(self.layers):  # the new layer, not yet an input
            self._draft_layer = None
            self.refusals = {key: error for key, error in self.refusals.items()
                             if not key.startswith(f"layer {index + 2} ")}
            self.layer_rows.objects = self._layer_row_widgets(self.inputs())
            return
        layers = list(self.layers)
        del layers[index]
        self.set_inputs(layers=tuple(layers), bars=None)

    def _edit_layer(self, index: int, part: int, units: str, text: str) -> None:
        """An extra layer's area (part 0) or depth (part 1) typed; index len(layers): the new one."""
        if self._applying:
            return
        self._input_count += 1
        what = "area" if part == 0 else "depth"
        field = f"layer {index + 2} {what}"
        self._last_edited = field
        try:
            typed = read_number(field, text)
            if typed is None and index < len(self.layers):
                raise engine.InputError(field, text, f"the layer's {what} (✕ removes the layer)")
        except engine.InputError as error:
            self.refusals = {**self.refusals, field: error}
            return
        if field in self.refusals:
            self.refusals = {key: error for key, error in self.refusals.items() if key != field}
        value = None if typed is None else self._in_use_units("As" if part == 0 else "d", typed,
                                                              units)
        if index >= len(self.layers):  # the new layer: an input once both values are in
            draft = self._draft_layer if self._draft_layer is not None else [None, None]
            draft[part] = value
            self._draft_layer = draft
            if None in draft:
                return
            self._draft_layer = None
            self.set_inputs(layers=tuple(self.layers) + (tuple(draft),), bars=None)
            return
        layers = [list(layer) for layer in self.layers]
        layers[index][part] = value
        self.set_inputs(layers=tuple(tuple(layer) for layer in layers), bars=None)

    def _sync_section_widgets(self, inputs: Inputs) -> None:
        self._applying = True
        try:
            self.shape_switch.value = inputs.shape
            slab = inputs.sw is not None and inputs.ln is not None
            self.flange_source.value = "slab" if slab else "direct"
            self.flange_box.visible = inputs.shape != "rect"
            for name, entry in self.entries.items():
                value = getattr(inputs, name)
                if name not in self.refusals and not shows(entry, value):
                    entry.value = shown_number(value)
            self.spiral_switch.value = inputs.spiral
            self.frame_switch.value = inputs.frame
            self.frame_box.visible = inputs.frame
            self.entries["bf"].disabled = slab
            self.entries["sw"].visible = self.entries["ln"].visible = slab
            full = len(inputs.layers) >= MAX_EXTRA_LAYERS
            self.add_layer_button.disabled = full
            if full:
                self.layer_note.object = (
                    f'<div class="rs-note" data-q="layer_limit">{MAX_EXTRA_LAYERS} extra '
                    f'tension layers, the most the page holds.</div>')
            elif "layer_limit" in self.layer_note.object or "not added" in self.layer_note.object:
                self.layer_note.object = ""
            rows = len(inputs.layers) + 1 + 2 * (self._draft_layer is not None)  # its row and note
            if inputs.layers != self._shown_layers or len(self.layer_rows) != rows:
                self._shown_layers = inputs.layers
                self.layer_rows.objects = self._layer_row_widgets(inputs)
            else:
                first = self.layer_rows.objects[0]
                first.object = self._first_layer_text(inputs)
        finally:
            self._applying = False

    def _on_bars(self, index: int, units: str, text: str) -> None:
        """Bars typed for tension layer `index` (0: the first, the As slider's)."""
        if self._applying:
            return
        self._input_count += 1
        field = "As bars" if index == 0 else f"layer {index + 1} bars"
        self._last_edited = field
        inputs = self.inputs()
        drawn = list(drawn_groups(inputs))
        try:
            group = None if not text.strip() else bar_group(field, text,
                                                             engine.unit_system(units))
            if group is not None and units != self.units:  # a box built before a switch
                group = bar_group(field, same_group(group, engine.unit_system(units),
                                                    engine.unit_system(self.units)),
                                  engine.unit_system(self.units))
        except engine.InputError as error:
            self.refusals = {**self.refusals, field: error}
            return
        if field in self.refusals:
            self.refusals = {key: error for key, error in self.refusals.items() if key != field}
        if index >= len(drawn):
            return  # the layer was removed while the text was on its way
        drawn[index] = group
        texts = tuple(None if g is None else g.link_text for g in drawn)
        new = with_drawn_areas(replace(inputs, drawn=texts if any(texts) else ()))
        self.set_inputs(As=new.As, layers=new.layers, drawn=new.drawn, bars=None)

    def _show_bars(self, inputs: Inputs) -> None:
        """Each bars box shows its layer's bars as drawn (blank: the area was typed)."""
        groups = drawn_groups(inputs)
        boxes = [self.bars_input] + self._layer_bars_boxes
        fields = ["As bars"] + [f"layer {index + 2} bars" for index in range(len(boxes) - 1)]
        self._applying = True
        try:
            for box, group, field in zip(boxes, groups, fields):
                text = "" if group is None else group.text
                if field not in self.refusals and box.value != text:
                    box.value = text
        finally:
            self._applying = False
        total = inputs.As + sum(area for area, _ in inputs.layers)
        label = self._label("As", inputs.units)
        if inputs.layers:  # the slider is one layer's: say so, and give the total beside it
            label = (f"As, layer 1 of {1 + len(inputs.layers)} ({unit_label(inputs.units, 'As')});"
                     f" total {summary.fmt(total)}")
        if self.sliders["As"].name != label:
            self.sliders["As"].name = label

    def _first_layer_text(self, inputs: Inputs) -> str:
        system = engine.unit_system(inputs.units)
        return (f'<div class="rs-note" data-q="layer_1">1: As = {summary.fmt(inputs.As)} '
                f'{escape(system.area)} at d = {summary.fmt(inputs.d)} '
                f'{escape(system.length)} (sliders)</div>')

    def _layer_row_widgets(self, inputs: Inputs) -> list:
        self._layer_bars_boxes = []  # each extra layer's bars box, in layer order
        rows = [pn.pane.HTML(self._first_layer_text(inputs), stylesheets=[TEXT_CSS],
                             margin=(0, 10))]
        area_unit, length_unit = unit_label(inputs.units, "As"), unit_label(inputs.units, "d")
        shown = list(inputs.layers)
        if self._draft_layer is not None:
            shown.append(tuple(self._draft_layer))
        for index, (area, depth) in enumerate(shown):
            new = index >= len(inputs.layers)
            area_box = number_box(f"{index + 2}: area ({area_unit})", area,
                                  f"rs-layer-{index + 2}-area", width=110,
                                  placeholder="type" if new else "")
            depth_box = number_box(f"depth ({length_unit})", depth, f"rs-layer-{index + 2}-depth",
                                   width=110, placeholder="type" if new else "")
            units = inputs.units
            area_box.param.watch(lambda e, i=index: self._edit_layer(i, 0, units, e.new),
                                 "value")
            depth_box.param.watch(lambda e, i=index: self._edit_layer(i, 1, units, e.new),
                                  "value")
            remove = pn.widgets.Button(label="✕", width=36, align="end",
                                       description="remove this layer",
                                       css_classes=[f"rs-layer-{index + 2}-remove"])
            remove.on_click(lambda event, i=index: self._remove_layer(i))
            if new:
                rows.append(pn.Row(area_box, depth_box, remove, margin=0))
                continue
            bars_box = pn.widgets.TextInput(label="or bars", placeholder="e.g. 2 #8"
                                            if units == "us" else "e.g. 2 No. 25", width=90,
                                            css_classes=[f"rs-layer-{index + 2}-bars"])
            bars_box.param.watch(lambda e, i=index: self._on_bars(i + 1, units, e.new), "value")
            self._layer_bars_boxes.append(bars_box)
            rows.append(pn.FlexBox(area_box, depth_box, bars_box, remove, margin=0,
                                   gap="0 4px"))
        if self._draft_layer is not None:
            rows.append(pn.pane.HTML(
                f'<div class="rs-note" data-q="new_layer">Layer {len(shown) + 1}: type its area '
                f'and depth; it counts once both are in.</div>', stylesheets=[TEXT_CSS],
                margin=(0, 10)))
        return rows

    def _flange_note(self, inputs: Inputs) -> str:
        if inputs.shape == "rect" or inputs.sw is None or inputs.ln is None:
            return ""
        system = engine.unit_system(inputs.units)
        try:
            bf = slab_flange_width(inputs.shape, inputs.b, inputs.hf, inputs.sw, inputs.ln)
        except engine.InputError as error:
            return summary.messages_html([str(error)])
        return (f'<div class="rs-note">bf = <span data-q="bf_slab">{summary.fmt(bf)}</span> '
                f'{escape(system.length)} from ACI 318-19 Table 6.3.2.1 '
                f'({"T: each overhang the least of 8hf, sw/2, ln/8" if inputs.shape == "T" else "L: the overhang the least of 6hf, sw/2, ln/12"})</div>')

    def _curve(self, inputs: Inputs, result: engine.FlexuralCheck) -> engine.CapacityCurve:
        """The capacity curve, recomputed only when more than As changed.

        The curve depends on the section and materials, not on As, so a drag of
        the As slider reuses it (and sends no new curve data to the browser)
        as long as the section's ρ stays within it.
        """
        kwargs = inputs.section_kwargs()
        # With several layers As is one of them, so it shapes the curve too.
        key = tuple((k, v) for k, v in kwargs.items() if k != "As" or "layers" in kwargs)
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
                '<div class="rs-notice" data-q="link_notice">'
                + summary.messages_html(["The shared link had values that could not be used "
                                         "(the address bar now shows the inputs in use):"]
                                        + list(messages)) + '</div>')
        else:
            self.link_pane.object = ""

    # -- layout ----------------------------------------------------------

    def __panel__(self):
        sidebar = pn.Column(
            pn.pane.HTML('<h3 style="margin:4px 0">Beam section</h3>', stylesheets=[TEXT_CSS],
                         margin=(4, 10, 0, 10)),
            self.demo_note,
            self.unit_switch,
            self.quantity_inputs,
            self.section_card,
            self.copy_button,
            width=330, min_width=280, stylesheets=[SIDEBAR_CSS], margin=(6, 8),
        )
        main = pn.Column(
            self.views,
            sizing_mode="stretch_width", min_width=340, styles={"flex": "1 1 600px"},
        )
        # The verdict and any refusal sit under the caution, full width, so they
        # are in view without scrolling at any width (the inputs wrap below on a
        # narrow screen).
        return pn.Column(
            self.header,
            self.input_pane,
            self.link_pane,
            self.cards,
            pn.FlexBox(sidebar, main, flex_wrap="wrap", align_items="flex-start",
                       sizing_mode="stretch_width"),
            sizing_mode="stretch_width", styles={"background": "#f7f6f2"},
        )
