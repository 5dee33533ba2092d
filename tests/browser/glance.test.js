// At a glance on a phone: each eye's answer stays in view while any of its
// fields has focus, the near page stays short with the details closed, the
// disclosure is remembered, each card leads with one recommendation, and the
// pages stay accessible with the details open or closed.
//
// Expected figures: C1/C2 [textbook] (shared/optics-notes.md §11, Bennett &
// Rabbetts; Keating): −8.00 −2.00 ×180 and +6.00 −2.00 ×90 at 12 mm are
// −7.30 −1.63 ×180 and +6.47 −2.26 ×090 at the cornea; the stock toric for the
// first (cylinders −0.75/−1.25/−1.75/−2.25, 10° axes, sphere keeping the
// spherical equivalent on 0.50 D steps beyond 6 D — common practice, no
// source) is −7.00 −1.75 ×180. N1/N3 [textbook/derived]: −6.00 at 12 mm with
// add +2.50 at 40 cm gives an equivalent contact-lens add of +2.43 (+2.50 in
// quarter steps), +6.00 likewise +2.43 (N4 [derived]).
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { createRequire } from 'node:module';
import { startServer, launch, waitForApp } from './harness.js';

const require = createRequire(import.meta.url);
const AXE = require.resolve('axe-core/axe.min.js');

let server;
let browser;
before(async () => { server = await startServer(); browser = await launch(); });
after(async () => { await browser?.close(); await server?.stop(); });

const enc = encodeURIComponent;
const PANELS = [
  {
    name: 'vertex',
    link: `vertex?r=${enc('-8.00 -2.00 x180')}&l=${enc('+6.00 -2.00 x90')}`,
    glance: { Right: ['Order -7.00 -1.75 ×180', 'exact -7.30 -1.63 ×180'], Left: ['exact +6.47 -2.26 ×090'] },
  },
  {
    // C1 meridians −7.2993 / −8.9286 [textbook] → spherical equivalent −8.11 at the cornea, −8.00 on CL steps.
    name: 'equivalent',
    link: `equivalent?r=${enc('-8.00 -2.00 x180')}&l=${enc('+6.00 -2.00 x90')}`,
    glance: { Right: ['Order -8.00 DS', 'exact -8.11'], Left: ['exact +5.33'] },
  },
  {
    name: 'near',
    link: 'near?r=-6.00&l=%2B6.00&add=2.50&reading=40',
    glance: { Right: ['Add +2.50', 'exact +2.43'], Left: ['Add +2.50', 'exact +2.43'] },
  },
];
// The newer calculators, checked for the answer in view (their own files check the rest).
const MORE = [
  {
    // Notes §13 [Bennett & Rabbetts, power factor with a 3 mm entrance pupil depth, from memory]:
    // +8.00 at 12 mm gives +13.6 % in spectacles and -9.6 % on changing to contact lenses.
    name: 'image-size',
    link: `image-size?r=${enc('+8.00')}&l=${enc('-10.00')}&from=12`,
    glance: { Right: ['-9.6 %'], Left: [] },
  },
  {
    // Two entries per eye: each keeps the eye's answer in view (the order line is checked
    // against the notes' values in over-refraction.test.js).
    name: 'over-refraction',
    link: `over-refraction?r=${enc('-3.00 -1.00 x180')}&ror=${enc('-0.50')}&l=${enc('-2.00')}&lor=${enc('+0.25')}&worn=0`,
    groups: (eye) => [`${eye} eye (${eye[0]}): lens worn`, `${eye} eye (${eye[0]}): over-refraction`],
    glance: { Right: ['Order'], Left: ['Order'] },
  },
  {
    // Notes §14 [ANSI Z80.1-2015 as publicly summarised]: -2.00 -1.00 ×090 read as -2.10 -1.12 ×093 is within.
    name: 'lens-check',
    link: `lens-check?r=${enc('-2.00 -1.00 x90')}&rm=${enc('-2.10 -1.12 x93')}&l=${enc('-2.00 -1.00 x90')}&lm=${enc('-2.10 -1.12 x93')}`,
    groups: (eye) => [`${eye} eye (${eye[0]}): lens ordered`, `${eye} eye (${eye[0]}): focimeter reading`],
    glance: { Right: ['within tolerance'], Left: ['within tolerance'] },
  },
];
const SIZES = [[390, 450], [320, 400]];

/** True when the element's box is wholly on screen (to the pixel: layout positions are fractional). */
async function onScreen(locator) {
  return locator.evaluate((el) => {
    const r = el.getBoundingClientRect();
    return r.height > 0 && r.top > -1 && r.bottom < window.innerHeight + 1 && r.left > -1 && r.right < window.innerWidth + 1;
  });
}

for (const [width, height] of SIZES) {
  test(`every field of both eyes keeps its eye's answer in view at ${width} × ${height} (every calculator with entries per eye)`, async () => {
    const context = await browser.newContext({ viewport: { width, height } });
    const page = await context.newPage();
    for (const panel of [...PANELS, ...MORE]) {
      await page.goto(server.url(panel.link));
      await waitForApp(page);
      for (const eye of ['Right', 'Left']) for (const name of (panel.groups ?? ((e) => [`${e} eye (${e[0]})`]))(eye)) {
        const entry = page.getByRole('group', { name, exact: true });
        // The separate fields are one tap away: open them so every field is checked.
        const toggle = entry.locator('details.rx-fields-toggle');
        if (!(await toggle.evaluate((d) => d.open))) await toggle.locator('summary').click();
        // Any other disclosure of the entry (the image size's lens form) too.
        for (const d of await entry.locator('details:not([open])').all()) await d.locator('summary').first().click();
        const glance = entry.locator('.glance');
        for (const want of panel.glance[eye]) await glance.getByText(want, { exact: false }).waitFor();
        const fields = entry.locator('input[type="text"]');
        const n = await fields.count();
        assert.ok(n >= 4, `${panel.name} ${name}: ${n} fields`);
        for (let i = 0; i < n; i += 1) {
          const field = fields.nth(i);
          const id = await field.getAttribute('id');
          // Wherever the browser scrolls on focus, and wherever the keyboard pushes the field.
          await field.focus();
          assert.ok(await onScreen(glance), `${panel.name} ${eye} ${id} focused: the answer is off screen`);
          for (const block of ['start', 'center', 'end']) {
            await field.evaluate((el, b) => el.scrollIntoView({ block: b }), block);
            assert.ok(await onScreen(glance), `${panel.name} ${eye} ${id} at the ${block}: the answer is off screen`);
            assert.ok(await onScreen(field), `${panel.name} ${eye} ${id} at the ${block}: the field itself is hidden`);
            // The field is not covered by the answer held above it.
            const covered = await page.evaluate(([f]) => {
              const r = document.getElementById(f).getBoundingClientRect();
              const top = document.elementFromPoint(r.left + r.width / 2, r.top + r.height / 2);
              return top !== document.getElementById(f) && !document.getElementById(f).contains(top);
            }, [id]);
            assert.equal(covered, false, `${panel.name} ${eye} ${id} at the ${block}: covered`);
          }
        }
      }
    }
    await context.close();
  });
}

test('the near page with both eyes and an age stays within three screens at 390 × 844 with the details closed', async () => {
  const context = await browser.newContext({ viewport: { width: 390, height: 844 } });
  const page = await context.newPage();
  await page.goto(server.url(`near?r=${enc('-8.00 -2.00 x180')}&l=${enc('+6.00 -2.00 x90')}&add=2.50&age=50`));
  await waitForApp(page);
  await page.getByRole('region', { name: 'Left eye result' }).locator('output.rx.big').waitFor();
  assert.equal(await page.locator('details.card-details[open]').count(), 0, 'details closed by default');
  const total = await page.evaluate(() => document.documentElement.scrollHeight);
  assert.ok(total <= 3 * 844, `the near page is ${total} px tall, over three screens (${3 * 844} px)`);
  // Warnings and cautions are never hidden: they are outside every disclosure.
  const hidden = await page.evaluate(() => [...document.querySelectorAll('.warnings, .cautions')]
    .filter((el) => el.closest('details')).length);
  assert.equal(hidden, 0);
  await context.close();
});

test('each card leads with one recommendation and the exact value beside it; alternatives come after it', async () => {
  const page = await browser.newPage();
  await page.goto(server.url(PANELS[0].link));
  await waitForApp(page);
  for (const eye of ['Right', 'Left']) {
    const card = page.getByRole('region', { name: `${eye} eye result` });
    await card.locator('output.rx.big').waitFor();
    assert.equal(await card.locator('output.rx.big').count(), 1, `${eye}: one recommendation`);
    assert.equal(await card.locator('.result-exact').count(), 1, `${eye}: one exact value`);
    assert.match(await card.locator('.reason').innerText(), /\S/, `${eye}: says why`);
  }
  const right = page.getByRole('region', { name: 'Right eye result' });
  assert.equal((await right.locator('output.rx.big').innerText()).trim(), '-7.00 -1.75 ×180');
  assert.equal((await right.locator('.result-exact .rx').innerText()).trim(), '-7.30 -1.63 ×180');
  // The alternatives each say what they leave: the spherical lens of the spherical equivalent leaves the cylinder.
  const alternatives = right.locator('.alternatives li');
  assert.ok(await alternatives.count() >= 1);
  await alternatives.filter({ hasText: '-8.00 DS' }).filter({ hasText: 'leaves 1.63 D of cylinder uncorrected' }).waitFor();
  await page.close();
});

test('the details disclosure is closed by default and remembered per panel across a reload', async () => {
  const page = await browser.newPage();
  await page.goto(server.url(PANELS[0].link));
  await waitForApp(page);
  const details = page.getByRole('region', { name: 'Right eye result' }).locator('details.card-details');
  await details.waitFor({ state: 'attached' });
  assert.equal(await details.evaluate((d) => d.open), false);
  await details.locator('summary').click();
  // Both cards follow the one choice of the panel.
  await page.waitForFunction(() => [...document.querySelectorAll('details.card-details')].every((d) => d.open));
  await page.getByRole('region', { name: 'Right eye result' }).getByText('Change per meridian (+ means more plus)').waitFor();
  await page.reload();
  await waitForApp(page);
  await page.getByRole('region', { name: 'Right eye result' }).locator('details.card-details[open]').waitFor();
  // Another panel keeps its own choice (closed).
  await page.goto(server.url(PANELS[2].link));
  await waitForApp(page);
  await page.getByRole('region', { name: 'Right eye result' }).locator('details.card-details').waitFor({ state: 'attached' });
  assert.equal(await page.locator('details.card-details[open]').count(), 0);
  await page.close();
});

for (const scheme of ['light', 'dark']) {
  test(`axe-core finds no WCAG 2.2 AA violations with the details open and closed (${scheme} theme)`, async () => {
    // bypassCSP only so the test can inject axe-core; the app itself runs under its strict policy.
    const context = await browser.newContext({ bypassCSP: true, colorScheme: scheme, viewport: { width: 390, height: 844 } });
    const page = await context.newPage();
    for (const panel of PANELS) {
      for (const open of [false, true]) {
        await page.goto(server.url(panel.link));
        await waitForApp(page);
        await page.getByRole('region', { name: 'Right eye result' }).locator('output.rx.big').waitFor();
        await page.evaluate((o) => document.querySelectorAll('details').forEach((d) => { d.open = o; }), open);
        await page.addScriptTag({ path: AXE });
        const result = await page.evaluate(async () => globalThis.axe.run(document, {
          runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'] },
        }));
        const found = result.violations.map((v) => `${panel.name} (details ${open ? 'open' : 'closed'}): ${v.id} ${v.nodes.slice(0, 2).map((n) => n.target.join(' ')).join(' | ')}`);
        assert.deepEqual(found, [], found.join('\n'));
      }
    }
    await context.close();
  });
}

test('no sideways scrolling at 320 px with every disclosure open', async () => {
  const context = await browser.newContext({ viewport: { width: 320, height: 640 } });
  const page = await context.newPage();
  for (const panel of PANELS) {
    await page.goto(server.url(panel.link));
    await waitForApp(page);
    await page.getByRole('region', { name: 'Right eye result' }).locator('output.rx.big').waitFor();
    await page.evaluate(() => document.querySelectorAll('details').forEach((d) => { d.open = true; }));
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
    assert.ok(overflow <= 0, `${panel.name} scrolls sideways by ${overflow}px`);
  }
  await context.close();
});
