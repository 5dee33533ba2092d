// Near panel: accommodation through spectacles and contact lenses, the
// equivalent add at another plane, amplitude by age, and the panel's link,
// field and stale behaviour, in real Chromium.
//
// Expected figures are not taken from the app. Each carries its source:
// - [textbook] the vergence chain of clinical optics texts (Bennett &
//   Rabbetts, Clinical Visual Optics 4th ed.; Keating, Geometric, Physical and
//   Visual Optics 2nd ed.); worked values N1/N2 of shared/optics-notes.md §11,
//   recomputed there.
// - [derived] worked out from that chain with plain arithmetic (N3/N4 of the
//   notes, or computed by hand where a comment shows the steps).
// - [published] Hofstetter's age-amplitude formulas (1950; H1 of the notes;
//   citation details from memory).
// - [definition] demand = 100 / distance in cm; 1 in = 2.54 cm exactly
//   (international yard and pound agreement, 1959).
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { startServer, launch, waitForApp, watchErrors } from './harness.js';

let server;
let browser;
before(async () => { server = await startServer(); browser = await launch(); });
after(async () => { await browser?.close(); await server?.stop(); });

const WAIT = { timeout: 15000 };
const escape = (s) => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
const exactly = (s) => new RegExp(`^\\s*${escape(s)}\\s*$`);

const result = (page, eye) => page.getByRole('region', { name: `${eye} eye result` });
// The card leads with the add in quarter steps; the exact equivalent add sits beside it.
const mainValue = (page, eye) => result(page, eye).locator('.result-exact .rx');
const orderValue = (page, eye) => result(page, eye).locator('output.rx.big');

function row(page, eye, label) {
  const dt = page.locator('dt', { hasText: label instanceof RegExp ? label : exactly(label) });
  return result(page, eye).locator('.result-row').filter({ has: dt });
}

/** Waits until the row labelled `label` of `eye` shows exactly `value`; on failure says what it showed. */
async function expectRow(page, eye, label, value) {
  const r = row(page, eye, label);
  try {
    await r.locator('.rx', { hasText: exactly(value) }).first().waitFor(WAIT);
  } catch {
    assert.fail(`${eye} eye, "${label}": expected ${value}, page shows ${JSON.stringify(await r.allInnerTexts())}`);
  }
}

/** Waits until the row's detail text matches `pattern`. */
async function expectDetail(page, eye, label, pattern) {
  const r = row(page, eye, label);
  try {
    await r.locator('.detail', { hasText: pattern }).first().waitFor(WAIT);
  } catch {
    assert.fail(`${eye} eye, "${label}": detail should match ${pattern}, page shows ${JSON.stringify(await r.allInnerTexts())}`);
  }
}

async function expectMain(page, eye, value) {
  try {
    await mainValue(page, eye).filter({ hasText: exactly(value) }).waitFor(WAIT);
  } catch {
    assert.fail(`${eye} eye main result: expected ${value}, page shows ${JSON.stringify(await mainValue(page, eye).allInnerTexts())}`);
  }
}

/** Waits until the address bar matches `pattern` (the panel writes it with replaceState). */
async function expectUrl(page, pattern) {
  try {
    await page.waitForFunction((src) => new RegExp(src).test(location.pathname + location.search), pattern.source, WAIT);
  } catch {
    assert.fail(`address should match ${pattern}, is ${page.url()}`);
  }
}

/** The message shown under a field (tied to it by aria-describedby). */
async function fieldMessage(page, field) {
  const id = await field.getAttribute('aria-describedby');
  return page.locator(`[id="${id}"]`);
}

async function expectFieldError(page, field, pattern) {
  const msg = await fieldMessage(page, field);
  try {
    await msg.locator('.error', { hasText: pattern }).waitFor(WAIT);
  } catch {
    assert.fail(`field message should match ${pattern}, shows ${JSON.stringify(await msg.innerText())}`);
  }
  assert.equal(await field.getAttribute('aria-invalid'), 'true');
}

async function open(route) {
  const page = await browser.newPage();
  // The figures checked here sit behind each card's disclosure: remembered open, as a user would leave it.
  await page.addInitScript(() => { try { localStorage.setItem('lensplane.details.near', 'open'); } catch { /* about:blank */ } });
  const errors = watchErrors(page);
  await page.goto(server.url(route));
  await waitForApp(page);
  return { page, errors };
}

const addField = (page) => page.getByLabel('Spectacle add', { exact: true });
const readingField = (page) => page.getByLabel('Reading distance', { exact: true });
const ageField = (page) => page.getByLabel('Age', { exact: true });

test('N1/N2 [textbook]: accommodation at 40 cm through −6.00 and +6.00 spectacles at 12 mm, and in contact lenses', async () => {
  const { page, errors } = await open('near?r=-6.00&l=%2B6.00&from=12&to=0&reading=40&measured=lens');
  // N1 [textbook]: −6.00 @ 12 mm, object 40 cm from the lens: ocular accommodation 2.1162, contact lens 2.4272, spectacle 2.50.
  await expectRow(page, 'Right', 'Accommodation through the spectacles, no add', '2.12 D');
  await expectRow(page, 'Right', 'Accommodation in contact lenses, no add', '2.43 D');
  await expectDetail(page, 'Right', 'Demand at 40 cm', /spectacle accommodation \(at the lens plane\) 2\.50 D/);
  // N2 [textbook]: +6.00 @ 12 mm: 2.8121 through the spectacles; contact lens 2.4272.
  await expectRow(page, 'Left', 'Accommodation through the spectacles, no add', '2.81 D');
  await expectRow(page, 'Left', 'Accommodation in contact lenses, no add', '2.43 D');
  // Notes §6.3 and §10 [textbook]: a myope needs more accommodation in contact lenses, a hyperope less.
  await result(page, 'Right').locator('.reason', { hasText: /myope needs more accommodation in contact lenses/ }).waitFor(WAIT);
  // No add entered: the card leads with the accommodation and shows no add rows.
  await orderValue(page, 'Right').filter({ hasText: exactly('2.43 D') }).waitFor(WAIT);
  assert.equal(await result(page, 'Right').getByText('Equivalent add in quarter steps').count(), 0);
  await result(page, 'Left').locator('.reason', { hasText: /hyperope needs less accommodation in contact lenses/ }).waitFor(WAIT);
  assert.deepEqual(errors, []);
  await page.close();
});

test('N3/N4 [derived]: the equivalent contact-lens add follows the vergence chain, not the shortcut V(F + A) − V(F)', async () => {
  const { page, errors } = await open('near?r=-6.00&l=%2B6.00&add=2.50&from=12&to=0&reading=40');
  // N3 [derived]: −6.00, add +2.50, 40 cm from the lens: relief at the eye 2.1162, contact-lens add 2.4272.
  await expectMain(page, 'Right', '+2.43');
  await expectRow(page, 'Right', 'Relief the spectacle add gives at the eye', '2.12 D');
  // [derived] An add equal to the spectacle demand (2.50 D at 40 cm from the lens) leaves light from the
  // object leaving the lens as from infinity: L' = L + F + A = F, so no accommodation is left to do.
  await expectRow(page, 'Right', 'Accommodation through the spectacles with the add +2.50', '0.00 D');
  // N4 [derived]: +6.00, add +2.50: relief 2.8121, contact-lens add 2.4272.
  await expectMain(page, 'Left', '+2.43');
  await expectRow(page, 'Left', 'Relief the spectacle add gives at the eye', '2.81 D');
  // The shortcut would give +2.24 (N3) and +3.00 (N4), notes §6 and §11: neither may be the result.
  assert.notEqual((await mainValue(page, 'Right').innerText()).trim(), '+2.24');
  assert.notEqual((await mainValue(page, 'Left').innerText()).trim(), '+3.00');
  assert.doesNotMatch(await result(page, 'Right').innerText(), /2\.24/);
  // The equivalent add in quarter steps: 2.4272 → +2.50 (notes §5, ties toward plus) [common practice];
  // at the cornea it is an equivalent add, not an orderable multifocal label.
  await expectRow(page, 'Right', 'Equivalent add in quarter steps', '+2.50');
  await expectRow(page, 'Left', 'Equivalent add in quarter steps', '+2.50');
  await orderValue(page, 'Right').filter({ hasText: exactly('+2.50') }).waitFor(WAIT);
  assert.equal(await result(page, 'Right').getByText(/orderable add/i).count(), 0);
  // [derived] Near prescription at the cornea, exact: distance power there (notes §2: −6/(1 + 0.012·6) = −5.5970;
  // +6/(1 − 0.012·6) = +6.4655) plus the 2.4272 add: −3.1698 and +8.8927.
  await expectRow(page, 'Right', 'Near prescription at the cornea (contact lens), exact', '-3.17 DS');
  await expectRow(page, 'Left', 'Near prescription at the cornea (contact lens), exact', '+8.89 DS');
  // Orderable [common practice, notes §5 contact-lens ladder]: −5.5970 → −5.50 and +6.4655 → +6.50 (0.50 steps beyond 6),
  // each plus the orderable add +2.50.
  await expectRow(page, 'Right', 'Near prescription in steps', '-3.00 DS');
  await expectRow(page, 'Left', 'Near prescription in steps', '+9.00 DS');
  assert.deepEqual(errors, []);
  await page.close();
});

test('D1 [definition]: the demand of 40, 33.33 and 25 cm is 2.50, 3.00 and 4.00 D', async () => {
  const { page } = await open('near?r=-2.00&add=1.50');
  for (const [cm, demand] of [['40', '2.50 D'], ['33.33', '3.00 D'], ['25', '4.00 D']]) {
    await readingField(page).fill(`${cm} cm`);
    await expectRow(page, 'Right', `Demand at ${cm} cm`, demand);
  }
  await page.close();
});

test('H1 [published] and A1 [textbook]: Hofstetter amplitudes at 40 and 50, tentative adds at 40 cm', async () => {
  const { page, errors } = await open('near?r=plano&add=2.00&reading=40&age=40');
  // H1 [published]: age 40 → 5.00 / 6.50 / 9.00 D (minimum / average / maximum).
  await expectRow(page, 'Right', 'Amplitude at age 40 (Hofstetter)', '5.00 / 6.50 / 9.00 D');
  await ageField(page).fill('50');
  // H1 [published]: age 50 → 2.50 / 3.50 / 5.00 D.
  await expectRow(page, 'Right', 'Amplitude at age 50 (Hofstetter)', '2.50 / 3.50 / 5.00 D');
  // A1 [textbook]: 40 cm (2.50 D), minimum amplitude 2.50: half in reserve 2.50 − 1.25 = 1.25;
  // one-third in reserve 2.50 − 1.6667 = 0.8333 → 0.75 on quarter steps; compared with the add entered.
  await expectRow(page, 'Right', 'Tentative add, minimum amplitude', '+1.25');
  await expectDetail(page, 'Right', 'Tentative add, minimum amplitude',
    /one-third in reserve \+0\.83 \(orderable \+0\.75\); add entered \+2\.00/);
  // [derived from the same textbook rule] average amplitude 3.50: half in reserve 2.50 − 1.75 = 0.75.
  await expectRow(page, 'Right', 'Tentative add, average amplitude', '+0.75');
  await expectUrl(page, /age=50/);
  // The population-estimate caution is on the page.
  await page.getByRole('complementary', { name: 'Cautions' }).getByText(/population estimate/).waitFor(WAIT);
  assert.deepEqual(errors, []);
  await page.close();
});

test('inches: 16 in is 40.64 cm, and switching the unit re-reads the same text', async () => {
  const { page, errors } = await open('near?r=-6.00&add=2.50&reading=16&unit=in');
  assert.equal(await readingField(page).inputValue(), '16');
  assert.equal(await page.getByRole('radio', { name: 'in', exact: true }).isChecked(), true);
  // [definition] 16 in = 40.64 cm; demand 100 / 40.64 = 2.4606 D.
  await expectRow(page, 'Right', 'Demand at 16 in (40.64 cm)', '2.46 D');
  // Back to centimetres: a bare 16 could be either, so the field asks (notes §9).
  await page.getByRole('radio', { name: 'cm', exact: true }).check();
  await expectFieldError(page, readingField(page), /needs a unit/);
  await expectUrl(page, /^\/near\?(?!.*unit=)/);
  await page.getByRole('radio', { name: 'in', exact: true }).check();
  await expectUrl(page, /reading=16&unit=in/);
  await expectRow(page, 'Right', 'Demand at 16 in (40.64 cm)', '2.46 D');
  assert.deepEqual(errors, []);
  await page.close();
});

test('measured from the eye changes the figures (notes §6.3)', async () => {
  const { page } = await open('near?r=-6.00&reading=40&measured=lens');
  // N1 [textbook]: from the lens, contact lens 1/(0.40 + 0.012) = 2.4272.
  await expectRow(page, 'Right', 'Accommodation in contact lenses, no add', '2.43 D');
  await page.getByRole('radio', { name: 'Eye', exact: true }).check();
  await expectUrl(page, /measured=eye/);
  // [textbook, notes §6.3] a contact lens wearer accommodates 1 / distance from the eye: 1/0.40 = 2.50.
  await expectRow(page, 'Right', 'Accommodation in contact lenses, no add', '2.50 D');
  // [derived, notes §6.1] object 38.8 cm from the lens: L = −2.5773, L' = −8.5773, L_e = L'/(1 − 0.012·L') = −7.7769;
  // K = −5.5970; accommodation K − L_e = 2.1798.
  await expectRow(page, 'Right', 'Accommodation through the spectacles, no add', '2.18 D');
  await page.close();
});

test('per meridian: the −6.00 meridian of −6.00 −2.00 ×180 has N1\'s figures', async () => {
  const { page } = await open('near?r=-6.00%20-2.00%20x180&add=2.50&reading=40');
  // Notes §6: for cylinders, every figure per meridian. Meridian 180 is −6.00: N1 [textbook] 2.12 / 2.43, N3 [derived] relief 2.12.
  await expectRow(page, 'Right', 'Meridian 180°', '-6.00');
  await expectDetail(page, 'Right', 'Meridian 180°', /spectacles 2\.12 D without the add, 0\.00 D with it; in contact lenses 2\.43 D; relief at the eye 2\.12 D/);
  // Meridian 90 is −8.00 [derived, notes §6.1]: K = −8/1.096 = −7.2993; L_e = −10.5/1.126 = −9.3250; 2.0258.
  await expectRow(page, 'Right', 'Meridian 090°', '-8.00');
  await expectDetail(page, 'Right', 'Meridian 090°', /spectacles 2\.03 D without the add/);
  // The summary figures are for the spherical equivalent S + C/2 = −7.00 [definition, notes §4]:
  // [derived] K = −7/1.084 = −6.4576; L_e = −9.5/1.114 = −8.5278; 2.0703.
  await expectRow(page, 'Right', 'Spherical equivalent', '-7.00');
  await expectRow(page, 'Right', 'Accommodation through the spectacles, no add', '2.07 D');
  await page.close();
});

test('a target at the same vertex distance keeps the spectacle add (a consistency check)', async () => {
  // [derived] Moving nothing changes nothing: the equivalent add at 12 mm for spectacles worn at 12 mm is the add itself.
  const { page } = await open('near?r=-6.00&add=2.25&from=12&to=12&reading=40');
  await expectMain(page, 'Right', '+2.25');
  await expectRow(page, 'Right', 'Accommodation with the lens at 12 mm, no add', '2.12 D');
  await page.close();
});

test('every input round-trips through the link, both ways', async () => {
  const link = 'near?r=-8.00%20-2.00%20x180&l=%2B1.50&add=2.25&from=13&to=14&reading=16&unit=in&measured=eye&age=52';
  const { page, errors } = await open(link);
  assert.equal(await page.getByLabel('Right prescription', { exact: true }).inputValue(), '-8.00 -2.00 x180');
  assert.equal(await page.getByLabel('Left prescription', { exact: true }).inputValue(), '+1.50');
  assert.equal(await addField(page).inputValue(), '2.25');
  assert.equal(await page.getByLabel('Vertex distance of the spectacles worn', { exact: true }).inputValue(), '13');
  assert.equal(await page.getByRole('radio', { name: 'Spectacles', exact: true }).first().isChecked(), true);
  assert.equal(await page.getByLabel('Spectacle vertex distance', { exact: true }).inputValue(), '14');
  assert.equal(await readingField(page).inputValue(), '16');
  assert.equal(await page.getByRole('radio', { name: 'in', exact: true }).isChecked(), true);
  assert.equal(await page.getByRole('radio', { name: 'Eye', exact: true }).isChecked(), true);
  assert.equal(await ageField(page).inputValue(), '52');
  await mainValue(page, 'Right').waitFor(WAIT);
  await mainValue(page, 'Left').waitFor(WAIT);
  // Opened as written: the address still carries every input.
  await expectUrl(page, /^\/near\?r=-8\.00%20-2\.00%20x180&l=%2B1\.50&add=2\.25&from=13&to=14&reading=16&unit=in&measured=eye&age=52$/);

  // Edits flow into the address.
  await addField(page).fill('2.75');
  await expectUrl(page, /add=2\.75/);
  await page.getByRole('button', { name: 'Spectacle add: 0.25 D more plus' }).click();
  assert.equal(await addField(page).inputValue(), '+3.00');
  await expectUrl(page, /add=%2B3\.00/);
  await page.getByLabel('Vertex distance of the spectacles worn', { exact: true }).fill('11');
  await expectUrl(page, /from=11/);
  await page.getByLabel('Spectacle vertex distance', { exact: true }).fill('15');
  await expectUrl(page, /to=15/);
  await page.getByRole('radio', { name: 'Contact lens', exact: true }).check();
  await expectUrl(page, /to=0/);
  await readingField(page).fill('14');
  await expectUrl(page, /reading=14&unit=in/);
  await page.getByRole('radio', { name: 'Spectacles', exact: true }).nth(1).check();
  await expectUrl(page, /measured=lens/);
  await ageField(page).fill('61');
  await expectUrl(page, /age=61/);
  await ageField(page).fill('');
  await expectUrl(page, /^\/near\?(?!.*age=)/);
  await page.getByLabel('Left prescription', { exact: true }).fill('+2.00 -0.50 x90');
  await expectUrl(page, /l=%2B2\.00%20-0\.50%20x90/);

  // A link opened within the panel (back) loads every field again.
  await page.goBack();
  await page.goForward();
  await page.goto(server.url('near?r=-1.00&add=1.75&reading=33&measured=eye'));
  await waitForApp(page);
  assert.equal(await addField(page).inputValue(), '1.75');
  assert.equal(await readingField(page).inputValue(), '33');
  assert.equal(await page.getByRole('radio', { name: 'cm', exact: true }).isChecked(), true);
  assert.equal(await page.getByRole('radio', { name: 'Eye', exact: true }).isChecked(), true);
  assert.equal(await ageField(page).inputValue(), '');
  assert.deepEqual(errors, []);
  await page.close();
});

test('bad inputs get a clear message at the field', async () => {
  const { page } = await open('near?r=-6.00&add=2.50&reading=40&age=50');
  await mainValue(page, 'Right').waitFor(WAIT);
  // Notes §9: a bare 16 could be cm or inches: ask.
  await readingField(page).fill('16');
  await expectFieldError(page, readingField(page), /reading distance 16 needs a unit/);
  await readingField(page).fill('40');
  // An add is always plus (notes §9).
  await addField(page).fill('-1');
  await expectFieldError(page, addField(page), /an add is always plus/);
  await addField(page).fill('2.50');
  // Age limits 1–110 (notes §9).
  await ageField(page).fill('200');
  await expectFieldError(page, ageField(page), /outside 1–110/);
  await ageField(page).fill('50');
  assert.equal(await ageField(page).getAttribute('aria-invalid'), 'false');
  // Reading distance limits 10–100 cm (notes §9).
  await readingField(page).fill('150 cm');
  await expectFieldError(page, readingField(page), /outside 10–100 cm/);
  // The text stays exactly as typed.
  assert.equal(await readingField(page).inputValue(), '150 cm');
  await page.close();
});

test('the last good result stays visible, marked stale, while an input is wrong', async () => {
  const { page } = await open('near?r=-6.00&add=2.50&reading=40');
  // N3 [derived]: +2.43 at the cornea.
  await expectMain(page, 'Right', '+2.43');
  await addField(page).fill('-1');
  const card = result(page, 'Right');
  await card.locator('.stale-note', { hasText: /Not updated: an add is always plus/ }).waitFor(WAIT);
  assert.match(await card.getAttribute('class'), /\bstale\b/);
  assert.equal((await mainValue(page, 'Right').innerText()).trim(), '+2.43');
  // Fixed, the result is current again: add +2.00 at 40 cm for −6.00 [derived, notes §6.4]:
  // L_e(−6 + 2 − 2.5) = −6.5/1.078 = −6.0297; K = −5.5970; L_c = −2.4272: add = −6.0297 + 5.5970 + 2.4272 = 1.9945.
  await addField(page).fill('2.00');
  await expectMain(page, 'Right', '+1.99');
  assert.doesNotMatch(await card.getAttribute('class'), /\bstale\b/);
  await page.close();
});

test('copy as text and save to history', async () => {
  const context = await browser.newContext();
  await context.grantPermissions(['clipboard-read', 'clipboard-write'], { origin: server.origin });
  const page = await context.newPage();
  await page.goto(server.url('near?r=-6.00&l=%2B6.00&add=2.50&reading=40'));
  await waitForApp(page);
  await expectMain(page, 'Right', '+2.43');
  await page.getByRole('button', { name: 'Copy as text' }).click();
  await page.getByRole('status').filter({ hasText: 'Copied as text.' }).waitFor(WAIT);
  const copied = await page.evaluate(() => navigator.clipboard.readText());
  // N3/N4 [derived] in the copied text: one order line per eye (the equivalent add in quarter steps), then the exact adds.
  assert.match(copied, /^R add \+2\.50 \(contact lens, from -6\.00 DS with add \+2\.50 at 12 mm, reading at 40 cm\)$/m);
  assert.match(copied, /^L add \+2\.50 \(contact lens, from \+6\.00 DS with add \+2\.50 at 12 mm, reading at 40 cm\)$/m);
  assert.match(copied, /^R exact \+2\.43; L exact \+2\.43$/m);
  assert.match(copied, /not a prescription/);
  await page.getByLabel('Label (optional)').fill('room 2');
  await page.getByRole('button', { name: 'Save to history' }).click();
  await page.getByRole('status').filter({ hasText: /Saved/ }).waitFor(WAIT);
  await context.close();
});

test('the cautions of the near panel are on the page', async () => {
  const { page } = await open('near?r=-6.00&add=2.50');
  const cautions = page.getByRole('complementary', { name: 'Cautions' });
  for (const text of [/"add" labels are not optical adds/, /population estimate/, /measured amplitude/,
    /real reading distance/, /licensed practice/, /not a prescription/]) {
    await cautions.getByText(text).first().waitFor(WAIT);
  }
  await page.close();
});
