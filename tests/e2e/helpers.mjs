// Shared set-up for the end-to-end tests: serves the built page (dist/) with server.mjs on a free
// port, drives Debian's Chromium through playwright-core, and computes the expected figures with
// the `report` example, the same contract the page follows (shared/reference/url-and-report.md).
//
// playwright-core is not installed in the clone: scripts/tools.sh puts it in a per-user cache and
// sets NODE_PATH, which only CommonJS `require` honours (ESM `import` ignores it).
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { serve } from './server.mjs';

const require = createRequire(import.meta.url);
const { chromium } = require('playwright-core');

const HERE = dirname(fileURLToPath(import.meta.url));
export const ROOT = resolve(HERE, '..', '..');
export const DIST = process.env.SHARPFIELD_DIST || join(ROOT, 'dist');
export const ARTIFACTS = join(HERE, 'artifacts');

// Chromium as root in a closed network (shared/reference/toolchain.md).
const CHROMIUM_ARGS = [
  '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking',
  '--disable-component-update', '--disable-sync', '--disable-dev-shm-usage',
];

/** Starts the static server on a free port and a headless Chromium; `close()` stops both. */
export async function start() {
  if (!existsSync(join(DIST, 'index.html'))) {
    throw new Error(`${DIST}/index.html is missing: run \`trunk build --release\` first (scripts/test does)`);
  }
  const server = await serve(DIST, 0);
  const origin = `http://127.0.0.1:${server.address().port}`;
  let browser;
  try {
    browser = await chromium.launch({ executablePath: '/usr/bin/chromium', headless: true, args: CHROMIUM_ARGS });
  } catch (e) {
    await new Promise((ok) => server.close(ok));
    throw e;
  }

  /**
   * Opens `query` (without `?`, or '' for none) in a fresh context; records every request (in
   * `page.context().requests`) and every uncaught error or console error (in `page.errors`), and
   * waits until the app has rendered its results.
   */
  async function open(query = '', { viewport = { width: 1024, height: 768 } } = {}) {
    const context = await browser.newContext({ viewport });
    // Requests of the page and of any worker it starts (a service worker fetches on its own).
    context.requests = [];
    context.on('request', (r) => context.requests.push(r.url()));
    const page = await context.newPage();
    page.errors = [];
    page.on('pageerror', (e) => page.errors.push(String(e)));
    page.on('console', (m) => { if (m.type() === 'error') page.errors.push(m.text()); });
    await page.goto(`${origin}/${query ? `?${query}` : ''}`);
    try {
      await page.waitForSelector('[data-key="limit_m"]', { timeout: 15000 });
    } catch (e) {
      const seen = context.requests.join(', ');
      await context.close();
      throw new Error(`the app did not render (${e.message.split('\n')[0]}); page errors: ${page.errors.join(' | ') || 'none'}; requests: ${seen}`);
    }
    return page;
  }

  async function close() {
    await browser.close().catch(() => {});
    server.closeAllConnections?.();
    await new Promise((ok) => server.close(ok));
  }

  return { origin, server, browser, open, close };
}

/**
 * Waits until the page has settled on its scenario: panels out of view follow the scenario once
 * typing pauses (and the QR code and the printed sheet always do), and the parts the second
 * module draws follow a moment later, so what a test reads of them after a change is read once the
 * page says so.
 */
export async function settled(page) {
  await page.waitForSelector('main[data-settled="true"]', { timeout: 15000 });
  // Parts drawn by the second module (the light panel's) say when they show an earlier scenario.
  await page.waitForFunction(() => document.querySelector('main[data-settled="true"]') && !document.querySelector('main [data-settled="false"]'), null, { timeout: 15000 });
}

/** Path of the report example; scripts/test builds it once before the tests. */
function reportBinary() {
  if (process.env.SHARPFIELD_REPORT) return process.env.SHARPFIELD_REPORT;
  const built = join(ROOT, 'target', 'debug', 'examples', 'report');
  const run = spawnSync('cargo', ['build', '--quiet', '--example', 'report'], { cwd: ROOT, stdio: 'inherit' });
  if (run.status !== 0) throw new Error('cargo build --example report failed');
  return built;
}

let binary;
/** The report of each query, from one run of the report example (`-`: one query per line). */
export function reports(queries) {
  binary ??= reportBinary();
  const run = spawnSync(binary, ['-'], { input: queries.join('\n') + '\n', encoding: 'utf8', cwd: ROOT });
  if (run.status !== 0) throw new Error(`report example failed: ${run.stderr}`);
  const lines = run.stdout.trim().split('\n');
  if (lines.length !== queries.length) throw new Error(`report gave ${lines.length} lines for ${queries.length} queries`);
  return lines.map((l) => JSON.parse(l));
}

/** The report of one query. */
export function report(query) {
  return reports([query])[0];
}

/** Every displayed `[data-key]` element: its key, its data-si (null when absent) and its text, once
 * the page has settled on its scenario. */
export async function displayed(page) {
  await settled(page);
  return page.$$eval('[data-key]', (els) => els.map((e) => ({
    key: e.getAttribute('data-key'),
    si: e.getAttribute('data-si'),
    text: e.textContent.trim(),
  })));
}

/** Whether two numbers agree to a relative tolerance (the page's wasm libm may differ in the last bits). */
export function close(a, b, rel = 1e-9) {
  if (a === b) return true;
  return Math.abs(a - b) <= rel * Math.max(Math.abs(a), Math.abs(b));
}

/**
 * Differences between what the page shows and the report: one line per displayed element whose
 * data-si does not equal the report's field of the same name. Numbers compare within 1e-9
 * relative; a null field must be shown with an empty data-si; words compare exactly, and a yes/no
 * field is shown as `true` or `false`.
 */
export function mismatches(shown, rep) {
  const out = [];
  for (const { key, si, text } of shown) {
    // A nested figure is named by its path: `task_ranges.2.p50_m`.
    const path = key.split('.');
    let parent = rep;
    for (const part of path.slice(0, -1)) parent = parent == null ? undefined : parent[part];
    const last = path[path.length - 1];
    if (parent == null || typeof parent !== 'object' || !(last in parent)) { out.push(`${key}: shown ("${text}") but the report has no such field`); continue; }
    const want = parent[last];
    if (si === null) { out.push(`${key}: shown ("${text}") without data-si`); continue; }
    if (typeof want === 'number') {
      const got = Number(si);
      if (si.trim() === '' || !Number.isFinite(got) || !close(got, want)) out.push(`${key}: data-si ${si}, report ${want}`);
    } else if (want === null) {
      if (si !== '') out.push(`${key}: data-si ${si}, report null`);
    } else if (typeof want === 'boolean') {
      if (si !== String(want)) out.push(`${key}: data-si ${JSON.stringify(si)}, report ${want}`);
    } else if (typeof want === 'string') {
      if (si !== want) out.push(`${key}: data-si ${JSON.stringify(si)}, report ${JSON.stringify(want)}`);
    } else {
      out.push(`${key}: report field is ${JSON.stringify(want)}, not a number or a word`);
    }
  }
  return out;
}

/** Types `text` into the input `selector`, replacing what it holds, as a person would. */
export async function typeInto(page, selector, text) {
  await page.fill(selector, '');
  await page.type(selector, text);
}

/** Makes the artifacts folder and returns the path of `name` in it. */
export function artifact(name) {
  mkdirSync(ARTIFACTS, { recursive: true });
  return join(ARTIFACTS, name);
}
