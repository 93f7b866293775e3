"""Rhoscope's own colours and the style sheets of its text panes.

The palette is harbour-themed: deep teal ink, bronze, coral for the section
itself, pale washes for the ρ regions. Every colour that tells states apart
comes with a second cue (a hatch pattern, a dash pattern, a word or a sign).
"""

INK = "#1c2b33"
MUTED = "#56656d"
TEAL = "#0d6b70"
BRONZE = "#8a5a1c"
CORAL = "#c8402f"
PASS = "#1f7a3a"
FAIL = "#b3261e"
PAPER = "#f7f6f2"

# Regions of ρ on the capacity plot: (fill colour, hatch pattern).
REGION_STYLE = {
    "below-min": ("#d9d4e6", "."),
    "tension-controlled": ("#d7ece4", " "),
    "transition": ("#f3e9c6", "/"),
    "beyond-beam-limit": ("#f1d2c8", "x"),
    "compression-controlled": ("#e4c2c2", "+"),
}

# The four limit ratios: (colour, dash pattern), shared by both plots.
LIMIT_STYLE = {
    "rho_min": ("#5b4b8a", "dotted"),
    "rho_tc": ("#1f7a3a", "dashed"),
    "rho_max": ("#a4541b", "dashdot"),
    "rho_b": ("#9c1f2e", "solid"),
}

FONT = "'Source Sans 3', 'Segoe UI', 'Helvetica Neue', Arial, sans-serif"

# For pn.pane.HTML panes (they live in their own shadow root, so each gets it).
TEXT_CSS = f"""
:host {{ font-family: {FONT}; color: {INK}; width: 100%; }}
.rs-head {{ display: flex; flex-wrap: wrap; align-items: baseline; gap: 4px 18px;
  padding: 6px 14px; background: {INK}; color: #fff; border-radius: 6px; }}
.rs-title {{ font-size: 20px; font-weight: 700; letter-spacing: 0.02em; }}
.rs-sub {{ font-size: 13px; color: #cfe3e4; }}
.rs-caution {{ margin-top: 6px; padding: 5px 12px; font-size: 13px; line-height: 1.35;
  border-left: 5px solid {CORAL}; background: #fff4ec; border-radius: 4px; }}
.rs-caution b {{ color: {CORAL}; }}
.rs-cards {{ display: flex; flex-wrap: wrap; gap: 8px; }}
.rs-card {{ flex: 1 1 130px; background: #fff; border: 1px solid #d5dadc; border-radius: 6px;
  padding: 6px 10px; min-width: 120px; }}
.rs-card .k {{ font-size: 12px; color: {MUTED}; text-transform: none; }}
.rs-card .v {{ font-size: 21px; font-weight: 700; }}
.rs-card .u {{ font-size: 13px; color: {MUTED}; margin-left: 3px; }}
.rs-card .n {{ font-size: 12px; color: {MUTED}; }}
.rs-verdict {{ flex: 2 1 220px; border-width: 2px; }}
.rs-verdict.ok {{ border-color: {PASS}; }}
.rs-verdict.bad {{ border-color: {FAIL}; background: #fff6f5; }}
.rs-verdict.none {{ border-color: {MUTED}; }}
.rs-verdict.stale {{ border-color: {MUTED}; border-style: dashed; background: #f1f2f2; }}
.rs-card.stale .v, .rs-card.stale .k {{ color: {MUTED}; }}
.stale .rs-mark {{ color: {INK}; }}
.rs-notice {{ font-size: 12.5px; padding: 3px 10px; margin: 2px 0; border-radius: 4px;
  border-left: 5px solid {FAIL}; background: #fdeceb; overflow-wrap: anywhere; }}
.rs-notice .rs-msg {{ font-size: 12.5px; padding: 1px 0; margin: 0; border: none;
  background: none; }}
.rs-mark {{ font-weight: 700; }}
.ok .rs-mark, .pass {{ color: {PASS}; }}
.bad .rs-mark, .fail {{ color: {FAIL}; }}
h3 {{ font-size: 15px; margin: 10px 0 4px 0; color: {TEAL}; }}
table {{ border-collapse: collapse; width: 100%; font-size: 13.5px; }}
/* A table wider than a phone scrolls inside its own box, never the page sideways. */
:host {{ max-width: 100%; }}
table {{ display: block; overflow-x: auto; max-width: 100%; }}
th, td {{ text-align: left; padding: 3px 8px 3px 0; border-bottom: 1px solid #e3e6e7;
  vertical-align: top; }}
th {{ font-weight: 600; color: {MUTED}; font-size: 12.5px; }}
td.num {{ font-variant-numeric: tabular-nums; white-space: nowrap; }}
.rs-grid {{ display: flex; flex-wrap: wrap; gap: 6px 28px; }}
.rs-grid > div {{ flex: 1 1 300px; }}
.rs-msg {{ font-size: 13px; padding: 6px 10px; margin: 4px 0; border-radius: 4px;
  border-left: 5px solid {FAIL}; background: #fdeceb; white-space: pre-wrap;
  overflow-wrap: anywhere; }}
.rs-warn {{ border-left-color: #b8860b; background: #fdf6e3; }}
.rs-note {{ font-size: 12.5px; color: {MUTED}; }}
ul {{ margin: 2px 0; padding-left: 18px; }}
td.pass, td.fail {{ white-space: nowrap; }}
tr.rs-chosen td {{ background: #e6f2ef; font-weight: 600; }}
.rs-ok {{ font-size: 13px; padding: 6px 10px; margin: 4px 0; border-radius: 4px;
  border-left: 5px solid {PASS}; background: #eef7f0; }}
"""

# For the page's own layout elements (inputs column, cards row).
PANEL_CSS = f"""
:host {{ font-family: {FONT}; }}
"""

SIDEBAR_CSS = f"""
:host {{ background: #fff; border: 1px solid #d5dadc; border-radius: 6px; }}
"""

# For the sidebar's paired number boxes: a long label ("A's, compression steel (mm²)")
# wraps above its own box instead of running into its neighbour's.
ENTRY_CSS = """
.bk-input-group { white-space: normal; }
.bk-input-group > label { overflow-wrap: anywhere; line-height: 1.2; }
"""

# For FileDownload buttons: Panel 1.9 draws them in the default (grey) style whatever
# their button_type, which reads as disabled beside the primary buttons; this gives
# them the primary colours, and a disabled one (nothing to download yet) still fades.
DOWNLOAD_CSS = """
:host(.solid) .bk-btn.bk-btn-default {
  background-color: var(--primary-color); color: var(--button-primary-text-color);
}
:host(.solid) .bk-btn.bk-btn-default:hover { filter: brightness(0.9); }
:host(.solid) .bk-btn.bk-btn-default[disabled] { opacity: 0.5; cursor: not-allowed; filter: none; }
"""
