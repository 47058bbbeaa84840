// Benchmarks of the page, printed and written to target/e2e-timings.txt, never pass/fail (speed
// goals are measured, not timed as tests):
// - work per keystroke: from the input event on the height to the end of the page's update, 60
//   keystrokes, median and 95th percentile, as is and with the CPU slowed four times through the
//   DevTools protocol (standing for an older tablet). Two ends are recorded: the end of the DOM
//   update (the app renders in microtasks queued by the event; once they have run, the page shows
//   the new figures), which is the work the page does; and the next task after it, which adds the
//   browser's style, layout and paint whenever a frame falls due in between;
// - the first visit: the time from navigation to the first computed result with the HTTP cache and
//   the service worker off, as is and on a weak mobile link (1.6 Mbit/s, 300 ms round trip) with
//   the CPU slowed four times.
import { after, before, test } from 'node:test';
import assert from 'node:assert/strict';
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { ROOT, start } from './helpers.mjs';

const SCENARIO = 'v=1&sw=13.2&sh=8.8&cols=5472&rows=3648&focal=8.8&fnum=4&h=80&gd=0&air=power&cn2=1e-13&cexp=-1.333&speed=8&shutter=0.001&aw=400&al=600&need=0.03&tdim=0.75';
const lines = [];

let app;
before(async () => { app = await start(); });
after(() => {
  app?.close();
  mkdirSync(join(ROOT, 'target'), { recursive: true });
  writeFileSync(join(ROOT, 'target', 'e2e-timings.txt'), `${lines.join('\n')}\n`);
});

/** Median and 95th percentile of `times` (ms), as text. */
function summary(times) {
  const s = [...times].sort((a, b) => a - b);
  const at = (p) => s[Math.min(s.length - 1, Math.floor(p * s.length))];
  return `median ${at(0.5).toFixed(1)} ms, 95th percentile ${at(0.95).toFixed(1)} ms, max ${s[s.length - 1].toFixed(1)} ms (${s.length} runs)`;
}

for (const slowdown of [1, 4]) {
  test(`benchmark: work per keystroke on the height, CPU ×${slowdown} (not pass/fail)`, async (t) => {
    const page = await app.open(SCENARIO);
    const cdp = await page.context().newCDPSession(page);
    await cdp.send('Emulation.setCPUThrottlingRate', { rate: slowdown });
    const { update, task } = await page.evaluate(async (runs) => {
      const input = document.querySelector('#in-h');
      const slant = () => Number(document.querySelector('[data-key=slant_range_m]').getAttribute('data-si'));
      const nextTask = () => new Promise((done) => { const c = new MessageChannel(); c.port1.onmessage = done; c.port2.postMessage(0); });
      const update = [];
      const task = [];
      for (let i = 0; i <= runs; i++) {
        const height = 81 + (i % 40);
        await new Promise((done) => setTimeout(done, 20)); // let timers of the last keystroke run first
        let shown = null;
        const t0 = performance.now();
        input.value = String(height);
        input.dispatchEvent(new InputEvent('input', { bubbles: true, inputType: 'insertText', data: String(height) }));
        // The app renders in microtasks queued by the event; twenty empty hops let them all run
        // (each hop costs microseconds). Should the render ever wait for a task, the next task
        // is taken as the update's end instead.
        for (let hop = 0; hop < 20; hop++) await Promise.resolve();
        const isShown = () => Math.abs(slant() - height) <= 1e-9 * height;
        if (isShown()) shown = { at: performance.now() };
        await nextTask();
        const t2 = performance.now();
        if (!shown && isShown()) shown = { at: t2 };
        if (!shown) throw new Error(`height ${height} not shown when the update ended`);
        if (i > 0) { update.push(shown.at - t0); task.push(t2 - t0); } // the first run warms up and is left out
      }
      return { update, task };
    }, 60);
    assert.equal(update.length, 60);
    for (const [end, times] of [['the end of the DOM update', update], ['the next task, with any frame in between', task]]) {
      const line = `work per keystroke (input event to ${end}), CPU ×${slowdown}: ${summary(times)}`;
      t.diagnostic(`benchmark: ${line}`);
      lines.push(line);
    }
    assert.deepEqual(page.errors, []);
    await page.context().close();
  });
}

for (const [label, link, slowdown] of [['as is', null, 1], ['weak mobile link, CPU ×4', { latency: 300, throughput: 1.6e6 / 8 }, 4]]) {
  test(`benchmark: first visit to the first computed result, ${label} (not pass/fail)`, async (t) => {
    const context = await app.browser.newContext({ viewport: { width: 1024, height: 768 }, serviceWorkers: 'block' });
    const page = await context.newPage();
    const errors = [];
    page.on('pageerror', (e) => errors.push(String(e)));
    const cdp = await context.newCDPSession(page);
    await cdp.send('Network.enable');
    await cdp.send('Network.setCacheDisabled', { cacheDisabled: true });
    if (link) {
      await cdp.send('Network.emulateNetworkConditions', {
        offline: false, latency: link.latency, downloadThroughput: link.throughput, uploadThroughput: link.throughput,
      });
    }
    await cdp.send('Emulation.setCPUThrottlingRate', { rate: slowdown });
    await page.goto(`${app.origin}/?${SCENARIO}`, { waitUntil: 'commit' });
    // performance.now() counts from the navigation's start.
    const handle = await page.waitForFunction(() => document.querySelector('[data-key="limit_m"]') && performance.now(), null, { timeout: 60000, polling: 'raf' });
    const ms = await handle.jsonValue();
    const line = `first visit to the first computed result, cache and service worker off, ${label}: ${(ms / 1000).toFixed(2)} s`;
    t.diagnostic(`benchmark: ${line}`);
    lines.push(line);
    assert.deepEqual(errors, []);
    await context.close();
  });
}
