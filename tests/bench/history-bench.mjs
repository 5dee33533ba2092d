// History benchmark (prints figures; not a timed test). For invented entries
// in the stored layout it measures, in Debian's headless Chromium with the CPU
// slowed 4× (a phone-class stand-in), median of 3 runs:
//   first    from navigation to /history until the first screen of entries is
//            shown (includes starting the app; the 0-entry row is the baseline)
//   all      from navigation until every stored month has been read
//   busy     time spent reading the history, summed over its slices (as timed by the app)
//   slice    the longest single slice: the longest the history holds the page still
//   filter   from typing a filter (after everything is read) until the count and list update
//   save     from pressing "Save to history" on the vertex panel until it says it saved
// and the bytes stored per entry (localStorage characters of the history keys).
// "1 month" puts every entry in one stored month (one minute apart: the worst
// case, one key to read); "14 months" spreads 10,000 entries an hour apart.
// Run: cd tests && node bench/history-bench.mjs (LENSPLANE_DIST as for the browser tests, an absolute path)
import { startServer, launch, waitForApp } from '../browser/harness.js';
import { makeEntries, storedLayout, writeItems } from '../browser/history-fixtures.js';

const SLOWDOWN = Number(process.env.CPU_SLOWDOWN || 4);
const RUNS = 3;
const median = (xs) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
const HOUR = 3600000, MINUTE = 60000;
const CASES = [
  { n: 0, spread: '-', step: MINUTE },
  { n: 1000, spread: '1 month', step: MINUTE },
  { n: 10000, spread: '1 month', step: MINUTE },
  { n: 10000, spread: '14 months', step: HOUR },
];

const server = await startServer();
const browser = await launch();
const rows = [];
try {
  for (const { n, spread, step } of CASES) {
    const items = storedLayout(makeEntries(n, Date.UTC(2024, 4, 3, 8, 0), step));
    const chars = Object.entries(items).reduce((sum, [k, v]) => sum + k.length + v.length, 0);
    const m = { first: [], all: [], busy: [], slice: [], filter: [], save: [] };
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
      m.first.push(Date.now() - t0);
      await page.waitForFunction(() => globalThis.lensplaneHistoryLoadMs !== undefined);
      m.all.push(Date.now() - t0);
      m.busy.push(await page.evaluate(() => globalThis.lensplaneHistoryLoadMs));
      m.slice.push(await page.evaluate(() => globalThis.lensplaneHistoryLongestSliceMs));
      if (n) {
        // Time in the page: from the input event to the count text changing.
        m.filter.push(await page.evaluate(() => new Promise((resolve) => {
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
      if (n) {
        await page.goto(server.url('vertex?r=-8.00%20-2.00%20x180'));
        await waitForApp(page);
        await page.waitForFunction(() => globalThis.lensplaneHistoryLoadMs !== undefined);
        await page.getByRole('region', { name: 'Right eye result' }).getByText('×').first().waitFor();
        m.save.push(await page.evaluate(() => new Promise((resolve) => {
          const button = [...document.querySelectorAll('button')].find((b) => b.textContent.trim() === 'Save to history');
          const start = performance.now();
          new MutationObserver((_, obs) => {
            if (document.body.textContent.includes("Saved to this device's history.")) { obs.disconnect(); requestAnimationFrame(() => resolve(performance.now() - start)); }
          }).observe(document.body, { childList: true, subtree: true, characterData: true });
          button.click();
        })));
      }
      await context.close();
    }
    const ms = (xs) => (xs.length ? Math.round(median(xs)) : '-');
    rows.push({
      entries: n,
      spread,
      'first ms': ms(m.first),
      'all ms': ms(m.all),
      'busy ms': ms(m.busy),
      'slice ms': ms(m.slice),
      'filter ms': ms(m.filter),
      'save ms': ms(m.save),
      'stored KB': Math.round(chars * 2 / 1024),
      'bytes/entry': n ? Math.round((chars * 2) / n) : '-',
    });
  }
} finally {
  await browser.close();
  await server.stop();
}
console.log(`History benchmark, CPU slowed ${SLOWDOWN}×, median of ${RUNS} runs (bytes as localStorage counts them: UTF-16, 2 per character)`);
console.table(rows);
