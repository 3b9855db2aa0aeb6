/*
 * Plumbline offline cache (hand-written service worker). On install it caches the app shell and
 * every asset named in index.html; afterwards it answers same-origin GETs from the cache first and
 * adds whatever else is fetched (worker chunks), so the app opens at a trailhead with no signal.
 * The cache name carries the entry script's name, so a new build replaces the old cache.
 */
const PREFIX = 'plumbline-';

async function shellAndAssets() {
  const res = await fetch('./index.html', { cache: 'no-cache' });
  const html = await res.clone().text();
  const urls = new Set(['./', './index.html', './manifest.webmanifest', './icon.svg']);
  for (const m of html.matchAll(/(?:src|href)="(\.\/assets\/[^"]+)"/g)) urls.add(m[1]);
  // Chunks loaded later (panels, the analysis worker) are named inside the scripts: follow them,
  // so that a panel opened for the first time at the trailhead is already in the cache.
  const todo = [...urls].filter((u) => u.endsWith('.js'));
  const seen = new Set(todo);
  while (todo.length > 0) {
    const js = todo.pop();
    let text = '';
    try {
      text = await (await fetch(js, { cache: 'no-cache' })).text();
    } catch {
      continue;
    }
    for (const m of text.matchAll(/[`"'](?:\.\/)?([A-Za-z0-9_.-]+-[A-Za-z0-9_-]{8}\.js)[`"']/g)) {
      const u = `./assets/${m[1]}`;
      if (!seen.has(u)) {
        seen.add(u);
        urls.add(u);
        todo.push(u);
      }
    }
  }
  const entry = /assets\/(index-[^"]+\.js)/.exec(html);
  return { name: PREFIX + (entry ? entry[1] : 'dev'), urls: [...urls], res };
}

self.addEventListener('install', (event) => {
  event.waitUntil(
    (async () => {
      const { name, urls } = await shellAndAssets();
      const cache = await caches.open(name);
      await cache.addAll(urls);
      await self.skipWaiting();
    })(),
  );
});

self.addEventListener('activate', (event) => {
  event.waitUntil(
    (async () => {
      let keep = null;
      try {
        keep = (await shellAndAssets()).name;
      } catch {
        // Offline while activating: keep every cache.
      }
      if (keep) {
        for (const k of await caches.keys()) if (k.startsWith(PREFIX) && k !== keep) await caches.delete(k);
      }
      await self.clients.claim();
    })(),
  );
});

self.addEventListener('fetch', (event) => {
  const req = event.request;
  if (req.method !== 'GET' || new URL(req.url).origin !== self.location.origin) return;
  const isPage = req.mode === 'navigate';
  event.respondWith(
    (async () => {
      // Pages: network first (to pick up a new build), the cached shell when offline.
      if (isPage) {
        try {
          return await fetch(req);
        } catch {
          return (await caches.match('./index.html', { ignoreSearch: true, ignoreVary: true })) || Response.error();
        }
      }
      const hit = await caches.match(req, { ignoreSearch: true, ignoreVary: true });
      if (hit) return hit;
      const res = await fetch(req);
      if (res.ok) {
        const names = (await caches.keys()).filter((k) => k.startsWith(PREFIX));
        if (names.length > 0) (await caches.open(names[names.length - 1])).put(req, res.clone());
      }
      return res;
    })(),
  );
});
