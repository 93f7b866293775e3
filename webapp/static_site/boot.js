// Rhoscope's page side of the two-phase start (see worker.js).
//
// Until the worker has computed this link's own check, no number is on screen:
// the page holds only the first-look frame (caution, status, empty slots).
// The first look is filled in as text (textContent, never markup). Panel's
// JavaScript (BokehJS, panel.min.js) is fetched only after the first look, so
// that it does not compete with the Pyodide core; the interactive page then
// replaces the first look. Phases are marked with performance.mark:
// rhoscope:core-ready, rhoscope:first-look, rhoscope:full-page.
(function () {
  "use strict";
  var CONFIG = /*RHOSCOPE_PAGE*/;
  var worker = pyodideWorker;  // started by Panel's page script, above
  var panelHandler = worker.onmessage;
  var box = document.getElementById("rs-first-look");
  var firstLookShown = false;
  var scriptsReady = null;

  function byId(id) { return document.getElementById(id); }
  function setText(node, value) { node.textContent = value == null ? "" : String(value); }
  function mark(name) { try { performance.mark(name); } catch (error) { /* no timing API */ } }
  function setStatus(text) { setText(byId("rs-fl-status"), text); }

  function notice(text) {
    var node = byId("rs-fl-notice");
    setText(node, text);
    node.hidden = false;
  }

  function row(cells, numeric) {
    var tr = document.createElement("tr");
    cells.forEach(function (cell, index) {
      var td = document.createElement("td");
      if (numeric.indexOf(index) >= 0) td.className = "num";
      setText(td, cell);
      tr.appendChild(td);
    });
    return tr;
  }

  function fill(tbody, rows, numeric) {
    tbody.replaceChildren();
    rows.forEach(function (cells) { tbody.appendChild(row(cells, numeric)); });
  }

  function showFirstLook(look) {
    var verdict = byId("rs-fl-verdict");
    verdict.className = "rs-fl-verdict " + (["ok", "bad"].indexOf(look.verdict.kind) >= 0 ?
      look.verdict.kind : "none");
    setText(byId("rs-fl-verdict-title"), look.verdict.title);
    setText(byId("rs-fl-verdict-note"), look.verdict.note);
    fill(byId("rs-fl-quantities"), look.quantities, [1]);
    fill(byId("rs-fl-ratios"), look.ratios, [2, 3]);
    setText(byId("rs-fl-inputs"), look.inputs || "—");
    var list = byId("rs-fl-messages");
    list.replaceChildren();
    look.messages.forEach(function (message) {
      var item = document.createElement("li");
      item.setAttribute("data-q", "message");
      setText(item, message);
      list.appendChild(item);
    });
    firstLookShown = true;
    box.setAttribute("aria-busy", "false");
    setStatus("First look, computed in this browser. The interactive page (sliders, plots) " +
              "is loading and will replace it.");
  }

  function loadPageScripts() {
    // Fetched in parallel, run in order (async = false), as if they were in the head.
    if (scriptsReady) return scriptsReady;
    scriptsReady = Promise.all(CONFIG.pageScripts.map(function (source) {
      return new Promise(function (resolve, reject) {
        var script = document.createElement("script");
        script.src = source;
        script.async = false;
        script.onload = resolve;
        script.onerror = function () { reject(new Error("could not load " + source)); };
        document.head.appendChild(script);
      });
    }));
    return scriptsReady;
  }

  function showUnavailable(msg) {
    // msg.fetch: packages whose files could not be fetched; msg.blocked: those that
    // need one of them.
    box.classList.add("done");
    setStatus(firstLookShown ? "First look, computed in this browser." : "");
    var text = "The interactive page (sliders, plots) needs packages this browser could not fetch";
    if (msg.remote.length) text += " from " + CONFIG.cdn + ": " + msg.remote.join(", ");
    if (msg.local.length) text += (msg.remote.length ? "; and " : " ") + "from this site: " + msg.local.join(", ");
    if (msg.blocked.length) text += " (so " + msg.blocked.join(", ") + " could not be installed either)";
    text += ". The first look above is this link's own check, computed here by the same engine, " +
            "and stays valid.";
    if (msg.remote.length) text += " For the interactive page, open the link on a network that reaches " +
            CONFIG.cdn + " (once is enough: the page then works offline).";
    notice(text);
  }

  function showFailed(phase, detail) {
    box.classList.add("done");
    box.hidden = false;
    if (phase === "first-look") {
      setStatus("");
      notice("Rhoscope could not start Python in this browser (" + detail + "). " +
             "Nothing was computed for this link.");
    } else {
      notice("The interactive page could not be built (" + detail + ")." +
             (firstLookShown ? " The first look above is still this link's own check." : ""));
    }
  }

  function registerServiceWorker() {
    // After the first look, so that filling its cache does not slow the first visit down.
    if (!("serviceWorker" in navigator) || !window.isSecureContext) return;
    navigator.serviceWorker.register(CONFIG.serviceWorker).catch(function () {
      /* no offline copy; the page works the same online */
    });
  }

  function keepForNextVisit(workerUrls) {
    // On a first visit the service worker starts after these were fetched.
    if (!("serviceWorker" in navigator) || !window.isSecureContext) return;
    var urls = workerUrls.concat(performance.getEntriesByType("resource").map(function (entry) {
      return entry.name;
    }));
    navigator.serviceWorker.ready.then(function (registration) {
      if (registration.active) registration.active.postMessage({type: "rs-cache", urls: urls});
    });
  }

  worker.onmessage = function (event) {
    var msg = event.data || {};
    switch (msg.type) {
      case "status":  // Panel's and ours: plain text only
        if (!box.classList.contains("done")) setStatus(msg.msg);
        return undefined;
      case "rs-phase":
        mark("rhoscope:" + msg.phase);
        return undefined;
      case "rs-first-look":
        showFirstLook(JSON.parse(msg.look));
        mark("rhoscope:first-look");
        registerServiceWorker();
        loadPageScripts().catch(function (error) { showFailed("full-page", error.message); });
        return undefined;
      case "rs-unavailable":
        console.warn("Rhoscope: packages not loaded:", msg.errors.join("\n"));
        showUnavailable(msg);
        registerServiceWorker();
        return undefined;
      case "rs-failed":
        showFailed(msg.phase, msg.detail);
        return undefined;
      case "rs-loaded":
        keepForNextVisit(msg.urls);
        return undefined;
      case "render":
        return loadPageScripts().then(function () {
          return panelHandler.call(worker, event);
        }).then(function () {
          box.hidden = true;
          mark("rhoscope:full-page");
        }, function (error) { showFailed("full-page", String(error && error.message || error)); });
      default:
        return panelHandler.call(worker, event);
    }
  };
  worker.addEventListener("error", function (event) {
    showFailed(firstLookShown ? "full-page" : "first-look",
               "worker error" + (event && event.message ? ": " + event.message : ""));
  });
  worker.postMessage({type: "rs-start", search: window.location.search,
                      location: JSON.stringify(window.location)});

  setTimeout(function () {
    if (!firstLookShown && !box.classList.contains("done")) {
      notice("Nothing has been computed after " + CONFIG.bootTimeoutS + " s: the Python runtime " +
             "(" + CONFIG.pyodide + ") has not loaded. Check the connection and reload.");
    }
  }, CONFIG.bootTimeoutS * 1000);
})();
