// A static server for the built page, for the end-to-end tests: serves dist/ on 127.0.0.1 with
// `Cache-Control: no-store`, so that only a service worker (never Chromium's HTTP cache) can make
// the page load offline. It logs every request path, so tests can check what the page asked for.
// Like any static host it sends text and WebAssembly gzipped when the browser accepts it, so that
// timings on a slow link stand for a real visit.
// Usage: node tests/e2e/server.mjs DIR PORT
import { createServer } from 'node:http';
import { readFile, stat } from 'node:fs/promises';
import { extname, join, normalize, resolve } from 'node:path';
import { gzipSync } from 'node:zlib';

const TYPES = {
  '.html': 'text/html; charset=utf-8', '.js': 'text/javascript; charset=utf-8', '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8', '.wasm': 'application/wasm', '.json': 'application/json',
  '.webmanifest': 'application/manifest+json', '.svg': 'image/svg+xml', '.png': 'image/png', '.ico': 'image/x-icon',
};

/** Gzipped bodies by file and modification time, so each is compressed once. */
const zipped = new Map();

export function serve(dir, port) {
  const root = resolve(dir);
  const server = createServer(async (req, res) => {
    const url = new URL(req.url, 'http://127.0.0.1');
    let path = normalize(decodeURIComponent(url.pathname)).replace(/^(\.\.[/\\])+/, '');
    if (path.endsWith('/')) path += 'index.html';
    const file = join(root, path);
    server.requests.push(url.pathname);
    try {
      if (!file.startsWith(root) || !(await stat(file)).isFile()) throw new Error('not found');
      const body = await readFile(file);
      const headers = { 'Content-Type': TYPES[extname(file)] || 'application/octet-stream', 'Cache-Control': 'no-store', Vary: 'Accept-Encoding' };
      if (extname(file) !== '.png' && /\bgzip\b/.test(req.headers['accept-encoding'] || '')) {
        res.writeHead(200, { ...headers, 'Content-Encoding': 'gzip' });
        const key = `${file}:${(await stat(file)).mtimeMs}`;
        if (!zipped.has(key)) zipped.set(key, gzipSync(body, { level: 9 }));
        res.end(zipped.get(key));
      } else {
        res.writeHead(200, headers);
        res.end(body);
      }
    } catch {
      res.writeHead(404, { 'Content-Type': 'text/plain', 'Cache-Control': 'no-store' });
      res.end('not found');
    }
  });
  server.requests = [];
  return new Promise((ok) => server.listen(port, '127.0.0.1', () => ok(server)));
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const [dir = 'dist', port = '8080'] = process.argv.slice(2);
  serve(dir, Number(port)).then(() => console.log(`serving ${dir} at http://127.0.0.1:${port}/`));
}
