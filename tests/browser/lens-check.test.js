// Lens check in real Chromium: a received lens read on the focimeter against
// its order. Tolerances and check values: shared/optics-notes.md §14, the
// tables of ANSI Z80.1-2015 (spectacle lenses) as publicly summarised
// [standard]. The band edges below are read straight off those tables; the
// three "check values" are the notes' own, marked [derived from the table].
// The vertex figure that feeds "Check the received lens" is V6 of §11
// [textbook: F/(1 − dF), Bennett & Rabbetts, Clinical Visual Optics 4th ed.].
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { createRequire } from 'node:module';
import { startServer, launch, waitForApp, watchErrors, offlineAfterVisit } from './harness.js';
import { storedLayout, writeItems } from './history-fixtures.js';

const require = createRequire(import.meta.url);
const AXE = require.resolve('axe-core/axe.min.js');

let server;
let browser;
before(async () => { server = await startServer(); browser = await launch(); });
after(async () => { await browser?.close(); await server?.stop(); });

const enc = encodeURIComponent;
const region = (page, eye) => page.getByRole('region', { name: `${eye} eye check` });
const row = (page, eye, item) => region(page, eye).locator(`.check-row[data-item="${item}"]`);

/** A lens-check link from its parts (raw text, encoded). */
function link(parts) {
  return 'lens-check?' + Object.entries(parts).map(([k, v]) => `${k}=${enc(v)}`).join('&');
}

async function open(path, context) {
  const page = await (context || browser).newPage();
  const errors = watchErrors(page);
  await page.goto(server.url(path));
  await waitForApp(page);
  await page.getByRole('heading', { level: 1, name: 'Lens check' }).waitFor();
  return { page, errors };
}

/** Waits until the locator's text contains every string. */
async function expectText(locator, ...texts) {
  for (const t of texts) await locator.getByText(t, { exact: false }).first().waitFor({ timeout: 10000 });
}

/** Waits for one item's row and returns what it shows. */
async function item(page, eye, key) {
  const r = row(page, eye, key);
  await r.waitFor();
  const text = async (sel) => ((await r.locator(sel).count()) ? (await r.locator(sel).textContent()).trim() : null);
  return {
    deviation: await text('.check-deviation'),
    tolerance: await text('.check-tolerance'),
    verdict: await text('.check-verdict'),
    why: await text('.check-why'),
  };
}

async function overall(page, eye) {
  const o = region(page, eye).locator('output.check-overall');
  await o.waitFor();
  return (await o.textContent()).trim();
}

test('notes §14 check value 1 [derived from the table]: −2.00 −1.00 ×90 read −2.10 −1.12 ×93 is within tolerance, the axis at its ±3° limit', async () => {
  const { page, errors } = await open(link({ r: '-2.00 -1.00 x90', rm: '-2.10 -1.12 x93' }));
  assert.equal(await overall(page, 'Right'), 'within tolerance');
  // Sphere meridian −6.50 to +6.50: ±0.13 D [ANSI Z80.1-2015, notes §14].
  assert.deepEqual(await item(page, 'Right', 'sphere'), {
    deviation: '-0.10', tolerance: '±0.13 D', verdict: 'within tolerance', why: 'sphere meridian -6.50 to +6.50 D: ±0.13 D',
  });
  // Cylinder up to 2.00: ±0.13 D [ANSI Z80.1-2015, notes §14].
  assert.deepEqual(await item(page, 'Right', 'cylinder'), {
    deviation: '-0.12', tolerance: '±0.13 D', verdict: 'within tolerance', why: 'cylinder up to 2.00 D: ±0.13 D',
  });
  // Axis for a cylinder over 0.75 to 1.50: ±3° [ANSI Z80.1-2015, notes §14].
  assert.deepEqual(await item(page, 'Right', 'axis'), {
    deviation: '+3°', tolerance: '±3°', verdict: 'within tolerance', why: 'axis for a cylinder over 0.75 to 1.50 D: ±3°',
  });
  const add = await item(page, 'Right', 'add');
  assert.equal(add.verdict, 'not checked');
  assert.equal(add.why, 'Not checked: no add ordered');
  await expectText(region(page, 'Right'), 'R overall: within tolerance');
  await expectText(region(page, 'Left'), 'Nothing entered for this eye.');
  assert.deepEqual(errors, []);
  await page.close();
});

test('notes §14 check value 2 [derived from the table]: −8.00 −0.25 ×45 read −8.20 −0.25 ×60 is outside for the sphere (±0.16) and the axis (±14°)', async () => {
  const { page } = await open(link({ l: '-8.00 -0.25 x45', lm: '-8.20 -0.25 x60' }));
  assert.equal(await overall(page, 'Left'), 'outside tolerance');
  // Stronger than ±6.50: ±2 % of the ordered 8.00 = ±0.16 D [ANSI Z80.1-2015, notes §14].
  const sphere = await item(page, 'Left', 'sphere');
  assert.deepEqual([sphere.deviation, sphere.tolerance, sphere.verdict], ['-0.20', '±0.16 D', 'outside tolerance']);
  assert.equal(sphere.why, 'sphere meridian stronger than ±6.50 D: ±2 % of 8.00 D = ±0.16 D');
  // Axis for a cylinder 0.12 to 0.25: ±14° [ANSI Z80.1-2015, notes §14].
  const axis = await item(page, 'Left', 'axis');
  assert.deepEqual([axis.deviation, axis.tolerance, axis.verdict], ['+15°', '±14°', 'outside tolerance']);
  assert.equal((await item(page, 'Left', 'cylinder')).verdict, 'within tolerance');
  await expectText(region(page, 'Left'), 'L overall: outside tolerance (sphere, axis)');
  await page.close();
});

test('notes §14 check value 3 [derived from the table]: +3.00 −5.00 ×180 read +3.10 −5.22 ×179 is outside for the cylinder (±4 % = ±0.20)', async () => {
  const { page } = await open(link({ r: '+3.00 -5.00 x180', rm: '+3.10 -5.22 x179' }));
  assert.equal(await overall(page, 'Right'), 'outside tolerance');
  const cyl = await item(page, 'Right', 'cylinder');
  assert.deepEqual([cyl.deviation, cyl.tolerance, cyl.verdict], ['-0.22', '±0.20 D', 'outside tolerance']);
  assert.equal(cyl.why, 'cylinder over 4.50 D: ±4 % of 5.00 D = ±0.20 D');
  const sphere = await item(page, 'Right', 'sphere');
  assert.deepEqual([sphere.deviation, sphere.verdict], ['+0.10', 'within tolerance']);
  // Axis for a cylinder over 1.50: ±2° [ANSI Z80.1-2015]; 180 → 179 is 1° the short way.
  const axis = await item(page, 'Right', 'axis');
  assert.deepEqual([axis.deviation, axis.tolerance, axis.verdict], ['-1°', '±2°', 'within tolerance']);
  await page.close();
});

test('the axis difference is taken the short way round: ordered 179, read 2 is +3° (notes §14: 179 vs 2 → 3°)', async () => {
  // Cylinder 2.00 is over 1.50: ±2° [ANSI Z80.1-2015], so 3° is outside; 177° would be absurd.
  const { page } = await open(link({ r: '-1.00 -2.00 x179', rm: '-1.00 -2.00 x2', l: '-1.00 -1.00 x2', lm: '-1.00 -1.00 x179' }));
  const r = await item(page, 'Right', 'axis');
  assert.deepEqual([r.deviation, r.tolerance, r.verdict], ['+3°', '±2°', 'outside tolerance']);
  // Cylinder 1.00 (over 0.75 to 1.50: ±3°): the same 3° the other way is within.
  const l = await item(page, 'Left', 'axis');
  assert.deepEqual([l.deviation, l.tolerance, l.verdict], ['-3°', '±3°', 'within tolerance']);
  assert.equal(await overall(page, 'Right'), 'outside tolerance');
  assert.equal(await overall(page, 'Left'), 'within tolerance');
  await page.close();
});

// Band edges on both sides, single vision [ANSI Z80.1-2015 as publicly summarised, notes §14].
// Each case: order, reading, item, expected deviation, tolerance, verdict. The
// right eye sits at the edge (deviation = tolerance: within), the left one step beyond.
const EDGES = [
  // Cylinder up to 2.00: ±0.13; over 2.00 to 4.50: ±0.15.
  ['cylinder 2.00: ±0.13', ['-1.00 -2.00 x90', '-1.00 -2.13 x90'], ['-1.00 -2.00 x90', '-1.00 -2.14 x90'], 'cylinder', ['-0.13', '±0.13 D'], ['-0.14', '±0.13 D']],
  ['cylinder 2.12: ±0.15', ['-1.00 -2.12 x90', '-1.00 -2.27 x90'], ['-1.00 -2.12 x90', '-1.00 -2.28 x90'], 'cylinder', ['-0.15', '±0.15 D'], ['-0.16', '±0.15 D']],
  ['cylinder 4.50: ±0.15', ['plano -4.50 x90', 'plano -4.35 x90'], ['plano -4.50 x90', 'plano -4.34 x90'], 'cylinder', ['+0.15', '±0.15 D'], ['+0.16', '±0.15 D']],
  ['cylinder 4.75: ±4 % = ±0.19', ['plano -4.75 x90', 'plano -4.94 x90'], ['plano -4.75 x90', 'plano -4.95 x90'], 'cylinder', ['-0.19', '±0.19 D'], ['-0.20', '±0.19 D']],
  // Sphere meridian −6.50 to +6.50: ±0.13; stronger: ±2 % (of 6.75 = 0.135, judged in hundredths as 0.13).
  ['sphere +6.50: ±0.13', ['+6.50', '+6.63'], ['+6.50', '+6.64'], 'sphere', ['+0.13', '±0.13 D'], ['+0.14', '±0.13 D']],
  ['sphere −6.50: ±0.13', ['-6.50', '-6.63'], ['-6.50', '-6.64'], 'sphere', ['-0.13', '±0.13 D'], ['-0.14', '±0.13 D']],
  ['sphere −6.75: ±2 % = ±0.135', ['-6.75', '-6.88'], ['-6.75', '-6.89'], 'sphere', ['-0.13', '±0.13 D'], ['-0.14', '±0.13 D']],
  ['sphere +10.00: ±2 % = ±0.20', ['+10.00', '+10.20'], ['+10.00', '+10.21'], 'sphere', ['+0.20', '±0.20 D'], ['+0.21', '±0.20 D']],
  // Axis by the ordered cylinder: 0.12–0.25 ±14°; >0.25–0.50 ±7°; >0.50–0.75 ±5°; >0.75–1.50 ±3°; >1.50 ±2°.
  ['axis at cylinder 0.25: ±14°', ['-1.00 -0.25 x90', '-1.00 -0.25 x104'], ['-1.00 -0.25 x90', '-1.00 -0.25 x105'], 'axis', ['+14°', '±14°'], ['+15°', '±14°']],
  ['axis at cylinder 0.37: ±7°', ['-1.00 -0.37 x90', '-1.00 -0.37 x97'], ['-1.00 -0.37 x90', '-1.00 -0.37 x98'], 'axis', ['+7°', '±7°'], ['+8°', '±7°']],
  ['axis at cylinder 0.50: ±7°', ['-1.00 -0.50 x90', '-1.00 -0.50 x83'], ['-1.00 -0.50 x90', '-1.00 -0.50 x82'], 'axis', ['-7°', '±7°'], ['-8°', '±7°']],
  ['axis at cylinder 0.62: ±5°', ['-1.00 -0.62 x90', '-1.00 -0.62 x95'], ['-1.00 -0.62 x90', '-1.00 -0.62 x96'], 'axis', ['+5°', '±5°'], ['+6°', '±5°']],
  ['axis at cylinder 0.75: ±5°', ['-1.00 -0.75 x10', '-1.00 -0.75 x5'], ['-1.00 -0.75 x10', '-1.00 -0.75 x4'], 'axis', ['-5°', '±5°'], ['-6°', '±5°']],
  ['axis at cylinder 0.87: ±3°', ['-1.00 -0.87 x90', '-1.00 -0.87 x93'], ['-1.00 -0.87 x90', '-1.00 -0.87 x94'], 'axis', ['+3°', '±3°'], ['+4°', '±3°']],
  ['axis at cylinder 1.50: ±3°', ['-1.00 -1.50 x90', '-1.00 -1.50 x87'], ['-1.00 -1.50 x90', '-1.00 -1.50 x86'], 'axis', ['-3°', '±3°'], ['-4°', '±3°']],
  ['axis at cylinder 1.62: ±2°', ['-1.00 -1.62 x1', '-1.00 -1.62 x179'], ['-1.00 -1.62 x1', '-1.00 -1.62 x178'], 'axis', ['-2°', '±2°'], ['-3°', '±2°']],
];
for (const [name, [r, rm], [l, lm], key, [rDev, rTol], [lDev, lTol]] of EDGES) {
  test(`band edge, ${name} [ANSI Z80.1-2015]: at the limit within, one step beyond outside`, async () => {
    const { page } = await open(link({ r, rm, l, lm }));
    const right = await item(page, 'Right', key);
    assert.deepEqual([right.deviation, right.tolerance, right.verdict], [rDev, rTol, 'within tolerance'], `right ${r} read ${rm}`);
    const left = await item(page, 'Left', key);
    assert.deepEqual([left.deviation, left.tolerance, left.verdict], [lDev, lTol, 'outside tolerance'], `left ${l} read ${lm}`);
    assert.equal(await overall(page, 'Left'), 'outside tolerance');
    await page.close();
  });
}

test('below 0.12 D of cylinder no axis tolerance is defined, at 0.12 it is ±14° [ANSI Z80.1-2015, notes §14]', async () => {
  const { page } = await open(link({ r: '-1.00 -0.10 x90', rm: '-1.00 -0.10 x150', l: '-1.00 -0.12 x90', lm: '-1.00 -0.12 x104' }));
  const r = await item(page, 'Right', 'axis');
  assert.equal(r.verdict, 'not checked');
  assert.equal(r.why, 'Not checked: axis for a cylinder under 0.12 D: no axis tolerance');
  assert.equal(await overall(page, 'Right'), 'within tolerance');
  const l = await item(page, 'Left', 'axis');
  assert.deepEqual([l.deviation, l.tolerance, l.verdict], ['+14°', '±14°', 'within tolerance']);
  await page.close();
});

test('both lens types: progressive lenses have the wider power tolerances (sphere ±0.16 to ±8.00, cylinder ±0.16/±0.18/±5 %) [ANSI Z80.1-2015, notes §14]', async () => {
  const parts = { r: '-2.00 -3.50 x90', rm: '-2.16 -3.68 x90', l: '-9.00', lm: '-9.18' };
  const { page } = await open(link({ ...parts, type: 'sv' }));
  // Single vision: sphere ±0.13 and cylinder over 2.00 to 4.50 ±0.15, so 0.16 and 0.18 are outside.
  assert.deepEqual(Object.values(await item(page, 'Right', 'sphere')).slice(0, 3), ['-0.16', '±0.13 D', 'outside tolerance']);
  assert.deepEqual(Object.values(await item(page, 'Right', 'cylinder')).slice(0, 3), ['-0.18', '±0.15 D', 'outside tolerance']);
  // 2 % of 9.00 = 0.18 in both types.
  assert.deepEqual(Object.values(await item(page, 'Left', 'sphere')).slice(0, 3), ['-0.18', '±0.18 D', 'within tolerance']);
  assert.equal(await page.getByRole('radio', { name: 'single vision or multifocal' }).isChecked(), true);
  // One tap to progressive: the same readings are within ±0.16 and ±0.18 (cylinder over 2.00 to 3.50).
  await page.getByRole('radio', { name: 'progressive' }).check();
  await page.waitForURL(/type=pal/);
  await row(page, 'Right', 'sphere').locator('.check-tolerance').getByText('±0.16 D').waitFor();
  assert.deepEqual(Object.values(await item(page, 'Right', 'sphere')).slice(0, 3), ['-0.16', '±0.16 D', 'within tolerance']);
  assert.deepEqual(Object.values(await item(page, 'Right', 'cylinder')).slice(0, 3), ['-0.18', '±0.18 D', 'within tolerance']);
  assert.equal(await overall(page, 'Right'), 'within tolerance');
  // −9.00 is beyond ±8.00: ±2 % = ±0.18 for progressive lenses too.
  assert.equal((await item(page, 'Left', 'sphere')).tolerance, '±0.18 D');
  // Progressive cylinder over 3.50: ±5 % (of 4.00 = 0.20).
  await page.goto(server.url(link({ r: 'plano -4.00 x90', rm: 'plano -4.20 x90', l: 'plano -4.00 x90', lm: 'plano -4.21 x90', type: 'pal' })));
  await waitForApp(page);
  assert.deepEqual(Object.values(await item(page, 'Right', 'cylinder')).slice(0, 3), ['-0.20', '±0.20 D', 'within tolerance']);
  assert.deepEqual(Object.values(await item(page, 'Left', 'cylinder')).slice(0, 3), ['-0.21', '±0.20 D', 'outside tolerance']);
  await page.close();
});

test('the add: ±0.12 D up to +4.00 [ANSI Z80.1-2015, notes §14], each eye read on its own', async () => {
  const { page } = await open(link({ r: '+1.00', rm: '+1.00', l: '+1.00', lm: '+1.00', add: '+2.00', radd: '2.12', ladd: '2.13' }));
  assert.deepEqual(Object.values(await item(page, 'Right', 'add')).slice(0, 3), ['+0.12', '±0.12 D', 'within tolerance']);
  assert.deepEqual(Object.values(await item(page, 'Left', 'add')).slice(0, 3), ['+0.13', '±0.12 D', 'outside tolerance']);
  assert.equal(await overall(page, 'Right'), 'within tolerance');
  await expectText(region(page, 'Left'), 'L overall: outside tolerance (add)');
  await page.close();
});

test('a link opens as written, and editing rewrites it with every other raw text kept', async () => {
  const raw = { r: '−2,00 −1,00 ×90', l: '-3 DS', rm: '-2.1/-1.12x93', lm: '-3.05', add: '2', radd: 'add 2.1', ladd: '2.05', type: 'PAL' };
  const { page } = await open(link(raw));
  assert.equal(await page.getByLabel('Right lens ordered', { exact: true }).inputValue(), raw.r);
  assert.equal(await page.getByLabel('Right focimeter reading', { exact: true }).inputValue(), raw.rm);
  assert.equal(await page.getByLabel('Left lens ordered', { exact: true }).inputValue(), raw.l);
  assert.equal(await page.getByLabel('Add ordered', { exact: true }).inputValue(), raw.add);
  assert.equal(await page.getByLabel('Right add read', { exact: true }).inputValue(), raw.radd);
  assert.equal(await page.getByRole('radio', { name: 'progressive' }).isChecked(), true);
  // Read as typed: the notes' first check value again, within (progressive add ±0.12).
  assert.equal(await overall(page, 'Right'), 'within tolerance');
  assert.equal((await item(page, 'Right', 'add')).deviation, '+0.10');
  await page.getByLabel('Left focimeter reading', { exact: true }).fill('-3.25');
  await row(page, 'Left', 'sphere').getByText('-0.25').waitFor();
  await page.waitForURL(/lm=-3\.25/);
  const q = new URL(page.url()).searchParams;
  for (const [k, v] of Object.entries(raw)) if (k !== 'lm') assert.equal(q.get(k), v, k);
  assert.equal(new URL(page.url()).pathname, '/lens-check');
  // Reloading the rewritten link gives the same page.
  await page.reload();
  await waitForApp(page);
  assert.equal(await page.getByLabel('Left focimeter reading', { exact: true }).inputValue(), '-3.25');
  assert.equal(await page.getByLabel('Right lens ordered', { exact: true }).inputValue(), raw.r);
  await page.close();
});

test('the separate fields are one tap away and feed the reading the same way', async () => {
  const { page } = await open(link({ r: '-2.00 -1.00 x90' }));
  await expectText(region(page, 'Right'), 'Enter the focimeter reading of the received lens for this eye.');
  const group = page.getByRole('group', { name: 'Right eye (R): focimeter reading' });
  await group.locator('details.rx-fields-toggle > summary').click();
  await page.getByLabel('Right focimeter reading sphere', { exact: true }).fill('-2.10');
  await page.getByLabel('Right focimeter reading cylinder', { exact: true }).fill('-1.12');
  await page.getByLabel('Right focimeter reading axis', { exact: true }).fill('93');
  assert.equal(await overall(page, 'Right'), 'within tolerance');
  assert.equal((await item(page, 'Right', 'axis')).deviation, '+3°');
  await page.waitForURL(/rm=-2\.10%20-1\.12%20x93/);
  // A reading between quarter steps is no news on a focimeter: no off-step notice there.
  assert.equal(await group.locator('.field-msg .notice').count(), 0);
  // An order between quarter steps does get the notice (the same selector finds it).
  await page.getByLabel('Right lens ordered', { exact: true }).fill('-2.10');
  await expectText(page.getByRole('group', { name: 'Right eye (R): lens ordered' }).locator('.field-msg .notice'), 'between quarter steps');
  await page.close();
});

// Bad input at each field gets the core's own message there; what was typed stays.
const BAD = [
  ['lens ordered', { r: '2.00 -1.00 x90', rm: '-2.00' }, 'Right lens ordered', 'sphere needs a sign: +2.00 or -2.00?'],
  ['focimeter reading', { r: '-2.00', rm: '-2.00 -1.00 x181' }, 'Right focimeter reading', 'axis 181 is outside 1–180'],
  ['add ordered', { r: '-2.00', rm: '-2.00', add: '-1.00' }, 'Add ordered', 'an add is always plus'],
  ['add read', { r: '-2.00', rm: '-2.00', add: '2.00', radd: '5.25' }, 'Right add read', 'measured add 5.25 is outside 0.00 to +5.00'],
  ['add read, missing', { r: '-2.00', rm: '-2.00', add: '2.00' }, 'Right add read', 'measured add is empty'],
];
for (const [name, parts, label, message] of BAD) {
  test(`bad input at the ${name}: "${message}" at the field, the text kept`, async () => {
    const { page } = await open(link(parts));
    const field = page.getByLabel(label, { exact: true });
    const typed = { 'Right lens ordered': parts.r, 'Right focimeter reading': parts.rm, 'Add ordered': parts.add, 'Right add read': parts.radd ?? '' }[label];
    assert.equal(await field.inputValue(), typed);
    await expectText(page.locator(`#${await field.getAttribute('aria-describedby')}`), message);
    assert.equal(await field.getAttribute('aria-invalid'), 'true');
    // No verdict from a bad input.
    assert.equal(await region(page, 'Right').locator('output.check-overall').count(), 0);
    await page.close();
  });
}

test('an unknown lens type from a link gets the core\'s message at the choice and no verdict; choosing one clears it', async () => {
  const { page } = await open(link({ r: '-2.00', rm: '-2.10', type: 'bifocal' }));
  const msg = 'lens type "bifocal" is not one of sv (single vision or multifocal), pal (progressive)';
  await expectText(page.locator('#lens-check-type-msg'), msg);
  assert.equal(await region(page, 'Right').locator('output.check-overall').count(), 0);
  assert.equal(new URL(page.url()).searchParams.get('type'), 'bifocal');
  await page.getByRole('radio', { name: 'single vision or multifocal' }).check();
  assert.equal(await overall(page, 'Right'), 'within tolerance');
  await page.waitForURL(/type=sv/);
  assert.equal(await page.locator('#lens-check-type-msg .error').count(), 0);
  await page.close();
});

test('a bad edit keeps the last verdict visible, marked as not updated', async () => {
  const { page } = await open(link({ r: '-2.00', rm: '-2.10' }));
  assert.equal(await overall(page, 'Right'), 'within tolerance');
  await page.getByLabel('Right focimeter reading', { exact: true }).fill('-2.10 -1.00');
  await expectText(page.locator('#lens-check-read-right-line-msg'), 'cylinder needs an axis');
  await expectText(region(page, 'Right'), 'Not updated');
  assert.match(await region(page, 'Right').getAttribute('class'), /stale/);
  await page.close();
});

test('the page says whose tolerances these are and that prism and centration are not checked', async () => {
  const { page } = await open(link({ r: '-2.00', rm: '-2.10' }));
  const scope = page.locator('.check-scope');
  await expectText(scope, 'ANSI Z80.1-2015 as publicly summarised', 'confirm against the standard', 'local regulation or a lab agreement may set others');
  await expectText(scope, 'Prism and centration are not checked');
  const cautions = page.getByRole('complementary', { name: 'Cautions' });
  await expectText(cautions, 'Tolerances are those of ANSI Z80.1-2015 as publicly summarised', 'Prism and centration are not checked', 'not a prescription');
  // The tables themselves, one tap away, for the chosen lens type.
  await page.locator('details.check-tables > summary').click();
  await expectText(page.locator('details.check-tables'), 'Tolerances for single vision or multifocal lenses', 'over 2.00 to 4.50 D', '±4 % of the ordered size', 'no axis tolerance');
  await page.close();
});

test('copy as text gives the verdict lines of both eyes; save to history, reopen from there', async () => {
  const context = await browser.newContext({ permissions: ['clipboard-read', 'clipboard-write'] });
  const { page } = await open(link({ r: '-2.00 -1.00 x90', rm: '-2.10 -1.12 x93', l: '-8.00 -0.25 x45', lm: '-8.20 -0.25 x60' }), context);
  assert.equal(await overall(page, 'Left'), 'outside tolerance');
  await page.getByRole('button', { name: 'Copy as text' }).click();
  await page.getByRole('status').filter({ hasText: 'Copied as text.' }).waitFor();
  const text = await page.evaluate(() => navigator.clipboard.readText());
  assert.match(text, /^Lensplane · Lens check$/m);
  assert.match(text, /^R sphere -2\.10 \(ordered -2\.00\): -0\.10, tolerance ±0\.13 D \(-6\.50 to \+6\.50 D\): within tolerance$/m);
  assert.match(text, /^R axis ×093 \(ordered ×090\): \+3°, tolerance ±3° \(cylinder over 0\.75 to 1\.50 D\): within tolerance$/m);
  assert.match(text, /^R overall: within tolerance$/m);
  assert.match(text, /^L sphere -8\.20 \(ordered -8\.00\): -0\.20, tolerance ±0\.16 D .*outside tolerance$/m);
  assert.match(text, /^L overall: outside tolerance \(sphere, axis\)$/m);
  assert.match(text, /ANSI Z80\.1-2015/);
  assert.match(text, /Prism and centration are not checked/);
  assert.doesNotMatch(text, /NaN|Infinity|undefined/);

  await page.getByLabel('Label (optional)').fill('Bench 3 delivery');
  await page.getByRole('button', { name: 'Save to history' }).click();
  await page.getByText("Saved to this device's history.").waitFor();
  await page.getByRole('navigation', { name: 'Calculators' }).getByRole('link', { name: 'History' }).click();
  const entry = page.locator('.history-entry').filter({ hasText: 'Bench 3 delivery' });
  await entry.waitFor();
  assert.match(await entry.textContent(), /Lens check/);
  assert.match(await entry.textContent(), /read -8\.20 -0\.25 ×060: outside tolerance \(sphere, axis\)/);
  // A lens check is not an order: no "Check lens" on it.
  assert.equal(await entry.getByRole('link', { name: 'Check lens' }).count(), 0);
  await entry.getByRole('link', { name: 'Open' }).click();
  await page.waitForURL(/\/lens-check\?/);
  assert.equal(await overall(page, 'Left'), 'outside tolerance');
  assert.equal(await overall(page, 'Right'), 'within tolerance');
  assert.equal(await page.getByLabel('Left focimeter reading', { exact: true }).inputValue(), '-8.20 -0.25 x60');
  await context.close();
});

test('"Check the received lens" on the vertex panel: a spectacle order opens as the lens ordered, a contact-lens order has none', async () => {
  const page = await browser.newPage();
  // V6 [textbook]: −10.00 moved from 10 to 14 mm → −10.42, orderable −10.50 on spectacle quarter steps.
  await page.goto(server.url('vertex?r=-10.00&from=10&to=14'));
  await waitForApp(page);
  await page.getByRole('region', { name: 'Right eye result' }).getByText('-10.50 DS').first().waitFor();
  const check = page.getByRole('link', { name: 'Check the received lens' });
  await check.click();
  await page.waitForURL(/\/lens-check\?r=-10\.50%20DS$/);
  assert.equal(await page.getByLabel('Right lens ordered', { exact: true }).inputValue(), '-10.50 DS');
  // Only the order travels: no reading, no vertex distances.
  const q = new URL(page.url()).searchParams;
  assert.deepEqual([...q.keys()], ['r']);
  await page.getByLabel('Right focimeter reading', { exact: true }).fill('-10.62');
  // Stronger than ±6.50: ±2 % of 10.50 = ±0.21 [ANSI Z80.1-2015, notes §14].
  assert.equal(await overall(page, 'Right'), 'within tolerance');
  assert.equal((await item(page, 'Right', 'sphere')).tolerance, '±0.21 D');
  // At the cornea (the default target) the order is a contact lens: no focimeter check here.
  await page.goto(server.url('vertex?r=-10.00&from=12&to=0'));
  await waitForApp(page);
  await page.getByRole('region', { name: 'Right eye result' }).getByText('-8.93').first().waitFor();
  assert.equal(await page.getByRole('link', { name: 'Check the received lens' }).count(), 0);
  await page.close();
});

test('"Check lens" on history entries that hold a spectacle order: vertex (the orderable lens) and near (the distance lens and the add)', async () => {
  const context = await browser.newContext();
  const page = await context.newPage();
  const save = async (path, wait) => {
    await page.goto(server.url(path));
    await waitForApp(page);
    await page.getByRole('region', { name: 'Right eye result' }).getByText(wait).first().waitFor();
    await page.getByRole('button', { name: 'Save to history' }).click();
    await page.getByText("Saved to this device's history.").waitFor();
  };
  // V6 [textbook]: −10.00 from 10 to 14 mm → orderable −10.50.
  await save('vertex?r=-10.00&from=10&to=14', '-10.50 DS');
  // V4 [textbook]: −10.00 at 12 mm → −8.93 at the cornea: a contact lens, no check.
  await save('vertex?r=-10.00&from=12&to=0', '-8.93');
  await save(`near?r=${enc('+1.00 -0.50 x90')}&add=2.00&to=0`, 'add');
  await page.goto(server.url('history'));
  await page.getByRole('heading', { level: 1, name: 'History' }).waitFor();
  const entries = page.locator('.history-entry');
  await entries.nth(2).waitFor();
  const near = entries.filter({ hasText: 'Near' });
  const spectacles = entries.filter({ hasText: '-10.42' });
  const contact = entries.filter({ hasText: '-8.93' });
  assert.equal(await contact.getByRole('link', { name: 'Check lens' }).count(), 0);
  await spectacles.getByRole('link', { name: 'Check lens' }).click();
  await page.waitForURL(/\/lens-check\?r=-10\.50%20DS$/);
  assert.equal(await page.getByLabel('Right lens ordered', { exact: true }).inputValue(), '-10.50 DS');
  await page.goBack();
  await near.getByRole('link', { name: 'Check lens' }).click();
  await page.waitForURL(/\/lens-check\?/);
  const q = new URL(page.url()).searchParams;
  assert.deepEqual([...q.keys()], ['r', 'add']);
  assert.equal(await page.getByLabel('Right lens ordered', { exact: true }).inputValue(), '+1.00 -0.50 ×090');
  assert.equal(await page.getByLabel('Add ordered', { exact: true }).inputValue(), '+2.00');
  await context.close();
});

test('"Check lens" on saved spherical-equivalent and over-refraction orders only when they are for spectacles', async () => {
  // Invented entries in the stored layout: they test which entries link, not clinical figures.
  const t = Date.UTC(2025, 0, 15, 9, 0);
  const eye = (o) => [{ s: 'R', i: '-2.00 -0.50 ×090', r: o, o }];
  const items = storedLayout([
    { id: 'se-spec', t, p: 'equivalent', q: `r=${enc('-2.00 -0.50 x90')}&from=12&to=12`, e: eye('-2.25 DS'), l: 'SE spectacles' },
    { id: 'se-cl', t: t + 1, p: 'equivalent', q: `r=${enc('-2.00 -0.50 x90')}`, e: eye('-2.25 DS'), l: 'SE contact lens' },
    { id: 'or-spec', t: t + 2, p: 'over-refraction', q: `r=-2.00&ror=-0.50&worn=12`, e: eye('-2.50 DS'), l: 'Over spectacles' },
    { id: 'or-cl', t: t + 3, p: 'over-refraction', q: `r=-2.00&ror=-0.50&worn=0`, e: eye('-2.50 DS'), l: 'Over contact lens' },
    { id: 'or-to-spec', t: t + 4, p: 'over-refraction', q: `r=-2.00&ror=-0.50&worn=0&to=13`, e: eye('-2.50 DS'), l: 'Over to spectacles' },
  ]);
  const context = await browser.newContext();
  const page = await context.newPage();
  await page.goto(server.url('icons/icon.svg'));
  await page.evaluate(writeItems, items);
  await page.goto(server.url('history'));
  await page.getByRole('heading', { level: 1, name: 'History' }).waitFor();
  const entry = (label) => page.locator('.history-entry').filter({ hasText: label });
  await entry('SE spectacles').waitFor();
  const links = async (label) => entry(label).getByRole('link', { name: 'Check lens' }).count();
  assert.deepEqual(
    [await links('SE spectacles'), await links('SE contact lens'), await links('Over spectacles'), await links('Over contact lens'), await links('Over to spectacles')],
    [1, 0, 1, 0, 1],
  );
  await entry('Over to spectacles').getByRole('link', { name: 'Check lens' }).click();
  await page.waitForURL(/\/lens-check\?r=-2\.50%20DS$/);
  assert.equal(await page.getByLabel('Right lens ordered', { exact: true }).inputValue(), '-2.50 DS');
  await context.close();
});

test('the lens check takes nothing from the navigation and gives its lenses to no other calculator', async () => {
  const page = await browser.newPage();
  await page.goto(server.url(`vertex?r=${enc('-8.00 -2.00 x180')}`));
  await waitForApp(page);
  await page.getByRole('navigation', { name: 'Calculators' }).getByRole('link', { name: 'Lens check' }).click();
  await page.waitForURL(/\/lens-check$/);
  assert.equal(await page.getByLabel('Right lens ordered', { exact: true }).inputValue(), '');
  await page.getByLabel('Right lens ordered', { exact: true }).fill('-1.00');
  await page.getByRole('navigation', { name: 'Calculators' }).getByRole('link', { name: 'Vertex' }).click();
  await page.waitForURL(/\/vertex/);
  // The refraction the vertex panel had is still the one it gets back, not the lens ordered.
  assert.equal(await page.getByLabel('Right prescription', { exact: true }).inputValue(), '-8.00 -2.00 x180');
  await page.close();
});

test('offline: after one visit, a lens-check link opens and checks with the server stopped', async () => {
  const { server: own, context, page } = await offlineAfterVisit(browser, 'lens-check');
  await page.goto(own.url(link({ r: '-8.00 -0.25 x45', rm: '-8.20 -0.25 x60' })));
  await waitForApp(page);
  assert.equal(await overall(page, 'Right'), 'outside tolerance');
  assert.equal((await item(page, 'Right', 'sphere')).tolerance, '±0.16 D');
  await context.close();
});

const FULL = link({ r: '-2.00 -1.00 x90', rm: '-2.10 -1.12 x93', l: '+3.00 -5.00 x180', lm: '+3.10 -5.22 x179', add: '2.00', radd: '2.10', ladd: '2.25', type: 'pal' });

for (const scheme of ['light', 'dark']) {
  test(`axe-core finds no WCAG 2.2 AA violations, disclosures open and closed (${scheme} theme)`, async () => {
    // bypassCSP only so the test can inject axe-core; the app itself runs under its strict policy.
    const context = await browser.newContext({ bypassCSP: true, colorScheme: scheme, viewport: { width: 390, height: 844 } });
    for (const path of [FULL, link({ r: '2.00', rm: '-2.00', type: 'bifocal' })]) {
      for (const opened of [false, true]) {
        const { page } = await open(path, context);
        await region(page, 'Right').locator('h2').waitFor();
        await page.evaluate((o) => document.querySelectorAll('details').forEach((d) => { d.open = o; }), opened);
        await page.addScriptTag({ path: AXE });
        const result = await page.evaluate(async () => globalThis.axe.run(document, {
          runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'] },
        }));
        const found = result.violations.map((v) => `${v.id} ${v.nodes.slice(0, 2).map((n) => n.target.join(' ')).join(' | ')}`);
        assert.deepEqual(found, [], found.join('\n'));
        await page.close();
      }
    }
    await context.close();
  });
}

test('320 px: no sideways scrolling with every disclosure open; no NaN, Infinity or undefined on the page', async () => {
  const context = await browser.newContext({ viewport: { width: 320, height: 640 } });
  for (const path of [FULL, link({ r: '-25.00 -8.00 x1', rm: '+25.00 -0.12 x180', l: 'pl', lm: 'plano -0.25 x90' }), 'lens-check']) {
    const { page } = await open(path, context);
    await region(page, 'Right').locator('h2').waitFor();
    await page.evaluate(() => document.querySelectorAll('details').forEach((d) => { d.open = true; }));
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
    assert.ok(overflow <= 0, `${path} scrolls sideways by ${overflow}px`);
    const text = await page.locator('body').innerText();
    assert.doesNotMatch(text, /NaN|Infinity|undefined/, path);
    await page.close();
  }
  await context.close();
});

test('printing keeps the verdicts and the cautions, without the buttons', async () => {
  const { page } = await open(FULL);
  assert.equal(await overall(page, 'Left'), 'outside tolerance');
  await page.emulateMedia({ media: 'print' });
  assert.ok(await region(page, 'Left').isVisible());
  assert.ok(await row(page, 'Left', 'cylinder').isVisible());
  assert.ok(await page.locator('.cautions').isVisible());
  assert.equal(await page.getByRole('button', { name: 'Save to history' }).isVisible(), false);
  await page.close();
});
