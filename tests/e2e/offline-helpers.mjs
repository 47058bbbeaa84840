// Helpers for the share, save, print and offline end-to-end tests, on top of helpers.mjs: pages
// opened with scripts that run before the app (storage abuse, a stub share sheet), a copy of the
// build served on a port of its own (the offline tests change it and stop it), and the poppler
// tools that read printed PDFs.
import { execFileSync } from 'node:child_process';
import { cpSync, mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { DIST } from './helpers.mjs';
import { serve } from './server.mjs';

/** The selector that is present once the app has computed and rendered its results. */
export const RENDERED = '[data-key="limit_m"]';

/**
 * Opens `url` in a new context of `browser`; `init` scripts run before any page script, on every
 * navigation. Records requests (`context.requests`) and uncaught or console errors (`page.errors`).
 * Waits for the app unless `waitForApp` is false.
 */
export async function openPage(browser, url, { init = [], contextOptions = {}, waitForApp = true } = {}) {
  const context = await browser.newContext({ viewport: { width: 1024, height: 768 }, ...contextOptions });
  context.requests = [];
  context.on('request', (r) => context.requests.push(r.url()));
  for (const script of init) await context.addInitScript(script);
  const page = await context.newPage();
  watchErrors(page);
  await page.goto(url);
  if (waitForApp) await page.waitForSelector(RENDERED, { timeout: 15000 });
  return page;
}

/** Records uncaught errors and console errors of `page` in `page.errors`. */
export function watchErrors(page) {
  page.errors = [];
  page.on('pageerror', (e) => page.errors.push(String(e)));
  page.on('console', (m) => { if (m.type() === 'error') page.errors.push(m.text()); });
}

/**
 * A fresh copy of the build in a temporary folder, which a test may change freely. Trunk's
 * staging folder (present while a build runs) is not part of the build.
 */
export function copyOfBuild() {
  const dir = mkdtempSync(join(tmpdir(), 'sharpfield-build-'));
  cpSync(DIST, dir, { recursive: true, filter: (path) => !path.split(/[\\/]/).includes('.stage') });
  return dir;
}

/** Serves `dir` on `port` (0: any free port); see server.mjs. */
export function serveDir(dir, port = 0) {
  return serve(dir, port);
}

/**
 * Serves `dir` like a common static host that lets browsers keep files for an hour (server.mjs
 * sends no-store, which hides mistakes that only show when the browser's HTTP cache answers).
 */
export async function serveCacheable(dir, port = 0) {
  const server = await serve(dir, port);
  server.prependListener('request', (req, res) => {
    const writeHead = res.writeHead;
    res.writeHead = function cacheable(status, headers) {
      if (status === 200 && headers) headers['Cache-Control'] = 'max-age=3600';
      return writeHead.call(this, status, headers);
    };
  });
  return server;
}

/** Stops a server at once, dropping the browser's kept-alive connections too. */
export async function stopServer(server) {
  server.closeAllConnections?.();
  await new Promise((ok) => server.close(ok));
}

/** The version and the precache list that scripts/post_build.py wrote into DIR/sw.js. */
export function serviceWorkerOf(dir) {
  const text = readFileSync(join(dir, 'sw.js'), 'utf8');
  const version = text.match(/const VERSION = '([^']*)'/)?.[1];
  const list = text.match(/const PRECACHE = \[([^\]]*)\]/)?.[1];
  if (!version || list === undefined) throw new Error(`${dir}/sw.js has no VERSION or PRECACHE`);
  return { version, precache: JSON.parse(`[${list}]`) };
}

/** Pages of a PDF file, as `pdfinfo` counts them, and the page size in points. */
export function pdfInfo(path) {
  const text = execFileSync('pdfinfo', [path], { encoding: 'utf8' });
  const pages = Number(text.match(/^Pages:\s+(\d+)/m)?.[1]);
  const size = text.match(/^Page size:\s+([\d.]+) x ([\d.]+) pts/m);
  return { pages, width: Number(size?.[1]), height: Number(size?.[2]) };
}

/**
 * The text of a PDF file in the order it was drawn (`pdftotext -raw`, so a table cell's wrapped
 * lines stay together), with every run of white space made one space.
 */
export function pdfText(path) {
  return flat(execFileSync('pdftotext', ['-raw', path, '-'], { encoding: 'utf8' }));
}

/** `text` with every run of white space made one space, trimmed. */
export function flat(text) {
  return text.replace(/\s+/g, ' ').trim();
}

/** Renders the first page of a PDF to `stem`-1.png (or -01…) at `dpi` and returns nothing. */
export function pdfToPng(path, stem, dpi = 60) {
  execFileSync('pdftoppm', ['-png', '-r', String(dpi), '-f', '1', '-l', '1', path, stem]);
}
