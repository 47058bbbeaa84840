// The survey panel on the built page: the figures equal the report's, the diagram draws the lines
// the plan counts, the GeoJSON download is RFC 7946 and matches the plan, bad survey inputs are
// named beside their field, and a speed above a limit is flagged with what to change.
import { after, before, test } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync } from 'node:fs';
import { displayed, mismatches, report, start, typeInto } from './helpers.mjs';

const FIELD = 'v=1&name=North+paddock&sw=13.2&sh=8.8&cols=5472&rows=3648&focal=8.8&fnum=4&h=80&gd=0'
  + '&speed=8&shutter=0.001&aw=400&al=600&fo=75&so=65&trig=2&endur=25&turn=10&mb=10'
  + '&lat=-36.85&lon=146.29&hdg=30';

let app;
before(async () => { app = await start(); });
after(() => app?.close());

/** Asserts the page shows the report of its current address and did not crash. */
async function showsReport(page) {
  const query = new URL(page.url()).search.slice(1);
  const rep = report(query);
  assert.deepEqual(mismatches((await displayed(page)).filter((s) => s.si !== null), rep), []);
  assert.equal(await page.isHidden('#crash-notice'), true);
  return rep;
}

test('survey figures and the diagram follow the plan', async () => {
  const page = await app.open(FIELD);
  const rep = await showsReport(page);
  assert.ok(rep.lines > 1 && rep.photos > rep.lines, 'the field needs several lines and photos');
  for (const key of ['footprint_across_m', 'base_m', 'line_spacing_m', 'trigger_s', 'lines', 'photos', 'flight_time_s', 'batteries']) {
    assert.equal(await page.locator(`#survey [data-key=${key}]`).count(), 1, `${key} is shown in the survey panel`);
  }
  const drawn = await page.locator('#survey svg.survey-map g.flight-line').count();
  assert.equal(drawn, Math.min(rep.lines, 60), 'one drawn line per flight line (at most 60)');
  assert.equal(await page.locator('#survey svg.survey-map circle.start').count(), 1, 'the start is marked');
  assert.equal(await page.locator('#survey svg.survey-map rect.end').count(), 1, 'the end is marked');
  assert.ok(await page.locator('#survey svg.survey-map rect.footprint').count() >= 2, 'first footprints drawn');
  // Directions alternate: line 1 runs along the area, line 2 back (serpentine order).
  const ys = await page.$$eval('#survey g.flight-line line', (ls) => ls.slice(0, 2).map((l) => [Number(l.getAttribute('y1')), Number(l.getAttribute('y2'))]));
  assert.ok(ys[0][1] > ys[0][0] && ys[1][1] < ys[1][0], `lines 1 and 2 run in opposite directions: ${JSON.stringify(ys)}`);
  await page.context().close();
});

test('the GeoJSON download is a FeatureCollection of the area and every flight line', async () => {
  const page = await app.open(FIELD);
  const rep = report(new URL(page.url()).search.slice(1));
  const [download] = await Promise.all([
    page.waitForEvent('download'),
    page.click('#survey .export button'),
  ]);
  assert.match(download.suggestedFilename(), /^north-paddock\.geojson$/);
  const geo = JSON.parse(readFileSync(await download.path(), 'utf8'));
  assert.equal(geo.type, 'FeatureCollection');
  const polygons = geo.features.filter((f) => f.geometry.type === 'Polygon');
  const lines = geo.features.filter((f) => f.geometry.type === 'LineString');
  assert.equal(polygons.length, 1);
  assert.equal(lines.length, rep.lines);
  const ring = polygons[0].geometry.coordinates[0];
  assert.deepEqual(ring[0], ring[ring.length - 1], 'the ring is closed (RFC 7946 §3.1.6)');
  // Counter-clockwise outer ring (RFC 7946 §3.1.6): positive shoelace area in lon/lat.
  let twice = 0;
  for (let i = 0; i + 1 < ring.length; i++) twice += ring[i][0] * ring[i + 1][1] - ring[i + 1][0] * ring[i][1];
  assert.ok(twice > 0, 'the outer ring is counter-clockwise');
  // [longitude, latitude] order near the origin given in the link.
  for (const [lon, lat] of ring) {
    assert.ok(Math.abs(lon - 146.29) < 0.05 && Math.abs(lat + 36.85) < 0.05, `${lon},${lat} is near the origin`);
  }
  await page.context().close();
});

test('the export is built by an on-demand module: not loaded with the page, loaded on the first export', async () => {
  // No service worker here, so that every file the page asks for shows as its own request.
  const context = await app.browser.newContext({ serviceWorkers: 'block', acceptDownloads: true });
  const requested = [];
  context.on('request', (r) => requested.push(new URL(r.url()).pathname));
  const page = await context.newPage();
  const errors = [];
  page.on('pageerror', (e) => errors.push(String(e)));
  await page.goto(`${app.origin}/?${FIELD}`);
  await page.waitForSelector('[data-key="limit_m"]');
  const module = (paths) => paths.filter((p) => p.includes('sharpfield-export'));
  assert.deepEqual(module(requested), [], 'the export module came with the first load');
  const [download] = await Promise.all([page.waitForEvent('download'), page.click('#survey .export button')]);
  assert.match(download.suggestedFilename(), /\.geojson$/);
  assert.deepEqual(module(requested).sort(), ['/sharpfield-export.js', '/sharpfield-export_bg.wasm', '/sharpfield-export_loader.js']);
  // A second export asks the module already loaded.
  const before = requested.length;
  const [again] = await Promise.all([page.waitForEvent('download'), page.click('#survey .export button')]);
  assert.equal(JSON.parse(readFileSync(await again.path(), 'utf8')).type, 'FeatureCollection');
  assert.deepEqual(module(requested.slice(before)), [], 'the module was loaded twice');
  assert.deepEqual(errors, []);
  await context.close();
});

test('an area the export cannot write says why after the export is asked for, and the page goes on', async () => {
  // Across the 180° meridian: only the geodesics of the export find it.
  const page = await app.open(FIELD.replace(/lon=[^&]*/, 'lon=179.999'));
  await page.click('#survey .export button');
  await page.waitForFunction(() => /180° meridian/.test(document.querySelector('#survey .export')?.textContent ?? ''));
  assert.deepEqual(page.errors, []);
  await page.context().close();
});

test('bad survey inputs are named beside their field; nothing crashes', async () => {
  const page = await app.open(FIELD);
  const cases = [
    ['#in-fo', '100', /Front overlap .*from 0 to 95 %/],
    ['#in-so', '-5', /Side overlap .*from 0 to 95 %/],
    ['#in-aw', '0', /Area width .*from 1 to 100000 m/],
  ];
  for (const [selector, text, message] of cases) {
    await typeInto(page, selector, text);
    // The address follows within a fifth of a second; compare the page with the report only then.
    await page.waitForFunction(([k, v]) => new URLSearchParams(location.search).get(k) === v, [selector.slice(4), text]);
    const field = page.locator(`.field:has(${selector})`);
    await field.locator('.error').waitFor();
    assert.match(await field.locator('.error').textContent(), message);
    assert.equal(await page.isHidden('#crash-notice'), true);
  }
  await showsReport(page);
  await page.context().close();
});

test('zero speed leaves the timing blank with a note; a speed over the blur limit is flagged', async () => {
  const still = await app.open(FIELD.replace('speed=8', 'speed=0'));
  const rep = await showsReport(still);
  assert.equal(rep.trigger_s, null);
  assert.equal(await still.getAttribute('#survey [data-key=trigger_s]', 'data-si'), '');
  assert.ok((await still.locator('#survey .note').count()) > 0, 'a note says why the timing is missing');
  await still.context().close();

  const fast = await app.open(FIELD.replace('speed=8', 'speed=30').replace('shutter=0.001', 'shutter=0.01'));
  const fastReport = await showsReport(fast);
  assert.ok(fastReport.speed_flags.some((f) => f.code === 'blur'));
  const flag = fast.locator('#survey .flag[data-flag=blur]');
  assert.equal(await flag.count(), 1);
  assert.match(await flag.textContent(), /shutter|slow/i, 'the flag says what to change');
  await fast.context().close();
});

test('the survey origin can be taken from the device position; a refusal is said, not a crash', async () => {
  const context = await app.browser.newContext({
    permissions: ['geolocation'],
    geolocation: { latitude: -35.123456789, longitude: 149.987654321 },
  });
  const page = await context.newPage();
  await page.goto(`${app.origin}/?${FIELD}`);
  await page.waitForSelector('[data-key="limit_m"]');
  await page.click('#locate');
  // Rounded to six decimal places (about 0.1 m).
  await page.waitForFunction(() => new URLSearchParams(location.search).get('lat') === '-35.123457');
  assert.equal(new URL(page.url()).searchParams.get('lon'), '149.987654');
  assert.equal(await page.inputValue('#in-lat'), '-35.123457');
  await context.close();

  const refused = await app.browser.newContext();
  const other = await refused.newPage();
  const errors = [];
  other.on('pageerror', (e) => errors.push(String(e)));
  await other.goto(`${app.origin}/?${FIELD}`);
  await other.waitForSelector('[data-key="limit_m"]');
  await other.click('#locate');
  await other.waitForFunction(() => /not available|cannot tell/.test(document.querySelector('.locate .note')?.textContent ?? ''));
  assert.equal(new URL(other.url()).searchParams.get('lat'), '-36.85', 'a refusal leaves the origin as it was');
  assert.equal(await other.isHidden('#crash-notice'), true);
  assert.deepEqual(errors, []);
  await refused.close();
});

test('relief, wind and the block edges: typed in, shown as the report gives them, drawn and warned of', async () => {
  const page = await app.open(FIELD);
  // The edges with no relief or wind: the extra photos beyond each end and the margin drawn.
  let rep = await showsReport(page);
  assert.equal(rep.extra_photos_per_end, 2);
  assert.equal(await page.locator('#survey [data-key=extra_photos_per_end]').textContent(), '2');
  assert.equal(await page.locator('#survey svg.survey-map rect.margin').count(), 1, 'the full-overlap margin is drawn');
  assert.equal(await page.locator('#survey [data-key=gsd_min_m]').count(), 0, 'no relief figures without a relief');
  // A 20 m hill: the least overlaps fall and a warning says what restores them.
  await typeInto(page, '#in-relief', '-5,20');
  await page.waitForFunction(() => new URLSearchParams(location.search).get('relief') === '-5,20');
  await page.locator('#survey [data-key=front_min_pct]').waitFor();
  rep = await showsReport(page);
  assert.ok(rep.front_min_pct < 75 && rep.side_min_pct < 65, `${rep.front_min_pct} / ${rep.side_min_pct}`);
  const notes = await page.locator('#survey .note').allTextContents();
  assert.ok(notes.some((n) => /side overlap falls from 65 % .* Fly at 100 m above take-off/.test(n)), notes.join('\n'));
  // A wind from the north-north-east: the legs' ground speeds and the crab angle.
  await typeInto(page, '#in-wind', '5');
  await typeInto(page, '#in-wdir', '30');
  await page.waitForFunction(() => new URLSearchParams(location.search).get('wdir') === '30');
  await page.locator('#survey [data-key=crab_deg]').waitFor();
  rep = await showsReport(page);
  assert.ok(rep.ground_speed_out_mps < 8 && rep.ground_speed_back_mps > 8, 'a headwind out, a tailwind back');
  // The print sheet carries the wind and the relief.
  await page.locator('main[data-settled="true"]').waitFor();
  const sheet = await page.locator('.print-sheet').textContent();
  assert.match(sheet, /Wind, ground speeds/);
  assert.match(sheet, /Relief.*least overlap/);
  // A span that is not two numbers is named beside its field with what it takes; nothing else is lost.
  await typeInto(page, '#in-relief', '20');
  const field = page.locator('.field:has(#in-relief)');
  await field.locator('.error').waitFor();
  assert.match(await field.locator('.error').textContent(), /Ground height under the block .*two numbers from -10000 to 10000/);
  assert.equal(await page.inputValue('#in-wind'), '5');
  assert.equal(await page.isHidden('#crash-notice'), true);
  await page.context().close();
});

// A 400 m square paddock with a dam in it (a hole), as `lon lat` points: the same shape the
// native tests work by hand (tests/field.rs), placed near the origin used above.
const PADDOCK = '146.29 -36.85,146.294486 -36.85,146.294486 -36.846396,146.29 -36.846396'
  + ';146.291346 -36.848919,146.293140 -36.848919,146.293140 -36.847477,146.291346 -36.847477';

test('a boundary typed in: lines, photos and time over it from the on-demand module, drawn, and shown as the report gives them', async () => {
  const page = await app.open(FIELD);
  const requested = [];
  page.on('request', (r) => requested.push(new URL(r.url()).pathname));
  await page.waitForTimeout(300);
  assert.ok(!requested.some((p) => p.includes('sharpfield-field')), 'the boundary module is not loaded without a boundary');
  await page.fill('#in-field', PADDOCK);
  await page.waitForFunction(() => new URLSearchParams(location.search).get('field'));
  await page.locator('#survey .field-map').waitFor({ timeout: 20000 });
  assert.ok(requested.some((p) => p.includes('sharpfield-field')), 'the boundary module loads when a boundary is given');
  const rep = await showsReport(page);
  assert.ok(rep.field_lines > 5 && rep.field_photos > rep.field_lines, JSON.stringify({ l: rep.field_lines, p: rep.field_photos }));
  for (const key of ['area_m2', 'field_lines', 'field_photos', 'field_path_length_m', 'field_turns', 'field_flight_time_s']) {
    assert.equal(await page.locator(`#survey [data-key=${key}]`).count(), 1, `${key} is shown over the boundary`);
  }
  // The drawing: the boundary with its hole, a line per flown stretch, a dot per photo centre,
  // a scale bar and a north arrow.
  assert.equal(await page.locator('#survey .field-map .field-line').count(), rep.field_stretches);
  assert.equal(await page.locator('#survey .field-map .photo').count(), rep.field_photos);
  assert.equal(await page.locator('#survey .field-map .scale-bar').count(), 1);
  assert.equal(await page.locator('#survey .field-map .north').count(), 1);
  // The printed sheet carries the drawing too.
  await page.locator('.print-sheet .field-map').waitFor({ state: 'attached', timeout: 20000 });
  // The plan over the boundary downloads as GeoJSON, KML and a CSV of photo centres, in step
  // with the report.
  const downloaded = async (format) => {
    const [download] = await Promise.all([
      page.waitForEvent('download'),
      page.click(`#survey .boundary button[data-export=${format}]`),
    ]);
    return { name: download.suggestedFilename(), text: readFileSync(await download.path(), 'utf8') };
  };
  const geo = await downloaded('geojson');
  assert.match(geo.name, /\.geojson$/);
  const kinds = JSON.parse(geo.text).features.map((f) => f.properties.kind);
  assert.equal(kinds.filter((k) => k === 'photo').length, rep.field_photos);
  assert.equal(kinds.filter((k) => k === 'flight_line').length, rep.field_stretches);
  assert.equal(kinds.filter((k) => k === 'boundary').length, 1);
  const kml = await downloaded('kml');
  assert.match(kml.name, /\.kml$/);
  assert.equal((kml.text.match(/<Point>/g) ?? []).length, rep.field_photos);
  const csv = await downloaded('csv');
  const rows = csv.text.trim().split('\n');
  assert.equal(rows[0], 'latitude,longitude,height_m,line,index,trigger_m');
  assert.equal(rows.length - 1, rep.field_photos);
  const [lat, lon] = rows[1].split(',').map(Number);
  assert.ok(Math.abs(lat - rep.photo_points[0].lat) < 1e-9 && Math.abs(lon - rep.photo_points[0].lon) < 1e-9, rows[1]);
  // A ring that crosses itself is named with its place; the text typed stays.
  const bowTie = '146.29 -36.85,146.2945 -36.8464,146.2945 -36.85,146.29 -36.8464';
  await page.fill('#in-field', bowTie);
  await page.locator('#survey [data-key=field_problem]').waitFor({ timeout: 20000 });
  assert.match(await page.locator('#survey [data-key=field_problem]').textContent(), /outer ring crosses itself/);
  assert.equal(await page.inputValue('#in-field'), bowTie);
  assert.equal(await page.isHidden('#crash-notice'), true);
  await page.context().close();
});

test('a boundary file imported: GeoJSON and KML read by their own modules into the boundary field; a bad file is named and nothing is lost', async () => {
  const page = await app.open(FIELD);
  const requested = [];
  page.on('request', (r) => requested.push(new URL(r.url()).pathname));
  const ring = [[146.29, -36.85], [146.294486, -36.85], [146.294486, -36.846396], [146.29, -36.846396], [146.29, -36.85]];
  const geojson = JSON.stringify({ type: 'FeatureCollection', features: [{ type: 'Feature', properties: { name: 'Dam paddock' }, geometry: { type: 'Polygon', coordinates: [ring] } }] });
  await page.setInputFiles('#import-boundary', { name: 'dam-paddock.geojson', mimeType: 'application/geo+json', buffer: Buffer.from(geojson) });
  await page.waitForFunction(() => document.querySelector('#in-field').value.startsWith('146.29 -36.85'));
  await page.locator('#survey .field-map').waitFor({ timeout: 20000 });
  assert.match(await page.textContent('#survey-status'), /Read dam-paddock\.geojson/);
  assert.ok(requested.some((p) => p.includes('sharpfield-geojson')) && !requested.some((p) => p.includes('sharpfield-kml')), 'only the GeoJSON reader loads for a GeoJSON file');
  await showsReport(page);
  // KML, with a hole.
  const coords = (r) => r.map((p) => p.join(',')).join(' ');
  const hole = [[146.291346, -36.848919], [146.29314, -36.848919], [146.29314, -36.847477], [146.291346, -36.847477], [146.291346, -36.848919]];
  const kml = `<?xml version="1.0"?><kml xmlns="http://www.opengis.net/kml/2.2"><Document><Placemark><Polygon><outerBoundaryIs><LinearRing><coordinates>${coords(ring)}</coordinates></LinearRing></outerBoundaryIs><innerBoundaryIs><LinearRing><coordinates>${coords(hole)}</coordinates></LinearRing></innerBoundaryIs></Polygon></Placemark></Document></kml>`;
  await page.setInputFiles('#import-boundary', { name: 'dam.kml', mimeType: 'application/vnd.google-earth.kml+xml', buffer: Buffer.from(kml) });
  await page.waitForFunction(() => document.querySelector('#in-field').value.includes(';'));
  const withHole = await page.inputValue('#in-field');
  // A file that holds no polygon is named with what it holds; the boundary stays as it was.
  await page.setInputFiles('#import-boundary', { name: 'gate.geojson', mimeType: 'application/geo+json', buffer: Buffer.from('{"type":"Point","coordinates":[146.3,-36.8]}') });
  await page.waitForFunction(() => /gate\.geojson: The file holds no polygon/.test(document.querySelector('#survey-status')?.textContent ?? ''));
  assert.equal(await page.inputValue('#in-field'), withHole);
  assert.equal(await page.isHidden('#crash-notice'), true);
  await page.context().close();
});

test('walking the field: the device position added corner by corner makes the boundary', async () => {
  const context = await app.browser.newContext({
    permissions: ['geolocation'],
    geolocation: { latitude: -36.85, longitude: 146.29 },
  });
  const page = await context.newPage();
  await page.goto(`${app.origin}/?${FIELD}`);
  await page.waitForSelector('[data-key="limit_m"]');
  const corners = [[-36.85, 146.29], [-36.85, 146.2945], [-36.8464, 146.2945], [-36.8464, 146.29]];
  for (const [i, [latitude, longitude]] of corners.entries()) {
    await context.setGeolocation({ latitude, longitude });
    await page.click('#add-corner');
    await page.waitForFunction((n) => (new URLSearchParams(location.search).get('field') ?? '').split(',').length === n, i + 1);
  }
  assert.equal(await page.inputValue('#in-field'), '146.29 -36.85, 146.2945 -36.85, 146.2945 -36.8464, 146.29 -36.8464');
  await page.locator('#survey .field-map').waitFor({ timeout: 20000 });
  await showsReport(page);
  await context.close();
});
