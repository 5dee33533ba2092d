// Where opening the history spends its time (a tool for performance work, not a test):
// seeds N invented entries (default 10,000, one minute apart; SPREAD_HOURS=1 spreads them an
// hour apart), opens /history with the CPU slowed 4× under Chromium's sampling profiler and
// prints the 40 functions with the most self time, in ms. Function names need a build that
// keeps them: target/release/lensplane build --no-opt --out /tmp/prof-dist
// Run: cd tests && LENSPLANE_DIST=/tmp/prof-dist node bench/history-profile.mjs
import { startServer, launch, waitForApp } from '../browser/harness.js';
import { makeEntries, storedLayout, writeItems } from '../browser/history-fixtures.js';
const n = Number(process.env.N || 10000);
const step = Number(process.env.SPREAD_HOURS || 0) * 3600000 || 60000;
const server = await startServer();
const browser = await launch();
try {
  const items = storedLayout(makeEntries(n, Date.UTC(2024, 4, 3, 8, 0), step));
  const context = await browser.newContext();
  const page = await context.newPage();
  await page.goto(server.url('icons/icon.svg'));
  await page.evaluate(writeItems, items);
  const cdp = await context.newCDPSession(page);
  await cdp.send('Emulation.setCPUThrottlingRate', { rate: 4 });
  await cdp.send('Profiler.enable');
  await cdp.send('Profiler.setSamplingInterval', { interval: 200 });
  await cdp.send('Profiler.start');
  await page.goto(server.url('history'));
  await waitForApp(page);
  await page.waitForSelector('.history-entry');
  await page.waitForFunction(() => globalThis.lensplaneHistoryLoadMs !== undefined);
  const { profile } = await cdp.send('Profiler.stop');
  console.log('busy ms', await page.evaluate(() => globalThis.lensplaneHistoryLoadMs), 'in', await page.evaluate(() => globalThis.lensplaneHistorySlices), 'slices');
  const self = new Map();
  const byId = new Map(profile.nodes.map((x) => [x.id, x]));
  const dt = profile.timeDeltas; const samples = profile.samples;
  for (let i = 0; i < samples.length; i++) {
    const node = byId.get(samples[i]);
    const name = node.callFrame.functionName || node.callFrame.url.split('/').pop() || '(anon)';
    self.set(name, (self.get(name) || 0) + (dt[i] || 0) / 1000);
  }
  const top = [...self].sort((a, b) => b[1] - a[1]).slice(0, 40);
  for (const [k, v] of top) console.log(v.toFixed(1).padStart(8), k.slice(0, 140));
} finally { await browser.close(); await server.stop(); }
