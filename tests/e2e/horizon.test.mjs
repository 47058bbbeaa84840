// The round Earth on the page, as a person would try it (issue 13): a mast camera looking at a
// vehicle beyond the horizon is told plainly that it is not in view, with both distances, the
// chances are nil, the chart marks the horizon, and every figure equals the report of the same
// query; a taller target (its height typed in) comes back into view.
import { after, before, test } from 'node:test';
import assert from 'node:assert/strict';
import { artifact, displayed, mismatches, report, settled, start, typeInto } from './helpers.mjs';

const MAST = 'v=1&name=Ridge+mast&sw=6.17&sh=4.55&cols=4000&rows=3000&focal=100&fnum=4&wl=550&h=8&gd=20000&air=none&speed=0&tdim=2.3&need=0.5';

let app;
before(async () => { app = await start(); });
after(() => app?.close());

test('a target beyond the horizon is not in view, says so and has no chance', async () => {
  const page = await app.open(MAST);
  await settled(page);
  const rep = report(MAST);
  assert.equal(rep.visible, false);
  const shown = await displayed(page);
  assert.deepEqual(mismatches(shown.filter((s) => s.si !== null), rep), []);
  assert.ok(shown.some((s) => s.key === 'horizon_m'), 'the horizon is shown');
  assert.equal(await page.getAttribute('[data-key="visible"]', 'data-si'), 'false');
  const caution = await page.locator('#cautions').textContent();
  assert.match(caution, /below the horizon/);
  assert.match(caution, /20 km/);
  // The greatest range stops at the horizon, and the chart marks it.
  assert.equal(rep.reach.kind, 'horizon');
  assert.ok(await page.locator('#chart .marker.horizon').count() > 0, 'the chart marks the horizon');
  await page.locator('#group-geometry').screenshot({ path: artifact('horizon-geometry.png') });
  assert.deepEqual(page.errors, []);
  await page.context().close();
});

test('a taller target typed in comes back into view', async () => {
  const page = await app.open(MAST);
  await typeInto(page, '#in-tht', '12');
  await page.waitForFunction(() => new URLSearchParams(location.search).get('tht') === '12');
  await settled(page);
  const query = new URL(page.url()).search.slice(1);
  const rep = report(query);
  assert.equal(rep.visible, true);
  assert.equal(await page.locator('[data-key="visible"]').count(), 0, 'no longer said to be out of view');
  const caution = await page.locator('#cautions').textContent();
  assert.doesNotMatch(caution, /below the horizon/);
  assert.deepEqual(mismatches((await displayed(page)).filter((s) => s.si !== null), rep), []);
  assert.deepEqual(page.errors, []);
  await page.context().close();
});
