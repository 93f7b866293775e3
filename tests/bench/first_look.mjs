// `make bench`: the static site's first phase under Node, for one project wheel.
//
//   node tests/bench/first_look.mjs WHEEL RUNS
//
// Each run starts a fresh Pyodide (the pinned npm package), unpacks WHEEL into
// site-packages as the worker does, and computes one link's first look.
// Prints one JSON line: {core_ms: [...], first_look_ms: [...]}.
import { readFileSync } from "node:fs";
import { createRequire } from "node:module";
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";

const here = dirname(fileURLToPath(import.meta.url));
const require = createRequire(join(here, "..", "pyodide", "package.json"));
const { loadPyodide } = require("pyodide");
const [wheel, runs = "3"] = process.argv.slice(2);
const bytes = new Uint8Array(readFileSync(wheel));
const result = {core_ms: [], first_look_ms: []};
for (let run = 0; run < Number(runs); run++) {
  const start = performance.now();
  const pyodide = await loadPyodide({indexURL: dirname(require.resolve("pyodide/package.json")) + "/"});
  const ready = performance.now();
  pyodide.unpackArchive(bytes, "wheel");
  pyodide.runPython("from webapp.first_look import first_look_json\n" +
                    "first_look_json('?units=us&fc=3000&fy=60000&b=10&d=15&As=6&Mu=500')");
  const done = performance.now();
  result.core_ms.push(Math.round(ready - start));
  result.first_look_ms.push(Math.round(done - ready));
}
console.log(JSON.stringify(result));
