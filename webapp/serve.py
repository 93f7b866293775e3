"""`python -m webapp serve`: the app from a local Panel server, for offline use and tests."""

from __future__ import annotations

from pathlib import Path

APP = Path(__file__).with_name("app.py")


def serve(port: int) -> int:
    """Serve the app at http://localhost:`port`/ until interrupted; 0 on a clean stop."""
    import panel as pn

    from . import served_template

    served_template.SERVING = True

    origins = [f"localhost:{port}", f"127.0.0.1:{port}"]
    print(f"Rhoscope at http://localhost:{port}/ (Ctrl+C stops it)", flush=True)
    try:
        pn.serve(str(APP), port=port, address="localhost", websocket_origin=origins,
                 show=False, title="Rhoscope: beam flexure check")
    except KeyboardInterrupt:
        pass
    return 0
