""""Size the bars": from Mu and a trial b × h to bar arrangements, and back into the check.

`SizeBarsView` holds the bar-sizing inputs' widgets (among them the order
of the options and whether the 9.6.1.3 waiver of As,min is allowed), runs
`engine.design_section` on the page's current materials, b, h and Mu, and
shows the options in that order (bar, count, layers, As, d, dt, φMn, εt,
clear spacing, ok, the rules each breaks with its clause), the lightest that
works marked in words, the verdict and the ways out when nothing works, and
the detailing checks of the selected option. "Use in the check" hands the option's layers to the page. Every
string shown is escaped; the numbers are the engine's.
"""

from __future__ import annotations

from html import escape

import panel as pn

import engine

from .state import DESIGN_DEFAULTS, SECTION_DEFAULTS, unit_label
from .summary import fmt
from .theme import TEXT_CSS

SUPPORTS = {"not given": None, "simply supported": "simple", "one end continuous": "one-end",
            "both ends continuous": "both-ends", "cantilever": "cantilever"}
STIRRUPS = {"us": ["#3", "#4", "#5"], "si": ["10", "13", "16"]}
ORDERS = {"practical (fewer layers, fewer bars)": engine.Order.PRACTICAL.value,
          "lightest (least steel)": engine.Order.LIGHTEST.value}
LIGHTEST_MARK = "lightest"


def design_kwargs(inputs) -> dict:
    """`engine.design_section` keywords for the page's `inputs` (defaults filled in)."""
    units = inputs.units
    base = DESIGN_DEFAULTS[units]
    kwargs = {"units": units, "fc": inputs.fc, "fy": inputs.fy, "b": inputs.b,
              "h": design_h(inputs), "Mu": inputs.Mu,
              "cover": inputs.cover,  # None: the engine's Table 20.5.1.3.1 default
              "stirrup": inputs.stirrup or base["stirrup"],
              "agg": inputs.agg if inputs.agg is not None else base["agg"],
              "layers": inputs.nlayers or base["nlayers"],
              "order": inputs.order or engine.Order.PRACTICAL.value,
              "waive_as_min": inputs.waiver}
    if inputs.span is not None and inputs.support is not None:
        kwargs.update(span=inputs.span, support=inputs.support)
    return kwargs


def design_h(inputs) -> float:
    """h of the trial section: the check's, or B-204's depth (deepened for a deep d)."""
    if inputs.h is not None:
        return inputs.h
    below = 2.5 if inputs.units == "us" else 63.0  # common practice: cover, stirrup, bar/2
    return max(SECTION_DEFAULTS[inputs.units]["h"], inputs.d + below)


def option_key(option) -> str:
    """The link's `bars` value of `option`: "#8:4,2" (bar, then bars per layer, bottom first)."""
    return f"{option.bar.designation}:{','.join(map(str, option.per_layer))}"


def option_inputs(inputs, option, h: float) -> dict:
    """The check inputs that `option` sets: its layers (bottom first), h and its key."""
    (As, d), *upper = option.arrangement.steel_layers
    bar_number = option.arrangement.bar.number
    return {"As": As, "d": d, "layers": tuple(upper), "dt": None, "h": h,
            "bars": option_key(option),
            "drawn": tuple(f"{count}x{bar_number}" for count in option.arrangement.per_layer)}


def matching_option(result: engine.DesignResult | None, inputs):
    """The option `inputs.bars` names, if its layers are the check's; else None."""
    if result is None or inputs.bars is None:
        return None
    layers = [(inputs.As, inputs.d)] + list(inputs.layers)
    for option in result.options:
        if option_key(option) != inputs.bars:
            continue
        steel = option.arrangement.steel_layers
        if len(steel) == len(layers) and all(
                abs(a - b) <= 1e-9 * max(abs(a), abs(b), 1e-300)
                for pair, other in zip(steel, layers) for a, b in zip(pair, other)):
            return option
    return None


def options_html(result: engine.DesignResult, selected: int | None) -> str:
    """The options table, best first, with failed rules and their clauses."""
    if not result.options:
        return '<div class="rs-note" data-q="options">No bar arrangement to list.</div>'
    u = result.section.system
    L, A, M = escape(u.length), escape(u.area), escape(u.moment)
    rows = []
    for index, option in enumerate(result.options):
        rules = "; ".join(f"{escape(rule.clause)}: {escape(rule.message)}"
                          for rule in option.failed_rules) or "—"
        mark = ("✔ ok" + (" (9.6.1.3 waiver)" if option.min_steel_waived else "")
                if option.ok else "✘ no")
        if option is result.lightest:
            mark += f' <strong data-q="lightest_mark">· {LIGHTEST_MARK}</strong>'
        chosen = ' class="rs-chosen"' if index == selected else ""
        rows.append(
            f'<tr{chosen} data-q="option"><td class="num">{index + 1}</td>'
            f'<td data-q="option_label">{escape(option.label)}</td>'
            f'<td class="num">{option.count}</td><td class="num">{option.layers}</td>'
            f'<td class="num">{fmt(option.As)}</td><td class="num">{fmt(option.d)}</td>'
            f'<td class="num">{fmt(option.dt)}</td><td class="num">{fmt(option.phiMn)}</td>'
            f'<td class="num">{fmt(option.eps_t)}</td>'
            f'<td class="num">{fmt(option.clear_spacing, 3)}</td>'
            f'<td class="{"pass" if option.ok else "fail"}" data-q="option_ok">{mark}</td>'
            f'<td class="rs-note">{rules}</td></tr>')
    head = (f'<tr><th>#</th><th>bars</th><th>count</th><th>layers</th><th>As ({A})</th>'
            f'<th>d ({L})</th><th>dt ({L})</th><th>φMn ({M})</th><th>εt</th>'
            f'<th>clear spacing ({L})</th><th>ok</th><th>rules broken (clause)</th></tr>')
    return f'<table data-q="options">{head}{"".join(rows)}</table>'


def verdict_html(result: engine.DesignResult) -> str:
    u = result.section.system
    box = "rs-msg rs-warn" if not result.feasible or result.best is None else "rs-ok"
    remedies = "".join(f"<li>{escape(text)}</li>" for text in result.remedies)
    remedies = f"<div>Ways out:</div><ul data-q=\"remedies\">{remedies}</ul>" if remedies else ""
    warnings = "".join(f'<div class="rs-msg rs-warn">{escape(text)}</div>'
                       for text in result.warnings)
    req = ("—" if result.As_req is None else
           f"{fmt(result.As_req)} {escape(u.area)} at d = {fmt(result.As_req_d)} "
           f"{escape(u.length)}")
    return (f'<div class="{box}" data-q="design_verdict">{escape(result.verdict)}</div>'
            f'{remedies}<div class="rs-note">As,req = <span data-q="As_req_design">{req}</span>'
            f' · largest φMn with εt ≥ 0.004 at the deepest d: {fmt(result.phiMn_max)} '
            f'{escape(u.moment)} · the trial section is the rectangle b × h (a flange is '
            f'not counted here; the check counts it)</div>{warnings}')


def detailing_html(result: engine.DesignResult, option) -> str:
    if option is None:
        return ""
    rows = "".join(
        f'<tr><td class="{"pass" if c.passed else "fail"}" data-q="detail_check">'
        f'{"✔ pass" if c.passed else "✘ fail"}</td><td>{escape(c.clause)}</td>'
        f'<td>{escape(c.title)}</td><td class="rs-note">{escape(c.detail)}</td></tr>'
        for c in result.detailing(option))
    return (f'<h3>Checks of {escape(option.label)}</h3><table><tr><th>result</th>'
            f'<th>clause</th><th>requirement</th><th>detail</th></tr>{rows}</table>')


class SizeBarsView:
    """The "Size the bars" tab of a `BeamCheckPage`."""

    def __init__(self, page) -> None:
        self.page = page
        self.result: engine.DesignResult | None = None
        self._key = None
        units = page.units
        # Widths hold each label at about 7 px a character, so no label runs into the next.
        self.h_input = pn.widgets.FloatInput(label="", start=0.0, css_classes=["rs-design-h"],
                                             format="0[.][0000]", width=150)
        self.mu_input = pn.widgets.FloatInput(label="", start=0.0, css_classes=["rs-design-Mu"],
                                              format="0[.][0000]", width=120)
        self.cover_input = pn.widgets.FloatInput(label="", start=0.0, format="0[.][0000]",
                                                 placeholder="code",
                                                 css_classes=["rs-design-cover"], width=150)
        self.stirrup_input = pn.widgets.Select(label="", options=STIRRUPS[units], width=110,
                                               css_classes=["rs-design-stirrup"])
        self.agg_input = pn.widgets.FloatInput(label="", start=0.0, format="0[.][0000]",
                                               css_classes=["rs-design-agg"], width=110)
        self.layers_input = pn.widgets.RadioButtonGroup(label="Layers", options=[1, 2], value=2,
                                                        css_classes=["rs-design-layers"])
        self.span_input = pn.widgets.FloatInput(label="", start=0.0, format="0[.][0000]",
                                                placeholder="none", width=175,
                                                css_classes=["rs-design-span"])
        self.support_input = pn.widgets.Select(label="", options=list(SUPPORTS), width=170,
                                               css_classes=["rs-design-support"])
        self.order_input = pn.widgets.Select(label="order of the options", options=list(ORDERS),
                                             width=240, css_classes=["rs-design-order"])
        self.waiver_input = pn.widgets.Checkbox(
            label="allow the 9.6.1.3 waiver (As ≥ 4/3 As,req in place of As,min)", value=False,
            css_classes=["rs-design-waiver"])
        self.choice = pn.widgets.Select(label="Option", options={}, width=260,
                                        css_classes=["rs-design-choice"])
        self.use_button = pn.widgets.Button(label="Use this option in the check",
                                            color="primary", width=240,
                                            css_classes=["rs-design-use"])
        self.verdict = pn.pane.HTML("", stylesheets=[TEXT_CSS], sizing_mode="stretch_width")
        self.table = pn.pane.HTML("", stylesheets=[TEXT_CSS], sizing_mode="stretch_width")
        self.detail = pn.pane.HTML("", stylesheets=[TEXT_CSS], sizing_mode="stretch_width")
        self.message = pn.pane.HTML("", stylesheets=[TEXT_CSS], sizing_mode="stretch_width")
        self._syncing = False
        for widget, name in ((self.h_input, "h"), (self.mu_input, "Mu"),
                             (self.cover_input, "cover"), (self.stirrup_input, "stirrup"),
                             (self.agg_input, "agg"), (self.layers_input, "nlayers"),
                             (self.span_input, "span"), (self.support_input, "support"),
                             (self.order_input, "order"), (self.waiver_input, "waiver")):
            widget.param.watch(lambda event, name=name: self._on_input(name, event.new), "value")
        self.choice.param.watch(self._on_choice, "value")
        self.use_button.on_click(lambda event: self.use_selected())

    # -- inputs ----------------------------------------------------------

    def input_widgets(self) -> list:
        """The bar-sizing inputs' widgets (the page re-sends their values, see widget_sync)."""
        return [self.h_input, self.mu_input, self.cover_input, self.stirrup_input,
                self.agg_input, self.layers_input, self.span_input, self.support_input,
                self.order_input, self.waiver_input]

    def _on_input(self, name: str, value) -> None:
        if self._syncing or self.page._applying:
            return
        if name == "support":
            value = SUPPORTS.get(value)
        elif name == "order":
            value = ORDERS.get(value)
        self.page.set_inputs(**{name: value})

    def _on_choice(self, event) -> None:
        if self._syncing or self.result is None or event.new is None:
            return
        self.detail.object = detailing_html(self.result, self.result.options[event.new])
        self.table.object = options_html(self.result, event.new)

    def use_selected(self) -> None:
        """Set the check's inputs to the selected option's bars."""
        if self.result is None or self.choice.value is None:
            return
        option = self.result.options[self.choice.value]
        self.page.set_inputs(**option_inputs(self.page.inputs(), option,
                                             self.result.section.h))

    # -- results ---------------------------------------------------------

    def update(self, inputs) -> None:
        """Show the design of `inputs` (re-run only when a design input changed)."""
        self._sync_widgets(inputs)
        if inputs.Mu is None or inputs.Mu <= 0:
            self.result = None
            self._key = None
            self.message.object = ('<div class="rs-msg rs-warn" data-q="design_message">'
                                   'Enter Mu (above, or in the inputs) to size the bars.</div>')
            self.verdict.object = self.table.object = self.detail.object = ""
            return
        kwargs = design_kwargs(inputs)
        key = tuple(sorted(kwargs.items()))
        if key != self._key:
            self._key = key
            try:
                self.result = engine.design_section(**kwargs)
            except (engine.InputError, ArithmeticError) as error:
                self.result = None
                text = str(error) if isinstance(error, engine.InputError) else (
                    f"the engine could not size these inputs ({type(error).__name__})")
                self.message.object = (f'<div class="rs-msg" data-q="design_message">'
                                       f'{escape(text)}</div>')
                self.verdict.object = self.table.object = self.detail.object = ""
                return
            self.message.object = ""
            self.verdict.object = verdict_html(self.result)
            self._syncing = True
            try:
                self.choice.options = {
                    f"{i + 1}. {o.label}{'' if o.ok else ' (fails)'}"
                    f"{f' ({LIGHTEST_MARK})' if o is self.result.lightest else ''}": i
                    for i, o in enumerate(self.result.options)}
                best = self.result.best
                self.choice.value = (self.result.options.index(best) if best is not None
                                     else 0 if self.result.options else None)
            finally:
                self._syncing = False
        if self.result is None:
            return  # the same inputs could not be sized last time: their message stays
        chosen = matching_option(self.result, inputs)
        index = self.choice.value if chosen is None else self.result.options.index(chosen)
        if chosen is not None and self.choice.value != index:
            self._syncing = True
            self.choice.value = index
            self._syncing = False
        self.table.object = options_html(self.result, index)
        self.detail.object = detailing_html(
            self.result, None if index is None else self.result.options[index])

    def show_unchecked(self, text: str) -> None:
        """The page's inputs were refused: say why here, and show no options."""
        self.result = None
        self._key = None
        self.message.object = (f'<div class="rs-msg" data-q="design_message">Not computed: '
                               f'{escape(text)}. Correct the input to size the bars.</div>')
        self.verdict.object = self.table.object = self.detail.object = ""
        self._syncing = True
        try:
            self.choice.options = {}
        finally:
            self._syncing = False

    def _sync_widgets(self, inputs) -> None:
        units = inputs.units
        base = DESIGN_DEFAULTS[units]
        self._syncing = True
        try:
            self.stirrup_input.options = STIRRUPS[units]
            values = {self.h_input: design_h(inputs), self.mu_input: inputs.Mu,
                      self.cover_input: inputs.cover,
                      self.stirrup_input: inputs.stirrup or base["stirrup"],
                      self.agg_input: inputs.agg if inputs.agg is not None else base["agg"],
                      self.layers_input: inputs.nlayers or base["nlayers"],
                      self.span_input: inputs.span,
                      self.support_input: next(k for k, v in SUPPORTS.items()
                                               if v == inputs.support),
                      self.order_input: next(k for k, v in ORDERS.items()
                                             if v == (inputs.order or
                                                      engine.Order.PRACTICAL.value)),
                      self.waiver_input: bool(inputs.waiver)}
            for widget, value in values.items():
                if widget.value != value:
                    widget.value = value
            labels = ((self.h_input, "h, overall depth", "h"), (self.mu_input, "Mu", "Mu"),
                      (self.cover_input, "cover to stirrup", "cover"),
                      (self.agg_input, "max aggregate", "agg"),
                      (self.span_input, "span (Table 9.3.1.1)", "span"))
            for widget, text, name in labels:
                widget.label = f"{text} ({unit_label(units, name)})"
            # A bar designation (#3, 10), not a length: no unit in its label.
            self.stirrup_input.label = "stirrup bar"
            self.support_input.label = "support"
            self.layers_input.label = "layers at most"
        finally:
            self._syncing = False

    def __panel__(self):
        return pn.Column(
            pn.pane.HTML('<div class="rs-note">From the demand Mu and a trial b × h (b, f\'c '
                         'and fy from the inputs) to bars that carry it, fit and meet the '
                         'detailing rules. Pick an option and use it: the check, the plot, '
                         'the sketch and the link follow.</div>', stylesheets=[TEXT_CSS],
                         sizing_mode="stretch_width"),
            pn.FlexBox(self.mu_input, self.h_input, self.cover_input, self.stirrup_input,
                       self.agg_input, pn.Column(pn.pane.HTML(
                           '<div class="rs-note">layers at most</div>', stylesheets=[TEXT_CSS],
                           margin=(0, 5)), self.layers_input),
                       self.span_input, self.support_input, gap="0 6px"),
            pn.FlexBox(self.order_input, self.waiver_input, gap="0 12px", align_items="flex-end"),
            self.message, self.verdict, self.table,
            pn.FlexBox(self.choice, self.use_button, align_items="flex-end", gap="0 6px"),
            self.detail,
            sizing_mode="stretch_width", name="Size the bars",
        )
