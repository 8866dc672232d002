// Joulewise service worker: keeps the app working with no network.
// Written into dist/sw.js by `cargo xtask dist` from xtask/src/sw.js, with
// the cache name and the list of every file of the build filled in.
// Plain JavaScript, no library, nothing fetched from outside this origin.
//
// - install: fetch every file of this build (bypassing the HTTP cache) into
//   a cache named by the build's content hash; if one file fails, the whole
//   install fails and the previous version keeps running.
// - activate: delete the caches of earlier builds of this app at this path,
//   then take control of the open pages.
// - fetch: same-origin GET requests are answered from the cache first, then
//   from the network; opening the app (a navigation) answers with the cached
//   index.html, also when the network is down.
// - message 'SKIP_WAITING': sent by the page when the user presses Reload on
//   the update notice; the new version takes over (the page then reloads).
'use strict';

// The folder this worker serves, e.g. /tools/joulewise/. Caches are shared by
// the whole origin, so the path is part of the name: two copies of Joulewise
// on one server do not delete each other's files.
const SCOPE = new URL('./', self.location.href);
const PREFIX = `joulewise ${SCOPE.pathname} `;
const CACHE = `${PREFIX}__CACHE__`;
const FILES = __FILES__;

self.addEventListener('install', (event) => {
  event.waitUntil((async () => {
    const cache = await caches.open(CACHE);
    await cache.addAll(FILES.map((file) => new Request(new URL(file, SCOPE), { cache: 'reload' })));
  })());
});

self.addEventListener('activate', (event) => {
  event.waitUntil((async () => {
    const names = await caches.keys();
    await Promise.all(names
      .filter((name) => name.startsWith(PREFIX) && name !== CACHE)
      .map((name) => caches.delete(name)));
    await self.clients.claim();
  })());
});

self.addEventListener('message', (event) => {
  if (event.data === 'SKIP_WAITING') self.skipWaiting();
});

self.addEventListener('fetch', (event) => {
  const request = event.request;
  if (request.method !== 'GET' || new URL(request.url).origin !== self.location.origin) return;
  event.respondWith(answer(request));
});

async function answer(request) {
  const cache = await caches.open(CACHE);
  const index = new URL('index.html', SCOPE).href;
  const url = new URL(request.url);
  // Opening the app itself (with or without a query): the cached page.
  if (request.mode === 'navigate' && url.pathname === SCOPE.pathname) {
    const page = await cache.match(index);
    if (page) return page;
  }
  const hit = await cache.match(request);
  if (hit) return hit;
  try {
    return await fetch(request);
  } catch (error) {
    if (request.mode === 'navigate') {
      const page = await cache.match(index);
      if (page) return page;
    }
    throw error;
  }
}
