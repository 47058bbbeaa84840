// Sharing a scenario: the address always holds it (replaced in place, no history entry per
// keystroke), a link restores it exactly, a bad or partial link still opens with each bad value
// named and unknown keys kept; "Copy link" puts the address in the clipboard, the share sheet gets
// it, and the QR code follows the scenario. The page runs under its Content-Security-Policy
// (only its own files and the hashed loader script) without a single violation.
import { after, before, test } from 'node:test';
import assert from 'node:assert/strict';
import { createHash } from 'node:crypto';
import { report, settled, start, typeInto } from './helpers.mjs';
import { RENDERED, openPage } from './offline-helpers.mjs';

const SURVEY = 'v=1&name=Share+me&sw=13.2&sh=8.8&cols=5472&rows=3648&focal=8.8&fnum=4&wl=550&h=80&gd=0'
  + '&air=power&cn2=1e-13&cexp=-1.333&speed=8&shutter=0.001&aw=200&al=300&fo=75&so=65&need=0.03&tdim=0.75';

let app;
before(async () => { app = await start(); });
after(() => app?.close());

/** The page's address query, without '?'. */
function queryOf(page) {
  return new URL(page.url()).search.slice(1);
}

/** Waits until the address carries key=value (the app writes it after rendering). */
async function addressHas(page, key, value) {
  await page.waitForFunction(([k, v]) => new URLSearchParams(location.search).get(k) === v, [key, value]);
}

/** Every input and select of the scenario form, by id: what a person sees in the fields. */
function fields(page) {
  return page.$$eval('form.inputs input, form.inputs select', (els) => Object.fromEntries(els.map((e) => [e.id, e.value])));
}

/** The QR code's drawn modules (its path), on screen and on the print sheet. */
function qrPaths(page) {
  return page.evaluate(() => ({
    screen: document.querySelector('#share svg.qr-code path.qr-dark')?.getAttribute('d') ?? null,
    print: document.querySelector('.print-sheet svg.print-qr path.qr-dark')?.getAttribute('d') ?? null,
  }));
}

test('typing replaces the address in place; reloading and opening the link restore the scenario exactly', async () => {
  const page = await app.open(SURVEY);
  assert.equal(queryOf(page), SURVEY, 'a canonical link was rewritten on opening');
  const historyLength = await page.evaluate(() => history.length);
  await typeInto(page, '#in-h', '123.5');
  await addressHas(page, 'h', '123.5');
  await typeInto(page, '#in-name', 'Share me too');
  await addressHas(page, 'name', 'Share me too');
  assert.equal(await page.evaluate(() => history.length), historyLength, 'typing added history entries');
  const edited = queryOf(page);
  const shown = await fields(page);
  const limit = await page.getAttribute(RENDERED, 'data-si');

  await page.reload();
  await page.waitForSelector(RENDERED);
  assert.equal(queryOf(page), edited, 'reloading changed the address');
  assert.deepEqual(await fields(page), shown, 'reloading changed the fields');
  assert.equal(await page.getAttribute(RENDERED, 'data-si'), limit);

  // The link opened elsewhere (a fresh browser context) shows the same.
  const other = await app.open(edited);
  assert.equal(queryOf(other), edited);
  assert.deepEqual(await fields(other), shown, 'the link opened elsewhere shows other fields');
  assert.equal(await other.getAttribute(RENDERED, 'data-si'), limit);
  assert.deepEqual([...page.errors, ...other.errors], []);
  await other.context().close();
  await page.context().close();
});

test('a bad or partial link opens: good values load, each bad one is named with its range, unknown keys are kept', async () => {
  const link = 'h=abc&focal=50&zzz=1';
  const expected = report(link);
  const page = await app.open(link);
  const hError = expected.errors.find((e) => e.key === 'h');
  assert.ok(hError, 'the report does not reject h=abc');
  assert.match(hError.message, /from [\d.e+-]+ to [\d.e+-]+/, 'the message names no range');
  const beside = page.locator('.field:has(#in-h) .error');
  assert.equal((await beside.textContent()).trim(), hError.message);
  assert.equal(await page.getAttribute('#in-h', 'aria-invalid'), 'true');
  assert.equal(await page.inputValue('#in-h'), 'abc', 'the bad text is not kept in its field');
  assert.equal(await page.inputValue('#in-focal'), '50', 'the good value did not load');
  assert.equal(await page.getAttribute('#in-focal', 'aria-invalid'), 'false');
  assert.equal(Number(await page.getAttribute(RENDERED, 'data-si')), expected.limit_m, 'the limit differs from the report');
  assert.deepEqual(expected.ignored, ['zzz']);
  assert.match(await page.textContent('form.inputs'), /unknown keys in the link\): zzz\b/, 'the unknown key is not named as kept');
  assert.equal(new URLSearchParams(queryOf(page)).get('zzz'), '1', 'the unknown key was dropped from the address');
  // Still kept after an edit, and the correction clears the message.
  await typeInto(page, '#in-h', '60');
  await addressHas(page, 'h', '60');
  assert.equal(new URLSearchParams(queryOf(page)).get('zzz'), '1', 'an edit dropped the unknown key');
  assert.equal(await page.locator('.field:has(#in-h) .error').count(), 0);
  assert.equal(await page.isHidden('#crash-notice'), true);
  assert.deepEqual(page.errors, []);
  await page.context().close();
});

test('"Copy link" puts the current address in the clipboard', async () => {
  const page = await openPage(app.browser, `${app.origin}/?${SURVEY}`, {
    contextOptions: { permissions: ['clipboard-read', 'clipboard-write'] },
  });
  const read = () => page.evaluate(() => navigator.clipboard.readText());
  await page.evaluate(() => navigator.clipboard.writeText('nothing yet'));
  await page.click('#copy-link');
  await page.waitForSelector('#share .status');
  assert.equal((await page.textContent('#share .status')).trim(), 'Link copied.');
  assert.equal(await read(), page.url());
  await typeInto(page, '#in-h', '95');
  await addressHas(page, 'h', '95');
  await page.click('#copy-link');
  await page.waitForFunction((url) => navigator.clipboard.readText().then((t) => t === url), page.url());
  assert.equal(new URL(await read()).searchParams.get('h'), '95');
  assert.deepEqual(page.errors, []);
  await page.context().close();
});

test('the share button appears only with a share sheet, and hands it the link and the name', async () => {
  const plain = await app.open(SURVEY);
  const hasShare = await plain.evaluate(() => 'share' in navigator);
  assert.equal(await plain.locator('#share-link').count(), hasShare ? 1 : 0, 'the share button does not follow navigator.share');
  await plain.context().close();

  // A browser with a share sheet, stood in for by a recording stub.
  const page = await openPage(app.browser, `${app.origin}/?${SURVEY}`, {
    init: [() => {
      window.sharedItems = [];
      Object.defineProperty(Navigator.prototype, 'share', { configurable: true, value: async (data) => { window.sharedItems.push(data); } });
    }],
  });
  await page.click('#share-link');
  const shared = await page.evaluate(() => window.sharedItems);
  assert.deepEqual(shared, [{ title: 'Share me', url: page.url() }]);
  assert.deepEqual(page.errors, []);
  await page.context().close();
});

test('the QR code is drawn in the page and changes with the scenario', async () => {
  const page = await app.open(SURVEY);
  // The code is drawn by the second module a moment after the first figures show.
  await settled(page);
  const first = await qrPaths(page);
  assert.ok(first.screen && first.screen.length > 100, 'no QR code drawn');
  assert.equal(first.print, first.screen, 'the printed QR code differs from the screen one');
  const [size] = (await page.getAttribute('#share svg.qr-code', 'viewBox')).split(' ').slice(2).map(Number);
  // A QR symbol is 4 × version + 17 modules square; the drawing adds 4 light modules each side.
  assert.ok(size >= 29 && (size - 25) % 4 === 0, `${size} modules is no QR symbol with its quiet zone`);
  await typeInto(page, '#in-h', '140');
  await addressHas(page, 'h', '140');
  await page.waitForFunction((old) => document.querySelector('#share svg.qr-code path.qr-dark')?.getAttribute('d') !== old, first.screen);
  const second = await qrPaths(page);
  assert.notEqual(second.screen, first.screen);
  assert.equal(second.print, second.screen);
  // The code is drawn from the link alone: the same scenario gives the same code.
  await typeInto(page, '#in-h', '80');
  await addressHas(page, 'h', '80');
  await page.waitForFunction((want) => document.querySelector('#share svg.qr-code path.qr-dark')?.getAttribute('d') === want, first.screen);
  // No image, canvas or request made for it.
  assert.equal(await page.locator('#share img, #share canvas').count(), 0);
  assert.ok(page.context().requests.every((u) => u.startsWith(`${app.origin}/`)), 'a request left the origin');
  await page.context().close();
});

/** The Content-Security-Policy of the served index.html, as { directive: [sources] }. */
async function servedPolicy() {
  const html = await (await fetch(`${app.origin}/`)).text();
  // The build may be minified (attributes unquoted, in any order); the policy itself is always quoted.
  const metas = [...html.matchAll(/<meta\b[^>]*>/gi)].map((m) => m[0]).filter((tag) => /http-equiv=["']?Content-Security-Policy/i.test(tag));
  assert.equal(metas.length, 1, 'not exactly one CSP meta tag');
  const content = metas[0].match(/\bcontent="([^"]*)"/)?.[1] ?? '';
  const policy = Object.fromEntries(content.split(';').map((d) => d.trim().split(/\s+/)).filter((d) => d[0]).map(([name, ...sources]) => [name, sources]));
  const inline = [...html.matchAll(/<script(?![^>]*\bsrc=)[^>]*>([\s\S]*?)<\/script>/g)].map((m) => `'sha256-${createHash('sha256').update(m[1]).digest('base64')}'`);
  return { html, policy, inline };
}

test('the served page carries a CSP that allows only its own files and its hashed loader', async () => {
  const { policy, inline } = await servedPolicy();
  assert.deepEqual(policy['default-src'], ["'self'"]);
  assert.deepEqual(policy['object-src'], ["'none'"]);
  assert.deepEqual(policy['base-uri'], ["'none'"]);
  const hashes = policy['script-src'].filter((s) => s.startsWith("'sha256-"));
  assert.deepEqual(policy['script-src'].filter((s) => !hashes.includes(s)).sort(), ["'self'", "'wasm-unsafe-eval'"]);
  assert.ok(inline.length >= 1, 'no inline loader script: the hash check would be empty');
  assert.deepEqual(hashes.sort(), inline.sort(), 'the script hashes are not exactly those of the inline scripts');
  for (const [name, sources] of Object.entries(policy)) {
    for (const source of sources) {
      const local = ["'self'", "'none'", "'wasm-unsafe-eval'"].includes(source) || /^'sha256-[A-Za-z0-9+/=]+'$/.test(source)
        || (name === 'img-src' && ['data:', 'blob:'].includes(source));
      assert.ok(local, `${name} allows ${source}`);
    }
  }
  for (const needed of ['style-src', 'connect-src', 'img-src', 'worker-src', 'manifest-src', 'font-src']) {
    assert.ok(policy[needed]?.includes("'self'"), `${needed} is not limited to 'self'`);
  }
});

test('the app runs under its CSP without a violation, and the policy really blocks', async () => {
  const page = await openPage(app.browser, `${app.origin}/?${SURVEY}`, {
    init: [() => {
      window.cspViolations = [];
      document.addEventListener('securitypolicyviolation', (e) => window.cspViolations.push(`${e.violatedDirective} ${e.blockedURI}`));
    }],
    contextOptions: { permissions: ['clipboard-read', 'clipboard-write'] },
  });
  // Work every part of the page: edits, presets, saving, copying, exporting, the print layout.
  await typeInto(page, '#in-h', '150');
  await addressHas(page, 'h', '150');
  await page.selectOption('#air-preset', 'hv57');
  await page.selectOption('#geometry-mode', 'gd');
  await page.fill('#save-name', 'Policy check');
  await page.click('#save-scenario');
  await page.waitForSelector('#share li.saved');
  await page.click('#copy-link');
  const [download] = await Promise.all([page.waitForEvent('download'), page.click('#export-scenarios')]);
  assert.match(download.suggestedFilename(), /\.json$/);
  await page.click('button.toggle');
  await page.emulateMedia({ media: 'print' });
  await page.waitForTimeout(300);
  assert.deepEqual(await page.evaluate(() => window.cspViolations), [], 'CSP violations while the app ran');
  assert.deepEqual(page.errors.filter((e) => /Content.Security.Policy/i.test(e)), []);
  assert.deepEqual(page.errors, []);

  // The control: an injected inline script and an image from another origin are both refused,
  // so the listener above would have seen a violation had the app caused one.
  const blocked = await page.evaluate(async () => {
    const script = document.createElement('script');
    script.textContent = 'window.injectedRan = true;';
    document.head.append(script);
    const img = new Image();
    const loaded = new Promise((ok) => { img.onload = () => ok('loaded'); img.onerror = () => ok('refused'); });
    img.src = 'http://127.0.0.2:9/pixel.png';
    const outcome = await loaded;
    await new Promise((ok) => setTimeout(ok, 100));
    return { ran: window.injectedRan === true, img: outcome, violations: window.cspViolations };
  });
  assert.equal(blocked.ran, false, 'an injected inline script ran');
  assert.equal(blocked.img, 'refused');
  assert.ok(blocked.violations.some((v) => v.startsWith('script-src')), `no script-src violation: ${blocked.violations}`);
  assert.ok(blocked.violations.some((v) => v.startsWith('img-src') && v.includes('127.0.0.2')), `no img-src violation: ${blocked.violations}`);
  await page.context().close();
});
