// Foundation: the shell loads and computes, works offline, offers updates,
// stays on its own origin, is installable, and fits its size budget.
// Figures checked here come from the textbook vertex formula F/(1 − dF)
// (Bennett & Rabbetts, Clinical Visual Optics 4th ed.; check values V4/V5 of
// shared/optics-notes.md, recomputed there).
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import {
  DIST, ROOT, startServer, launch, launchPersistent, waitForApp, waitForWorkerControl, buildInto, watchErrors,
} from './harness.js';

let server;
let browser;
before(async () => { server = await startServer(); browser = await launch(); });
after(async () => { await browser?.close(); await server?.stop(); });

const rightResult = (page) => page.getByRole('region', { name: 'Right eye result' });

test('loads, routes and computes a sphere-only compensation through the core', async () => {
  const page = await browser.newPage();
  const errors = watchErrors(page);
  // V4 [textbook]: −10.00 D at 12 mm → −8.9286 D at the cornea.
  await page.goto(server.url('vertex?r=-10.00&from=12&to=0'));
  await waitForApp(page);
  await assert.doesNotReject(rightResult(page).getByText('-8.93').first().waitFor());
  // V5 [textbook]: +12.00 D at 12 mm → +14.0187 D; typed into the field this time.
  // The separate fields are one tap away.
  await page.getByRole('group', { name: 'Right eye (R)' }).getByText('Separate fields').click();
  const sphere = page.getByLabel('Right sphere', { exact: true });
  await sphere.fill('+12.00');
  await rightResult(page).getByText('+14.02').first().waitFor();
  assert.match(page.url(), /r=%2B12\.00|r=\+12\.00/);
  // Every destination is one tap away in the navigation, under the name its page carries.
  for (const name of ['Spherical equivalent', 'Near', 'History', 'About', 'Vertex']) {
    await page.getByRole('navigation', { name: 'Calculators' }).getByRole('link', { name, exact: true }).click();
    await page.getByRole('heading', { level: 1, name, exact: true }).waitFor();
    assert.equal(await page.title(), `${name} · Lensplane`);
  }
  assert.deepEqual(errors, []);
  await page.close();
});

test('navigation: links switch destination in place, back and forward work, the root opens the vertex panel', async () => {
  const page = await browser.newPage();
  const errors = watchErrors(page);
  await page.goto(server.url(''));
  await waitForApp(page);
  await page.getByRole('heading', { level: 1, name: 'Vertex' }).waitFor();
  await page.waitForFunction(() => location.pathname.endsWith('/vertex'));
  const nav = page.getByRole('navigation', { name: 'Calculators' });
  assert.equal(await nav.getByRole('link', { name: 'Vertex' }).getAttribute('aria-current'), 'page');
  // A marker on the window survives only if the page is not reloaded.
  await page.evaluate(() => { globalThis.lensplaneStayed = true; });
  await nav.getByRole('link', { name: 'Near' }).click();
  await page.getByRole('heading', { level: 1, name: 'Near' }).waitFor();
  assert.match(page.url(), /\/near(\?|$)/);
  assert.equal(await nav.getByRole('link', { name: 'Near' }).getAttribute('aria-current'), 'page');
  assert.equal(await nav.getByRole('link', { name: 'Vertex' }).getAttribute('aria-current'), null);
  assert.equal(await page.evaluate(() => globalThis.lensplaneStayed), true, 'followed in place, no reload');
  await page.goBack();
  await page.getByRole('heading', { level: 1, name: 'Vertex' }).waitFor();
  await page.goForward();
  await page.getByRole('heading', { level: 1, name: 'Near' }).waitFor();
  assert.equal(await page.evaluate(() => globalThis.lensplaneStayed), true);
  // The skip link moves the focus to the main region and stays on the page.
  await page.getByRole('link', { name: 'Skip to the calculator' }).focus();
  await page.keyboard.press('Enter');
  await page.waitForFunction(() => document.activeElement && document.activeElement.id === 'main');
  assert.match(page.url(), /\/near(\?|$)/);
  await page.getByRole('heading', { level: 1, name: 'Near' }).waitFor();
  await page.goto(server.url('elsewhere'));
  await waitForApp(page);
  await page.getByRole('heading', { level: 1, name: 'Not found' }).waitFor();
  assert.deepEqual(errors, []);
  await page.close();
});

test('no request leaves the app\'s origin', async () => {
  const page = await browser.newPage();
  const foreign = [];
  page.on('request', (r) => { if (!r.url().startsWith(server.origin) && !r.url().startsWith('data:')) foreign.push(r.url()); });
  for (const route of ['vertex?r=-4.00', 'equivalent', 'near', 'history']) {
    await page.goto(server.url(route));
    await waitForApp(page);
  }
  await waitForWorkerControl(page);
  assert.deepEqual(foreign, []);
  await page.close();
});

test('the server sends the worker uncached, falls back to the page for routes, and sets a strict CSP', async () => {
  const sw = await fetch(server.url('sw.js'));
  assert.equal(sw.status, 200);
  assert.equal(sw.headers.get('cache-control'), 'no-cache');
  const route = await fetch(server.url('near?r=-2.00&add=2.00'));
  assert.equal(route.status, 200);
  assert.match(await route.text(), /<div id="app">/);
  const csp = route.headers.get('content-security-policy');
  assert.match(csp, /script-src 'self' 'wasm-unsafe-eval';/);
  assert.doesNotMatch(csp, /unsafe-inline|unsafe-eval'(?<!wasm-unsafe-eval')/);
  assert.equal((await fetch(server.url('missing.js'))).status, 404);
});

test('the worker precaches every shipped file with its content hash', async () => {
  const sw = readFileSync(path.join(DIST, 'sw.js'), 'utf8');
  const list = JSON.parse(sw.match(/const PRECACHE = (\[[\s\S]*?\]);/)[1]);
  const urls = list.map((e) => e.url);
  for (const needed of ['index.html', 'manifest.json', 'icons/icon-192.png', 'icons/icon-512.png']) assert.ok(urls.includes(needed), needed);
  for (const ext of ['.js', '.wasm', '.css']) assert.ok(urls.some((u) => u.endsWith(ext)), ext);
  for (const entry of list) assert.match(entry.hash, /^[0-9a-f]{10}$/);
  const html = readFileSync(path.join(DIST, 'index.html'), 'utf8');
  assert.doesNotMatch(html, /<script(?![^>]*\bsrc=)[^>]*>/, 'no inline script');
});

test('offline: after one visit, every destination opens from a link and computes with the server stopped', async () => {
  const own = await startServer();
  const context = await browser.newContext();
  const page = await context.newPage();
  await page.goto(own.url('vertex'));
  await waitForApp(page);
  await waitForWorkerControl(page);
  await own.stop();
  // V4 [textbook] again, now with no server behind the page.
  await page.goto(own.url('vertex?r=-10.00&l=%2B12.00&from=12&to=0'));
  await waitForApp(page);
  await rightResult(page).getByText('-8.93').first().waitFor();
  await page.getByRole('region', { name: 'Left eye result' }).getByText('+14.02').first().waitFor();
  for (const [route, heading] of [['equivalent?r=-2.00', /equivalent/i], ['near?r=-6.00&add=2.50', /near/i], ['history', /history/i]]) {
    await page.goto(own.url(route));
    await page.getByRole('heading', { level: 1, name: heading }).waitFor();
  }
  await context.close();
});

test('update: a rebuilt version is offered, and accepting it runs the new version', async () => {
  const dirA = mkdtempSync(path.join(tmpdir(), 'lensplane-a-'));
  const dirB = mkdtempSync(path.join(tmpdir(), 'lensplane-b-'));
  try {
    buildInto(dirA, 'update-test-a');
    buildInto(dirB, 'update-test-b');
    let srv = await startServer({ dir: dirA });
    const context = await browser.newContext();
    const page = await context.newPage();
    await page.goto(srv.url('vertex?r=-4.00'));
    await waitForApp(page);
    await waitForWorkerControl(page);
    assert.equal(await page.locator('meta[name="lensplane-build"]').getAttribute('content'), 'update-test-a');
    // The same origin now serves the new build.
    const port = srv.port;
    await srv.stop();
    srv = await startServer({ dir: dirB, port });
    await page.evaluate(() => globalThis.LENSPLANE_CHECK_UPDATE());
    const accept = page.getByRole('button', { name: 'Reload with the new version' });
    await accept.waitFor({ state: 'visible', timeout: 30000 });
    // Until accepted, the page still runs the old version.
    assert.equal(await page.locator('meta[name="lensplane-build"]').getAttribute('content'), 'update-test-a');
    await Promise.all([page.waitForEvent('load'), accept.click()]);
    await waitForApp(page);
    assert.equal(await page.locator('meta[name="lensplane-build"]').getAttribute('content'), 'update-test-b');
    // The inputs survived the reload through the link.
    assert.match(page.url(), /r=-4\.00/);
    // The new version's lazy destinations open too (its chunks, from its cache).
    await page.getByRole('navigation', { name: 'Calculators' }).getByRole('link', { name: 'Near', exact: true }).click();
    await page.getByRole('heading', { level: 1, name: 'Near' }).waitFor();
    const caches = await page.evaluate(async () => (await globalThis.caches.keys()).filter((k) => k.startsWith('lensplane-shell-')));
    assert.equal(caches.length, 1, 'outdated caches are deleted on activation');
    await context.close();
    await srv.stop();
  } finally {
    rmSync(dirA, { recursive: true, force: true });
    rmSync(dirB, { recursive: true, force: true });
  }
});

test('Chromium finds no installability errors', async () => {
  const context = await launchPersistent();
  const page = context.pages()[0] || (await context.newPage());
  await page.goto(server.url('vertex'));
  await waitForApp(page);
  await waitForWorkerControl(page);
  const cdp = await context.newCDPSession(page);
  const { installabilityErrors } = await cdp.send('Page.getInstallabilityErrors');
  assert.deepEqual(installabilityErrors, []);
  const manifest = await (await fetch(server.url('manifest.json'))).json();
  assert.equal(manifest.display, 'standalone');
  const sizes = manifest.icons.map((i) => `${i.sizes}/${i.purpose}`);
  for (const need of ['192x192/any', '512x512/any', '512x512/maskable']) assert.ok(sizes.includes(need), need);
  await context.close();
});

test('works when deployed under a sub-path', async () => {
  const sub = await startServer({ prefix: '/clinic/lensplane/' });
  const page = await browser.newPage();
  // V4 [textbook] once more, from a sub-path link.
  await page.goto(sub.url('vertex?r=-10.00'));
  await waitForApp(page);
  await rightResult(page).getByText('-8.93').first().waitFor();
  await page.getByRole('link', { name: 'Near' }).click();
  await page.waitForURL(/\/clinic\/lensplane\/near/);
  await page.close();
  await sub.stop();
});

// The enforced budget (README "Sizes"); the build reports the same figure.
const BUDGET_GZIP = 210_000;

test('the landing page fits its gzip budget (the lazy destinations\' chunks are not part of it)', () => {
  const report = JSON.parse(readFileSync(`${DIST}.report.json`, 'utf8'));
  console.log(`landing: ${report.landing_raw} B raw, ${report.landing_gzip} B gzip (budget ${BUDGET_GZIP}); chunks ${report.chunks_gzip} B gzip; whole output ${report.total_gzip} B gzip`);
  assert.equal(report.budget_gzip, BUDGET_GZIP, 'the build and the test agree on the budget');
  const landing = report.files.filter((f) => f.part === 'landing');
  assert.equal(landing.reduce((sum, f) => sum + f.gzip, 0), report.landing_gzip, 'the landing figure is its files\' sum');
  for (const needed of ['index.html', 'lensplane-chunks.js']) assert.ok(landing.some((f) => f.file === needed), needed);
  for (const ext of ['.wasm', '.css']) assert.ok(landing.some((f) => f.file.endsWith(ext)), ext);
  assert.ok(report.landing_gzip <= BUDGET_GZIP, `${report.landing_gzip} B gzip is over budget`);
  assert.ok(report.files.some((f) => f.part === 'chunk' && f.file.endsWith('.wasm')), 'the build split the app');
});
