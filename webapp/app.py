"""The page as a servable script: `panel serve` and `panel convert` both take this file."""

import panel as pn

from webapp.page import BeamCheckPage
from webapp.served_template import use_served_template
from webapp.session_cleanup import forget_unshown_callbacks

pn.extension(notifications=False)

BeamCheckPage().servable(title="Rhoscope: beam flexure check")
if pn.state.curdoc is not None and pn.state.curdoc.session_context is not None:
    pn.state.curdoc.on_session_destroyed(forget_unshown_callbacks)
    use_served_template(pn.state.curdoc)
