// History: saving from a panel, the list, open/delete/undo/clear, filter,
// export and import, persistence (reload, offline), and every storage fault
// in real Chromium. Clinical figures: C1 and V4 of shared/optics-notes.md
// [textbook: the vertex formula F/(1 − dF), Bennett & Rabbetts, Clinical
// Visual Optics 4th ed.]: −8.00 −2.00 ×180 at 12 mm → −7.30 −1.63 ×180 at the
// cornea; −10.00 D at 12 mm → −8.93 D.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync } from 'node:fs';
import { startServer, launch, waitForApp, waitForWorkerControl, watchErrors } from './harness.js';
import { makeEntries, storedLayout, writeItems } from './history-fixtures.js';

let server;
let browser;
before(async () => { server = await startServer(); browser = await launch(); });
after(async () => { await browser?.close(); await server?.stop(); });

const C1_INPUT = '-8.00 -2.00 x180';
const C1_CORNEA = '-7.30 -1.63 ×180';

async function fresh(options = {}) {
  const context = await browser.newContext({ acceptDownloads: true, ...options });
  const page = await context.newPage();
  return { context, page };
}

const rightResult = (page) => page.getByRole('region', { name: 'Right eye result' });
const entries = (page) => page.locator('.history-entry');
const count = (page) => page.locator('.history-count');

/** Opens the vertex panel with `r`, waits for its result and saves it. */
async function saveVertex(page, r, label, expect = "Saved to this device's history.") {
  await page.goto(server.url(`vertex?r=${encodeURIComponent(r)}`));
  await waitForApp(page);
  await rightResult(page).getByText('×').first().or(rightResult(page).getByText('DS').first()).first().waitFor();
  if (label) await page.getByLabel('Label (optional)').fill(label);
  await page.getByRole('button', { name: 'Save to history' }).click();
  await page.getByText(expect).waitFor();
}

async function openHistory(page, query = '') {
  await page.goto(server.url(`history${query}`));
  await page.getByRole('heading', { level: 1, name: 'History' }).waitFor();
}

/** Seeds localStorage on the app's origin, then opens the history. */
async function seeded(page, items, query = '') {
  await page.goto(server.url('icons/icon.svg'));
  await page.evaluate(writeItems, items);
  await openHistory(page, query);
}

async function downloadText(page, button) {
  const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: button }).click()]);
  return { name: download.suggestedFilename(), text: readFileSync(await download.path(), 'utf8') };
}

test('a saved calculation shows in the history, survives reload and offline, and opening it restores the panel', async () => {
  const own = await startServer();
  const { context, page } = await fresh();
  const errors = watchErrors(page);
  await page.goto(own.url(`vertex?r=${encodeURIComponent(C1_INPUT)}`));
  await waitForApp(page);
  await rightResult(page).getByText(C1_CORNEA).first().waitFor();
  // A label that looks like markup must stay text.
  const label = 'Bench <img src=x onerror="window.__pwned=1"> A';
  await page.getByLabel('Label (optional)').fill(label);
  await page.getByRole('button', { name: 'Save to history' }).click();
  await page.getByText("Saved to this device's history.").waitFor();
  await page.getByRole('navigation', { name: 'Calculators' }).getByRole('link', { name: 'History' }).click();
  const entry = entries(page).filter({ hasText: C1_CORNEA });
  await entry.waitFor();
  assert.equal(await entry.locator('.history-label').textContent(), label);
  assert.equal(await entry.locator('img').count(), 0);
  assert.match(await entry.textContent(), /Vertex/);
  assert.match(await page.locator('.history-day h2').first().textContent(), /^Today, /);
  assert.equal(await page.evaluate(() => window.__pwned), undefined);

  await waitForWorkerControl(page);
  await page.reload();
  await entries(page).filter({ hasText: label }).waitFor();
  await own.stop();
  await page.reload();
  await entries(page).filter({ hasText: label }).waitFor();

  await entries(page).filter({ hasText: label }).getByRole('link', { name: 'Open' }).click();
  await page.waitForURL(/\/vertex\?r=-8\.00%20-2\.00%20x180/);
  await rightResult(page).getByText(C1_CORNEA).first().waitFor();
  assert.equal(await page.getByLabel('Right sphere', { exact: true }).inputValue(), '-8.00');
  assert.deepEqual(errors.filter((e) => !/Failed to load resource|ERR_CONNECTION_REFUSED/.test(e)), []);
  await context.close();
});

test('delete with undo, and clear all only after a confirmation', async () => {
  const { context, page } = await fresh();
  await seeded(page, storedLayout(makeEntries(3)));
  await count(page).getByText('3 entries.').waitFor();
  const newest = entries(page).first();
  const text = await newest.textContent();
  await newest.getByRole('button', { name: 'Delete' }).click();
  await count(page).getByText('2 entries.').waitFor();
  await page.reload();
  await count(page).getByText('2 entries.').waitFor();
  assert.notEqual(await entries(page).first().textContent(), text);

  await entries(page).first().getByRole('button', { name: 'Delete' }).click();
  await count(page).getByText('1 entry.').waitFor();
  await page.getByRole('button', { name: 'Undo' }).click();
  await count(page).getByText('2 entries.').waitFor();
  await page.reload();
  await count(page).getByText('2 entries.').waitFor();

  await page.getByRole('button', { name: 'Clear all…' }).click();
  await page.getByText('Delete all 2 entries from this device?').waitFor();
  await page.getByRole('button', { name: 'Cancel' }).click();
  assert.equal(await entries(page).count(), 2);
  await page.getByRole('button', { name: 'Clear all…' }).click();
  await page.getByRole('button', { name: 'Delete all entries' }).click();
  await page.getByText('Nothing saved yet.').waitFor();
  await page.reload();
  await page.getByText('Nothing saved yet.').waitFor();
  // Controls that do not apply are not on screen (the hidden attribute beats any class's display).
  for (const name of ['Clear all…', 'Undo', 'Show more', 'Export unreadable data']) {
    assert.equal(await page.locator('button', { hasText: name }).first().isVisible(), false, name);
  }
  await context.close();
});

test('filter by text (label, power) and by calculation, kept in the link', async () => {
  const { context, page } = await fresh();
  // 12 entries: panels cycle vertex, equivalent, near; labels "Room i%7" except every fourth.
  await seeded(page, storedLayout(makeEntries(12)));
  await count(page).getByText('12 entries.').waitFor();
  await page.getByLabel('Filter').fill('room 1');
  await count(page).getByText('2 of 12 entries match.').waitFor(); // i = 1, 8
  assert.match(page.url(), /history\?q=room%201/);
  // Typed "x" and "-" match the stored × and minus: i=6 is -1.50 -1.50 ×30.
  await page.getByLabel('Filter').fill('-1.50 -1.50 x30');
  await count(page).getByText('1 of 12 entries match.').waitFor();
  await page.getByLabel('Filter').fill('');
  const options = await page.getByLabel('Calculation').locator('option').allTextContents();
  assert.equal(options[0], 'All calculations');
  for (const name of ['Vertex', 'Spherical equivalent', 'Near']) assert.ok(options.includes(name), name);
  await page.getByLabel('Calculation').selectOption('near');
  await count(page).getByText('4 of 12 entries match.').waitFor();
  assert.equal(await entries(page).filter({ hasText: 'Near' }).count(), 4);
  await page.getByLabel('Filter').fill('room');
  await count(page).getByText('3 of 12 entries match.').waitFor(); // near: 2, 5, 8, 11 (11 unlabelled)
  // The filter opens from its link.
  await openHistory(page, '?q=room%202&panel=near');
  await count(page).getByText('1 of 12 entries match.').waitFor();
  assert.equal(await page.getByLabel('Filter').inputValue(), 'room 2');
  assert.equal(await page.getByLabel('Calculation').inputValue(), 'near');
  await context.close();
});

test('the filter ignores case in any script, and reads x as ×', async () => {
  const { context, page } = await fresh();
  const list = makeEntries(3);
  list[0].l = 'Salle Émeraude';
  list[1].l = 'КАБИНЕТ 4';
  await seeded(page, storedLayout(list));
  await count(page).getByText('3 entries.').waitFor();
  for (const [typed, matches] of [['salle ém', 1], ['ÉMERAUDE', 1], ['кабинет', 1], ['SALLE', 1]]) {
    await page.getByLabel('Filter').fill(typed);
    await count(page).getByText(`${matches} of 3 entries match.`).waitFor();
  }
  // Entry 1 is -0.25 -0.25 ×5 in the fixtures: typed with x for ×.
  await page.getByLabel('Filter').fill('-0.25 x5');
  await count(page).getByText('1 of 3 entries match.').waitFor();
  await context.close();
});

test('corrupt stored data: the app starts and computes, says so, and keeps the data aside for export', async () => {
  const { context, page } = await fresh();
  const errors = watchErrors(page);
  await page.goto(server.url('icons/icon.svg'));
  await page.evaluate(() => {
    localStorage.setItem('lensplane.history', '{"schema":2,"chunks":[["2024-05",');
    localStorage.setItem('lensplane.history.2.0', '[{"id":"x","t":');
  });
  // V4 [textbook]: −10.00 D at 12 mm → −8.93 D at the cornea.
  await page.goto(server.url('vertex?r=-10.00'));
  await waitForApp(page);
  await rightResult(page).getByText('-8.93').first().waitFor();
  await page.locator('.storage-banner').getByText('could not be read').waitFor();
  const aside = JSON.parse(await page.evaluate(() => localStorage.getItem('lensplane.history.aside')));
  assert.deepEqual(aside.map(([k]) => k).sort(), ['lensplane.history', 'lensplane.history.2.0']);
  assert.ok(aside.some(([, v]) => v === '{"schema":2,"chunks":[["2024-05",'));

  await saveVertex(page, '-4.00', 'after the fault');
  await openHistory(page);
  await entries(page).filter({ hasText: 'after the fault' }).waitFor();
  const { name, text } = await downloadText(page, 'Export unreadable data');
  assert.match(name, /\.json$/);
  const file = JSON.parse(text);
  assert.equal(file.format, 'lensplane-unreadable');
  assert.ok(file.kept.some(([k, v]) => k === 'lensplane.history.2.0' && v === '[{"id":"x","t":'));
  assert.deepEqual(errors, []);
  await context.close();
});

test('storage full: a clear message, nothing stored is lost, the calculation stays on screen', async () => {
  const { context, page } = await fresh();
  await saveVertex(page, '-4.00', 'stored before');
  await page.goto(server.url(`vertex?r=${encodeURIComponent(C1_INPUT)}`));
  await waitForApp(page);
  await rightResult(page).getByText(C1_CORNEA).first().waitFor();
  const before = await page.evaluate(() => ({ ...localStorage }));
  await page.evaluate(() => {
    Storage.prototype.setItem = function () { throw new DOMException('The quota has been exceeded.', 'QuotaExceededError'); };
  });
  await page.getByLabel('Label (optional)').fill('does not fit');
  await page.getByRole('button', { name: 'Save to history' }).click();
  await page.getByText("Not saved: this device's storage is full. Nothing already saved was lost").waitFor();
  await rightResult(page).getByText(C1_CORNEA).first().waitFor();
  assert.equal(await page.getByLabel('Label (optional)').inputValue(), 'does not fit');
  assert.deepEqual(await page.evaluate(() => ({ ...localStorage })), before);
  await openHistory(page); // a new page: setItem is the browser's own again
  await count(page).getByText('1 entry.').waitFor();
  await entries(page).filter({ hasText: 'stored before' }).waitFor();
  await context.close();
});

test('storage full while deleting or clearing: the page says what did not happen, and nothing is lost', async () => {
  const { context, page } = await fresh();
  await seeded(page, storedLayout(makeEntries(2)));
  await count(page).getByText('2 entries.').waitFor();
  const before = await page.evaluate(() => ({ ...localStorage }));
  await page.evaluate(() => {
    Storage.prototype.setItem = function () { throw new DOMException('The quota has been exceeded.', 'QuotaExceededError'); };
  });
  await entries(page).first().getByRole('button', { name: 'Delete' }).click();
  await page.getByRole('status').getByText("Not deleted: this device's storage is full. Nothing already saved was lost").waitFor();
  await count(page).getByText('2 entries.').waitFor();
  await page.getByRole('button', { name: 'Clear all…' }).click();
  await page.getByRole('button', { name: 'Delete all entries' }).click();
  await page.getByRole('status').getByText("Nothing was deleted: this device's storage is full.").waitFor();
  await count(page).getByText('2 entries.').waitFor();
  assert.deepEqual(await page.evaluate(() => ({ ...localStorage })), before);
  await context.close();
});

test('a quota of nothing (as some private windows have): the first save is kept for the session, and the message says so', async () => {
  const { context, page } = await fresh();
  await context.addInitScript(() => {
    Storage.prototype.setItem = function () { throw new DOMException('The quota has been exceeded.', 'QuotaExceededError'); };
  });
  await saveVertex(page, C1_INPUT, 'private window', 'Saved for this session only');
  assert.equal(await page.getByText('storage is full').count(), 0);
  await page.locator('.storage-banner:visible').getByText('session only').waitFor();
  await page.getByRole('navigation', { name: 'Calculators' }).getByRole('link', { name: 'History' }).click();
  await count(page).getByText('1 entry.').waitFor();
  await page.locator('.storage-banner:visible').getByText('session only').waitFor();
  await context.close();
});

test('storage unavailable: computes, keeps a session history in memory and says it will not persist', async () => {
  const { context, page } = await fresh();
  await context.addInitScript(() => {
    Object.defineProperty(window, 'localStorage', { get() { throw new DOMException('Access is denied.', 'SecurityError'); } });
  });
  await page.goto(server.url(`vertex?r=${encodeURIComponent(C1_INPUT)}`));
  await waitForApp(page);
  await rightResult(page).getByText(C1_CORNEA).first().waitFor();
  await page.locator('.storage-banner').getByText('session only').waitFor();
  await page.getByLabel('Label (optional)').fill('memory only');
  await page.getByRole('button', { name: 'Save to history' }).click();
  await page.getByText('Saved for this session only').waitFor();
  await page.getByRole('navigation', { name: 'Calculators' }).getByRole('link', { name: 'History' }).click();
  await entries(page).filter({ hasText: 'memory only' }).waitFor();
  await page.getByRole('alert').getByText('will be gone when the page is closed').waitFor();
  assert.ok(await page.locator('nav + .storage-banner').isHidden(), 'the shell banner steps aside on the history page');
  await context.close();
});

test('data from the older schema loads after the upgrade', async () => {
  const { context, page } = await fresh();
  const v1 = [{ id: 'old-1', time: 1714745100, link: '/vertex?r=-10.00&from=12&to=0', label: 'Older layout',
    eyes: [{ eye: 'R', input: '-10.00 DS', result: '-8.93 DS', order: '-9.00 DS' }] }];
  await seeded(page, { 'lensplane.history.1': JSON.stringify(v1) });
  const entry = entries(page).filter({ hasText: 'Older layout' });
  await entry.waitFor();
  assert.match(await entry.textContent(), /-10\.00 DS → -8\.93 DS · order -9\.00 DS/);
  const stored = await page.evaluate(() => ({ ...localStorage }));
  assert.equal(stored['lensplane.history.1'], undefined);
  assert.equal(JSON.parse(stored['lensplane.history']).schema, 2);
  await page.reload();
  await entry.waitFor();
  await entry.getByRole('link', { name: 'Open' }).click();
  await page.waitForURL(/\/vertex\?r=-10\.00&from=12&to=0/);
  await rightResult(page).getByText('-8.93').first().waitFor();
  await context.close();
});

test('export JSON and CSV as downloads; re-import skips duplicates; bad files change nothing', async () => {
  const { context, page } = await fresh();
  await seeded(page, storedLayout(makeEntries(3)));
  await count(page).getByText('3 entries.').waitFor();
  const json = await downloadText(page, 'Export JSON');
  assert.match(json.name, /^lensplane-history-\d{4}-\d{2}-\d{2}\.json$/);
  const file = JSON.parse(json.text);
  assert.equal(file.format, 'lensplane-history');
  assert.equal(file.schema, 2);
  assert.deepEqual(file.entries.map((e) => e.id), ['seed-0', 'seed-1', 'seed-2']);

  const csv = await downloadText(page, 'Export CSV');
  assert.match(csv.name, /\.csv$/);
  const rows = csv.text.replace(/^\uFEFF/, '').trim().split('\r\n');
  // One row per eye: entries 0 and 2 have both eyes, entry 1 the right only.
  assert.equal(rows.length, 1 + 5);
  assert.equal(rows[0], 'date,time,calculation,label,eye,entered,result,orderable');
  // The calculation is its stable id, not its label.
  assert.match(rows[1], /^\d{4}-\d{2}-\d{2},\d{2}:\d{2},near,Room 2,R,-0\.50 -0\.50 ×010,/);
  assert.match(rows[3], /^\d{4}-\d{2}-\d{2},\d{2}:\d{2},equivalent,Room 1,R,/);

  await page.getByRole('button', { name: 'Clear all…' }).click();
  await page.getByRole('button', { name: 'Delete all entries' }).click();
  await page.getByText('Nothing saved yet.').waitFor();
  const importFile = (name, text) => page.getByLabel('Import JSON…').setInputFiles({ name, mimeType: 'application/json', buffer: Buffer.from(text) });
  await importFile('back.json', json.text);
  await page.getByText('Imported 3 entries.').waitFor();
  await count(page).getByText('3 entries.').waitFor();
  await importFile('back.json', json.text);
  await page.getByText('Nothing new to import: all 3 entries already in the history.').waitFor();

  const before = await page.evaluate(() => ({ ...localStorage }));
  await importFile('notes.json', 'these are not the droids');
  await page.getByText('The file was not imported: it is not a Lensplane history export (JSON). Nothing was changed.').waitFor();
  const tampered = { ...file, entries: [...file.entries, { ...file.entries[0], id: 'new-one', p: 'elsewhere' }] };
  await importFile('tampered.json', JSON.stringify(tampered));
  await page.getByText('The file was not imported: entry new-one names an unknown panel. Nothing was changed.').waitFor();
  await importFile('huge.json', `{"format":"lensplane-history","schema":2,"pad":"${'x'.repeat(6_100_000)}"}`);
  await page.getByText('larger than 6 MB').waitFor();
  assert.deepEqual(await page.evaluate(() => ({ ...localStorage })), before);
  await count(page).getByText('3 entries.').waitFor();
  await context.close();
});

test('asks the browser for persistent storage once, ever', async () => {
  const { context, page } = await fresh();
  await context.addInitScript(() => {
    window.__persistCalls = 0;
    if (navigator.storage) navigator.storage.persist = async () => { window.__persistCalls += 1; return false; };
  });
  await saveVertex(page, '-4.00', 'one');
  assert.equal(await page.evaluate(() => window.__persistCalls), 1);
  await page.getByRole('button', { name: 'Save to history' }).click();
  await page.getByText("Saved to this device's history.").waitFor();
  assert.equal(await page.evaluate(() => window.__persistCalls), 1);
  await saveVertex(page, '-5.00', 'two');
  assert.equal(await page.evaluate(() => window.__persistCalls), 0);
  await context.close();
});

test('10,000 entries open showing one page, with more on request', async () => {
  const { context, page } = await fresh();
  await seeded(page, storedLayout(makeEntries(10_000)));
  await count(page).getByText('10000 entries.').waitFor();
  assert.equal(await entries(page).count(), 50);
  await page.getByRole('button', { name: 'Show more' }).click();
  await page.waitForFunction(() => document.querySelectorAll('.history-entry').length === 100);
  await page.getByLabel('Filter').fill('-9.75');
  await count(page).getByText(/^\d+ of 10000 entries match\.$/).waitFor();
  assert.ok((await entries(page).count()) <= 50);
  await context.close();
});

test('a large history opens in slices: the newest month shows first while older months are read, and typing meanwhile is kept', async () => {
  const { context, page } = await fresh();
  await page.goto(server.url('icons/icon.svg'));
  // 10,000 entries an hour apart: fourteen stored months, newest read first.
  const list = makeEntries(10_000, Date.UTC(2024, 4, 3, 8, 0), 3_600_000);
  await page.evaluate(writeItems, storedLayout(list));
  // A phone-class CPU, so that reading takes many slices here too.
  const cdp = await context.newCDPSession(page);
  await cdp.send('Emulation.setCPUThrottlingRate', { rate: 4 });
  await openHistory(page);
  await count(page).getByText(/Still opening older entries…$/).waitFor();
  const newest = list[list.length - 1];
  assert.equal(await entries(page).first().locator('button[data-id]').getAttribute('data-id'), newest.id);
  // Typing while reading goes on is not lost, and the count follows the months as they arrive.
  await page.getByLabel('Filter').fill('room 3');
  await count(page).getByText(/^\d+ of 10000 entries match\.$/).waitFor();
  assert.equal(await page.getByLabel('Filter').inputValue(), 'room 3');
  const slices = await page.evaluate(() => globalThis.lensplaneHistorySlices);
  assert.ok(slices > 5, `read in ${slices} slices`);
  await context.close();
});
