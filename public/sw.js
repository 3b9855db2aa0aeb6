/*
 * Plumbline offline cache (hand-written service worker). Each build writes its own id and file list
 * into this script (the build step in vite.config.ts), so every new build is a byte-different worker:
 * the browser installs it at the next visit, it takes over at once, and the old build's cache is
 * deleted on activate. Pages come from the network first (a new build reaches an online user at
 * once) and from the cache when offline; the build's own files come from the cache first.
 */
const BUILD = 'dev' /*__PLUMBLINE_BUILD__*/;
const ASSETS = [/*__PLUMBLINE_ASSETS__*/];
const PREFIX = 'plumbline-';
const CACHE = PREFIX + BUILD;

self.addEventListener('install', (event) => {
  event.waitUntil(
    (async () => {
      const cache = await caches.open(CACHE);
      await cache.addAll(['./', './index.html', ...ASSETS].map((u) => new Request(u, { cache: 'reload' })));
      await self.skipWaiting();
    })(),
  );
});

self.addEventListener('activate', (event) => {
  event.waitUntil(
    (async () => {
      for (const k of await caches.keys()) if (k.startsWith(PREFIX) && k !== CACHE) await caches.delete(k);
      await self.clients.claim();
    })(),
  );
});

self.addEventListener('message', (event) => {
  if (event.data === 'build') event.source?.postMessage({ build: BUILD, cache: CACHE });
});

self.addEventListener('fetch', (event) => {
  const req = event.request;
  if (req.method !== 'GET' || new URL(req.url).origin !== self.location.origin) return;
  const isPage = req.mode === 'navigate';
  event.respondWith(
    (async () => {
      // Pages: network first (to pick up a new build), this build's cached shell when offline.
      if (isPage) {
        try {
          return await fetch(req);
        } catch {
          const cache = await caches.open(CACHE);
          return (await cache.match('./index.html', { ignoreSearch: true, ignoreVary: true })) || Response.error();
        }
      }
      const cache = await caches.open(CACHE);
      const hit = await cache.match(req, { ignoreSearch: true, ignoreVary: true });
      if (hit) return hit;
      const res = await fetch(req);
      if (res.ok) await cache.put(req, res.clone());
      return res;
    })(),
  );
});
