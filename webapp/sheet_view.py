"""The calculation sheet of the current check: header fields, a preview and a download.

The sheet is the engine's (`engine.documents.sheet.calculation_sheet`), one
self-contained HTML document in which the engine escapes every piece of
user text. The preview shows that very document in a sandboxed iframe
(`srcdoc`, itself escaped), so the page's styles and the sheet's never mix
and the sheet can run nothing. The download is the same bytes.

The view reads the check through callables (the page's `current_inputs`,
`share_url` and its chosen `bars`), so it draws no formula of its own. It
redraws only while it is shown: a change of the page's inputs while another
tab is open marks it stale, and opening it redraws it.
"""

from __future__ import annotations

import datetime
import html
import io
import re
from collections.abc import Callable

import panel as pn
import param

import engine
from engine.documents.sheet import calculation_sheet

from . import lazy_packages
from .lazy_tab import LazyTab
from .summary import messages_html
from .theme import DOWNLOAD_CSS, TEXT_CSS

PREVIEW_HEIGHT = 1000  # px: a Letter or A4 page at screen size, scrolled inside the frame


def qr_svg(text: str) -> str | None:
    """The QR code of `text` as inline SVG, or None when the text is too long for one.

    None too while segno is not installed: the static site fetches it when
    the sheet is first drawn (`lazy_packages`), and the sheet is drawn again.
    """
    try:
        import segno
    except ImportError:
        return None

    try:
        return segno.make(text, error="m").svg_inline(scale=1, omitsize=True, dark="#000")
    except ValueError:  # segno.DataOverflowError: longer than a QR code holds
        return None


def _segno_installed() -> bool:
    try:
        import segno  # noqa: F401
    except ImportError:
        return False
    return True


def sheet_filename(mark: str) -> str:
    """A download name from the beam mark: letters, digits, '-', '_' and '.' only."""
    stem = re.sub(r"[^A-Za-z0-9._-]+", "-", mark.strip()).strip("-.")[:60]
    return f"{stem or 'beam'}-calculation-sheet.html"


class SheetView(LazyTab, pn.viewable.Viewer):
    """The calculation sheet for the inputs `inputs()` returns, reopened by `link()`."""

    project = param.String(default="", doc="project name (user text); blank prints a line")
    mark = param.String(default="", doc="beam mark (user text); blank prints a line")
    engineer = param.String(default="", doc="who made the check (user text)")
    checked_by = param.String(default="", doc="who checked it (user text)")
    date = param.String(default="", doc="date of the check (user text; default today)")
    document = param.String(default="", doc="the last sheet made, one HTML document")

    def __init__(self, inputs: Callable[[], dict], link: Callable[[], str],
                 bars: Callable[[], str | None] = lambda: None,
                 frame: Callable[[], dict | None] = lambda: None, **params) -> None:
        params.setdefault("date", datetime.date.today().isoformat())
        super().__init__(**params)
        self._inputs, self._link, self._bars, self._frame = inputs, link, bars, frame
        self._qr_for: tuple[str, str | None] | None = None
        # The placeholders show the form of an entry in grey; the sheet prints a
        # blank line for a field left empty, never the example.
        self.fields = {
            name: pn.widgets.TextInput.from_param(
                self.param[name], name=label, placeholder=example, sizing_mode="stretch_width",
                css_classes=[f"rs-sheet-{name.replace('_', '-')}"])
            for name, label, example in (
                ("project", "Project", "e.g. Harbourline Depot"),
                ("mark", "Beam mark", "e.g. B-204"), ("engineer", "Engineer", "your name"),
                ("checked_by", "Checked by", "the checker's name"),
                ("date", "Date", "YYYY-MM-DD"))}
        self.download = pn.widgets.FileDownload(
            callback=self._download_file, filename=sheet_filename(self.mark),
            label="Download sheet (HTML)", color="primary", stylesheets=[DOWNLOAD_CSS],
            css_classes=["rs-sheet-download"], width=240, margin=(8, 10))
        self.message = pn.pane.HTML("", stylesheets=[TEXT_CSS], sizing_mode="stretch_width",
                                    css_classes=["rs-sheet-message"])
        self.frame = pn.pane.HTML("", sizing_mode="stretch_width", min_height=PREVIEW_HEIGHT,
                                  css_classes=["rs-sheet-frame"], margin=(4, 0))
        self._layout = pn.Column(
            pn.FlexBox(*self.fields.values(), sizing_mode="stretch_width"),
            self.download,
            pn.pane.HTML('<div class="rs-note">One self-contained HTML file: open it and print '
                         'it from the browser (Letter or A4).</div>', stylesheets=[TEXT_CSS],
                         sizing_mode="stretch_width", margin=(0, 10)),
            self.message, self.frame, sizing_mode="stretch_width")

    # -- wiring ----------------------------------------------------------

    @classmethod
    def attach(cls, page, title: str = "Calculation sheet", **params) -> "SheetView":
        """A view of `page`'s check added as the tab `title`.

        `page` gives current_inputs, share_url, add_view and `bars` (the chosen
        arrangement, or None when the area was typed).
        """
        view = cls(page.current_inputs, page.share_url, lambda: _bars_of(page),
                   lambda: _frame_of(page), **params)
        page.add_view(title, view)
        view.follow(page, getattr(page, "views", None))
        return view

    @param.depends("project", "mark", "engineer", "checked_by", "date", watch=True)
    def _header_changed(self) -> None:
        self.download.filename = sheet_filename(self.mark)
        self._stale = True
        if self._visible():
            self.refresh()

    # -- drawing ---------------------------------------------------------

    def _qr(self, link: str) -> str | None:
        if self._qr_for is None or self._qr_for[0] != link:
            if not _segno_installed():
                lazy_packages.request("segno", self._segno_arrived)
                return None  # not kept: drawn again with the code once segno is there
            self._qr_for = (link, qr_svg(link) if link else None)
        return self._qr_for[1]

    def _segno_arrived(self) -> None:
        self._stale = True
        if self._visible():
            self.refresh()

    def sheet_html(self) -> str:
        """The calculation sheet for the current inputs; `engine.InputError` if they are bad."""
        link = self._link()
        return calculation_sheet(self._inputs(), project=self.project, mark=self.mark,
                                 engineer=self.engineer, checked_by=self.checked_by,
                                 date=self.date, bars=self._bars(), link=link,
                                 qr_svg=self._qr(link), frame=self._frame())

    def refresh(self) -> None:
        """Make the sheet again and show it; bad inputs leave the last sheet with a message."""
        try:
            document = self.sheet_html()
        except (engine.InputError, ArithmeticError) as error:
            text = str(error) if isinstance(error, engine.InputError) else (
                f"the engine could not compute these inputs ({type(error).__name__})")
            self.message.object = messages_html([f"No sheet for these inputs: {text}."])
            self._stale = False
            return
        self._stale = False
        self.message.object = ""
        if document != self.document:
            self.document = document
            self.frame.object = preview_html(document)

    def _download_file(self) -> io.BytesIO:
        self.refresh()
        return io.BytesIO(self.document.encode("utf-8"))

    def __panel__(self):
        if self._stale:
            self.refresh()
        return self._layout


def preview_html(document: str) -> str:
    """`document` inside a sandboxed iframe: escaped into `srcdoc`, no scripts, no navigation."""
    return (f'<iframe class="rs-sheet" title="Calculation sheet" sandbox="" '
            f'srcdoc="{html.escape(document, quote=True)}" '
            f'style="width:100%;height:{PREVIEW_HEIGHT}px;border:1px solid #bbb;'
            f'background:#fff"></iframe>')


def _bars_of(page) -> str | None:
    """The bars the page knows: the arrangement chosen in Size the bars, else the bars as drawn."""
    chosen = getattr(page, "bars", None)
    if chosen:
        return chosen
    drawn = getattr(page, "drawn", ())
    return ",".join(group or "" for group in drawn) if drawn and any(drawn) else None


def _frame_of(page) -> dict | None:
    """The top steel of the special moment frame checks, when the page asks for them; else None."""
    if not getattr(page, "frame", False):
        return None
    return {"top_As": page.top_As, "top_d": page.top_d}
