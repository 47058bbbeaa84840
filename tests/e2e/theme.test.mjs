// The high-contrast choice lasts through a reload: the toggle stores it, the page opens in it again,
// and switching back is remembered too. A browser that refuses storage still switches the theme.
import { after, before, test } from 'node:test';
import assert from 'node:assert/strict';
import { start } from './helpers.mjs';
import { RENDERED, openPage } from './offline-helpers.mjs';

let app;
before(async () => { app = await start(); });
after(() => app?.close());

/**
 * The page's theme and the toggle's aria-pressed, once the page shows `expected` or after 5 s
 * (the app applies the theme in an effect after its first render).
 */
async function theme(page, expected) {
  await page.waitForSelector(RENDERED);
  await page.waitForFunction((t) => document.documentElement.getAttribute('data-theme') === t, expected, { timeout: 5000 })
    .catch(() => {});
  return page.evaluate(() => ({
    theme: document.documentElement.getAttribute('data-theme'),
    pressed: document.querySelector('header.top button.toggle')?.getAttribute('aria-pressed') ?? null,
  }));
}

test('high contrast is kept through a reload, and so is switching back', async () => {
  const page = await app.open('');
  assert.deepEqual(await theme(page, 'default'), { theme: 'default', pressed: 'false' });

  await page.click('header.top button.toggle');
  assert.deepEqual(await theme(page, 'contrast'), { theme: 'contrast', pressed: 'true' });
  await page.reload();
  assert.deepEqual(await theme(page, 'contrast'), { theme: 'contrast', pressed: 'true' }, 'the choice was lost on reload');

  await page.click('header.top button.toggle');
  assert.deepEqual(await theme(page, 'default'), { theme: 'default', pressed: 'false' });
  await page.reload();
  assert.deepEqual(await theme(page, 'default'), { theme: 'default', pressed: 'false' }, 'switching back was lost on reload');
  assert.equal(await page.evaluate(() => localStorage.getItem('sharpfield.theme')), 'default');
  assert.deepEqual(page.errors, []);
  await page.context().close();
});

test('storage that refuses to write: the theme still switches, quietly', async () => {
  const page = await openPage(app.browser, `${app.origin}/`, {
    init: [() => {
      Storage.prototype.setItem = function full() { throw new DOMException('The quota has been exceeded.', 'QuotaExceededError'); };
    }],
  });
  await page.click('header.top button.toggle');
  assert.deepEqual(await theme(page, 'contrast'), { theme: 'contrast', pressed: 'true' });
  await page.click('header.top button.toggle');
  assert.deepEqual(await theme(page, 'default'), { theme: 'default', pressed: 'false' });
  assert.equal(await page.isHidden('#crash-notice'), true, 'the crash notice is shown');
  assert.deepEqual(page.errors, []);
  await page.context().close();
});
