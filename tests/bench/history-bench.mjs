// History benchmark (prints figures; not a timed test). For 1,000 and 10,000
// invented entries in the stored layout it measures, in Debian's headless
// Chromium with the CPU slowed 4× (a phone-class stand-in):
//   load    opening the store (reading and checking every entry), as timed by the app
//   first   from navigation to /history until the first screen of entries is shown
//           (includes starting the app; the 0-entry row is the baseline)
//   filter  from typing a filter until the count and list are updated
// and the bytes stored per entry (localStorage characters of the history keys).
// Run: cd tests && node bench/history-bench.mjs (LENSPLANE_DIST as for the browser tests, an absolute path)
import { startServer, launch, waitForApp } from '../browser/harness.js';
import { makeEntries, storedLayout, writeItems } from '../browser/history-fixtures.js';

const SLOWDOWN = Number(process.env.CPU_SLOWDOWN || 4);
const RUNS = 3;
const median = (xs) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

const server = await startServer();
const browser = await launch();
const rows = [];
try {
  for (const n of [0, 1000, 10000]) {
    const items = storedLayout(makeEntries(n));
    const chars = Object.entries(items).reduce((sum, [k, v]) => sum + k.length + v.length, 0);
    const load = [], first = [], filter = [];
    for (let run = 0; run < RUNS; run++) {
      const context = await browser.newContext();
      const page = await context.newPage();
      await page.goto(server.url('icons/icon.svg'));
      if (n) await page.evaluate(writeItems, items);
      const cdp = await context.newCDPSession(page);
      await cdp.send('Emulation.setCPUThrottlingRate', { rate: SLOWDOWN });
      const t0 = Date.now();
      await page.goto(server.url('history'));
      await waitForApp(page);
      if (n) await page.waitForSelector('.history-entry');
      else await page.getByText('Nothing saved yet.').waitFor();
      first.push(Date.now() - t0);
      load.push(await page.evaluate(() => globalThis.lensplaneHistoryLoadMs));
      if (n) {
        // Time in the page: from the input event to the count text changing.
        filter.push(await page.evaluate(() => new Promise((resolve) => {
          const count = document.querySelector('.history-count');
          const before = count.textContent;
          const input = document.getElementById('history-filter');
          const start = performance.now();
          new MutationObserver((_, obs) => {
            if (count.textContent !== before) { obs.disconnect(); requestAnimationFrame(() => resolve(performance.now() - start)); }
          }).observe(count, { childList: true, subtree: true, characterData: true });
          input.value = 'room 3';
          input.dispatchEvent(new Event('input', { bubbles: true }));
        })));
      }
      await context.close();
    }
    rows.push({
      entries: n,
      'load ms': Math.round(median(load)),
      'first screen ms': Math.round(median(first)),
      'filter ms': n ? Math.round(median(filter)) : '-',
      'stored KB': Math.round(chars * 2 / 1024),
      'bytes/entry': n ? Math.round((chars * 2) / n) : '-',
      'chars/entry': n ? Math.round(chars / n) : '-',
    });
  }
} finally {
  await browser.close();
  await server.stop();
}
console.log(`History benchmark, CPU slowed ${SLOWDOWN}×, median of ${RUNS} runs (bytes as localStorage counts them: UTF-16, 2 per character)`);
console.table(rows);
