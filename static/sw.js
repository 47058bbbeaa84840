// Sharpfield service worker: keeps the app usable with no network.
// scripts/post_build.py fills in the list of built files and a version taken from their contents,
// so every new build installs a new worker, precaches the new files and deletes the old cache.
const VERSION = 'BUILD_VERSION';
const CACHE = 'sharpfield-' + VERSION;
const PRECACHE = [
  /*PRECACHE*/
];

self.addEventListener('install', (event) => {
  event.waitUntil(
    // `reload`: fetch every file from the server, never from the HTTP cache, or a host that lets
    // browsers keep index.html would have the new worker precache the previous build's page.
    caches.open(CACHE)
      .then((cache) => cache.addAll(PRECACHE.map((url) => new Request(url, { cache: 'reload' }))))
      .then(() => self.skipWaiting())
  );
});

self.addEventListener('activate', (event) => {
  event.waitUntil(
    caches.keys()
      .then((keys) => Promise.all(keys.filter((k) => k.startsWith('sharpfield-') && k !== CACHE).map((k) => caches.delete(k))))
      .then(() => self.clients.claim())
  );
});

self.addEventListener('fetch', (event) => {
  const request = event.request;
  if (request.method !== 'GET' || new URL(request.url).origin !== self.location.origin) return;
  if (request.mode === 'navigate') {
    // The page itself: the network first, so a new build shows when online; the cached page
    // (whatever the scenario in its query) when offline.
    event.respondWith(
      fetch(request).catch(() => caches.open(CACHE).then((cache) => cache.match('./', { ignoreSearch: true })))
    );
    return;
  }
  // Built files carry a content hash in their names: the cache first.
  event.respondWith(
    caches.open(CACHE).then((cache) => cache.match(request, { ignoreSearch: true }).then((hit) => hit || fetch(request)))
  );
});
