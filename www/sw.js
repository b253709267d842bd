// Headroom's service worker: precaches exactly the files of one release
// build (the list and version are written by scripts/post-build from dist/,
// so they can never go stale with Trunk's hashed names) and serves them,
// offline or not. Each version has a cache of its own; an old page keeps
// its old files until it reloads into the new version.
const VERSION = "__HEADROOM_VERSION__";
const FILES = __HEADROOM_PRECACHE__;
const CACHE = "headroom-" + VERSION;

self.addEventListener("install", (event) => {
  event.waitUntil(caches.open(CACHE).then((cache) => cache.addAll(FILES)));
  // First install: nothing to mix with, take over at once.
  if (!self.registration.active) self.skipWaiting();
});

self.addEventListener("activate", (event) => {
  event.waitUntil(
    caches.keys()
      .then((keys) => Promise.all(keys.filter((k) => k.startsWith("headroom-") && k !== CACHE).map((k) => caches.delete(k))))
      .then(() => self.clients.claim()),
  );
});

self.addEventListener("message", (event) => {
  if (event.data === "take-over") self.skipWaiting();
});

self.addEventListener("fetch", (event) => {
  const request = event.request;
  if (request.method !== "GET" || new URL(request.url).origin !== self.location.origin) return;
  event.respondWith(
    caches.open(CACHE).then(async (cache) => {
      // The worksheet travels in the fragment, which never reaches here;
      // any navigation is the one page.
      const hit = request.mode === "navigate"
        ? await cache.match("./index.html")
        : await cache.match(request, { ignoreSearch: true });
      return hit || fetch(request);
    }),
  );
});
