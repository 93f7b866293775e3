"""The page as a servable script: `panel serve` and `panel convert` both take this file."""

import panel as pn

from webapp.page import BeamCheckPage

pn.extension(notifications=False)

BeamCheckPage().servable(title="Rhoscope: beam flexure check")
