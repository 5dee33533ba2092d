// Clinic-ready front: accessibility (axe-core, WCAG 2.2 AA), layouts from
// 320 px phones to landscape tablets, touch targets, text at 200 %, themes,
// keyboard use, the about view and the connection indicator. Screenshots of
// every destination go to tests/artifacts/ (ignored by git) for review.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { createRequire } from 'node:module';
import { startServer, launch, waitForApp, artifact } from './harness.js';

const require = createRequire(import.meta.url);
const AXE = require.resolve('axe-core/axe.min.js');

let server;
let browser;
before(async () => { server = await startServer(); browser = await launch(); });
after(async () => { await browser?.close(); await server?.stop(); });

const enc = encodeURIComponent;
const RX = `r=${enc('-8.00 -2.00 x180')}&l=${enc('+6.00 -2.00 x90')}`;
const DESTINATIONS = [
  ['vertex', `vertex?${RX}`],
  ['equivalent', `equivalent?${RX}`],
  ['near', `near?${RX}&add=2.50&age=50`],
  ['image-size', `image-size?${RX}&rf=6&rt=2&rn=1.5`],
  // Notes §14 check values [derived from ANSI Z80.1-2015 as publicly summarised].
  ['lens-check', `lens-check?r=${enc('-2.00 -1.00 x90')}&rm=${enc('-2.10 -1.12 x93')}&l=${enc('+3.00 -5.00 x180')}&lm=${enc('+3.10 -5.22 x179')}&add=2.00&radd=2.10&ladd=2.25`],
  ['chart', `chart?${RX}`],
  ['over-refraction', `over-refraction?${RX}&ror=${enc('-0.50 -0.25 x80')}&worn=0&rrot=10`],
  ['history', 'history'],
  ['about', 'about'],
];
const SIZES = [['phone-320', 320, 640], ['phone-390', 390, 844], ['tablet-portrait', 820, 1180], ['tablet-landscape', 1180, 820]];

async function page(options = {}) {
  // bypassCSP only so the test can inject axe-core; the app itself runs under its strict policy.
  const context = await browser.newContext({ bypassCSP: true, ...options });
  return { context, page: await context.newPage() };
}

for (const scheme of ['light', 'dark']) {
  test(`axe-core finds no WCAG 2.2 AA violations on any destination (${scheme} theme)`, async () => {
    const { context, page: p } = await page({ colorScheme: scheme });
    for (const [name, path] of DESTINATIONS) {
      await p.goto(server.url(path));
      await waitForApp(p);
      await p.getByRole('heading', { level: 1 }).first().waitFor();
      await p.addScriptTag({ path: AXE });
      const result = await p.evaluate(async () => globalThis.axe.run(document, {
        runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'] },
      }));
      const found = result.violations.map((v) => `${name}: ${v.id} (${v.nodes.length}) ${v.nodes.slice(0, 2).map((n) => n.target.join(' ')).join(' | ')}`);
      assert.deepEqual(found, [], found.join('\n'));
    }
    await context.close();
  });
}

test('every destination fits phones from 320 px and tablets both ways, without sideways scrolling; screenshots saved', async () => {
  for (const scheme of ['light', 'dark']) {
    for (const [label, width, height] of SIZES) {
      const { context, page: p } = await page({ viewport: { width, height }, colorScheme: scheme });
      for (const [name, path] of DESTINATIONS) {
        await p.goto(server.url(path));
        await waitForApp(p);
        await p.getByRole('heading', { level: 1 }).first().waitFor();
        const overflow = await p.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
        assert.ok(overflow <= 0, `${name} at ${width}px scrolls sideways by ${overflow}px`);
        await p.screenshot({ path: artifact(`${name}-${label}-${scheme}.png`), fullPage: true });
      }
      await context.close();
    }
  }
});

test('touch targets are at least 44 × 44 px on a phone', async () => {
  const { context, page: p } = await page({ viewport: { width: 390, height: 844 } });
  for (const [name, path] of DESTINATIONS) {
    await p.goto(server.url(path));
    await waitForApp(p);
    // Every disclosure open, so what sits behind one is measured too.
    await p.evaluate(() => document.querySelectorAll('details').forEach((d) => { d.open = true; }));
    const small = await p.evaluate(() => [...document.querySelectorAll('button, a[href], input:not([type=radio]):not([type=checkbox]), select, summary, label.choice, label.button')]
      // A visually hidden input is operated through its visible label (measured instead).
      .filter((el) => el.checkVisibility() && !el.classList.contains('skip-link') && !el.classList.contains('visually-hidden'))
      .map((el) => { const r = el.getBoundingClientRect(); return { what: el.outerHTML.slice(0, 80), w: Math.round(r.width), h: Math.round(r.height) }; })
      .filter((r) => r.w < 44 || r.h < 44));
    assert.deepEqual(small, [], `${name}: ${JSON.stringify(small)}`);
  }
  await context.close();
});

test('placeholders and choices in selects are not cut off on phones from 320 to 390 px', async () => {
  for (const width of [320, 390]) {
    const { context, page: p } = await page({ viewport: { width, height: 800 } });
    for (const [name, path] of DESTINATIONS) {
      await p.goto(server.url(path));
      await waitForApp(p);
      await p.evaluate(() => document.querySelectorAll('details').forEach((d) => { d.open = true; }));
      const cut = await p.evaluate(() => {
        const ctx = document.createElement('canvas').getContext('2d');
        return [...document.querySelectorAll('input[placeholder], select')]
          .filter((el) => el.checkVisibility() && !el.classList.contains('visually-hidden'))
          .map((el) => {
            const cs = getComputedStyle(el);
            ctx.font = `${cs.fontWeight} ${cs.fontSize} ${cs.fontFamily}`;
            const texts = el.tagName === 'SELECT' ? [...el.options].map((o) => o.text) : [el.placeholder];
            // A select's arrow takes about 1.5em of its box.
            const arrow = el.tagName === 'SELECT' ? 1.5 * parseFloat(cs.fontSize) : 0;
            const room = el.clientWidth - parseFloat(cs.paddingLeft) - parseFloat(cs.paddingRight) - arrow;
            const widest = Math.max(...texts.map((t) => ctx.measureText(t).width));
            return { id: el.id, text: texts.join(' | '), widest: Math.round(widest), room: Math.round(room) };
          })
          .filter((r) => r.widest > r.room);
      });
      assert.deepEqual(cut, [], `${name} at ${width}px: ${JSON.stringify(cut)}`);
    }
    await context.close();
  }
});

test('text at 200 % loses nothing: no sideways scrolling and the result stays readable', async () => {
  const { context, page: p } = await page({ viewport: { width: 390, height: 844 } });
  for (const [name, path] of DESTINATIONS) {
    await p.goto(server.url(path));
    await waitForApp(p);
    await p.addStyleTag({ content: 'html { font-size: 200% !important; }' });
    const overflow = await p.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
    assert.ok(overflow <= 0, `${name} at 200 % scrolls sideways by ${overflow}px`);
  }
  // C1 [textbook]: the result is still there in full at 200 %.
  await p.goto(server.url(`vertex?${RX}`));
  await waitForApp(p);
  await p.addStyleTag({ content: 'html { font-size: 200% !important; }' });
  await p.getByRole('region', { name: 'Right eye result' }).getByText('-7.30 -1.63 ×180').first().waitFor();
  await context.close();
});

test('the theme follows the system until chosen, and the choice is remembered', async () => {
  const { context, page: p } = await page({ colorScheme: 'light' });
  await p.goto(server.url('vertex'));
  await waitForApp(p);
  const bg = () => p.evaluate(() => getComputedStyle(document.body).backgroundColor);
  const light = await bg();
  await p.getByRole('button', { name: 'Theme: system' }).click();
  assert.equal(await p.evaluate(() => document.documentElement.dataset.theme), 'dark');
  assert.notEqual(await bg(), light);
  await p.reload();
  await waitForApp(p);
  assert.equal(await p.evaluate(() => document.documentElement.dataset.theme), 'dark');
  await p.getByRole('button', { name: 'Theme: dark' }).waitFor();
  // Dark is drawn for a dim room: no large white surfaces.
  const whites = await p.evaluate(() => [...document.querySelectorAll('body, main, fieldset, input, section, .save-bar')]
    .map((el) => getComputedStyle(el).backgroundColor)
    .filter((c) => { const m = c.match(/\d+/g); return m && m.slice(0, 3).every((v) => Number(v) > 200); }));
  assert.deepEqual(whites, []);
  await context.close();
});

test('keyboard: skip link, tab order into the fields, Enter in the label saves, Escape closes settings', async () => {
  const { context, page: p } = await page();
  await p.goto(server.url(`equivalent?${RX}`));
  await waitForApp(p);
  await p.keyboard.press('Tab');
  assert.equal(await p.evaluate(() => document.activeElement.textContent), 'Skip to the calculator');
  await p.getByText('Substitute limits').focus();
  await p.keyboard.press('Enter');
  assert.equal(await p.locator('details.settings').evaluate((d) => d.open), true);
  await p.getByLabel('Largest cylinder, with the rule', { exact: true }).focus();
  await p.keyboard.press('Escape');
  assert.equal(await p.locator('details.settings').evaluate((d) => d.open), false);
  await p.getByLabel('Label (optional)').fill('room 2');
  await p.keyboard.press('Enter');
  await p.locator('.save-bar [role="status"]').getByText('Saved').waitFor();
  // Errors are tied to their fields (the separate fields are one tap away).
  await p.getByRole('group', { name: 'Right eye (R)' }).getByText('Separate fields').click();
  const sphere = p.getByLabel('Right sphere', { exact: true });
  await sphere.fill('2');
  assert.equal(await sphere.getAttribute('aria-invalid'), 'true');
  const described = await sphere.getAttribute('aria-describedby');
  assert.match(await p.locator(`#${described}`).textContent(), /needs a sign/);
  await context.close();
});

test('results are announced politely when they change', async () => {
  const { context, page: p } = await page();
  await p.goto(server.url('vertex'));
  await waitForApp(p);
  await p.getByLabel('Right prescription', { exact: true }).fill('-10.00');
  // V4 [textbook]: −10.00 at 12 mm → −8.93 at the cornea.
  await p.locator('[aria-live="polite"].visually-hidden').getByText('-8.93').waitFor();
  await context.close();
});

test('about view: the model, the cautions, not a prescription, version and build, data on the device', async () => {
  const { context, page: p } = await page();
  await p.goto(server.url('vertex'));
  await waitForApp(p);
  await p.getByRole('link', { name: 'About' }).click();
  await p.getByRole('heading', { level: 1, name: 'About', exact: true }).waitFor();
  const text = await p.locator('main').textContent();
  for (const needed of ['not a prescription', 'corneal vertex', 'Thin lenses', 'local regulations', 'stays on this device', 'build ']) {
    assert.ok(text.includes(needed), needed);
  }
  const build = await p.locator('meta[name="lensplane-build"]').getAttribute('content');
  assert.ok(text.includes(build), 'the build id is shown');
  await context.close();
});

test('the connection indicator says when the device is offline', async () => {
  const { context, page: p } = await page();
  await p.goto(server.url('vertex'));
  await waitForApp(p);
  await p.locator('.connection').getByText('Online').waitFor();
  await context.setOffline(true);
  await p.locator('.connection').getByText('Offline').waitFor();
  await context.setOffline(false);
  await p.locator('.connection').getByText('Online').waitFor();
  await context.close();
});

test('printing keeps the inputs, results and cautions in black on white, without navigation or buttons, in either theme', async () => {
  const { context, page: p } = await page({ colorScheme: 'dark' });
  await p.goto(server.url(`vertex?${RX}`));
  await waitForApp(p);
  // C1 [textbook]: −8.00 −2.00 ×180 at 12 mm → −7.30 −1.63 ×180 at the cornea.
  await p.getByRole('region', { name: 'Right eye result' }).getByText('-7.30 -1.63 ×180').first().waitFor();
  await p.emulateMedia({ media: 'print' });
  const look = await p.evaluate(() => ({
    bg: getComputedStyle(document.body).backgroundColor,
    ink: getComputedStyle(document.body).color,
  }));
  assert.deepEqual(look, { bg: 'rgb(255, 255, 255)', ink: 'rgb(0, 0, 0)' });
  for (const hidden of [p.locator('nav.destinations'), p.getByRole('button', { name: 'Save to history' }), p.getByRole('button', { name: 'Copy link' })]) {
    assert.equal(await hidden.first().isVisible(), false);
  }
  for (const shown of [p.getByRole('region', { name: 'Right eye result' }), p.getByLabel('Right prescription', { exact: true }), p.locator('.cautions')]) {
    assert.ok(await shown.first().isVisible());
  }
  await context.close();
});
