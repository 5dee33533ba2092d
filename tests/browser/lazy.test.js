// Lazy destinations: every destination but the landing one (vertex) is its
// own wasm chunk, fetched when it is first opened, kept by the worker for
// offline use, and a chunk that cannot be fetched gets a message and a retry
// instead of breaking the app. Which chunks each destination needs is read
// from the build's size report (`destinations`), not from the app.
// Figures checked here come from the textbook vergence formulas:
// - S1 [definition]: the spherical equivalent of −2.00 −0.50 ×90 is −2.25
//   (sphere + half the cylinder; shared/optics-notes.md, check value S1).
// - N1 [textbook]: −6.00 at 12 mm, reading at 40 cm: 2.43 D of accommodation
//   in contact lenses (Bennett & Rabbetts, Clinical Visual Optics 4th ed.;
//   check value N1 of shared/optics-notes.md).
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync } from 'node:fs';
import { DIST, startServer, launch, waitForApp, waitForWorkerControl, watchErrors } from './harness.js';

let server;
let browser;
before(async () => { server = await startServer(); browser = await launch(); });
after(async () => { await browser?.close(); await server?.stop(); });

const report = JSON.parse(readFileSync(`${DIST}.report.json`, 'utf8'));
const CHUNKS = report.files.filter((f) => f.part === 'chunk').map((f) => f.file);
const LANDING = report.files.filter((f) => f.part === 'landing').map((f) => f.file);
const TITLES = {
  equivalent: 'Spherical equivalent', near: 'Near', 'over-refraction': 'Over-refraction', 'image-size': 'Image size',
  chart: 'Conversion chart', 'lens-check': 'Lens check', history: 'History', about: 'About',
};
const WAIT = { timeout: 20000 };
const heading = (page, name) => page.getByRole('heading', { level: 1, name, exact: true });
const nav = (page) => page.getByRole('navigation', { name: 'Calculators' });
const file = (url) => new URL(url).pathname.split('/').pop();

/** Records the wasm files a page requests (through the worker or not). */
function wasmRequests(page) {
  const seen = [];
  page.on('request', (r) => { if (r.url().endsWith('.wasm')) seen.push(file(r.url())); });
  return seen;
}

test('the build lists a chunk for every destination but the landing one', () => {
  assert.deepEqual(Object.keys(report.destinations).sort(), Object.keys(TITLES).sort());
  for (const [id, files] of Object.entries(report.destinations)) {
    assert.ok(files.length > 0, id);
    for (const f of files) assert.ok(CHUNKS.includes(f), `${id}: ${f} is shipped as a chunk`);
  }
  assert.equal(LANDING.filter((f) => f.endsWith('.wasm')).length, 1, 'one main module');
});

test('the landing page loads no chunk, and its glue and wasm start with the page', async () => {
  const context = await browser.newContext({ serviceWorkers: 'block' });
  const page = await context.newPage();
  const errors = watchErrors(page);
  const wasm = wasmRequests(page);
  const requested = new Set();
  page.on('request', (r) => requested.add(r.isNavigationRequest() ? 'index.html' : new URL(r.url()).pathname.slice(1)));
  await page.goto(server.url(`vertex?r=${encodeURIComponent('-2.00 -0.50 x90')}`));
  await waitForApp(page);
  await page.getByRole('region', { name: 'Right eye result' }).getByText('×').first().waitFor(WAIT);
  assert.deepEqual(wasm, LANDING.filter((f) => f.endsWith('.wasm')));
  // The landing figure of the size report is what this page really loads.
  await page.waitForLoadState('load');
  for (const f of LANDING) assert.ok(requested.has(f), `${f} is counted as landing and loaded`);
  const rest = report.files.filter((f) => f.part === 'rest').map((f) => f.file);
  for (const f of requested) assert.ok(LANDING.includes(f) || rest.includes(f), `${f} is loaded and counted as landing`);
  // No waterfall: the page itself names the main wasm and the glue to fetch.
  const html = await (await fetch(server.url('vertex'))).text();
  const main = LANDING.find((f) => f.endsWith('.wasm'));
  const glue = LANDING.find((f) => /^lensplane-[0-9a-f]{10}\.js$/.test(f));
  assert.match(html, new RegExp(`<link rel="preload" href="\\./${main}" as="fetch" type="application/wasm" crossorigin>`));
  assert.match(html, new RegExp(`<link rel="modulepreload" href="\\./${glue}">`));
  // ...and the browser used those preloads rather than asking twice.
  const entries = await page.evaluate(() => performance.getEntriesByType('resource').map((e) => [e.name.split('/').pop(), e.initiatorType]));
  assert.deepEqual(entries.filter(([n]) => n === main), [[main, 'link']]);
  // (Chromium files a module preload under 'script'; one entry means one download.)
  assert.equal(entries.filter(([n]) => n === glue).length, 1, 'the glue is fetched once');
  assert.deepEqual(errors, []);
  await context.close();
});

test('opening a lazy destination fetches only its chunks and computes', async () => {
  const context = await browser.newContext({ serviceWorkers: 'block' });
  const page = await context.newPage();
  const errors = watchErrors(page);
  await page.goto(server.url('vertex?r=-6.00'));
  await waitForApp(page);
  const wasm = wasmRequests(page);
  await nav(page).getByRole('link', { name: 'Spherical equivalent', exact: true }).click();
  await heading(page, 'Spherical equivalent').waitFor(WAIT);
  assert.deepEqual(wasm.sort(), [...report.destinations.equivalent].sort());
  // S1 [definition] on the panel the chunk brought.
  await page.goto(server.url(`equivalent?r=${encodeURIComponent('-2.00 -0.50 x90')}&from=12&to=12`));
  await waitForApp(page);
  await page.getByRole('region', { name: 'Right eye result' }).getByText('-2.25 DS').first().waitFor(WAIT);
  // In place again: the near panel's chunks, minus those already here.
  await page.evaluate(() => { globalThis.lensplaneStayed = true; });
  wasm.length = 0;
  await nav(page).getByRole('link', { name: 'Near', exact: true }).click();
  await heading(page, 'Near').waitFor(WAIT);
  const already = new Set(report.destinations.equivalent);
  assert.deepEqual(wasm.sort(), report.destinations.near.filter((f) => !already.has(f)).sort());
  assert.equal(await page.evaluate(() => globalThis.lensplaneStayed), true, 'no reload');
  assert.deepEqual(errors, []);
  await context.close();
});

test('a deep link to each lazy destination works online (its chunks fetched early) and offline', async () => {
  const own = await startServer();
  const context = await browser.newContext();
  const page = await context.newPage();
  const errors = watchErrors(page);
  for (const [id, title] of Object.entries(TITLES)) {
    await page.goto(own.url(id));
    await heading(page, title).waitFor(WAIT);
    // boot.js asked for the chunks with the page (a preload link), before the app asked.
    const entries = await page.evaluate(() => performance.getEntriesByType('resource').map((e) => [e.name.split('/').pop(), e.initiatorType]));
    for (const f of report.destinations[id]) {
      assert.deepEqual(entries.filter(([n]) => n === f).map(([, t]) => t), ['link'], `${id}: ${f}`);
    }
  }
  await waitForWorkerControl(page);
  await own.stop();
  for (const [id, title] of Object.entries(TITLES)) {
    await page.goto(own.url(id));
    await heading(page, title).waitFor(WAIT);
  }
  // N1 [textbook], offline.
  await page.goto(own.url('near?r=-6.00&from=12&to=0&reading=40&measured=lens'));
  await page.getByRole('region', { name: 'Right eye result' }).locator('output.rx.big', { hasText: /^\s*2\.43 D\s*$/ }).waitFor(WAIT);
  assert.deepEqual(errors, []);
  await context.close();
});

test('a chunk that cannot be fetched shows a message at the page, and Retry loads it', async () => {
  const context = await browser.newContext({ serviceWorkers: 'block' });
  const page = await context.newPage();
  const errors = watchErrors(page);
  const blocked = new Set(report.destinations.near);
  const block = (route) => (blocked.has(file(route.request().url())) ? route.abort('internetdisconnected') : route.continue());
  await page.route('**/*.wasm', block);
  await page.goto(server.url('vertex?r=-6.00'));
  await waitForApp(page);
  await nav(page).getByRole('link', { name: 'Near', exact: true }).click();
  const alert = page.getByRole('alert').filter({ hasText: 'could not be loaded' });
  await alert.waitFor(WAIT);
  await heading(page, 'Near').waitFor(WAIT);
  // The app is still alive: the rest of the page works.
  await nav(page).getByRole('link', { name: 'Vertex', exact: true }).click();
  // [derived] from the textbook vertex formula F / (1 − dF): −6.00 at 12 mm is −6 / 1.072 = −5.597 at the cornea.
  await page.getByRole('region', { name: 'Right eye result' }).getByText('-5.60').first().waitFor(WAIT);
  await nav(page).getByRole('link', { name: 'Near', exact: true }).click();
  await alert.waitFor(WAIT);
  await page.unroute('**/*.wasm', block);
  await page.getByRole('button', { name: 'Retry' }).click();
  await page.getByLabel('Reading distance', { exact: true }).waitFor(WAIT);
  assert.equal(await alert.count(), 0);
  // No trap, no uncaught error: only the failed requests' own console lines.
  assert.deepEqual(errors.filter((e) => e.startsWith('pageerror')), []);
  await context.close();
});
