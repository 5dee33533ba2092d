// Image size in real Chromium: spectacle against contact-lens magnification
// per principal meridian and between the eyes, as shared/optics-notes.md §13
// gives it. Provenance beside each check value:
// [textbook] = the spectacle magnification of a thin lens, power factor
//   1 / (1 − h·F) and shape factor 1 / (1 − (t/n)·F1), as taught in
//   Bennett & Rabbetts, Clinical Visual Optics (4th ed.); the change to a
//   contact lens is −d·F for thin lenses;
// [derived] = worked from those formulas in the notes, no printed example;
// [from memory] = the 3 mm entrance pupil depth behind the cornea;
// [common practice] = the 3–5 % tolerance and 1.5 % per dioptre rule of
//   thumb (no source).
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { createRequire } from 'node:module';
import { startServer, launch, waitForApp, watchErrors, offlineAfterVisit } from './harness.js';

const require = createRequire(import.meta.url);
const AXE = require.resolve('axe-core/axe.min.js');

let server;
let browser;
before(async () => { server = await startServer(); browser = await launch(); });
after(async () => { await browser?.close(); await server?.stop(); });

const enc = encodeURIComponent;
const region = (page, eye) => page.getByRole('region', { name: `${eye} eye result` });
const between = (page) => page.getByRole('region', { name: 'Between the eyes' });

async function open(path, options = {}) {
  const context = await browser.newContext(options);
  const page = await context.newPage();
  const errors = watchErrors(page);
  await page.goto(server.url(path));
  await waitForApp(page);
  return { context, page, errors };
}

/** Waits until the locator's text contains every string. */
async function expectText(locator, ...texts) {
  for (const t of texts) await locator.getByText(t, { exact: false }).first().waitFor({ timeout: 10000 });
}

/** Opens every disclosure on the page (details of the cards, lens forms, separate fields). */
async function openAll(page) {
  await page.evaluate(() => document.querySelectorAll('details').forEach((d) => { d.open = true; }));
}

/** Waits for the text of a labelled input's message (its aria-describedby). */
async function expectFieldMessage(page, label, message) {
  const input = page.getByLabel(label, { exact: true });
  const id = await input.getAttribute('aria-describedby');
  await expectText(page.locator(`#${id}`), message);
  await page.waitForFunction((el) => el.getAttribute('aria-invalid') === 'true', await input.elementHandle());
}

/** Every percentage on the page (text and accessible labels), each must have one decimal. */
async function percentages(page) {
  return page.evaluate(() => {
    const texts = [document.body.innerText];
    document.querySelectorAll('[aria-label]').forEach((el) => texts.push(el.getAttribute('aria-label')));
    return texts.join('\n').match(/[-+]?\d[\d.,]*\s*%/g) || [];
  });
}

async function expectCleanPage(page) {
  const found = await percentages(page);
  assert.ok(found.length > 0, 'the page shows percentages');
  const bad = found.filter((p) => !/^[-+]?\d+\.\d %$/.test(p));
  assert.deepEqual(bad, [], `percentages without one decimal: ${bad.join(', ')}`);
  const text = await page.evaluate(() => document.body.innerText);
  assert.doesNotMatch(text, /NaN|Infinity|undefined/);
}

test('+8.00 at 12 mm [derived]: spectacles +13.6 %, contact lens +2.7 %, change −9.6 %; the shape factor is said to be left out', async () => {
  const { context, page, errors } = await open('image-size?r=%2B8.00&from=12');
  const r = region(page, 'Right');
  // The headline: the change with contact lenses, with the spectacle figure beside it.
  await expectText(r.locator('.headline'), '-9.6 %', '+13.6 %', 'Shape factor left out: lens form not given');
  await expectText(r.locator('.reason'), 'in contact lenses 2.7 % larger than uncorrected');
  // Details one tap away: closed by default, then the factors per meridian.
  assert.equal(await r.locator('details.card-details').evaluate((d) => d.open), false);
  await r.locator('details.card-details > summary').click();
  const rows = r.locator('.result-list');
  // Power factor 1 / (1 − 0.015 × 8) = 1.1364 [textbook formula; h = 12 + 3 mm, 3 mm from memory].
  await expectText(rows.locator('.result-row', { hasText: 'Power factor' }), '+13.6 %');
  await expectText(rows.locator('.result-row', { hasText: 'In contact lenses' }), '+2.7 %');
  await expectText(rows.locator('.result-row', { hasText: 'Shape factor' }), 'shape factor left out: lens form not given');
  // +8.00 at 12 mm is +8.85 at the cornea [textbook: F / (1 − dF) = 8 / 0.904 = 8.8496].
  await expectText(rows.locator('.result-row', { hasText: 'Contact lens' }).first(), '+8.85 D');
  await expectText(between(page), 'Enter a complete prescription for both eyes');
  await expectCleanPage(page);
  assert.deepEqual(errors, []);
  await context.close();
});

test('±10.00 at 12 mm [textbook]: the change to contact lenses is −d·F, 12.0 % smaller for plus and 12.0 % larger for minus', async () => {
  const { context, page } = await open('image-size?r=%2B10.00&l=-10.00&from=12');
  await expectText(region(page, 'Right').locator('.headline'), '-12.0 %');
  await expectText(region(page, 'Left').locator('.headline'), '+12.0 %');
  await context.close();
});

test('R −1.00 / L −5.00 at 12 mm [derived]: spectacles −1.5 % / −7.0 %, difference 5.9 %; contact lenses −0.3 % / −1.4 %, difference 1.1 %', async () => {
  const { context, page } = await open('image-size?r=-1.00&l=-5.00&from=12');
  // Notes: spectacles −1.48 % / −6.98 %, contact lenses −0.30 % / −1.40 %; one decimal on the page.
  await expectText(region(page, 'Right').locator('.headline'), '-1.5 %');
  await expectText(region(page, 'Left').locator('.headline'), '-7.0 %');
  await expectText(region(page, 'Left').locator('.reason'), 'in contact lenses 1.4 % smaller');
  await expectText(region(page, 'Right').locator('.reason'), 'in contact lenses 0.3 % smaller');
  const b = between(page);
  const row180 = b.getByRole('row', { name: /^180/ });
  await expectText(row180, '5.9 %, R larger', '1.1 %, R larger');
  await expectText(b.getByRole('row', { name: /^090/ }), '5.9 %, R larger');
  // Rule of thumb [common practice]: 1.5 % per dioptre × 4.00 D = 6.0 %; above about 5.0 % often not tolerated.
  await expectText(b.locator('.reading'), 'often not tolerated', '4.00 D here, about 6.0 %', 'a fifth of that in contact lenses');
  // Knapp's law [textbook]: informs the choice, does not make it.
  await expectText(b.locator('.knapp'), "Knapp's law", 'anterior focal point', 'not automatically better', 'does not make it');
  await expectCleanPage(page);
  await context.close();
});

test("each eye's picture: two outlines to scale with a text alternative stating both sizes", async () => {
  const { context, page } = await open('image-size?r=-1.00&l=-5.00&from=12');
  const left = region(page, 'Left').getByRole('img', {
    name: 'Left eye image size against the uncorrected eye: in spectacles -7.0 % (solid outline), in contact lenses -1.4 % (dashed outline)',
  });
  await left.waitFor();
  const right = region(page, 'Right').getByRole('img', { name: /^Right eye image size .* in spectacles -1\.5 % .* in contact lenses -0\.3 %/ });
  await right.waitFor();
  // To scale [derived]: the right contact-lens image (0.9970) is the largest of the four and is drawn at
  // the full 44 units; the left spectacle image is 0.930233 / 0.997044 of it = 41.05 units.
  const radii = async (img) => img.locator('ellipse').evaluateAll((els) => els.map((e) => [e.getAttribute('class'), e.getAttribute('rx')]));
  assert.deepEqual(await radii(right), [['outline spectacles', '43.48'], ['outline contact-lens', '44.00']]);
  assert.deepEqual(await radii(left), [['outline spectacles', '41.05'], ['outline contact-lens', '43.51']]);
  await context.close();
});

test('a cylinder gives a figure per principal meridian; the eyes are compared in 180 and 090', async () => {
  // −1.00 −4.00 ×180: 180 meridian −1.00, 090 meridian −5.00 [textbook power cross]; the notes' −1.48 % / −6.98 % [derived].
  const { context, page } = await open(`image-size?r=${enc('-1.00 -4.00 x180')}&l=-1.00`);
  const r = region(page, 'Right');
  await expectText(r.locator('.headline'), '180: -1.5 %, 090: -7.0 %');
  // In 090 the left (−1.00) image is the larger [derived: 0.985222 / 0.930233 − 1 = 5.9 %]; in 180 both are −1.00.
  await expectText(between(page).getByRole('row', { name: /^090/ }), '5.9 %, L larger');
  await expectText(between(page).getByRole('row', { name: /^180/ }), '0.0 %');
  await r.getByRole('img', { name: /in spectacles 180: -1\.5 %, 090: -7\.0 %/ }).waitFor();
  await openAll(page);
  await expectText(r.locator('.result-list'), 'Power factor, 090 meridian', 'Spectacles → contact lenses, 180 meridian');
  await expectCleanPage(page);
  await context.close();
});

test('link round trip: the lens form opens from the link, adds the shape factor, and the link keeps the raw text', async () => {
  const link = `image-size?r=${enc('+8,00')}&from=12&rf=${enc('+6.00')}&rt=${enc('2 mm')}&rn=${enc('1,5')}`;
  const { context, page } = await open(link);
  const r = region(page, 'Right');
  // Shape factor 1 / (1 − 0.002 / 1.5 × 6) = 1.0081 [textbook formula; derived]: spectacles
  // 1.1364 × 1.0081 = +14.6 %; contact lens +2.7 %; change 1.0273 / 1.1455 − 1 = −10.3 %.
  await expectText(r.locator('.headline'), '-10.3 %', '+14.6 %', 'Includes the shape factor of the lens form given');
  const form = page.getByRole('group', { name: 'Right eye (R)' }).locator('details.lens-form');
  assert.equal(await form.evaluate((d) => d.open), true, 'a lens form from the link is shown');
  assert.equal(await page.getByLabel('Right front surface', { exact: true }).inputValue(), '+6.00');
  assert.equal(await page.getByLabel('Right centre thickness', { exact: true }).inputValue(), '2 mm');
  assert.equal(await page.getByLabel('Right refractive index', { exact: true }).inputValue(), '1,5');
  assert.equal(await page.getByLabel('Right prescription', { exact: true }).inputValue(), '+8,00');
  await expectFieldNotice(page, 'Right refractive index', 'read the comma as a decimal point: 1.5');
  await r.locator('details.card-details > summary').click();
  await expectText(r.locator('.result-row', { hasText: 'Shape factor' }), '+0.8 %');
  // The left eye's lens form is its own: the left disclosure stays closed and empty.
  assert.equal(await page.getByRole('group', { name: 'Left eye (L)' }).locator('details.lens-form').evaluate((d) => d.open), false);
  // Editing rewrites the link with the text as typed.
  await page.getByLabel('Right centre thickness', { exact: true }).fill('2,2');
  await page.waitForURL((u) => new URL(u).searchParams.get('rt') === '2,2');
  const url = new URL(page.url());
  assert.equal(url.pathname, '/image-size');
  for (const [k, v] of [['r', '+8,00'], ['from', '12'], ['rf', '+6.00'], ['rn', '1,5']]) assert.equal(url.searchParams.get(k), v, k);
  // Reopened, the link shows the same thing.
  await page.goto(url.href);
  await waitForApp(page);
  assert.equal(await page.getByLabel('Right centre thickness', { exact: true }).inputValue(), '2,2');
  await expectText(region(page, 'Right').locator('.headline'), 'Includes the shape factor of the lens form given');
  await context.close();
});

async function expectFieldNotice(page, label, message) {
  const id = await page.getByLabel(label, { exact: true }).getAttribute('aria-describedby');
  await expectText(page.locator(`#${id}`), message);
}

test('the lens form is all three fields or none; index "16" is refused with the reading it may mean', async () => {
  const { context, page } = await open('image-size?r=%2B8.00');
  const r = region(page, 'Right');
  await expectText(r.locator('.headline'), '-9.6 %');
  const form = page.getByRole('group', { name: 'Right eye (R)' }).locator('details.lens-form');
  assert.equal(await form.evaluate((d) => d.open), false, 'behind a disclosure when the link has none');
  await form.locator('summary').click();
  await page.getByLabel('Right front surface', { exact: true }).fill('6');
  // Only one of three: the first empty one says so, the result is marked not updated.
  await expectFieldMessage(page, 'Right centre thickness', 'centre thickness is empty');
  await expectFieldMessage(page, 'Right refractive index', 'refractive index is empty');
  await expectText(r, 'Not updated: centre thickness is empty');
  await page.getByLabel('Right centre thickness', { exact: true }).fill('2');
  await page.getByLabel('Right refractive index', { exact: true }).fill('16');
  await expectFieldMessage(page, 'Right refractive index', 'refractive index 16 is outside 1.40–2.00: did you mean 1.6?');
  assert.equal(await page.getByLabel('Right refractive index', { exact: true }).inputValue(), '16');
  await page.waitForURL((u) => new URL(u).searchParams.get('rn') === '16');
  await page.getByLabel('Right refractive index', { exact: true }).fill('1.5');
  await expectText(r.locator('.headline'), '-10.3 %');
  // All three emptied: no lens form, the shape factor left out again.
  for (const f of ['front surface', 'centre thickness', 'refractive index']) await page.getByLabel(`Right ${f}`, { exact: true }).fill('');
  await expectText(r.locator('.headline'), '-9.6 %', 'Shape factor left out');
  assert.doesNotMatch(page.url(), /[?&]r[ftn]=/);
  await context.close();
});

// Each field refuses a bad value with the core's exact message at the field, the text kept.
const badInputs = [
  ['r', 'Right prescription', '2.00 -1.00 x90', 'sphere needs a sign: +2.00 or -2.00?'],
  ['l', 'Left prescription', '-2.00 -1.00', 'cylinder needs an axis'],
  ['from', 'Vertex distance of the spectacles', '45', 'vertex distance 45 mm is outside 0–30 mm'],
  ['from', 'Vertex distance of the spectacles', '1.2', 'vertex distance 1.2 mm is under 3 mm: did you mean 12 mm?'],
  ['from', 'Vertex distance of the spectacles', '0', 'vertex distance 0 mm is a contact lens: give the spectacle vertex distance'],
  ['rf', 'Right front surface', '30', 'front surface 30 is outside 0.00 to +25.00'],
  ['lf', 'Left front surface', '-2', 'front surface -2 is outside 0.00 to +25.00'],
  ['rt', 'Right centre thickness', '0.3', 'centre thickness 0.3 mm is outside 0.5–20 mm'],
  ['lt', 'Left centre thickness', '2 cm', 'unexpected "cm"'],
  ['rn', 'Right refractive index', '1.3', 'refractive index 1.3 is outside 1.40–2.00'],
  ['ln', 'Left refractive index', '1523', 'refractive index 1523 is outside 1.40–2.00: did you mean 1.523?'],
];
const FULL_FORM = { rf: '6', rt: '2', rn: '1.5', lf: '6', lt: '2', ln: '1.5' };
for (const [key, label, typed, message] of badInputs) {
  test(`bad input at ${label}: "${typed}" → "${message}"`, async () => {
    const q = new URLSearchParams({ r: '+4.00', l: '-3.00', from: '12' });
    if (/^[rl][ftn]$/.test(key)) for (const k of Object.keys(FULL_FORM).filter((k) => k[0] === key[0])) q.set(k, FULL_FORM[k]);
    q.set(key, typed);
    const { context, page } = await open(`image-size?${q.toString().replace(/\+/g, '%20')}`);
    assert.equal(await page.getByLabel(label, { exact: true }).inputValue(), typed, 'what was typed is kept');
    await expectFieldMessage(page, label, message);
    assert.equal(new URL(page.url()).searchParams.get(key), typed, 'the link keeps the raw text');
    const text = await page.evaluate(() => document.body.innerText);
    assert.doesNotMatch(text, /NaN|Infinity|undefined/);
    await context.close();
  });
}

test('copy as text: one line per eye, the comparison and Knapp\'s note; cautions are on the page', async () => {
  const { context, page } = await open('image-size?r=-1.00&l=-5.00&from=12', { permissions: ['clipboard-read', 'clipboard-write'] });
  await expectText(region(page, 'Left').locator('.headline'), '-7.0 %');
  await page.getByRole('button', { name: 'Copy as text' }).click();
  await expectText(page.getByRole('status').filter({ hasText: 'Copied' }), 'Copied');
  const text = await page.evaluate(() => navigator.clipboard.readText());
  assert.match(text, /^Lensplane · Image size · /);
  // [derived] the notes' figures at one decimal; the change is −d·F [textbook]: +1.2 % and +6.0 %.
  assert.match(text, /^R -1\.00 DS at 12 mm: spectacles -1\.5 %, contact lenses -0\.3 %, change \+1\.2 % \(shape factor left out\)$/m);
  assert.match(text, /^L -5\.00 DS at 12 mm: spectacles -7\.0 %, contact lenses -1\.4 %, change \+6\.0 %/m);
  assert.match(text, /Between the eyes: 180: spectacles 5\.9 %, R larger; contact lenses 1\.1 %, R larger/);
  assert.match(text, /Knapp's law/);
  assert.match(text, /not a prescription/);
  assert.doesNotMatch(text, /NaN|Infinity|undefined/);
  const cautions = page.getByRole('complementary', { name: 'Cautions' });
  await expectText(cautions, 'thin-lens estimates of spectacle magnification, not a measurement of aniseikonia', 'measure or refer');
  await context.close();
});

test('saved to history and reopened from it, the same link and figures', async () => {
  const { context, page } = await open(`image-size?r=%2B8.00&l=-5.00&from=14&rf=6&rt=${enc('4.5')}&rn=1.6`);
  await expectText(region(page, 'Left').locator('.headline'), '%');
  const headline = await region(page, 'Right').locator('.headline').innerText();
  await page.getByLabel('Label (optional)').fill('Image bench');
  await page.getByRole('button', { name: 'Save to history' }).click();
  await page.getByText("Saved to this device's history.").waitFor();
  await page.getByRole('navigation', { name: 'Calculators' }).getByRole('link', { name: 'History' }).click();
  const entry = page.locator('.history-entry').filter({ hasText: 'Image bench' });
  await entry.waitFor();
  assert.match(await entry.textContent(), /Image size/);
  assert.match(await entry.textContent(), /contact lenses [-+]\d+\.\d %/);
  await entry.getByRole('link', { name: 'Open' }).click();
  await page.waitForURL(/\/image-size\?/);
  const url = new URL(page.url());
  for (const [k, v] of [['r', '+8.00'], ['l', '-5.00'], ['from', '14'], ['rf', '6'], ['rt', '4.5'], ['rn', '1.6']]) assert.equal(url.searchParams.get(k), v, k);
  await region(page, 'Right').locator('.headline').getByText('Includes the shape factor of the lens form given').waitFor();
  assert.equal(await region(page, 'Right').locator('.headline').innerText(), headline);
  await context.close();
});

test('offline: after one visit, an image-size link opens and computes with the server stopped', async () => {
  const { server: own, context, page } = await offlineAfterVisit(browser, 'image-size');
  await page.goto(own.url('image-size?r=%2B8.00&from=12'));
  await waitForApp(page);
  // [derived] +8.00 at 12 mm: change −9.6 %.
  await expectText(region(page, 'Right').locator('.headline'), '-9.6 %', '+13.6 %');
  await context.close();
});

const LINKS = [
  'image-size?r=%2B8.00&from=12',
  `image-size?r=${enc('-1.00 -4.00 x30')}&l=-5.00&from=12&rf=6&rt=2&rn=1.5`,
  `image-size?r=${enc('+12.00 -2.50 x75')}&l=${enc('+4.25 -0.75 x100')}&from=13&lf=9&lt=${enc('5.5')}&ln=1.74`,
  'image-size?r=-1.00&l=-5.00&from=12',
  'image-size?r=plano&l=-2.00&from=10',
];

test('every percentage on the page has one decimal, with details open, in every state; no NaN or Infinity', async () => {
  const { context, page } = await open(LINKS[0]);
  for (const link of LINKS) {
    await page.goto(server.url(link));
    await waitForApp(page);
    await region(page, 'Right').locator('output.rx.big').waitFor();
    await openAll(page);
    await expectCleanPage(page);
  }
  await context.close();
});

for (const scheme of ['light', 'dark']) {
  test(`axe-core finds no WCAG 2.2 AA violations, disclosures open and closed (${scheme} theme)`, async () => {
    // bypassCSP only so the test can inject axe-core; the app itself runs under its strict policy.
    const { context, page } = await open(LINKS[1], { bypassCSP: true, colorScheme: scheme, viewport: { width: 390, height: 844 } });
    for (const link of [LINKS[1], LINKS[3], 'image-size?r=%2B8.00&rf=6&rt=&rn=16']) {
      for (const opened of [false, true]) {
        await page.goto(server.url(link));
        await waitForApp(page);
        await region(page, 'Right').locator('output.rx.big, .stale-note').first().waitFor();
        await page.evaluate((o) => document.querySelectorAll('details').forEach((d) => { d.open = o; }), opened);
        await page.addScriptTag({ path: AXE });
        const result = await page.evaluate(async () => globalThis.axe.run(document, {
          runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'] },
        }));
        const found = result.violations.map((v) => `${link} (${opened ? 'open' : 'closed'}): ${v.id} ${v.nodes.slice(0, 2).map((n) => n.target.join(' ')).join(' | ')}`);
        assert.deepEqual(found, [], found.join('\n'));
      }
    }
    await context.close();
  });
}

test('fits 320 px without sideways scrolling, every disclosure open', async () => {
  const { context, page } = await open(LINKS[2], { viewport: { width: 320, height: 640 } });
  for (const link of LINKS) {
    await page.goto(server.url(link));
    await waitForApp(page);
    await region(page, 'Right').locator('output.rx.big').waitFor();
    await openAll(page);
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
    assert.ok(overflow <= 0, `${link} scrolls sideways by ${overflow}px`);
  }
  await context.close();
});
