// Tidewright service worker: keeps the app's files so it starts offline after the first visit.
// Network first (a new build is picked up as soon as the network is there), cache as fallback.
// The cache name carries a hash of the build (filled in by web/cmake/service_worker.cmake).
const CACHE = 'tidewright-@TW_BUILD_HASH@';
const FILES = ['./', 'index.html', 'page.js', 'page.css', 'tidewright.js', 'tidewright.wasm', 'manifest.webmanifest',
  'icons/icon-192.png', 'icons/icon-512.png', 'icons/icon-maskable-512.png'];

self.addEventListener('install', (event) => {
  // 'no-cache': each file is revalidated with the server, so the copy kept is this build's, and
  // one the page has just downloaded comes from the HTTP cache instead of over the line again.
  event.waitUntil(caches.open(CACHE).then((c) => c.addAll(FILES.map((f) => new Request(f, { cache: 'no-cache' }))))
    .then(() => self.skipWaiting()));
});

self.addEventListener('activate', (event) => {
  event.waitUntil(caches.keys()
    .then((keys) => Promise.all(keys.filter((k) => k.startsWith('tidewright-') && k !== CACHE).map((k) => caches.delete(k))))
    .then(() => self.clients.claim()));
});

self.addEventListener('fetch', (event) => {
  const req = event.request;
  if (req.method !== 'GET' || new URL(req.url).origin !== self.location.origin) return;
  event.respondWith(fetch(req).then((resp) => {
    if (resp.ok) {
      const copy = resp.clone();
      caches.open(CACHE).then((c) => c.put(req, copy));
    }
    return resp;
  }).catch(() => caches.match(req, { ignoreSearch: true })
    .then((hit) => hit || (req.mode === 'navigate' ? caches.match('index.html') : undefined))
    .then((hit) => hit || new Response('Offline and not cached', { status: 503, statusText: 'Offline' }))));
});
