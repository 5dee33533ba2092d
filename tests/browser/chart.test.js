// The Conversion chart in real Chromium: a vertex table for the fitting-room
// wall. Check values are those of shared/optics-notes.md §15 and §11, each
// with its provenance: [textbook method] = the vertex formula F / (1 − dF)
// (Bennett & Rabbetts, Clinical Visual Optics, 4th ed.; Keating, Geometric,
// Physical and Visual Optics, 2nd ed.); the ladders are the notes' §5
// [common practice (no source)]: contact-lens steps of 0.25 D to ±6.00 and
// 0.50 D beyond, spectacle quarter steps, ties toward plus.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { startServer, launch, waitForApp, waitForWorkerControl, watchErrors, offlineAfterVisit } from './harness.js';

const require = createRequire(import.meta.url);
const AXE = require.resolve('axe-core/axe.min.js');

let server;
let browser;
before(async () => { server = await startServer(); browser = await launch(); });
after(async () => { await browser?.close(); await server?.stop(); });

const enc = encodeURIComponent;
const DEFAULT_TITLE = 'Vertex conversion chart: 12 mm → cornea (contact lens), contact-lens steps';

async function open(path, options = {}) {
  const context = await browser.newContext({ acceptDownloads: true, ...options });
  const page = await context.newPage();
  const errors = watchErrors(page);
  await page.goto(server.url(path));
  await waitForApp(page);
  await page.getByRole('heading', { level: 1, name: 'Conversion chart' }).waitFor();
  return { context, page, errors };
}

const tables = (page) => page.locator('table.chart-table');

/** Waits for the chart, then reads every row of both blocks as [power, exact, to order]. */
async function rows(page) {
  await tables(page).first().locator('tbody tr').first().waitFor();
  return page.evaluate(() => [...document.querySelectorAll('table.chart-table tbody tr')].map((tr) => {
    const th = tr.querySelector('th');
    const mark = th.querySelector('mark');
    const power = (mark ?? th).textContent.trim();
    return [power, ...[...tr.querySelectorAll('td')].map((td) => td.textContent.trim())];
  }));
}

function row(all, power) {
  const found = all.filter((r) => r[0] === power);
  assert.equal(found.length, 1, `one row for ${power}`);
  return found[0];
}

/** Waits until the text of `locator` contains `text`. */
async function expectText(locator, text) {
  await locator.getByText(text, { exact: false }).first().waitFor({ timeout: 10000 });
}

test('§15 check values on the default chart (12 mm → cornea, 4 to 20 D in quarter steps, contact-lens steps)', async () => {
  const { context, page, errors } = await open('chart');
  await page.getByRole('heading', { level: 2, name: DEFAULT_TITLE }).waitFor();
  const all = await rows(page);
  // 4.00 to 20.00 in 0.25 steps is 65 sizes, each minus and plus [derived from the settings].
  assert.equal(all.length, 130);
  assert.equal(await tables(page).nth(0).locator('tbody tr').count(), 65);
  assert.equal(await tables(page).nth(1).locator('tbody tr').count(), 65);
  // §15 [textbook method]: −6.00 @ 12 → −5.5970; [common practice (no source)] 0.25 D steps to 6.00 → −5.50.
  assert.deepEqual(row(all, '-6.00'), ['-6.00', '-5.60', '-5.50']);
  // §15 [textbook method]: +7.50 @ 12 → +8.2418; [common practice (no source)] 0.50 D steps beyond 6.00 → +8.00.
  assert.deepEqual(row(all, '+7.50'), ['+7.50', '+8.24', '+8.00']);
  // §15 [textbook method]: −20.00 @ 12 → −16.1290; [common practice (no source)] → −16.00.
  assert.deepEqual(row(all, '-20.00'), ['-20.00', '-16.13', '-16.00']);
  // §11 V1 [textbook]: −4.00 @ 12 mm → −3.8168 → −3.75; V2 [textbook]: +4.00 → +4.2017 → +4.25.
  assert.deepEqual(row(all, '-4.00'), ['-4.00', '-3.82', '-3.75']);
  assert.deepEqual(row(all, '+4.00'), ['+4.00', '+4.20', '+4.25']);
  // Minus block first, by size; then the plus block.
  assert.equal(all[0][0], '-4.00');
  assert.equal(all[64][0], '-20.00');
  assert.equal(all[65][0], '+4.00');
  // A real table: caption, column headers with scope, one row header per power.
  assert.deepEqual(await tables(page).locator('caption').allTextContents(), ['Minus powers', 'Plus powers']);
  assert.deepEqual(await tables(page).nth(0).locator('thead th[scope="col"]').allTextContents(),
    ['Power at 12 mm', 'Exact at the cornea', 'To order (contact-lens steps)']);
  assert.equal(await tables(page).nth(0).locator('tbody th[scope="row"]').count(), 65);
  // Every exact figure with two decimals, never NaN, Infinity or undefined.
  for (const [, exact] of all) assert.match(exact, /^[+-]\d+\.\d\d$/);
  const text = await page.locator('main').textContent();
  assert.doesNotMatch(text, /NaN|Infinity|undefined/);
  await expectText(page.getByRole('complementary', { name: 'Cautions' }), 'look up each principal meridian');
  assert.deepEqual(errors, []);
  await context.close();
});

test('§15 check values on spectacle quarter steps; the ladder is chosen in the form and kept in the link', async () => {
  const { context, page } = await open('chart');
  await rows(page);
  await page.getByLabel('Round to').selectOption('spec');
  await page.getByRole('heading', { level: 2, name: 'Vertex conversion chart: 12 mm → cornea (contact lens), spectacle quarter steps' }).waitFor();
  await page.waitForURL(/ladder=spec/);
  const all = await rows(page);
  // Same exact values [textbook method]; spectacle quarter steps [common practice (no source)]:
  // −5.5970 → −5.50, +8.2418 → +8.25, −16.1290 → −16.25 (0.121 from −16.25, 0.129 from −16.00).
  assert.deepEqual(row(all, '-6.00'), ['-6.00', '-5.60', '-5.50']);
  assert.deepEqual(row(all, '+7.50'), ['+7.50', '+8.24', '+8.25']);
  assert.deepEqual(row(all, '-20.00'), ['-20.00', '-16.13', '-16.25']);
  assert.equal(await tables(page).nth(0).locator('thead th').nth(2).textContent(), 'To order (spectacle quarter steps)');
  // Back to the default: the link leaves the ladder out, the contact-lens steps return.
  await page.getByLabel('Round to').selectOption('');
  await page.getByRole('heading', { level: 2, name: DEFAULT_TITLE }).waitFor();
  assert.doesNotMatch(page.url(), /ladder=/);
  assert.deepEqual(row(await rows(page), '+7.50'), ['+7.50', '+8.24', '+8.00']);
  await context.close();
});

test('a prescription carried from the vertex panel is highlighted, visibly and in words', async () => {
  const context = await browser.newContext();
  const page = await context.newPage();
  await page.goto(server.url(`vertex?r=${enc('-6.00 -2.00 x180')}&l=${enc('+7.50')}`));
  await waitForApp(page);
  await page.getByRole('region', { name: 'Right eye result' }).getByText('×180').first().waitFor();
  await page.getByRole('navigation', { name: 'Calculators' }).getByRole('link', { name: 'Conversion chart' }).click();
  await page.getByRole('heading', { level: 1, name: 'Conversion chart' }).waitFor();
  await page.waitForURL(/\/chart\?/);
  assert.equal(new URL(page.url()).searchParams.get('r'), '-6.00 -2.00 x180');
  assert.equal(await page.getByLabel('Right prescription to find').inputValue(), '-6.00 -2.00 x180');
  const carried = page.locator('table.chart-table tr.carried');
  await carried.first().waitFor();
  // The principal meridians of −6.00 −2.00 ×180 are −6.00 and −8.00 [definition: sphere, and sphere + cylinder].
  const marked = await carried.evaluateAll((trs) => trs.map((tr) => [tr.querySelector('mark')?.textContent, tr.querySelector('th').textContent]));
  assert.deepEqual(marked, [
    ['-6.00', '-6.00R, your prescription, right eye'],
    ['-8.00', '-8.00R, your prescription, right eye'],
    ['+7.50', '+7.50L, your prescription, left eye'],
  ]);
  // The letter is for the eye; screen readers hear the words instead.
  assert.equal(await carried.first().locator('.carried-tag').getAttribute('aria-hidden'), 'true');
  const highlighted = await carried.first().evaluate((tr) => getComputedStyle(tr).backgroundColor);
  const plain = await page.locator('table.chart-table tbody tr:not(.carried)').first().evaluate((tr) => getComputedStyle(tr).backgroundColor);
  assert.notEqual(highlighted, plain, 'the carried row looks different');
  await expectText(page.locator('#chart-r-msg'), 'Highlighted in the chart: -6.00 and -8.00.');
  await expectText(page.locator('#chart-l-msg'), 'Highlighted in the chart: +7.50.');
  // A power between the chart's rows has none, and says so.
  await page.getByLabel('Left prescription to find').fill('+7.60');
  await expectText(page.locator('#chart-l-msg'), 'No row of this chart has its principal powers');
  assert.equal(await carried.count(), 2);
  // A prescription that does not read gets its message at its field; the chart stays.
  await page.getByLabel('Left prescription to find').fill('-2.00 -1.00');
  await expectText(page.locator('#chart-l-msg'), 'cylinder needs an axis');
  assert.equal(await tables(page).count(), 2);
  await context.close();
});

// Each bad parameter: its exact message (the core's) at its own field, the
// text kept as typed in the field and the link, and no table.
const BAD = [
  ['min=20&max=4', 'chart-min', 'lowest power 20.00 is above the highest power, 4.00'],
  ['step=0', 'chart-step', 'step 0.00 must be more than 0'],
  ['max=31', 'chart-max', 'highest power 31.00 is outside 0–30 D'],
  ['min=-31', 'chart-min', 'lowest power 31.00 is outside 0–30 D'],
  ['step=40', 'chart-step', 'step 40.00 is outside 0.25–30 D'],
  ['min=0&max=30', 'chart-step', 'the chart would have 241 rows, more than 200 rows: use a larger step or a narrower range'],
  ['step=0.75', 'chart-step', 'step 0.75 does not lead from 4.00 to 20.00 in whole steps: try a highest power of 19.75 or 20.50'],
  ['step=0.3', 'chart-step', 'step 0.30 is not a whole number of quarter dioptres: try 0.25 or 0.50'],
  ['from=45', 'chart-from', 'vertex distance 45 mm is outside 0–30 mm'],
  ['ladder=half', 'chart-ladder', 'ladder "half" is not one of cl (contact-lens steps), spec (spectacle quarter steps)'],
];
for (const [query, field, message] of BAD) {
  test(`bad parameters ${query}: "${message}" at the field and no table`, async () => {
    const { context, page, errors } = await open(`chart?${query}`);
    await expectText(page.locator(`#${field}-msg`), message);
    assert.equal(await page.locator(`#${field}-msg .error`).textContent(), message);
    assert.equal(await page.locator(`#${field}`).getAttribute('aria-invalid'), 'true');
    await page.getByText('No chart: correct the setting that has a message.').waitFor();
    assert.equal(await page.locator('table').count(), 0);
    // Nothing typed is lost: the link keeps the raw text.
    const params = new URLSearchParams(query);
    const url = new URL(page.url());
    for (const [k, v] of params) assert.equal(url.searchParams.get(k), v, k);
    assert.doesNotMatch(await page.locator('main').textContent(), /NaN|Infinity|undefined/);
    // Saving says why there is nothing to save.
    await page.getByRole('button', { name: 'Save to history' }).click();
    await page.getByText('Nothing to save yet: correct the setting that has a message.').waitFor();
    assert.deepEqual(errors, []);
    await context.close();
  });
}

test('a corrected parameter brings the chart back', async () => {
  const { context, page } = await open('chart?step=0');
  await expectText(page.locator('#chart-step-msg'), 'step 0.00 must be more than 0');
  await page.getByLabel('Step', { exact: true }).fill('0.5');
  // 4.00 to 20.00 in 0.50 steps: 33 sizes, each sign [derived from the settings].
  assert.equal((await rows(page)).length, 66);
  await page.waitForURL(/step=0\.5(&|$)/);
  await context.close();
});

test('link round trip: a chart opens from its link, reads as typed, and edits rewrite the link', async () => {
  const { context, page } = await open(`chart?from=10&to=14&min=${enc('-8')}&max=12&step=0.5`);
  await page.getByRole('heading', { level: 2, name: 'Vertex conversion chart: 10 mm → 14 mm, spectacle quarter steps' }).waitFor();
  const all = await rows(page);
  // §11 V6 [textbook]: −10.00 moved from 10 to 14 mm → −10.4167 → −10.50 in quarter steps.
  assert.deepEqual(row(all, '-10.00'), ['-10.00', '-10.42', '-10.50']);
  // 8 to 12 in 0.50 steps: 9 sizes, each sign [derived from the settings].
  assert.equal(all.length, 18);
  // The sign typed is read as the size, and said; the field and the link keep it as typed.
  await expectText(page.locator('#chart-min-msg'), 'the chart lists both signs: -8 read as 8.00');
  assert.equal(await page.getByLabel('Lowest power').inputValue(), '-8');
  assert.equal(await page.getByLabel('Vertex distance of the listed powers').inputValue(), '10');
  assert.equal(await page.getByLabel('Spectacle vertex distance').inputValue(), '14');
  let url = new URL(page.url());
  assert.equal(url.pathname, '/chart');
  assert.deepEqual([...url.searchParams.entries()], [['from', '10'], ['to', '14'], ['min', '-8'], ['max', '12'], ['step', '0.5']]);
  // The target moved to the cornea: the link and the ladder follow (contact-lens steps at the cornea).
  await page.getByRole('radio', { name: 'Contact lens' }).check();
  await page.getByRole('heading', { level: 2, name: 'Vertex conversion chart: 10 mm → cornea (contact lens), contact-lens steps' }).waitFor();
  await page.waitForURL(/to=0/);
  await page.getByLabel('Highest power').fill('12,5');
  await expectText(page.locator('#chart-max-msg'), 'read the comma as a decimal point: 12.50');
  await page.waitForURL(/max=12%2C5/);
  url = new URL(page.url());
  // The rewritten link opens the same chart.
  const back = await browser.newPage();
  await back.goto(url.href);
  await waitForApp(back);
  await back.getByRole('heading', { level: 2, name: 'Vertex conversion chart: 10 mm → cornea (contact lens), contact-lens steps' }).waitFor();
  assert.deepEqual(await rows(back), await rows(page));
  assert.equal(await back.getByLabel('Highest power').inputValue(), '12,5');
  await back.close();
  await context.close();
});

test('a row with no finite lens says so, never a number', async () => {
  // [derived] +26.00 from 30 mm to the cornea: 26 / (1 − 0.030 × 26) = 118 D, beyond the 100 D limit
  // (decision 1 of the core); +24.00: 24 / 0.28 = +85.71 [derived].
  const { context, page } = await open('chart?from=30&to=0&min=24&max=26&step=2');
  const all = await rows(page);
  assert.deepEqual(row(all, '+26.00'), ['+26.00', 'no finite lens', 'none']);
  assert.deepEqual(row(all, '+24.00').slice(0, 2), ['+24.00', '+85.71']);
  assert.doesNotMatch(await page.locator('main').textContent(), /NaN|Infinity|undefined/);
  await context.close();
});

test('CSV download and copy as text give the chart as shown', async () => {
  const { context, page } = await open('chart', { permissions: ['clipboard-read', 'clipboard-write'] });
  await rows(page);
  const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Download CSV' }).click()]);
  assert.equal(download.suggestedFilename(), 'lensplane-chart-12mm-to-cornea-4-20-0.25-cl.csv');
  const csv = readFileSync(await download.path(), 'utf8');
  const lines = csv.split('\r\n');
  assert.equal(lines.pop(), '', 'every line ends with CRLF');
  assert.equal(lines.length, 131);
  assert.equal(lines[0], 'Power at 12 mm,Exact at the cornea,To order (contact-lens steps)');
  // §15 [textbook method] with the contact-lens ladder [common practice (no source)].
  assert.ok(lines.includes('-6.00,-5.60,-5.50'));
  assert.ok(lines.includes('+7.50,+8.24,+8.00'));
  assert.ok(lines.includes('-20.00,-16.13,-16.00'));
  // §11 V1 [textbook]: the first row.
  assert.equal(lines[1], '-4.00,-3.82,-3.75');
  assert.ok(!csv.includes('\n') || csv.split('\n').length === csv.split('\r\n').length);
  await page.getByText('Downloaded lensplane-chart-12mm-to-cornea-4-20-0.25-cl.csv.').waitFor();

  await page.getByRole('button', { name: 'Copy as text' }).click();
  await page.getByRole('status').filter({ hasText: 'Copied as text.' }).waitFor();
  const text = (await page.evaluate(() => navigator.clipboard.readText())).split('\n');
  assert.equal(text[0], 'Lensplane · Conversion chart');
  assert.equal(text[1], DEFAULT_TITLE);
  assert.ok(text.includes('-6.00\t-5.60\t-5.50'));
  assert.ok(text.includes('+7.50\t+8.24\t+8.00'));
  assert.match(text.at(-1), /not a prescription/);
  await context.close();
});

test('saved in the history without eyes, listed with what it is, and reopened from there', async () => {
  const own = await startServer();
  const context = await browser.newContext();
  const page = await context.newPage();
  const errors = watchErrors(page);
  await page.goto(own.url(`chart?from=10&to=14&min=8&max=12&step=0.5&r=${enc('-10.00')}`));
  await waitForApp(page);
  await rows(page);
  await page.getByLabel('Label (optional)').fill('Wall, room 3');
  await page.getByRole('button', { name: 'Save to history' }).click();
  await page.getByText("Saved to this device's history.").waitFor();
  await page.getByRole('navigation', { name: 'Calculators' }).getByRole('link', { name: 'History' }).click();
  const entry = page.locator('.history-entry').filter({ hasText: 'Wall, room 3' });
  await entry.waitFor();
  assert.equal(await entry.locator('.history-calculation').textContent(), 'Conversion chart');
  assert.equal(await entry.locator('.history-summary').textContent(),
    '10 mm → 14 mm, minus and plus 8.00 to 12.00 D in 0.50 D steps, spectacle quarter steps; R -10.00 DS highlighted');
  assert.equal(await entry.locator('.history-eyes').count(), 0);
  // The stored entry has no eyes, its summary instead.
  const stored = await page.evaluate(() => Object.keys(localStorage).filter((k) => /^lensplane\.history\.\d/.test(k)).map((k) => localStorage.getItem(k)).join(''));
  assert.match(stored, /"p":"chart","q":"from=10&to=14&min=8&max=12&step=0.5&r=-10.00","l":"Wall, room 3","d":"10 mm → 14 mm[^"]*","e":\[\]/);
  // The filter finds it by its planes; the calculation filter offers it.
  await page.getByLabel('Filter').fill('10 mm → 14 mm');
  await page.locator('.history-count').getByText('1 entry.').waitFor();
  await page.getByLabel('Calculation').selectOption('chart');
  await page.locator('.history-count').getByText('1 entry.').waitFor();
  // It survives a reload offline, and opens again.
  await waitForWorkerControl(page);
  await own.stop();
  await page.reload();
  await entry.waitFor();
  await entry.getByRole('link', { name: 'Open' }).click();
  await page.waitForURL(/\/chart\?from=10&to=14&min=8&max=12&step=0\.5&r=-10\.00/);
  const all = await rows(page);
  // §11 V6 [textbook]: −10.00 from 10 to 14 mm → −10.42 → −10.50, highlighted as the carried right prescription.
  assert.deepEqual(row(all, '-10.00'), ['-10.00', '-10.42', '-10.50']);
  assert.equal(await page.locator('tr.carried mark').textContent(), '-10.00');
  assert.deepEqual(errors.filter((e) => !/Failed to load resource|ERR_CONNECTION_REFUSED/.test(e)), []);
  await context.close();
});

test('offline: once visited, a chart opens from its link with the server stopped', async () => {
  const { server: own, context, page } = await offlineAfterVisit(browser, 'vertex');
  await page.goto(own.url('chart?ladder=spec'));
  await waitForApp(page);
  // §15 [textbook method], spectacle quarter steps [common practice (no source)]: −20.00 → −16.13 → −16.25.
  assert.deepEqual(row(await rows(page), '-20.00'), ['-20.00', '-16.13', '-16.25']);
  await context.close();
});

for (const scheme of ['light', 'dark']) {
  test(`axe-core finds no WCAG 2.2 AA violations on the chart, with highlighted rows and with an error (${scheme} theme)`, async () => {
    // bypassCSP only so the test can inject axe-core; the app itself runs under its strict policy.
    const { context, page } = await open(`chart?r=${enc('-6.00 -2.00 x180')}&l=${enc('+7.50')}`, { bypassCSP: true, colorScheme: scheme });
    for (const path of [null, 'chart?step=0&ladder=half']) {
      if (path) {
        await page.goto(server.url(path));
        await waitForApp(page);
        await page.getByText('No chart:').waitFor();
      } else {
        await page.locator('tr.carried').first().waitFor();
      }
      await page.addScriptTag({ path: AXE });
      const result = await page.evaluate(async () => globalThis.axe.run(document, {
        runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'] },
      }));
      const found = result.violations.map((v) => `${v.id} (${v.nodes.length}) ${v.nodes.slice(0, 2).map((n) => n.target.join(' ')).join(' | ')}`);
      assert.deepEqual(found, [], found.join('\n'));
    }
    await context.close();
  });
}

test('320 px: no sideways scrolling of the page, with highlighted rows and with an error', async () => {
  const { context, page } = await open(`chart?r=${enc('-6.00 -2.00 x180')}&l=${enc('+7.50')}`, { viewport: { width: 320, height: 640 } });
  for (const path of [null, 'chart?min=20&max=4&ladder=half', 'chart?from=10&to=14&ladder=cl']) {
    if (path) {
      await page.goto(server.url(path));
      await waitForApp(page);
      await page.getByRole('heading', { level: 1, name: 'Conversion chart' }).waitFor();
    }
    await page.locator('table.chart-table, .chart-none').first().waitFor();
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
    assert.ok(overflow <= 0, `${path ?? 'carried'} scrolls sideways by ${overflow}px`);
  }
  await context.close();
});

/** The pages of a PDF: its page objects (`/Type /Page`, not the `/Pages` tree). */
const pdfPages = (pdf) => (pdf.toString('latin1').match(/\/Type\s*\/Page(?![a-zA-Z])/g) || []).length;

test('printed, the default chart fits two A4 pages and two US Letter pages, in ink, without controls', async () => {
  const { context, page } = await open(`chart?r=${enc('-6.00 -2.00 x180')}`);
  await rows(page);
  // The browser's usual print margins (about 1 cm).
  const margin = { top: '10mm', bottom: '10mm', left: '10mm', right: '10mm' };
  const a4 = await page.pdf({ format: 'A4', margin });
  const letter = await page.pdf({ format: 'Letter', margin });
  const a4Pages = pdfPages(a4);
  const letterPages = pdfPages(letter);
  assert.ok(a4Pages >= 1 && a4Pages <= 2, `A4: ${a4Pages} pages`);
  assert.ok(letterPages >= 1 && letterPages <= 2, `Letter: ${letterPages} pages`);
  // The counter can fail: a chart of 200 rows does not fit two pages.
  await page.goto(server.url('chart?min=4&max=28.75'));
  await waitForApp(page);
  assert.equal((await rows(page)).length, 200);
  assert.ok(pdfPages(await page.pdf({ format: 'A4', margin })) > a4Pages, 'a longer chart prints on more pages');

  // What is on paper: the title says what it is, the version and date, the cautions; no
  // navigation or buttons; black on white whatever the theme.
  const dark = await browser.newContext({ colorScheme: 'dark' });
  const p = await dark.newPage();
  await p.goto(server.url(`chart?r=${enc('-6.00 -2.00 x180')}`));
  await waitForApp(p);
  await rows(p);
  await p.emulateMedia({ media: 'print', colorScheme: 'dark' });
  await p.getByRole('heading', { level: 2, name: DEFAULT_TITLE }).waitFor();
  const version = await p.locator('meta[name="lensplane-version"]').getAttribute('content');
  const today = await p.evaluate(() => {
    const d = new Date();
    return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, '0')}-${String(d.getDate()).padStart(2, '0')}`;
  });
  assert.equal(await p.locator('.chart-stamp').textContent(), `Lensplane ${version} · ${today}`);
  assert.ok(await p.locator('.chart-stamp').isVisible());
  assert.ok(await p.getByRole('complementary', { name: 'Cautions' }).getByText('Results are starting points, not a prescription').isVisible());
  const visibleControls = await p.evaluate(() => [...document.querySelectorAll('nav, button, input, select, a[href]')]
    .filter((el) => el.checkVisibility() && !el.classList.contains('skip-link')).map((el) => el.outerHTML.slice(0, 60)));
  assert.deepEqual(visibleControls, []);
  const ink = await p.evaluate(() => {
    const cell = document.querySelector('table.chart-table tbody td');
    const carried = document.querySelector('table.chart-table tr.carried');
    return [getComputedStyle(cell).color, getComputedStyle(document.body).backgroundColor, getComputedStyle(carried).backgroundColor];
  });
  assert.equal(ink[0], 'rgb(0, 0, 0)');
  assert.equal(ink[1], 'rgb(255, 255, 255)');
  assert.equal(ink[2], 'rgb(255, 255, 255)');
  // The two blocks side by side on paper.
  const [minus, plus] = await p.locator('table.chart-table').evaluateAll((ts) => ts.map((t) => t.getBoundingClientRect().left));
  assert.ok(plus > minus, 'plus block beside the minus block');
  await dark.close();
  await context.close();
});
