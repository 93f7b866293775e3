// Rhoscope's service worker: the site, and what it fetched from the Pyodide CDN,
// kept for the next visit and for offline use.
//
// One cache per build (its name carries a digest of every shipped file), so a
// new build never mixes with an old one: installing it fills its own cache
// with every file of the build, and activating it deletes every other
// Rhoscope cache. Requests for the site and the Pyodide CDN are answered from
// the cache first; anything not cached yet is fetched and stored. The page
// also sends the addresses its worker loaded before this service worker took
// control (a first visit), so that those are stored too.
// The build replaces the config placeholder below with JSON.

const CONFIG = /*RHOSCOPE_SW*/;
const PREFIX = "rhoscope-";

function cacheable(url) {
  return url.startsWith(self.registration.scope) || url.startsWith(CONFIG.cdn);
}

self.addEventListener("install", (event) => {
  event.waitUntil((async () => {
    const cache = await caches.open(CONFIG.cache);
    await cache.addAll(CONFIG.files);
    await self.skipWaiting();
  })());
});

self.addEventListener("activate", (event) => {
  event.waitUntil((async () => {
    for (const name of await caches.keys()) {
      if (name.startsWith(PREFIX) && name !== CONFIG.cache) await caches.delete(name);
    }
    await self.clients.claim();
  })());
});

async function answer(request) {
  const cache = await caches.open(CONFIG.cache);
  // The page's address carries the link's query; its document is the same for every link.
  const navigation = request.mode === "navigate";
  const cached = await cache.match(request, {ignoreSearch: navigation});
  if (cached) return cached;
  const response = await fetch(request);
  if (response.ok) await cache.put(request, response.clone());
  return response;
}

self.addEventListener("fetch", (event) => {
  const request = event.request;
  if (request.method !== "GET" || !cacheable(request.url)) return;
  event.respondWith(answer(request));
});

self.addEventListener("message", (event) => {
  const data = event.data || {};
  if (data.type !== "rs-cache" || !Array.isArray(data.urls)) return;
  event.waitUntil((async () => {
    const cache = await caches.open(CONFIG.cache);
    for (const url of data.urls) {
      if (typeof url !== "string" || !cacheable(url) || await cache.match(url)) continue;
      try {
        const response = await fetch(url);
        if (response.ok) await cache.put(url, response);
      } catch (error) { /* offline now: it is fetched again next time */ }
    }
  })());
});
