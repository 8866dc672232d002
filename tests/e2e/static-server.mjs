// A small static file server for the end-to-end tests (node only): serves a
// folder under a path prefix on 127.0.0.1, like an intranet server that puts
// Joulewise at /tools/joulewise/. Files are read on every request, so a test
// can deploy a new build by overwriting them while the server runs.
import fs from 'node:fs';
import http from 'node:http';
import path from 'node:path';

const TYPES = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.wasm': 'application/wasm',
  '.css': 'text/css; charset=utf-8',
  '.webmanifest': 'application/manifest+json',
  '.json': 'application/json',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
};

/**
 * Serve `root` under `prefix` (e.g. '/tools/joulewise/') on 127.0.0.1:`port`
 * (0: any free port). Resolves to { origin, url, port, close() }.
 */
export async function serveFolder(root, prefix = '/', port = 0) {
  const server = http.createServer((req, res) => {
    const pathname = decodeURIComponent(new URL(req.url, 'http://x').pathname);
    if (req.method !== 'GET' && req.method !== 'HEAD') {
      res.writeHead(405).end();
      return;
    }
    if (pathname === prefix.replace(/\/$/, '')) {
      res.writeHead(301, { Location: prefix }).end();
      return;
    }
    if (!pathname.startsWith(prefix) || pathname.split('/').includes('..')) {
      res.writeHead(404, { 'Content-Type': 'text/plain' }).end('not found');
      return;
    }
    let file = path.join(root, pathname.slice(prefix.length));
    if (pathname.endsWith('/')) file = path.join(file, 'index.html');
    fs.readFile(file, (err, body) => {
      if (err) {
        res.writeHead(404, { 'Content-Type': 'text/plain' }).end('not found');
        return;
      }
      res.writeHead(200, {
        'Content-Type': TYPES[path.extname(file)] ?? 'application/octet-stream',
        'Cache-Control': 'no-cache',
        'X-Content-Type-Options': 'nosniff',
      });
      res.end(req.method === 'HEAD' ? undefined : body);
    });
  });
  await new Promise((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', resolve);
  });
  const actual = server.address().port;
  const origin = `http://127.0.0.1:${actual}`;
  return {
    origin,
    url: `${origin}${prefix}`,
    port: actual,
    close: () => new Promise((resolve) => {
      server.closeAllConnections();
      server.close(() => resolve());
    }),
  };
}
