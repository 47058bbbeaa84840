// The printed flight plan: Chromium's print-to-PDF of the page gives exactly one page on A4 and
// on US Letter, and the PDF's text holds the plan (name, date, inputs, the four limits and the
// governing one, survey figures, cautions, sign-off). Expected words are read from the screen of
// the same page, so nothing here restates what the app computes. PDFs and a PNG of each page go
// to tests/e2e/artifacts/ for a person to look at.
import { after, before, test } from 'node:test';
import assert from 'node:assert/strict';
import { artifact, settled, start } from './helpers.mjs';
import { RENDERED, flat, openPage, pdfInfo, pdfText, pdfToPng } from './offline-helpers.mjs';

const LONG_NAME = 'Northern paddock, eastern slope and the creek flats below the old dairy — second pass after the storm, fence lines';

// Paper sizes in PDF points (1/72 inch): A4 is 210 × 297 mm, US Letter 8.5 × 11 inches.
const PAPER = { A4: [595.28, 841.89], Letter: [612, 792] };

/** How each scenario is opened: a query, or the demo picker. */
const SCENARIOS = {
  'default demo': { query: '' },
  'fence-mast demo (ground distance)': { query: '', demo: 'Ridge Road fence-line mast camera (demo)' },
  // The longest sheet: a two-line name, every caution (above 120 m, a 50 mm lens giving 138 px/m on
  // the target, where people can be recognised), a large
  // area with lines left out of the drawing, and imperial units' longer figures.
  'long name, every caution, a large survey area': {
    query: 'v=1&name=' + encodeURIComponent(LONG_NAME) + '&sw=13.2&sh=8.8&cols=5472&rows=3648&focal=50&fnum=4&wl=550'
      + '&h=150&gd=0&air=slc-day&speed=12&shutter=1%2F500&aw=1800&al=2600&fo=80&so=70&need=0.02&tdim=0.5'
      + '&trig=1.5&endur=20&units=imperial',
    cautions: 3,
  },
  'imperial, tilted, a bad value, thermal camera': {
    query: 'v=1&name=Thermal+tilt+check&sw=7.68&sh=6.144&cols=640&rows=512&focal=19&fnum=1.1&wl=10000&h=120&tilt=50'
      + '&air=hv57&speed=15&shutter=0.008&aw=500&al=500&need=abc&tdim=2.3&units=imperial',
  },
};

let app;
before(async () => { app = await start(); });
after(() => app?.close());

/** What the screen says, to be found again on paper. */
async function screenFacts(page) {
  await settled(page);
  return page.evaluate(() => {
    const text = (sel) => document.querySelector(sel)?.textContent.trim() ?? null;
    const governs = text('[data-key="governing"] strong');
    return {
      name: document.querySelector('#in-name').value,
      governing: governs?.replace(/ governs:\s*$/, ''),
      cautions: [...document.querySelectorAll('#cautions li')].map((li) => li.textContent.replace(li.querySelector('strong')?.textContent ?? '', '').trim()),
      footprint: text('#survey [data-key="footprint_across_m"]'),
      lines: text('#survey [data-key="lines"]'),
      hasArea: document.querySelector('#survey .survey-map') !== null,
      today: ((d) => `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, '0')}-${String(d.getDate()).padStart(2, '0')}`)(new Date()),
      qrScreen: document.querySelector('#share svg.qr-code path')?.getAttribute('d'),
      qrPrint: document.querySelector('.print-sheet svg.print-qr path')?.getAttribute('d'),
    };
  });
}

/** Sizes of the print sheet's parts under print media, in CSS pixels. */
function printedParts(page) {
  return page.evaluate(() => {
    const size = (sel) => {
      const e = document.querySelector(sel);
      if (!e) return null;
      const r = e.getBoundingClientRect();
      return { w: Math.round(r.width), h: Math.round(r.height) };
    };
    const hiddenScreen = ['.top', '.layout', '.summary', '.foot'].every((s) => {
      const e = document.querySelector(s);
      return !e || getComputedStyle(e).display === 'none';
    });
    return {
      sheet: size('.print-sheet'), qr: size('.print-sheet .print-qr'), chart: size('.print-sheet svg.chart'),
      map: size('.print-sheet svg.survey-map'), signoff: size('.print-sheet .signoff'), hiddenScreen,
    };
  });
}

for (const [label, { query, demo, cautions }] of Object.entries(SCENARIOS)) {
  test(`the flight plan prints on one page, A4 and Letter: ${label}`, async () => {
    const page = await app.open(query);
    if (demo) {
      const index = await page.$$eval('#demo option', (os, n) => os.findIndex((o) => o.textContent === n), demo);
      assert.ok(index > 0, `no demo named ${demo}`);
      await page.selectOption('#demo', { index });
      await page.waitForFunction((n) => document.querySelector('#in-name').value === n, demo);
      // The address follows the scenario within a fifth of a second (it is not rewritten per keystroke).
      await page.waitForFunction(() => Number(new URLSearchParams(location.search).get('gd')) > 0, null, { timeout: 2000 })
        .catch(() => assert.fail('the mast demo looks at a ground distance'));
    }
    await page.waitForSelector(RENDERED);
    const facts = await screenFacts(page);
    assert.ok(facts.governing, 'no governing limit on screen');
    assert.ok(facts.cautions.length > 0, 'no cautions on screen');
    if (cautions) assert.equal(facts.cautions.length, cautions, 'the scenario no longer gives every caution');
    assert.ok(facts.qrPrint, 'the print sheet has no QR code');
    assert.equal(facts.qrPrint, facts.qrScreen, 'the printed QR code is not the link shown on screen');

    await page.emulateMedia({ media: 'print' });
    const parts = await printedParts(page);
    assert.equal(parts.hiddenScreen, true, 'screen parts are printed');
    for (const part of ['sheet', 'qr', 'chart', 'signoff']) assert.ok(parts[part]?.h > 20, `${part} is not laid out for print: ${JSON.stringify(parts[part])}`);
    if (facts.hasArea) assert.ok(parts.map?.h > 20, `the survey layout is not printed: ${JSON.stringify(parts.map)}`);

    const stem = label.replace(/[^a-z0-9]+/gi, '-').replace(/-$/, '').toLowerCase();
    for (const [format, [width, height]] of Object.entries(PAPER)) {
      const path = artifact(`print-${stem}-${format}.pdf`);
      await page.pdf({ path, format });
      pdfToPng(path, artifact(`print-${stem}-${format}`));
      const info = pdfInfo(path);
      assert.equal(info.pages, 1, `${format}: ${info.pages} pages (${path})`);
      assert.ok(Math.abs(info.width - width) < 1 && Math.abs(info.height - height) < 1, `${format}: page is ${info.width} × ${info.height} pts`);

      const text = pdfText(path);
      const has = (words, what) => assert.ok(text.includes(flat(words)), `${format}: the PDF lacks ${what}: "${words}"`);
      has('Flight plan', 'the title');
      has(facts.name || 'Untitled scenario', 'the scenario name');
      has(`Printed ${facts.today}`, 'the date');
      for (const heading of ['Inputs', 'Resolution', 'Survey', 'Cautions', 'Sign-off']) has(heading, 'a heading');
      for (const limit of ['Pixel sampling (2 × GSD)', 'Lens diffraction (Rayleigh)', 'Air turbulence (seeing)', 'Motion during the exposure']) {
        has(limit, 'one of the four limits');
      }
      has(`${facts.governing} governs at`, 'the governing limit in words');
      for (const caution of facts.cautions) has(caution, 'a caution');
      if (facts.footprint) has(facts.footprint, 'the footprint');
      if (facts.lines) has(`Lines, photos ${facts.lines},`, 'the number of flight lines');
      for (const line of ['Pilot / operator', 'Signature']) has(line, 'a sign-off line');
      for (const screenOnly of ['Copy link', 'Save the current scenario as', 'Export all to a file']) {
        assert.ok(!text.includes(screenOnly), `${format}: the PDF shows the screen's "${screenOnly}"`);
      }
    }
    assert.deepEqual(page.errors, []);
    await page.context().close();
  });
}

test('the plan is dated with the local date of the person printing, not the UTC date', async () => {
  // A time zone whose date differs from UTC's right now: UTC+14 from 10:00 UTC on, else UTC−11.
  const timezoneId = new Date().getUTCHours() >= 10 ? 'Pacific/Kiritimati' : 'Pacific/Pago_Pago';
  const page = await openPage(app.browser, `${app.origin}/`, { contextOptions: { timezoneId } });
  const { local, utc } = await page.evaluate(() => {
    const d = new Date();
    const two = (n) => String(n).padStart(2, '0');
    return { local: `${d.getFullYear()}-${two(d.getMonth() + 1)}-${two(d.getDate())}`, utc: d.toISOString().slice(0, 10) };
  });
  assert.notEqual(local, utc, `${timezoneId} does not tell the two dates apart`);
  await page.emulateMedia({ media: 'print' });
  const path = artifact('print-local-date-A4.pdf');
  await page.pdf({ path, format: 'A4' });
  const text = pdfText(path);
  assert.ok(text.includes(`Printed ${local}.`), `not dated ${local} (${timezoneId}): ${text.match(/Printed [\d-]+/)?.[0]}`);
  await page.context().close();
});
