// The planner screen opened from a link: what it shows must be what the report computes for the
// same query (every `[data-key]` element's data-si against the report field of that name), with
// no query it shows the demo, a name full of markup stays text, and nothing leaves the origin.
import { after, before, test } from 'node:test';
import assert from 'node:assert/strict';
import { displayed, mismatches, report, reports, start } from './helpers.mjs';

// Scenarios of different kinds, each as a person would share it.
const CAMERA_1_TYPE = 'sw=13.2&sh=8.8&cols=5472&rows=3648&focal=8.8&fnum=4';
const QUERIES = {
  'drone looking straight down': `v=1&name=Nadir+survey&${CAMERA_1_TYPE}&wl=550&h=100&gd=0&air=none&speed=10&shutter=1%2F1000&aw=300&al=500&fo=75&so=65&need=0.03&tdim=0.75`,
  'drone tilted 35°': `v=1&name=Tilted&${CAMERA_1_TYPE}&wl=550&h=60&tilt=35&air=slc-day&speed=5&shutter=0.002&need=0.05`,
  'mast camera 1.5 km from the target, power-law air': 'v=1&name=Mast&sw=6.17&sh=4.55&cols=4000&rows=3000&focal=100&fnum=4&wl=550&h=8&gd=1500&air=power&cn2=1e-13&cexp=-1.333&speed=0&shutter=0.002&need=0.1&tdim=0.75',
  'thermal camera, Hufnagel–Valley air': 'v=1&name=Thermal&sw=7.68&sh=6.144&cols=640&rows=512&focal=19&fnum=1.1&wl=10000&h=120&air=hv57&speed=12&shutter=0.008&tdim=2.3',
  'imperial display units (data-si stays SI)': `v=1&${CAMERA_1_TYPE}&h=50&gd=0&air=slc-night&speed=3&shutter=0.0005&units=imperial&aw=100&al=100`,
  'bad values among good ones': `v=1&${CAMERA_1_TYPE}&focal=abc&fnum=0&h=90&air=hv57&speed=7&shutter=0.001`,
};

let app;
let expected;
before(async () => {
  app = await start();
  const names = Object.keys(QUERIES);
  const reps = reports(names.map((n) => QUERIES[n]));
  expected = Object.fromEntries(names.map((n, i) => [n, reps[i]]));
});
after(() => app?.close());

for (const [name, query] of Object.entries(QUERIES)) {
  test(`shown figures equal the report: ${name}`, async () => {
    const page = await app.open(query);
    const shown = await displayed(page);
    const rep = expected[name];
    // Every limit and the governing one are on screen; then each shown figure must match.
    for (const key of ['limit_m', 'governing', 'gsd_m', 'diffraction_m', 'turbulence_m', 'motion_m', 'slant_range_m']) {
      assert.ok(shown.some((s) => s.key === key), `${key} is not shown`);
    }
    const wrong = mismatches(shown.filter((s) => s.si !== null), rep);
    assert.deepEqual(wrong, [], `figures differing from the report for ${query}`);
    // Each rejected value's message (naming the accepted range) is shown beside its field.
    for (const { key, message } of rep.errors) {
      const beside = page.locator(`#err-${key}`);
      if ((await beside.count()) > 0) assert.equal((await beside.textContent()).trim(), message);
    }
    assert.equal(await page.isHidden('#crash-notice'), true, 'the crash notice is shown');
    assert.deepEqual(page.errors, [], 'errors in the page');
    await page.context().close();
  });
}

test('every displayed [data-key] element carries data-si (contract: url-and-report.md)', async () => {
  const page = await app.open(QUERIES['drone looking straight down']);
  const missing = (await displayed(page)).filter((s) => s.si === null).map((s) => s.key);
  assert.deepEqual(missing, [], 'elements with data-key but no data-si');
  await page.context().close();
});

test('the bad-values scenario names each bad value and still shows the rest', () => {
  // A guard on the scenario above: it must really carry rejected values, or it tests nothing.
  const rep = expected['bad values among good ones'];
  assert.deepEqual(rep.errors.map((e) => e.key).sort(), ['fnum', 'focal']);
  assert.ok(Number.isFinite(rep.limit_m) && rep.limit_m > 0);
});

test('opened with no query, the page shows the demo scenario', async () => {
  const page = await app.open('');
  const name = await page.inputValue('#in-name');
  assert.match(name, /Hollow Creek pasture survey/);
  assert.match(await page.textContent('.summary'), /Hollow Creek pasture survey/);
  // The address now carries the demo, and the figures are the report's for that address.
  const query = new URL(page.url()).search.slice(1);
  assert.match(decodeURIComponent(query.replace(/\+/g, ' ')), /name=Hollow Creek pasture survey/);
  const wrong = mismatches((await displayed(page)).filter((s) => s.si !== null), report(query));
  assert.deepEqual(wrong, []);
  await page.context().close();
});

test('a scenario name full of markup is shown as text', async () => {
  const markup = '<img src=x onerror=alert(1)><b>x</b>';
  const dialogs = [];
  const page = await app.open(`${CAMERA_1_TYPE}&h=80&name=${encodeURIComponent(markup)}`);
  page.on('dialog', (d) => { dialogs.push(d.message()); d.dismiss(); });
  await page.waitForTimeout(200);
  assert.equal(await page.inputValue('#in-name'), markup);
  assert.ok((await page.textContent('.summary')).includes(markup), 'the summary shows the name as typed');
  const created = await page.evaluate(() => ({
    img: [...document.querySelectorAll('img')].filter((i) => i.getAttribute('src') === 'x').length,
    b: [...document.querySelectorAll('b')].filter((b) => b.textContent === 'x').length,
  }));
  assert.deepEqual(created, { img: 0, b: 0 }, 'elements created from the name');
  assert.deepEqual(dialogs, []);
  assert.ok(!app.server.requests.includes('/x'), 'the page fetched the img src');
  await page.context().close();
});

test('the page requests nothing from any other origin', async () => {
  for (const query of ['', QUERIES['mast camera 1.5 km from the target, power-law air']]) {
    const page = await app.open(query);
    // Work the page a little, so lazily loaded resources would show up too.
    await page.selectOption('#air-preset', 'hv57');
    await page.fill('#in-h', '150');
    await page.waitForTimeout(300);
    const requests = page.context().requests;
    assert.ok(requests.length >= 3, `only ${requests.length} requests seen: the listener is not working`);
    const foreign = requests.filter((u) => !u.startsWith(`${app.origin}/`) && !/^(data|blob):/.test(u));
    assert.deepEqual(foreign, [], 'requests to other origins');
    await page.context().close();
  }
});
