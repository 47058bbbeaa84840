// Light and exposure on the page, as a person would try it: a link with a date, time and place
// shows the sun, the light, the exposure used, the electrons and the SNR, and once typing pauses
// the day's good hours on a timeline and the best settings, every figure equal to the report of the
// same query; a bad date and time is named beside its field while the rest still computes; the
// best settings are applied only when asked, and the device's clock fills the date.
import { after, before, test } from 'node:test';
import assert from 'node:assert/strict';
import { artifact, displayed, mismatches, report, settled as caughtUp, start } from './helpers.mjs';

const LIT = 'v=1&name=Spring+pasture+check&sw=13.2&sh=8.8&cols=5472&rows=3648&focal=8.8&fnum=4&h=80&gd=0&speed=10'
  + '&need=0.05&aw=400&al=600&lat=-37.8&lon=145.2&when=2026-09-21T09%3A30%2B10%3A00&expmode=auto&fmin=2.8';

let app;
before(async () => { app = await start(); });
after(() => app?.close());

/** Waits until the day and the best settings shown belong to the scenario on screen. */
async function settled(page) {
  await page.waitForSelector('#light .extras[data-settled="true"]', { timeout: 15000 });
  await caughtUp(page);
}

test('a lit scenario shows the sun, light, exposure, day and best settings as the report does', async () => {
  const page = await app.open(LIT);
  await settled(page);
  const shown = await displayed(page);
  const rep = report(LIT);
  for (const key of ['sun_elevation_deg', 'illuminance_lx', 'ev100', 'exposure_s', 'target_e', 'snr', 'best.f_number', 'best.exposure_s', 'best.iso', 'best.resolved_m']) {
    assert.ok(shown.some((s) => s.key === key), `${key} is not shown`);
  }
  assert.deepEqual(mismatches(shown.filter((s) => s.si !== null), rep), []);
  const dayText = await page.locator('#light .extras').textContent();
  assert.ok(dayText.includes(`Sunrise ${rep.day.sunrise}`), dayText);
  for (const window of rep.day.windows) assert.ok(dayText.includes(window), `${window} in ${dayText}`);
  assert.equal(await page.locator('#light svg.day-line rect.good').count() > 0, true, 'good hours shaded');
  await page.locator('#light').screenshot({ path: artifact('light-panel.png') });
  assert.deepEqual(page.errors, []);
  await page.context().close();
});

test('a bad date and time is named beside its field, kept as typed, and the rest still computes', async () => {
  const page = await app.open(LIT);
  await page.fill('#in-when', '2026-02-30T10:00+01:00');
  await page.waitForSelector('#err-when');
  const message = (await page.locator('#err-when').textContent()).trim();
  assert.match(message, /^Date and time '2026-02-30T10:00\+01:00' is not a local date and time with its UTC offset, such as 2026-06-21T10:30\+02:00/);
  assert.equal(await page.inputValue('#in-when'), '2026-02-30T10:00+01:00');
  assert.ok(await page.locator('[data-key="limit_m"]').count() > 0, 'the limits are still shown');
  await caughtUp(page);
  assert.equal(await page.locator('[data-key="sun_elevation_deg"]').count(), 0, 'no sun without a valid time');
  assert.deepEqual(page.errors, []);
  await page.context().close();
});

test('the best settings are applied only when asked, and then the page follows them', async () => {
  const page = await app.open(LIT.replace('&expmode=auto', '&expmode=set&shutter=0.004'));
  await settled(page);
  const fnumBefore = await page.inputValue('#in-fnum');
  const best = Number(await page.locator('[data-key="best.f_number"]').getAttribute('data-si'));
  assert.equal(await page.inputValue('#in-fnum'), fnumBefore, 'nothing typed is overwritten before asking');
  await page.click('#apply-best');
  await page.waitForFunction((b) => Math.abs(Number(document.querySelector('#in-fnum').value) - b) < 0.01, best);
  assert.equal(await page.inputValue('#expmode'), 'auto');
  await caughtUp(page);
  const query = new URL(page.url()).search.slice(1);
  const rep = report(query);
  const shownExposure = Number(await page.locator('#light [data-key="exposure_s"]').getAttribute('data-si'));
  assert.ok(Math.abs(shownExposure - rep.exposure_s) <= 1e-9 * rep.exposure_s, `${shownExposure} vs ${rep.exposure_s}`);
  assert.ok(rep.metered);
  assert.deepEqual(page.errors, []);
  await page.context().close();
});

test("the device's clock fills the date and time with its offset", async () => {
  const page = await app.open('v=1&sw=13.2&sh=8.8&cols=5472&rows=3648&focal=8.8&fnum=4&h=80&lat=-37.8&lon=145.2');
  await page.click('#when-now');
  await page.waitForFunction(() => document.querySelector('#in-when').value !== '');
  const value = await page.inputValue('#in-when');
  assert.match(value, /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}[+-]\d{2}:\d{2}$/);
  assert.equal(await page.locator('#err-when').count(), 0);
  await page.waitForSelector('[data-key="sun_elevation_deg"]');
  assert.deepEqual(page.errors, []);
  await page.context().close();
});
