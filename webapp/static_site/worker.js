// Rhoscope's page worker: Python (Pyodide) in the browser, in two phases.
//
// 1. First look: the Pyodide core and the project's wheel only (both shipped in
//    the build). The wheel is unpacked into site-packages, the link the page
//    sends is read by webapp.first_look and its check goes back to the page as
//    plain-text fields. No numpy, Bokeh or Panel is needed for that.
// 2. Full page: every package the page imports is loaded in one parallel
//    loadPackage call from the build's own lock file (shipped wheels by
//    relative path, compiled ones such as numpy from the Pyodide CDN), then
//    Panel builds the page with the link already applied and the page renders
//    it. A package that cannot be fetched is named to the page, which keeps the
//    first look.
//
// Messages to the page: Panel's own (status, render, patch, idle) and
// Rhoscope's (rs-phase, rs-first-look, rs-unavailable, rs-failed, rs-loaded).
// The build replaces the config placeholder below with JSON.

const CONFIG = /*RHOSCOPE_CONFIG*/;

importScripts(CONFIG.pyodide + "pyodide.js");

let receiveStart;
const started = new Promise((resolve) => { receiveStart = resolve; });

function post(message) { self.postMessage(message); }

function status(text) { post({type: "status", msg: text}); }

function sendPatch(patch, buffers) {
  post({type: "patch", patch: patch, buffers: buffers});
}

async function firstLook() {
  status("Starting Python in this browser…");
  const wheel = fetch(CONFIG.wheel).then((response) => {
    if (!response.ok) throw new Error(`${CONFIG.wheel}: HTTP ${response.status}`);
    return response.arrayBuffer();
  });
  // packageBaseUrl set explicitly: Pyodide's fallback base for packages (its public
  // CDN, used only under Node) then also points into the build.
  const core = new URL(CONFIG.pyodide, self.location).href;
  self.pyodide = await loadPyodide({indexURL: core, packageBaseUrl: core});
  post({type: "rs-phase", phase: "core-ready"});
  self.pyodide.unpackArchive(await wheel, "wheel");
  const start = await started;
  self.pyodide.globals.set("rs_search", start.search);
  const look = self.pyodide.runPython(
    "from webapp.first_look import first_look_json\nfirst_look_json(rs_search)");
  post({type: "rs-first-look", look: look});
  return start;
}

async function fullPage(start) {
  status("Loading the interactive page (numpy, Bokeh, Panel)…");
  const errors = [];
  await self.pyodide.loadPackage(CONFIG.packages, {
    messageCallback: () => {},
    errorCallback: (message) => errors.push(String(message)),
  });
  const loaded = self.pyodide.loadedPackages;
  const missing = CONFIG.packages.filter((name) => !(name in loaded));
  if (missing.length) {
    // Pyodide installs nothing that depends on a package it could not fetch.
    const failed = errors.map((text) => (/while loading ([^:\s]+):/.exec(text) || [])[1])
      .filter(Boolean).map((name) => name.toLowerCase().replace(/[-_.]+/g, "-"));
    const unfetched = missing.filter((name) => failed.includes(name));
    post({type: "rs-unavailable",
          remote: unfetched.filter((name) => CONFIG.remote.includes(name)),
          local: unfetched.filter((name) => !CONFIG.remote.includes(name)),
          blocked: missing.filter((name) => !unfetched.includes(name)), errors: errors});
    return;
  }
  status("Building the interactive page…");
  self.pyodide.globals.set("sendPatch", sendPatch);
  self.pyodide.globals.set("rs_location", start.location);
  const [docs_json, render_items, root_ids] = await self.pyodide.runPythonAsync(CONFIG.app);
  post({type: "render", docs_json: docs_json, render_items: render_items, root_ids: root_ids});
}

function reportLoaded() {
  // What this worker fetched, for the service worker to keep (see service-worker.js).
  const urls = self.performance.getEntriesByType("resource").map((entry) => entry.name);
  post({type: "rs-loaded", urls: urls});
}

async function main() {
  let start;
  try {
    start = await firstLook();
  } catch (error) {
    post({type: "rs-failed", phase: "first-look", detail: String(error && error.message || error)});
    return;
  }
  try {
    await fullPage(start);
  } catch (error) {
    const lines = String(error && error.message || error).trim().split("\n");
    post({type: "rs-failed", phase: "full-page", detail: lines[lines.length - 1]});
  }
  reportLoaded();
}

// Panel's page protocol, once the page has rendered the document.
self.onmessage = async (event) => {
  const msg = event.data;
  if (msg.type === "rs-start") {
    receiveStart(msg);
  } else if (msg.type === "rendered") {
    self.pyodide.runPythonAsync(`
from panel.io.state import state
from panel.io.pyodide import _link_docs_worker
_link_docs_worker(state.curdoc, sendPatch, setter='js')
`);
  } else if (msg.type === "patch") {
    self.pyodide.globals.set("patch", msg.patch);
    try {
      await self.pyodide.runPythonAsync(`
from panel.io.state import state
from panel.io.pyodide import _convert_json_patch
state.curdoc.apply_json_patch(_convert_json_patch(patch), setter='js')
`);
    } finally {
      post({type: "idle"});  // the page sends its next queued change only after this
    }
  } else if (msg.type === "location") {
    // The page applied the link before it was built (CONFIG.app); this only
    // repeats the same values, which changes nothing.
    self.pyodide.globals.set("rs_location", msg.location);
    self.pyodide.runPythonAsync("rhoscope_set_location(rs_location)");
  }
};

main();
