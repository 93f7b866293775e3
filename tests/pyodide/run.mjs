// Run one Python script inside real Pyodide under Node.js, offline.
//
//   node tests/pyodide/run.mjs SCRIPT.py [PACKAGE_DIR ...]
//
// Each PACKAGE_DIR (e.g. the repository's engine/) is copied into the Pyodide
// file system under /rhoscope/, which goes first on sys.path, so the script
// imports exactly the source tree the CPython tests import. Pyodide loads from
// this folder's node_modules/pyodide (the npm package ships the interpreter and
// the standard library; the engine needs nothing else), never from a CDN.
// The script runs as __main__; its stdout and stderr pass through; an uncaught
// Python exception prints its traceback and exits 1; SystemExit(n) exits n.

import { readFileSync, readdirSync, statSync } from "node:fs";
import { basename, dirname, join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import { createRequire } from "node:module";

const here = dirname(fileURLToPath(import.meta.url));
const require = createRequire(join(here, "package.json"));
const { loadPyodide } = require("pyodide");

const SITE = "/rhoscope";

function copyTree(FS, source, target) {
  FS.mkdirTree(target);
  for (const name of readdirSync(source)) {
    if (name === "__pycache__" || name.startsWith(".")) continue;
    const from = join(source, name);
    const to = `${target}/${name}`;
    if (statSync(from).isDirectory()) copyTree(FS, from, to);
    else if (name.endsWith(".py") || name.endsWith(".json")) FS.writeFile(to, readFileSync(from));
  }
}

async function main() {
  const [script, ...packages] = process.argv.slice(2);
  if (!script) {
    process.stderr.write("usage: node run.mjs SCRIPT.py [PACKAGE_DIR ...]\n");
    process.exit(64);
  }
  const indexURL = join(dirname(require.resolve("pyodide/package.json")), "/");
  const pyodide = await loadPyodide({
    indexURL,
    stdout: (line) => process.stdout.write(line + "\n"),
    stderr: (line) => process.stderr.write(line + "\n"),
  });
  for (const dir of packages) copyTree(pyodide.FS, resolve(dir), `${SITE}/${basename(resolve(dir))}`);
  pyodide.globals.set("__rhoscope_site__", SITE);
  pyodide.globals.set("__rhoscope_script__", resolve(script));
  pyodide.globals.set("__rhoscope_source__", readFileSync(resolve(script), "utf8"));
  // The script runs as __main__ inside a Python-side guard, so SystemExit and
  // tracebacks are handled in Python and only an exit status crosses to Node.
  const status = pyodide.runPython(`
import sys, traceback
sys.path.insert(0, __rhoscope_site__)
def __rhoscope_run(source, filename):
    namespace = {"__name__": "__main__", "__file__": filename}
    try:
        exec(compile(source, filename, "exec"), namespace)
    except SystemExit as stop:
        if stop.code is None or isinstance(stop.code, int):
            return stop.code or 0
        print(stop.code, file=sys.stderr)
        return 1
    except BaseException:
        traceback.print_exc()
        return 1
    finally:
        sys.stdout.flush()
        sys.stderr.flush()
    return 0
__rhoscope_run(__rhoscope_source__, __rhoscope_script__)
`);
  process.exitCode = status;
}

main().catch((error) => {
  process.stderr.write(`run.mjs: ${error.stack ?? error}\n`);
  process.exit(1);
});
