// Headroom's service worker: precaches exactly the files of one release
// build (the list and version are written by scripts/post-build from dist/,
// so they can never go stale with Trunk's hashed names) and serves them,
// offline or not. Each version has a cache of its own; an old page keeps
// its old files until it reloads into the new version.
const VERSION = "__HEADROOM_VERSION__";
const FILES = __HEADROOM_PRECACHE__;
// The scope is in the name: two copies of Headroom hosted under different
// paths of one origin never share or delete each other's caches.
const SCOPE = new URL(self.registration.scope).pathname;
const PREFIX = "headroom:" + SCOPE + ":";
const CACHE = PREFIX + VERSION;

self.addEventListener("install", (event) => {
  // `cache: "reload"` skips the HTTP cache: a new cache can never be
  // filled with an old boot.js that names files it does not hold.
  const requests = FILES.map((f) => new Request(f, { cache: "reload" }));
  event.waitUntil(caches.open(CACHE).then((cache) => cache.addAll(requests)));
  // First install: nothing to mix with, take over at once.
  if (!self.registration.active) self.skipWaiting();
});

self.addEventListener("activate", (event) => {
  // This scope's older versions, and caches of the first release, which
  // were named "headroom-" and a 16-digit hash.
  const stale = (k) => (k.startsWith(PREFIX) && k !== CACHE) || /^headroom-[0-9a-f]{16}$/.test(k);
  event.waitUntil(
    caches.keys()
      .then((keys) => Promise.all(keys.filter(stale).map((k) => caches.delete(k))))
      .then(() => self.clients.claim()),
  );
});

self.addEventListener("message", (event) => {
  if (event.data === "take-over") self.skipWaiting();
});

self.addEventListener("fetch", (event) => {
  const request = event.request;
  const url = new URL(request.url);
  if (request.method !== "GET" || url.origin !== self.location.origin) return;
  // The app's page only for navigations to the app itself (the worksheet
  // travels in the fragment, which never reaches here); any other page in
  // the scope goes to the network as usual.
  const isApp = url.pathname === SCOPE || url.pathname === SCOPE + "index.html";
  if (request.mode === "navigate" && !isApp) return;
  event.respondWith(
    caches.open(CACHE).then(async (cache) => {
      const hit = request.mode === "navigate"
        ? await cache.match("./index.html")
        : await cache.match(request, { ignoreSearch: true });
      return hit || fetch(request);
    }),
  );
});
