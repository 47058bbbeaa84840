// Saved scenarios in the browser: save, list after a reload, open, rename, duplicate, delete,
// export to a file and import it back, all under the versioned format. Storage that is corrupt,
// from an older or a newer version, disabled or full never crashes the app and never silently
// drops a scenario: what cannot be read is kept aside unchanged and the person is told.
import { after, before, test } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync, writeFileSync } from 'node:fs';
import { artifact, start, typeInto } from './helpers.mjs';
import { RENDERED, openPage } from './offline-helpers.mjs';

const KEY = 'sharpfield.scenarios';
const ASIDE = 'sharpfield.scenarios.kept-aside.';
const SURVEY = 'v=1&name=Library+survey&sw=13.2&sh=8.8&cols=5472&rows=3648&focal=8.8&fnum=4&wl=550&h=80&gd=0'
  + '&air=power&cn2=1e-13&cexp=-1.333&speed=8&shutter=0.001&aw=200&al=300&fo=75&so=65&need=0.03&tdim=0.75';

let app;
before(async () => { app = await start(); });
after(() => app?.close());

/** Names in the saved list, in order. */
function names(page) {
  return page.$$eval('#share li.saved .saved-name', (els) => els.map((e) => e.textContent));
}

/** The saved list's row for `name`. */
function row(page, name) {
  return page.locator('#share li.saved').filter({ has: page.getByText(name, { exact: true }) });
}

/** The status line's text once it reads `pattern`. */
async function status(page, pattern) {
  const line = page.locator('#share .status');
  await line.waitFor();
  await page.waitForFunction((src) => new RegExp(src).test(document.querySelector('#share .status')?.textContent ?? ''), pattern.source);
  return (await line.textContent()).trim();
}

/** The alerts the share panel shows about storage. */
function alerts(page) {
  return page.$$eval('#share p.error[role=alert]', (els) => els.map((e) => e.textContent.trim()));
}

/** Every stored key starting with `prefix`, with its text. */
function storedWith(page, prefix) {
  return page.evaluate((p) => Object.fromEntries(Object.keys(localStorage).filter((k) => k.startsWith(p)).map((k) => [k, localStorage.getItem(k)])), prefix);
}

/** The stored library, parsed. */
async function storedLibrary(page) {
  const text = await page.evaluate((k) => localStorage.getItem(k), KEY);
  return text === null ? null : JSON.parse(text);
}

/** Every field of the scenario form, by id. */
function fields(page) {
  return page.$$eval('form.inputs input, form.inputs select', (els) => Object.fromEntries(els.map((e) => [e.id, e.value])));
}

/**
 * Saves the current scenario under `name` (empty: the scenario's own name) and returns the status
 * line once it reads `expected`.
 */
async function save(page, name, expected = /^Saved as “/) {
  await page.fill('#save-name', name);
  await page.click('#save-scenario');
  return status(page, expected);
}

/** The app is up: results rendered, no crash notice, no page errors. */
async function healthy(page) {
  await page.waitForSelector(RENDERED);
  assert.equal(await page.isHidden('#crash-notice'), true, 'the crash notice is shown');
  assert.deepEqual(page.errors, [], 'errors in the page');
}

test('save, reload, change, open: the saved scenario comes back exactly', async () => {
  const page = await app.open(SURVEY);
  assert.equal(await page.locator('#share li.saved').count(), 0);
  assert.equal(await save(page, 'Ridge A'), 'Saved as “Ridge A”.');
  const savedQuery = new URL(page.url()).search.slice(1);
  const savedFields = await fields(page);
  const lib = await storedLibrary(page);
  assert.equal(lib.format, 'sharpfield-scenarios');
  assert.equal(lib.version, 1);
  assert.deepEqual(lib.scenarios.map((s) => [s.name, s.query]), [['Ridge A', savedQuery]]);
  assert.ok(!Number.isNaN(Date.parse(lib.scenarios[0].saved)), 'no save date');

  // Saved with no name typed: the scenario's own name.
  assert.equal(await save(page, ''), 'Saved as “Library survey”.');

  await page.reload();
  await page.waitForSelector(RENDERED);
  assert.deepEqual(await names(page), ['Ridge A', 'Library survey']);

  await typeInto(page, '#in-h', '250');
  await page.selectOption('#air-preset', 'hv57');
  await page.waitForFunction(() => new URLSearchParams(location.search).get('air') === 'hv57');
  assert.notDeepEqual(await fields(page), savedFields);
  await row(page, 'Ridge A').locator('button.open').click();
  assert.equal(await status(page, /^Opened/), 'Opened “Ridge A”.');
  await page.waitForFunction((q) => location.search === `?${q}`, savedQuery);
  assert.deepEqual(await fields(page), savedFields, 'opening did not restore the fields');
  await healthy(page);
  await page.context().close();
});

test('rename, duplicate and delete keep names unique; delete asks for confirmation', async () => {
  const page = await app.open(SURVEY);
  await save(page, 'Alpha');
  await typeInto(page, '#in-h', '95');
  await page.waitForFunction(() => new URLSearchParams(location.search).get('h') === '95');
  await save(page, 'Beta');
  assert.equal(await save(page, 'Alpha'), 'Saved as “Alpha (2)”.', 'a second "Alpha" was not renamed');

  // Rename "Alpha (2)" to a name in use: it gets a unique one.
  await row(page, 'Alpha (2)').locator('button.rename-start').click();
  const input = page.locator('#share li.saved form.rename input');
  await input.fill('Beta');
  await page.locator('#share li.saved form.rename button[type=submit]').click();
  assert.equal(await status(page, /^Renamed/), 'Renamed to “Beta (2)”.');
  await row(page, 'Alpha (2)').waitFor({ state: 'detached' });
  // And to a free name, exactly as typed.
  await row(page, 'Beta (2)').locator('button.rename-start').click();
  await input.fill('Gamma east');
  await page.locator('#share li.saved form.rename button[type=submit]').click();
  assert.equal(await status(page, /^Renamed/), 'Renamed to “Gamma east”.');

  await row(page, 'Alpha').locator('button.duplicate').click();
  assert.equal(await status(page, /^Duplicated/), 'Duplicated as “Alpha (copy)”.');
  await row(page, 'Alpha').locator('button.duplicate').click();
  assert.equal(await status(page, /^Duplicated/), 'Duplicated as “Alpha (copy) (2)”.');
  const listed = await names(page);
  assert.deepEqual(listed, ['Alpha', 'Beta', 'Gamma east', 'Alpha (copy)', 'Alpha (copy) (2)']);
  const lib = await storedLibrary(page);
  assert.deepEqual(lib.scenarios.map((s) => s.name), listed, 'storage differs from the list');
  const query = (name) => lib.scenarios.find((s) => s.name === name).query;
  assert.equal(query('Alpha (copy)'), query('Alpha'), 'the duplicate holds another scenario');
  assert.notEqual(query('Beta'), query('Alpha'));

  // Delete: the first click only asks.
  await row(page, 'Beta').locator('button.delete').click();
  assert.equal((await row(page, 'Beta').locator('button.delete').textContent()).trim(), 'Confirm delete');
  assert.deepEqual(await names(page), listed, 'deleted without confirmation');
  assert.equal((await storedLibrary(page)).scenarios.length, listed.length);
  await row(page, 'Beta').locator('button.delete').click();
  assert.equal(await status(page, /^Deleted/), 'Deleted “Beta”.');
  const left = listed.filter((n) => n !== 'Beta');
  assert.deepEqual(await names(page), left);
  await page.reload();
  await page.waitForSelector(RENDERED);
  assert.deepEqual(await names(page), left, 'the deletion was not stored');
  await healthy(page);
  await page.context().close();
});

test('export all to a JSON file, import it back: every scenario, unique names, same queries', async () => {
  const page = await app.open(SURVEY);
  await save(page, 'Field one');
  await typeInto(page, '#in-h', '60');
  await page.waitForFunction(() => new URLSearchParams(location.search).get('h') === '60');
  await save(page, 'Field two');
  const [download] = await Promise.all([page.waitForEvent('download'), page.click('#export-scenarios')]);
  assert.match(download.suggestedFilename(), /\.json$/);
  const file = artifact('library-export.json');
  await download.saveAs(file);
  const exported = JSON.parse(readFileSync(file, 'utf8'));
  assert.equal(exported.format, 'sharpfield-scenarios');
  assert.equal(exported.version, 1);
  assert.deepEqual(exported.scenarios, (await storedLibrary(page)).scenarios, 'the file differs from what is stored');
  assert.deepEqual(exported.scenarios.map((s) => s.name), ['Field one', 'Field two']);

  // Imported into the same browser: added beside the originals under new names.
  await page.setInputFiles('#import-scenarios', file);
  assert.equal(await status(page, /^Imported/), 'Imported 2 scenario(s).');
  const listed = await names(page);
  assert.deepEqual(listed, ['Field one', 'Field two', 'Field one (2)', 'Field two (2)']);
  const lib = await storedLibrary(page);
  assert.equal(new Set(lib.scenarios.map((s) => s.id)).size, 4, 'ids are not unique');
  const query = (name) => lib.scenarios.find((s) => s.name === name).query;
  assert.equal(query('Field one (2)'), query('Field one'));
  assert.equal(query('Field two (2)'), query('Field two'));

  // Imported on another device (a fresh browser context): the same names, and each opens.
  const other = await app.open('');
  await other.setInputFiles('#import-scenarios', file);
  assert.equal(await status(other, /^Imported/), 'Imported 2 scenario(s).');
  assert.deepEqual(await names(other), ['Field one', 'Field two']);
  await row(other, 'Field two').locator('button.open').click();
  await other.waitForFunction((q) => location.search === `?${q}`, query('Field two'));
  assert.equal(await other.inputValue('#in-h'), '60');
  await healthy(other);
  await other.context().close();

  // A file with one good and one unreadable entry: the good one comes in, the person is told.
  const mixed = artifact('library-mixed.json');
  writeFileSync(mixed, JSON.stringify({ format: 'sharpfield-scenarios', version: 1, scenarios: [exported.scenarios[0], { nonsense: true }] }));
  await page.setInputFiles('#import-scenarios', mixed);
  const message = await status(page, /^Imported 1 /);
  assert.match(message, /1 part\(s\) of the file could not be read and were not imported; the file itself is unchanged/);
  assert.deepEqual(await names(page), [...listed, 'Field one (3)']);
  // Text that is no JSON at all: nothing added, no crash.
  const junk = artifact('library-junk.json');
  writeFileSync(junk, 'this is not { json');
  await page.setInputFiles('#import-scenarios', junk);
  assert.match(await status(page, /^Imported 0 /), /could not be read/);
  assert.equal((await names(page)).length, listed.length + 1);
  await healthy(page);
  await page.context().close();
});

/** Opens the app with `text` stored under the library key before the page loads. */
async function openWithStored(text, query = SURVEY) {
  const page = await app.open(query);
  await page.evaluate(([k, t]) => { localStorage.clear(); localStorage.setItem(k, t); }, [KEY, text]);
  await page.reload();
  await page.waitForSelector(RENDERED);
  return page;
}

test('corrupt storage: the app opens, says so, keeps the text aside unchanged, and saving works again', async () => {
  const corrupt = '{"format":"sharpfield-scenarios","version":1,"scenarios":[{"name":"Lost?","query":"h=5"';
  const page = await openWithStored(corrupt);
  await healthy(page);
  const aside = await storedWith(page, ASIDE);
  const keys = Object.keys(aside);
  assert.equal(keys.length, 1, `kept-aside keys: ${keys}`);
  assert.equal(aside[keys[0]], corrupt, 'the kept-aside text is not the stored text');
  const told = await alerts(page);
  assert.ok(told.some((m) => /could not be read/.test(m)), `not told: ${told}`);
  assert.ok(told.some((m) => m.includes(keys[0])), 'the person is not told where the text was kept');

  // Opened again before anything is saved: told again, but no second copy piles up in storage.
  await page.reload();
  await healthy(page);
  assert.deepEqual(await storedWith(page, ASIDE), aside, 'reopening kept the same text aside again');
  assert.ok((await alerts(page)).some((m) => m.includes(keys[0])), 'on reopening, the person is not told');

  await save(page, 'Fresh start');
  assert.deepEqual((await storedLibrary(page)).scenarios.map((s) => s.name), ['Fresh start']);
  assert.deepEqual(await storedWith(page, ASIDE), aside, 'saving touched the kept-aside text');
  await healthy(page);
  await page.context().close();
});

test('an older, looser format (a bare list): readable entries load, the others are kept aside', async () => {
  const older = JSON.stringify([
    { name: 'Old east block', query: `${SURVEY.replace('h=80', 'h=45')}` },
    { nonsense: true },
    42,
  ]);
  const page = await openWithStored(older);
  await healthy(page);
  assert.deepEqual(await names(page), ['Old east block']);
  const aside = Object.values(await storedWith(page, ASIDE)).sort();
  assert.deepEqual(aside, ['42', '{"nonsense":true}'], 'the unreadable entries were not kept aside as they were');
  assert.ok((await alerts(page)).some((m) => /2 saved scenario\(s\) could not be read/.test(m)));
  await row(page, 'Old east block').locator('button.open').click();
  await page.waitForFunction(() => new URLSearchParams(location.search).get('h') === '45');
  assert.equal(await page.inputValue('#in-h'), '45');
  // Saving writes the current format, keeping the old entry.
  await save(page, 'New');
  const lib = await storedLibrary(page);
  assert.equal(lib.version, 1);
  assert.deepEqual(lib.scenarios.map((s) => s.name), ['Old east block', 'New']);
  await page.context().close();
});

test('a newer version in storage is left untouched, even when saving', async () => {
  const newer = JSON.stringify({ format: 'sharpfield-scenarios', version: 2, scenarios: [{ title: 'From the future', link: 'h=9' }] });
  const page = await openWithStored(newer);
  await healthy(page);
  assert.ok((await alerts(page)).some((m) => /newer version/.test(m)), 'the person is not told');
  assert.deepEqual(Object.values(await storedWith(page, ASIDE)), [newer], 'no copy kept aside');
  const message = await save(page, 'Today');
  assert.match(message, /not stored/);
  assert.deepEqual(await names(page), ['Today'], 'the scenario is not kept for this session');
  assert.equal(await page.evaluate((k) => localStorage.getItem(k), KEY), newer, 'the newer text was overwritten');
  await page.reload();
  await page.waitForSelector(RENDERED);
  assert.equal(await page.evaluate((k) => localStorage.getItem(k), KEY), newer);
  await healthy(page);
  await page.context().close();
});

test('storage disabled: the app opens and says saving is unavailable; a save is kept for the session', async () => {
  const page = await openPage(app.browser, `${app.origin}/?${SURVEY}`, {
    init: [() => {
      Object.defineProperty(window, 'localStorage', {
        configurable: true,
        get() { throw new DOMException('Access is denied for this document.', 'SecurityError'); },
      });
    }],
  });
  await healthy(page);
  const told = await alerts(page);
  assert.ok(told.some((m) => /does not let the page store data/.test(m) && /export them to a file/.test(m)), `not told: ${told}`);
  assert.match(await save(page, 'Session only'), /not stored/);
  assert.deepEqual(await names(page), ['Session only']);
  // Export still works, so nothing need be lost.
  const [download] = await Promise.all([page.waitForEvent('download'), page.click('#export-scenarios')]);
  const file = artifact('library-no-storage.json');
  await download.saveAs(file);
  assert.deepEqual(JSON.parse(readFileSync(file, 'utf8')).scenarios.map((s) => s.name), ['Session only']);
  await healthy(page);
  await page.context().close();
});

test('storage full: saving says so clearly, keeps the scenario for the session, no crash', async () => {
  const page = await openPage(app.browser, `${app.origin}/?${SURVEY}`, {
    init: [() => {
      Storage.prototype.setItem = function full() { throw new DOMException('The quota has been exceeded.', 'QuotaExceededError'); };
    }],
  });
  await healthy(page);
  assert.deepEqual(await alerts(page), [], 'a warning before anything went wrong');
  const message = await save(page, 'Too much', /refused/);
  assert.match(message, /storage may be full/);
  assert.match(message, /export/);
  assert.deepEqual(await names(page), ['Too much']);
  assert.equal(await page.evaluate((k) => localStorage.getItem(k), KEY), null);
  await healthy(page);
  await page.context().close();
});

test('storage full while corrupt text must be kept aside: saving is turned off and the text survives', async () => {
  const corrupt = 'not json at all [';
  const page = await openPage(app.browser, `${app.origin}/?${SURVEY}`, {
    init: [`(() => {
      const set = Storage.prototype.setItem;
      set.call(localStorage, ${JSON.stringify(KEY)}, ${JSON.stringify(corrupt)});
      Storage.prototype.setItem = function full() { throw new DOMException('The quota has been exceeded.', 'QuotaExceededError'); };
    })()`],
  });
  await healthy(page);
  const told = await alerts(page);
  assert.ok(told.some((m) => /saving is off/.test(m)), `not told: ${told}`);
  assert.match(await save(page, 'Careful'), /not stored/);
  assert.equal(await page.evaluate((k) => localStorage.getItem(k), KEY), corrupt, 'the unreadable text was overwritten');
  await healthy(page);
  await page.context().close();
});
