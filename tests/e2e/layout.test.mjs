// The planner screen at a desktop and a phone size: screenshots for a person to look at (written to
// tests/e2e/artifacts/, not compared), touch targets of at least 44 px, no sideways scrolling on a
// phone, and a benchmark of how soon a typed height is on screen (printed, never pass/fail).
import { after, before, test } from 'node:test';
import assert from 'node:assert/strict';
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { ROOT, artifact, start } from './helpers.mjs';

const VIEWPORTS = {
  desktop: { width: 1024, height: 768 },
  phone: { width: 390, height: 844 },
};

let app;
before(async () => { app = await start(); });
after(() => app?.close());

for (const [name, viewport] of Object.entries(VIEWPORTS)) {
  test(`screenshots at ${viewport.width}×${viewport.height} (${name}), the demo and a scenario with errors`, async () => {
    for (const [label, query] of [['demo', ''], ['errors', 'sw=13.2&sh=8.8&cols=5472&rows=3648&focal=abc&fnum=0&h=-5&air=hv57']]) {
      const page = await app.open(query, { viewport });
      const screen = artifact(`${name}-${label}.png`);
      const full = artifact(`${name}-${label}-full.png`);
      await page.screenshot({ path: screen });
      await page.screenshot({ path: full, fullPage: true });
      const height = await page.evaluate(() => document.documentElement.scrollHeight);
      assert.ok(height >= viewport.height, `page only ${height} px tall`);
      await page.context().close();
    }
  });

  test(`every input, select and button is at least 44 px tall at ${viewport.width} px wide`, async () => {
    const page = await app.open('', { viewport });
    const small = await page.$$eval('input, select, button', (els) => els
      .filter((e) => e.getClientRects().length > 0 && getComputedStyle(e).visibility !== 'hidden')
      .map((e) => ({ what: `${e.tagName.toLowerCase()}#${e.id || e.name || e.textContent.trim().slice(0, 20)}`, height: e.getBoundingClientRect().height }))
      .filter((e) => e.height < 44));
    const count = await page.locator('input, select, button').count();
    assert.ok(count >= 20, `only ${count} controls found`);
    assert.deepEqual(small, [], 'controls shorter than 44 px');
    await page.context().close();
  });

  test(`nothing is wider than the screen at ${viewport.width} px`, async () => {
    const page = await app.open('', { viewport });
    const { scroll, client, wide } = await page.evaluate(() => ({
      scroll: document.documentElement.scrollWidth,
      client: document.documentElement.clientWidth,
      wide: [...document.querySelectorAll('#app *')]
        .filter((e) => e.getClientRects().length > 0 && e.getBoundingClientRect().right > document.documentElement.clientWidth + 1)
        .slice(0, 5)
        .map((e) => `${e.tagName.toLowerCase()}${e.id ? `#${e.id}` : ''}.${[...e.classList].join('.')}`),
    }));
    assert.ok(scroll <= client, `the page scrolls sideways: ${scroll} px of content in ${client} px; e.g. ${wide.join(', ')}`);
    await page.context().close();
  });
}

test('benchmark: from typing a height to the next frame showing it (not pass/fail)', async (t) => {
  const page = await app.open('v=1&sw=13.2&sh=8.8&cols=5472&rows=3648&focal=8.8&fnum=4&h=80&gd=0&air=power&cn2=1e-13&cexp=-1.333&speed=8&shutter=0.001&aw=400&al=600&need=0.03&tdim=0.75');
  // Inside the page: set #in-h, dispatch the input event, wait for the DOM to show the new slant
  // range (equal to the height when looking straight down), then for the next animation frame.
  const times = await page.evaluate(async (runs) => {
    const input = document.querySelector('#in-h');
    const slant = () => Number(document.querySelector('[data-key=slant_range_m]').getAttribute('data-si'));
    const out = [];
    for (let i = 0; i <= runs; i++) {
      const height = 81 + i;
      const t0 = performance.now();
      input.value = String(height);
      input.dispatchEvent(new InputEvent('input', { bubbles: true, inputType: 'insertText', data: String(height) }));
      await new Promise((resolve, reject) => {
        const timer = setTimeout(() => reject(new Error(`height ${height} never shown`)), 5000);
        const check = () => {
          if (Math.abs(slant() - height) <= 1e-9 * height) { clearTimeout(timer); observer?.disconnect(); resolve(); return true; }
          return false;
        };
        let observer = null;
        if (!check()) {
          observer = new MutationObserver(check);
          observer.observe(document.body, { subtree: true, attributes: true, childList: true, characterData: true });
        }
      });
      await new Promise((resolve) => requestAnimationFrame(() => resolve()));
      if (i > 0) out.push(performance.now() - t0); // the first run warms up and is left out
    }
    return out;
  }, 20);
  assert.equal(times.length, 20);
  const sorted = [...times].sort((a, b) => a - b);
  const median = (sorted[9] + sorted[10]) / 2;
  const max = sorted[sorted.length - 1];
  const line = `input on #in-h to next frame with the new value, ${times.length} runs: median ${median.toFixed(1)} ms, max ${max.toFixed(1)} ms`;
  t.diagnostic(`benchmark: ${line}`);
  mkdirSync(join(ROOT, 'target'), { recursive: true });
  writeFileSync(join(ROOT, 'target', 'e2e-timings.txt'), `${line}\nall (ms): ${times.map((t) => t.toFixed(1)).join(' ')}\n`);
  assert.deepEqual(page.errors, []);
  await page.context().close();
});
