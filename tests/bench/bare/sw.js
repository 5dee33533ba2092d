// The bare page's worker: every file of the page from its cache, like the app's.
const CACHE = 'bare-1';
const FILES = ['./', './index.html', './bare.js', './bare.css'];
self.addEventListener('install', (e) => e.waitUntil(caches.open(CACHE).then((c) => c.addAll(FILES)).then(() => self.skipWaiting())));
self.addEventListener('activate', (e) => e.waitUntil(self.clients.claim()));
self.addEventListener('fetch', (e) => {
  if (e.request.method !== 'GET') return;
  e.respondWith((async () => {
    const cache = await caches.open(CACHE);
    if (e.request.mode === 'navigate') return (await cache.match('./index.html')) || fetch(e.request);
    return (await cache.match(e.request, { ignoreSearch: true })) || fetch(e.request);
  })());
});
