// Imperial display: lengths are typed in feet or inches and speeds in mph, while the address and
// every data-si stay SI (url-and-report.md). Conversions use the international foot (0.3048 m)
// and inch (0.0254 m) and the statute mile (1609.344 m), exact by definition.
import { after, before, test } from 'node:test';
import assert from 'node:assert/strict';
import { displayed, mismatches, report, start, typeInto } from './helpers.mjs';

let app;
before(async () => { app = await start(); });
after(() => app?.close());

/** Waits until the address carries key=value. */
async function addressHas(page, key, value) {
  await page.waitForFunction(([k, v]) => new URLSearchParams(location.search).get(k) === v, [key, value]);
}

async function showsReport(page) {
  const query = new URL(page.url()).search.slice(1);
  assert.deepEqual(mismatches((await displayed(page)).filter((s) => s.si !== null), report(query)), []);
  assert.equal(await page.isHidden('#crash-notice'), true);
}

test('switching to imperial converts the fields, not the scenario', async () => {
  const page = await app.open('');
  assert.equal(await page.inputValue('#in-h'), '80');
  await page.selectOption('#units', 'imperial');
  await addressHas(page, 'units', 'imperial');
  await page.waitForFunction(() => document.querySelector('#in-h').value === '262.467');
  assert.match(await page.textContent('label[for=in-h]'), /\(ft\)/);
  assert.match(await page.textContent('label[for=in-need]'), /\(in\)/);
  assert.match(await page.textContent('label[for=in-speed]'), /\(mph\)/);
  assert.equal(new URL(page.url()).searchParams.get('h'), '80', 'the address stays in metres');
  await showsReport(page);
  await page.context().close();
});

test('typing feet and mph stores metres and m/s; half-typed and bad text stay as typed', async () => {
  const page = await app.open('units=imperial&sw=13.2&sh=8.8&cols=5472&rows=3648&focal=8.8&fnum=4&h=80&speed=8');
  await typeInto(page, '#in-h', '400');
  await addressHas(page, 'h', '121.92');
  await showsReport(page);
  assert.equal(await page.locator('#cautions [data-caution=height]').count(), 1, '400 ft is above the 120 m note');
  assert.match(await page.textContent('.field:has(#in-h) .hint'), /= 122 m/);

  await typeInto(page, '#in-speed', '60');
  await addressHas(page, 'speed', '26.8224');

  await typeInto(page, '#in-h', '1.');
  await addressHas(page, 'h', '0.3048');
  assert.equal(await page.inputValue('#in-h'), '1.', 'the field keeps "1." while typing');

  await typeInto(page, '#in-h', 'abc');
  await addressHas(page, 'h', 'abc');
  const error = page.locator('.field:has(#in-h) .error');
  await error.waitFor();
  assert.match(await error.textContent(), /from 0\.1 to 20000 m.*In ft: from 0\.328 to 65617 ft/);
  assert.equal(await page.inputValue('#in-h'), 'abc');
  await showsReport(page);
  await page.context().close();
});
