// Offline: the service worker precaches every built file, serves the app with no network, and a
// new build replaces the old cache; a page without the service worker must fail once the server
// is down (the negative control: the server sends no-store, so no HTTP cache can stand in).
// The manifest and its icons make the app installable.
// Each test serves its own copy of the build, so that it can change it and stop the server.
import { after, before, test } from 'node:test';
import assert from 'node:assert/strict';
import { execFileSync } from 'node:child_process';
import { readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { ROOT, displayed, start, typeInto } from './helpers.mjs';
import { RENDERED, copyOfBuild, openPage, serveCacheable, serveDir, serviceWorkerOf, stopServer } from './offline-helpers.mjs';

// Two scenarios of different kinds: the page must compute whichever the address holds.
const SURVEY = 'v=1&name=Offline+survey&sw=13.2&sh=8.8&cols=5472&rows=3648&focal=8.8&fnum=4&wl=550&h=90&gd=0'
  + '&air=power&cn2=1e-13&cexp=-1.333&speed=9&shutter=0.001&aw=300&al=400&fo=75&so=65&need=0.03&tdim=0.75';
const MAST = 'v=1&name=Offline+mast&sw=6.17&sh=4.55&cols=4000&rows=3000&focal=100&fnum=4&wl=550&h=8&gd=1500'
  + '&air=hv57&speed=0&shutter=0.002&need=0.1&tdim=0.75';

let app;
const copies = [];
before(async () => { app = await start(); });
after(async () => {
  await app?.close();
  for (const dir of copies) rmSync(dir, { recursive: true, force: true });
});

/** A copy of the build served on a free port: { dir, server, origin }. */
async function servedCopy() {
  const dir = copyOfBuild();
  copies.push(dir);
  const server = await serveDir(dir, 0);
  return { dir, server, port: server.address().port, origin: `http://127.0.0.1:${server.address().port}` };
}

/** What the page shows, keyed: every [data-key] element's data-si and text. */
async function shown(page) {
  return (await displayed(page)).map(({ key, si, text }) => `${key}=${si} (${text})`);
}

/** Evaluates `fn(arg)` in the page every 100 ms until it gives a truthy value, and returns it. */
async function poll(page, fn, arg, what, timeout = 20000) {
  const end = Date.now() + timeout;
  for (;;) {
    const value = await page.evaluate(fn, arg);
    if (value) return value;
    if (Date.now() > end) throw new Error(`timed out waiting for ${what}`);
    await new Promise((ok) => setTimeout(ok, 100));
  }
}

/** The page's cache names, and the URLs in each. */
function cacheContents(page) {
  return page.evaluate(async () => {
    const out = {};
    for (const name of await caches.keys()) out[name] = (await (await caches.open(name)).keys()).map((r) => r.url).sort();
    return out;
  });
}

/**
 * Waits until a service worker controls the page and the cache of the build in `dir` holds every
 * file of its precache list; returns the build's version.
 */
async function precached(page, dir) {
  // The page's own first fetches (the second module, started once the first figures show) went
  // to the network before the worker controlled it: let them finish before a test stops the
  // server, or one cut short is reported as "Failed to fetch" (seen under load).
  await page.waitForSelector('main[data-settled="true"]', { timeout: 20000 });
  const { version, precache } = serviceWorkerOf(dir);
  const want = precache.map((p) => new URL(p, page.url()).href).sort();
  await page.evaluate(() => navigator.serviceWorker.ready);
  await poll(page, () => navigator.serviceWorker.controller !== null, null, 'a controlling service worker');
  const name = `sharpfield-${version}`;
  await poll(page, async ([n, count]) => {
    if (!(await caches.keys()).includes(n)) return false;
    return (await (await caches.open(n)).keys()).length >= count;
  }, [name, want.length], `${want.length} files in ${name}`);
  assert.deepEqual((await cacheContents(page))[name], want, 'the cache does not hold exactly the precache list');
  return version;
}

/**
 * Deploys a new build into `dir`: a visible change to the page, then the worker regenerated from
 * the folder's contents as the build's post-build hook does. Returns the page's new marker.
 */
function deploy(dir) {
  const marker = `build-${Date.now()}`;
  const indexPath = join(dir, 'index.html');
  const html = readFileSync(indexPath, 'utf8');
  // The build may be minified: `<div id=app></div>`.
  const mount = /<div id=("?)app\1><\/div>/;
  assert.ok(mount.test(html), 'no app mount point in index.html');
  writeFileSync(indexPath, html.replace(mount, `<div id="app" data-build="${marker}"></div>`));
  execFileSync('python3', [join(ROOT, 'scripts', 'post_build.py'), '--sw-only', dir]);
  return marker;
}

test('the precache list is every file of the build, versioned by their contents', () => {
  const dir = copyOfBuild();
  copies.push(dir);
  const files = readdirSync(dir, { recursive: true, withFileTypes: true })
    .filter((e) => e.isFile() && e.name !== 'sw.js')
    .map((e) => join(e.parentPath ?? e.path, e.name).slice(dir.length + 1))
    .map((rel) => (rel === 'index.html' ? './' : `./${rel}`))
    .sort();
  const { version, precache } = serviceWorkerOf(dir);
  assert.deepEqual([...precache].sort(), files, 'sw.js does not list exactly the built files');
  assert.match(version, /^[0-9a-f]{16}$/, 'the version is not a content digest');
  // The wasm, its loader and the style sheets carry content hashes in their names. Trunk writes
  // the 64-bit hash without leading zeros, so a name may carry fewer than 16 hex digits.
  for (const kind of [/_bg\.wasm$/, /\.js$/, /^\.\/app-.*\.css$/]) {
    assert.ok(precache.some((p) => kind.test(p) && /-[0-9a-f]{12,16}[._]/.test(p)), `no hashed file like ${kind} in the list`);
  }
  // The print style sheet keeps its name (the page links it itself); the version digest covers it.
  assert.ok(precache.includes('./print.css'), 'the print style sheet is not precached');
});

test('loaded once, the app opens and computes with the server stopped; without the service worker it does not', async () => {
  const site = await servedCopy();
  const url = (query) => `${site.origin}/?${query}`;

  // Online: the reference figures for both scenarios, from a context without service workers,
  // which is also the negative control below.
  const control = await openPage(app.browser, url(MAST), { contextOptions: { serviceWorkers: 'block' } });
  const onlineMast = await shown(control);
  assert.equal(await control.evaluate(() => navigator.serviceWorker.controller), null);
  const page = await openPage(app.browser, url(SURVEY));
  const onlineSurvey = await shown(page);
  await precached(page, site.dir);
  assert.ok(onlineSurvey.length > 10 && onlineMast.length > 10, 'too few figures shown');
  assert.notDeepEqual(onlineSurvey, onlineMast, 'the two scenarios show the same figures');

  await stopServer(site.server);
  const seenBy = site.server.requests.length;

  // Offline, with the service worker: the same address and another scenario both compute.
  await page.reload();
  await page.waitForSelector(RENDERED, { timeout: 15000 });
  assert.deepEqual(await shown(page), onlineSurvey, 'offline figures differ from online ones (same scenario)');
  await page.goto(url(MAST));
  await page.waitForSelector(RENDERED, { timeout: 15000 });
  assert.deepEqual(await shown(page), onlineMast, 'offline figures differ from online ones (another scenario)');
  assert.equal(await page.inputValue('#in-name'), 'Offline mast');
  assert.equal(await page.isHidden('#crash-notice'), true);
  // The page still works: an edit recomputes.
  const before = await page.getAttribute(RENDERED, 'data-si');
  await page.fill('#in-h', '30');
  await page.waitForFunction(([sel, old]) => document.querySelector(sel)?.getAttribute('data-si') !== old, [RENDERED, before]);
  assert.equal(site.server.requests.length, seenBy, 'the stopped server saw requests');
  assert.deepEqual(page.errors, [], 'errors in the offline page');

  // The negative control, without any service worker: reloading must fail.
  let failure = null;
  try {
    await control.reload({ timeout: 10000 });
  } catch (e) {
    failure = e.message;
  }
  const rendered = await control.waitForSelector(RENDERED, { timeout: 3000 }).then(() => true, () => false);
  assert.equal(rendered, false, 'the page without a service worker rendered with the server down: something else caches it');
  assert.match(failure ?? '', /ERR_CONNECTION_REFUSED|ERR_/, 'the reload without a service worker did not fail');

  await control.context().close();
  await page.context().close();
});

test('after one visit every on-demand module works with the server stopped: the export, the sun and the QR code, a boundary file read and laid out', async () => {
  const site = await servedCopy();
  const page = await openPage(app.browser, `${site.origin}/?${SURVEY}&lat=-36.85&lon=146.29&when=2026-11-02T10%3A30%2B11%3A00`, { contextOptions: { acceptDownloads: true } });
  await precached(page, site.dir);
  await stopServer(site.server);
  await page.reload();
  await page.waitForSelector(RENDERED, { timeout: 15000 });
  // The second module places the sun and draws the QR code.
  await page.waitForSelector('#light [data-key="sun_elevation_deg"]', { timeout: 15000 });
  await page.waitForSelector('.qr-code path', { timeout: 15000 });
  const [download] = await Promise.all([page.waitForEvent('download'), page.click('#survey .export button')]);
  assert.equal(JSON.parse(readFileSync(await download.path(), 'utf8')).type, 'FeatureCollection');
  // A boundary file: read by its module, laid out and drawn by the boundary module.
  const ring = [[146.29, -36.85], [146.2945, -36.85], [146.2945, -36.8464], [146.29, -36.8464], [146.29, -36.85]];
  const file = JSON.stringify({ type: 'Polygon', coordinates: [ring] });
  await page.setInputFiles('#import-boundary', { name: 'paddock.geojson', mimeType: 'application/geo+json', buffer: Buffer.from(file) });
  await page.waitForSelector('#survey .field-map', { timeout: 15000 });
  assert.deepEqual(page.errors, []);
  await page.context().close();
});

test('a new build installs while a person works: the open page is neither reloaded nor loses what was typed', async () => {
  const site = await servedCopy();
  const page = await openPage(app.browser, `${site.origin}/?${SURVEY}`);
  const oldVersion = await precached(page, site.dir);
  // Work in progress: a height typed in, and a mark on the window that a reload would lose.
  await page.evaluate(() => { window.workInProgress = 'kept'; });
  await typeInto(page, '#in-h', '95');
  await page.waitForFunction(() => document.querySelector('[data-key="slant_range_m"]')?.getAttribute('data-si') === '95');
  deploy(site.dir);
  const { version: newVersion } = serviceWorkerOf(site.dir);
  try {
    // The browser checks for a new worker now and then; ask it now, as it would on its own.
    await page.evaluate(() => navigator.serviceWorker.getRegistration().then((r) => r.update()));
    await poll(page, async ([fresh, old]) => {
      const keys = await caches.keys();
      return keys.includes(fresh) && !keys.includes(old);
    }, [`sharpfield-${newVersion}`, `sharpfield-${oldVersion}`], 'the new build to install and activate');
    assert.equal(await page.evaluate(() => window.workInProgress), 'kept', 'the page was reloaded');
    assert.equal(await page.inputValue('#in-h'), '95', 'the typed height was lost');
    assert.equal(await page.getAttribute('[data-key="slant_range_m"]', 'data-si'), '95');
    assert.equal(await page.getAttribute('#app', 'data-build'), null, 'the open page was replaced by the new build');
    assert.deepEqual(page.errors, []);
  } finally {
    await stopServer(site.server);
    await page.context().close();
  }
});

test('a new build is picked up: new worker, new page, old cache gone, and that works offline', async () => {
  const site = await servedCopy();
  const page = await openPage(app.browser, `${site.origin}/?${SURVEY}`);
  const oldVersion = await precached(page, site.dir);
  await stopServer(site.server);

  const marker = deploy(site.dir);
  const { version: newVersion } = serviceWorkerOf(site.dir);
  assert.notEqual(newVersion, oldVersion, 'post_build.py kept the old version for changed contents');

  // The same origin, hence the same port, as the worker is registered for it.
  const server = await serveDir(site.dir, site.port);
  try {
    await page.reload();
    await page.waitForSelector(RENDERED);
    // The browser checks sw.js on navigation; the new worker installs, skips waiting, deletes
    // the old cache and claims the page.
    await poll(page, async ([fresh, old]) => {
      const keys = await caches.keys();
      return keys.includes(fresh) && !keys.includes(old);
    }, [`sharpfield-${newVersion}`, `sharpfield-${oldVersion}`], 'the new cache to replace the old one');
    await precached(page, site.dir);
    const keys = await page.evaluate(() => caches.keys());
    assert.deepEqual(keys, [`sharpfield-${newVersion}`], 'caches left besides the new one');
    const controller = await page.evaluate(() => navigator.serviceWorker.controller?.scriptURL);
    assert.equal(controller, `${site.origin}/sw.js`);
    assert.equal(await page.getAttribute('#app', 'data-build'), marker, 'the new page is not shown online');
  } finally {
    await stopServer(server);
  }

  // Offline again: the new page comes from the new cache.
  await page.reload();
  await page.waitForSelector(RENDERED, { timeout: 15000 });
  assert.equal(await page.getAttribute('#app', 'data-build'), marker, 'offline, the old page is served');
  assert.deepEqual(page.errors, []);
  await page.context().close();
});

test('on a host that lets browsers cache files, a new build precaches the new page, not the old one', async () => {
  const dir = copyOfBuild();
  copies.push(dir);
  const server = await serveCacheable(dir, 0);
  const origin = `http://127.0.0.1:${server.address().port}`;
  let page;
  let marker;
  try {
    page = await openPage(app.browser, `${origin}/?${SURVEY}`);
    const oldVersion = await precached(page, dir);
    marker = deploy(dir);
    const { version: newVersion } = serviceWorkerOf(dir);
    // The browser looks for a new worker by itself (here asked at once, as it does periodically
    // for an open page); the new worker installs while the old page is in the HTTP cache.
    await page.evaluate(async () => (await navigator.serviceWorker.getRegistration()).update());
    await poll(page, async ([fresh, old]) => {
      const keys = await caches.keys();
      return keys.includes(fresh) && !keys.includes(old);
    }, [`sharpfield-${newVersion}`, `sharpfield-${oldVersion}`], 'the new cache to replace the old one');
    const cachedPage = await page.evaluate(async (name) => (await (await caches.open(name)).match('./')).text(), `sharpfield-${newVersion}`);
    assert.ok(cachedPage.includes(marker), 'the new build\'s cache holds the previous page, taken from the HTTP cache');
  } finally {
    await stopServer(server);
  }
  await page.reload();
  await page.waitForSelector(RENDERED, { timeout: 15000 });
  assert.equal(await page.getAttribute('#app', 'data-build'), marker, 'offline, the previous page is served');
  assert.deepEqual(page.errors, []);
  await page.context().close();
});

test('the manifest loads with a name and icons, each icon is served, and Chromium finds the app installable', async () => {
  const site = await servedCopy();
  try {
    const page = await openPage(app.browser, `${site.origin}/`);
    const href = await page.evaluate(() => document.querySelector('link[rel=manifest]')?.href);
    assert.ok(href, 'no <link rel=manifest>');
    const response = await fetch(href);
    assert.equal(response.status, 200);
    assert.match(response.headers.get('content-type'), /application\/manifest\+json/);
    const manifest = await response.json();
    assert.ok(manifest.name && manifest.short_name, 'the manifest has no name');
    assert.ok(['standalone', 'fullscreen', 'minimal-ui'].includes(manifest.display));
    assert.equal(new URL(manifest.start_url, href).origin, site.origin);
    const sizes = manifest.icons.map((i) => i.sizes);
    for (const size of ['192x192', '512x512']) assert.ok(sizes.includes(size), `no ${size} icon`);
    for (const icon of manifest.icons) {
      const res = await fetch(new URL(icon.src, href));
      assert.equal(res.status, 200, `${icon.src}: ${res.status}`);
      assert.equal(res.headers.get('content-type'), icon.type, `${icon.src} is served as another type`);
      const body = Buffer.from(await res.arrayBuffer());
      if (icon.type === 'image/png') {
        assert.equal(body.subarray(1, 4).toString(), 'PNG');
        const [w, h] = [body.readUInt32BE(16), body.readUInt32BE(20)];
        assert.equal(`${w}x${h}`, icon.sizes, `${icon.src} is ${w}x${h}`);
      }
    }
    // Chromium's own view: it parsed the manifest and sees nothing that prevents installing.
    await page.evaluate(() => navigator.serviceWorker.ready);
    const cdp = await page.context().newCDPSession(page);
    const { errors } = await cdp.send('Page.getAppManifest');
    assert.deepEqual(errors, [], 'Chromium reports manifest errors');
    // Test contexts are incognito-like, where Chromium never installs; every other reason counts.
    const { installabilityErrors } = await cdp.send('Page.getInstallabilityErrors');
    const reasons = installabilityErrors.map((e) => e.errorId).filter((id) => id !== 'in-incognito');
    assert.deepEqual(reasons, [], 'Chromium reports the app not installable');
    await page.context().close();
  } finally {
    await stopServer(site.server);
  }
});
