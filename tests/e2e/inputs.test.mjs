// Editing the scenario on the planner screen: results and chart follow each input, the address
// follows in place (no new history entry) and reloading it restores the scenario; bad values are
// named beside their field with the accepted range while everything else keeps working.
// After every change the figures on screen are checked against the report for the address the
// page then shows, so no expected number is written here.
import { after, before, test } from 'node:test';
import assert from 'node:assert/strict';
import { close, displayed, mismatches, report, settled, start, typeInto } from './helpers.mjs';

const NADIR = 'v=1&name=Edit+me&sw=13.2&sh=8.8&cols=5472&rows=3648&focal=8.8&fnum=4&wl=550&h=80&gd=0'
  + '&air=power&cn2=1e-13&cexp=-1.333&speed=8&shutter=0.001&need=0.03&tdim=0.75';

let app;
before(async () => { app = await start(); });
after(() => app?.close());

/** The value of `key` in the page's address. */
function param(page, key) {
  return new URL(page.url()).searchParams.get(key);
}

/** Waits until the address carries key=value (the app writes it after rendering). */
async function addressHas(page, key, value) {
  await page.waitForFunction(([k, v]) => new URLSearchParams(location.search).get(k) === v, [key, value]);
}

/** Asserts that every figure on screen equals the report for the page's current address. */
async function showsReportOfAddress(page) {
  const query = new URL(page.url()).search.slice(1);
  const wrong = mismatches((await displayed(page)).filter((s) => s.si !== null), report(query));
  assert.deepEqual(wrong, [], `figures differing from the report for ${query}`);
  assert.equal(await page.isHidden('#crash-notice'), true, 'the crash notice is shown');
}

/** What the on-screen chart draws: axis extent, plot box, the current marker and each series' path. */
async function chart(page) {
  await settled(page);
  return page.$eval('#chart svg.chart', (svg) => {
    const plot = svg.querySelector('rect.plot-bg');
    const current = svg.querySelector('g.marker[data-marker=current] line');
    const paths = {};
    for (const g of svg.querySelectorAll('g.series')) paths[[...g.classList].find((c) => c !== 'series')] = g.querySelector('path').getAttribute('d');
    return {
      title: document.querySelector('#chart h2').textContent,
      xMax: Number(svg.getAttribute('data-x-max')),
      left: Number(plot.getAttribute('x')),
      width: Number(plot.getAttribute('width')),
      current: current ? Number(current.getAttribute('x1')) : null,
      envelope: svg.querySelector('path.envelope').getAttribute('d'),
      paths,
    };
  });
}

/** Asserts that the current-position marker sits at `position` metres on the chart's x axis. */
function markerAt(c, position) {
  assert.notEqual(c.current, null, 'no current-position marker');
  const expected = c.left + c.width * Math.min(1, position / c.xMax);
  assert.ok(Math.abs(c.current - expected) < 0.5, `marker at x=${c.current}, expected ${expected} for ${position} m`);
}

test('typing a height updates results, chart and address in place; reload restores it', async () => {
  const page = await app.open(NADIR);
  const historyLength = await page.evaluate(() => history.length);
  const before = await chart(page);
  markerAt(before, 80);

  await typeInto(page, '#in-h', '150');
  await addressHas(page, 'h', '150');
  await showsReportOfAddress(page);
  assert.ok(close(Number(await page.getAttribute('[data-key=slant_range_m]', 'data-si')), 150), 'slant range is not the height');
  const moved = await chart(page);
  markerAt(moved, 150);
  assert.notEqual(moved.current, before.current, 'the current marker did not move');
  assert.equal(await page.evaluate(() => history.length), historyLength, 'editing added history entries');
  for (const key of ['sw', 'focal', 'air', 'need', 'name']) assert.equal(param(page, key), new URLSearchParams(NADIR).get(key), `${key} lost from the address`);

  const shownBefore = await displayed(page);
  await page.reload();
  await page.waitForSelector('[data-key="limit_m"]');
  assert.equal(await page.inputValue('#in-h'), '150');
  assert.equal(await page.inputValue('#in-name'), 'Edit me');
  assert.deepEqual(await displayed(page), shownBefore, 'reloading the address changed what is shown');
  assert.deepEqual(page.errors, []);
  await page.context().close();
});

test('choosing a sensor format updates the camera fields, the sampling line and the results', async () => {
  const page = await app.open(NADIR);
  const before = await chart(page);
  await page.selectOption('#camera-preset', 'aps-c');
  await addressHas(page, 'sw', '23.5');
  assert.equal(await page.inputValue('#in-sw'), '23.5');
  assert.equal(await page.inputValue('#in-cols'), '6000');
  assert.equal(await page.inputValue('#camera-preset'), 'aps-c');
  await showsReportOfAddress(page);
  const after = await chart(page);
  assert.notEqual(after.paths.sampling, before.paths.sampling, 'the sampling line did not change');
  await page.context().close();
});

test('choosing the air changes the turbulence line, r0 and the results', async () => {
  const page = await app.open(NADIR);
  const before = await chart(page);
  await page.selectOption('#air-preset', 'hv57');
  await addressHas(page, 'air', 'hv57');
  await showsReportOfAddress(page);
  const hv = await chart(page);
  assert.notEqual(hv.paths.turbulence, before.paths.turbulence, 'the turbulence line did not change');
  assert.ok(Number(await page.getAttribute('[data-key=r0_m]', 'data-si')) > 0);

  await page.selectOption('#air-preset', 'none');
  await addressHas(page, 'air', 'none');
  await showsReportOfAddress(page);
  assert.equal(await page.getAttribute('[data-key=r0_m]', 'data-si'), '', 'r0 shown without turbulence');
  assert.equal(Number(await page.getAttribute('[data-key=turbulence_m]', 'data-si')), 0);
  await page.context().close();
});

test('switching the view between straight down, tilted and a ground distance', async () => {
  const page = await app.open(NADIR);
  const down = await chart(page);

  await page.selectOption('#geometry-mode', 'tilt');
  await page.waitForSelector('#in-tilt');
  await addressHas(page, 'tilt', await page.inputValue('#in-tilt'));
  assert.equal(param(page, 'gd'), null, 'gd kept alongside tilt');
  await showsReportOfAddress(page);
  const look = Number(await page.getAttribute('[data-key=look_angle_deg]', 'data-si'));
  assert.ok(close(look, Number(param(page, 'tilt'))), `look angle ${look} for tilt ${param(page, 'tilt')}`);

  await page.selectOption('#geometry-mode', 'gd');
  await page.waitForSelector('#in-gd');
  await addressHas(page, 'gd', await page.inputValue('#in-gd'));
  assert.equal(param(page, 'tilt'), null, 'tilt kept alongside gd');
  await showsReportOfAddress(page);
  const across = await chart(page);
  assert.notEqual(across.title, down.title, 'the chart still plots against the same axis');
  markerAt(across, Number(param(page, 'gd')));
  await typeInto(page, '#in-gd', '2000');
  await addressHas(page, 'gd', '2000');
  await showsReportOfAddress(page);
  markerAt(await chart(page), 2000);

  await page.selectOption('#geometry-mode', 'down');
  await addressHas(page, 'gd', '0');
  assert.equal(await page.locator('#in-gd').count(), 0);
  await showsReportOfAddress(page);
  assert.equal(Number(await page.getAttribute('[data-key=look_angle_deg]', 'data-si')), 0);
  await page.context().close();
});

for (const [key, text] of [['focal', 'abc'], ['fnum', '0'], ['h', '-5']]) {
  test(`a bad value (${key}=${text}) is named beside its field with the accepted range`, async () => {
    const page = await app.open(NADIR);
    await typeInto(page, `#in-${key}`, text);
    await addressHas(page, key, text);
    const rep = report(new URL(page.url()).search.slice(1));
    const error = rep.errors.find((e) => e.key === key);
    assert.ok(error, `the report does not reject ${key}=${text}`);
    assert.match(error.message, /from -?[\d.e+-]+ to [\d.e+-]+/, 'the message names no range');
    const beside = page.locator(`.field:has(#in-${key}) .error`);
    assert.equal((await beside.textContent()).trim(), error.message);
    assert.equal(await beside.isVisible(), true);
    assert.equal(await page.getAttribute(`#in-${key}`, 'aria-invalid'), 'true');
    assert.equal(await page.inputValue(`#in-${key}`), text, 'the field lost what was typed');
    // Everything else is still computed and shown.
    await showsReportOfAddress(page);
    assert.ok(Number(await page.getAttribute('[data-key=limit_m]', 'data-si')) > 0);
    assert.ok((await page.locator('#chart svg.chart g.series path').count()) >= 4);

    // Correcting the value removes the message.
    await typeInto(page, `#in-${key}`, '12');
    await addressHas(page, key, '12');
    assert.equal(await page.locator(`.field:has(#in-${key}) .error`).count(), 0);
    assert.equal(await page.getAttribute(`#in-${key}`, 'aria-invalid'), 'false');
    await showsReportOfAddress(page);
    assert.deepEqual(page.errors, []);
    await page.context().close();
  });
}

test('a field keeps "1." while it is being typed', async () => {
  const page = await app.open(NADIR);
  await typeInto(page, '#in-focal', '1.');
  await addressHas(page, 'focal', '1.');
  assert.equal(await page.inputValue('#in-focal'), '1.');
  await showsReportOfAddress(page);
  await page.type('#in-focal', '5');
  await addressHas(page, 'focal', '1.5');
  assert.equal(await page.inputValue('#in-focal'), '1.5');
  await page.fill('#in-focal', '');
  await addressHas(page, 'focal', '');
  assert.equal(await page.inputValue('#in-focal'), '', 'an emptied field was refilled');
  assert.equal(await page.locator('.field:has(#in-focal) .error').count(), 1, 'an empty focal length is not named');
  await showsReportOfAddress(page);
  await page.context().close();
});
