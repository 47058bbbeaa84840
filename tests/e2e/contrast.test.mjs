// Text contrast on the built page, in both themes: every visible text meets WCAG 2.1 AA (1.4.3):
// 4.5:1, or 3:1 for large text (at least 24 px, or 18.66 px bold). The ratio and relative
// luminance are computed as WCAG 2.1 defines them; the background is the nearest opaque one
// behind the text.
import { after, before, test } from 'node:test';
import assert from 'node:assert/strict';
import { start } from './helpers.mjs';

let app;
before(async () => { app = await start(); });
after(() => app?.close());

/** Runs in the page: how many visible texts were checked, and one line per text below AA. */
function lowContrast() {
  const parse = (c) => {
    const m = c.match(/rgba?\(([^)]+)\)/);
    if (!m) return null;
    const [r, g, b, a = 1] = m[1].split(/[ ,/]+/).filter(Boolean).map(Number);
    return { r, g, b, a };
  };
  const luminance = ({ r, g, b }) => {
    const lin = (v) => { v /= 255; return v <= 0.04045 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4; };
    return 0.2126 * lin(r) + 0.7152 * lin(g) + 0.0722 * lin(b);
  };
  const background = (el) => {
    for (let e = el; e; e = e.parentElement) {
      if (e instanceof SVGElement && !(e instanceof SVGSVGElement)) continue;
      const c = parse(getComputedStyle(e).backgroundColor);
      if (c && c.a >= 0.99) return c;
    }
    return { r: 255, g: 255, b: 255, a: 1 };
  };
  const out = [];
  let checked = 0;
  const walker = document.createTreeWalker(document.body, NodeFilter.SHOW_TEXT);
  for (let node = walker.nextNode(); node; node = walker.nextNode()) {
    const el = node.parentElement;
    if (!node.textContent.trim() || !el || !el.checkVisibility?.({ visibilityProperty: true, opacityProperty: true })) continue;
    checked += 1;
    const style = getComputedStyle(el);
    const fg = parse(el instanceof SVGElement ? style.fill : style.color);
    if (!fg) continue;
    const bg = background(el);
    const [l1, l2] = [luminance(fg), luminance(bg)].sort((a, b) => b - a);
    const ratio = (l1 + 0.05) / (l2 + 0.05);
    const size = parseFloat(style.fontSize);
    const bold = Number(style.fontWeight) >= 700;
    const large = size >= 24 || (bold && size >= 18.66);
    if (ratio < (large ? 3 : 4.5)) out.push(`${ratio.toFixed(2)}:1 "${node.textContent.trim().slice(0, 40)}" (${el.tagName.toLowerCase()}.${el.getAttribute('class') || ''})`);
  }
  return { checked, low: out };
}

for (const theme of ['default', 'contrast']) {
  test(`every visible text meets WCAG AA contrast (${theme} theme)`, async () => {
    const page = await app.open('');
    if (theme === 'contrast') {
      await page.click('button.toggle');
      await page.waitForFunction(() => document.documentElement.getAttribute('data-theme') === 'contrast');
    }
    // Bring every panel into view once, so content-visibility lays each of them out.
    for (const id of ['results', 'cautions', 'chart', 'solve', 'target', 'survey', 'share']) {
      await page.locator(`#${id}`).scrollIntoViewIfNeeded();
      const { checked, low } = await page.evaluate(lowContrast);
      assert.ok(checked > 50, `only ${checked} visible texts were checked`);
      assert.deepEqual(low, [], `low-contrast text near #${id}`);
    }
    await page.context().close();
  });
}
