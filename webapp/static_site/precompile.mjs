// Precompile a pure-Python wheel for the pinned Pyodide, inside Pyodide itself.
//
//   node webapp/static_site/precompile.mjs PYODIDE_DIR IN.whl OUT.whl
//
// Each module's source is replaced by its bytecode (module.py -> module.pyc,
// which Python imports when no source is beside it), compiled by Pyodide's own
// interpreter, so that it always matches it. Bytecode is about twice the size
// of the source when zipped, so keeping both would cost twice the bytes before
// the first look; the sources are in the repository and in the CPython
// install. RECORD lists the files as they now are. Used by `python -m webapp build`.
import { dirname, resolve } from "node:path";
import { createRequire } from "node:module";

const [pyodideDir, input, output] = process.argv.slice(2);
if (!output) {
  process.stderr.write("usage: node precompile.mjs PYODIDE_DIR IN.whl OUT.whl\n");
  process.exit(64);
}
const require = createRequire(resolve(pyodideDir, "package.json"));
const { loadPyodide } = require("pyodide");
const pyodide = await loadPyodide({indexURL: resolve(pyodideDir) + "/"});
const inDir = dirname(resolve(input)), outDir = dirname(resolve(output));
pyodide.FS.mkdirTree("/in");
pyodide.FS.mount(pyodide.FS.filesystems.NODEFS, {root: inDir}, "/in");
if (outDir !== inDir) {
  pyodide.FS.mkdirTree("/out");
  pyodide.FS.mount(pyodide.FS.filesystems.NODEFS, {root: outDir}, "/out");
}
pyodide.globals.set("source", "/in/" + resolve(input).slice(inDir.length + 1));
pyodide.globals.set("target", (outDir === inDir ? "/in/" : "/out/") + resolve(output).slice(outDir.length + 1));
pyodide.runPython(`
import base64, hashlib, importlib._bootstrap_external as external, zipfile

def digest(data):
    return "sha256=" + base64.urlsafe_b64encode(hashlib.sha256(data).digest()).rstrip(b"=").decode()

with zipfile.ZipFile(source) as wheel_in, zipfile.ZipFile(target, "w", zipfile.ZIP_DEFLATED) as wheel_out:
    record = next(n for n in wheel_in.namelist() if n.endswith(".dist-info/RECORD"))
    rows = []
    for info in wheel_in.infolist():
        if info.filename == record:
            continue
        name, data = info.filename, wheel_in.read(info)
        if name.endswith(".py") and ".dist-info/" not in name:
            code = compile(data, name, "exec", dont_inherit=True)
            name, data = name + "c", bytes(external._code_to_timestamp_pyc(code, 0, len(data)))
        wheel_out.writestr(name, data, compresslevel=9)
        rows.append(f"{name},{digest(data)},{len(data)}")
    rows.append(f"{record},,")
    wheel_out.writestr(record, "\\n".join(rows) + "\\n")
`);
