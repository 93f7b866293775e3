"""`python -m webapp serve --port P` or `python -m webapp build --out DIR`."""

import argparse
import sys


def main(argv=None) -> int:
    parser = argparse.ArgumentParser(prog="python -m webapp", description="Rhoscope web app")
    commands = parser.add_subparsers(dest="command", required=True)
    serve_parser = commands.add_parser("serve", help="serve the app from a local Panel server")
    serve_parser.add_argument("--port", type=int, default=5006)
    build_parser = commands.add_parser("build", help="write the static Pyodide site")
    build_parser.add_argument("--out", default="build")
    build_parser.add_argument("--pyodide-cdn", default=None,
                              help="base URL of the Pyodide distribution (default: its public CDN)")
    args = parser.parse_args(argv)
    if args.command == "serve":
        from .serve import serve

        return serve(port=args.port)
    from .build import build

    return build(out=args.out, pyodide_cdn=args.pyodide_cdn)


sys.exit(main())
