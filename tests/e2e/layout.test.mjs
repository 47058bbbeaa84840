// The planner screen at a desktop and a phone size: screenshots for a person to look at (written to
// tests/e2e/artifacts/, not compared), touch targets of at least 44 px, no sideways scrolling on a
// phone (the page's speed is measured in speed.test.mjs).
import { after, before, test } from 'node:test';
import assert from 'node:assert/strict';
import { artifact, start } from './helpers.mjs';

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
