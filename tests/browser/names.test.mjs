// Names, units and cautions (issue 15): the first-visit demo shows the
// hazardous-voltage caution box (its switch node is above ES1), the standing
// caution is on the page; canvases are drawn at the device pixel ratio (and
// redrawn when the layout changes their width); the
// Pv–B chart is drawn from the engine's curves; the optimiser says it has not
// run yet; an old (version-1) design file opens converted, with a note.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { join } from 'node:path';
import { launch, attach, cli, cliText, shown, close, canvasInk, OUT, chooseWithKeyboard } from './harness.mjs';

let browser;
before(async () => { browser = await launch(); });
after(async () => { await browser?.close(); });

async function open(scale = 1) {
  const context = await browser.newContext({ viewport: { width: 1280, height: 900 }, deviceScaleFactor: scale, acceptDownloads: true });
  const { page, requests, errors } = await attach(context);
  return { context, page, requests, errors };
}

test('first visit: caution box for the 120 V switch node, standing caution, optimiser not run yet', async () => {
  const { context, page, requests, errors } = await open();
  const want = cli(['evaluate', '-'], cliText(['demo', 'forward']));
  // The CLI's report: the switch node above ES1 (60 V DC, IEC 62368-1) raises a caution.
  const vsw = want.waveforms.worst.find((w) => w.quantity === 'switch_voltage').value;
  assert.ok(vsw > 60, `switch node ${vsw} V`);
  assert.ok(want.cautions.some((c) => /switch node reaches/.test(c)), want.cautions.join(' | '));
  await page.waitForSelector('[data-testid="cautions"]:not(.hidden)');
  const shownCautions = await page.$$eval('[data-testid="cautions"] li', (li) => li.map((l) => l.textContent));
  assert.deepEqual(shownCautions, want.cautions);
  assert.ok(await page.isVisible('[data-testid="cautions"]'));
  // The standing caution, in the header, whatever the design.
  const standing = await page.textContent('[data-testid="standing-caution"]');
  assert.match(standing, /does not certify/);
  assert.match(standing, /IEC 62368-1 \/ IEC 61558/);
  assert.ok(await page.isVisible('[data-testid="standing-caution"]'));
  // The same line in the CLI's help.
  assert.ok(cliText(['--help']).includes(standing.trim()));
  // The header names every topology the page designs.
  const sub = await page.textContent('header.top .sub');
  for (const t of ['flyback', 'forward', 'push-pull', 'half-bridge', 'full-bridge', 'inductor']) assert.ok(sub.includes(t), `${t} in "${sub}"`);
  // The optimiser before its first run.
  assert.match(await page.textContent('[data-testid="suggest-status"]'), /Not run yet/);
  assert.doesNotMatch(await page.textContent('[data-testid="panel-suggest"]'), /No candidate passes/);
  await page.screenshot({ path: join(OUT, 'names-first-visit.png') });
  assert.deepEqual(requests, []);
  assert.deepEqual(errors, []);
  await context.close();
});

test('at a 2x pixel ratio every canvas has backing size = CSS size x devicePixelRatio', async () => {
  const { context, page, requests, errors } = await open(2);
  assert.equal(await page.evaluate(() => window.devicePixelRatio), 2);
  await page.waitForFunction(() => document.querySelectorAll('canvas').length >= 4);
  // Every drawn canvas (the Pareto plot draws after a run only).
  await page.waitForFunction(() => [...document.querySelectorAll('canvas')]
    .filter((c) => c.dataset.testid !== 'pareto-plot' && c.clientWidth > 0)
    .every((c) => c.width === Math.round(c.clientWidth * 2)));
  const sizes = await page.$$eval('canvas', (cs) => cs.map((c) => ({
    id: c.dataset.testid, w: c.width, h: c.height, cw: c.clientWidth, ch: c.clientHeight,
  })));
  const drawn = sizes.filter((s) => s.id !== 'pareto-plot' && s.cw > 0);
  assert.ok(drawn.length >= 4, JSON.stringify(sizes));
  for (const s of drawn) {
    assert.equal(s.w, Math.round(s.cw * 2), `${s.id} width ${JSON.stringify(s)}`);
    assert.ok(Math.abs(s.h - s.ch * 2) <= 2, `${s.id} height ${JSON.stringify(s)}`);
  }
  for (const id of ['flux-plot', 'pv-b-plot']) {
    const ink = await canvasInk(page, id);
    assert.ok(ink.ink > 0.01 && ink.colours > 3, `${id} drawn: ${JSON.stringify(ink)}`);
  }
  await page.locator('[data-testid="pv-b-figure"]').screenshot({ path: join(OUT, 'names-pv-b-2x.png') });
  await page.locator('[data-testid="flux-plot"]').screenshot({ path: join(OUT, 'names-flux-2x.png') });
  assert.deepEqual(requests, []);
  assert.deepEqual(errors, []);
  await context.close();
});

test('a canvas whose laid-out width changes is redrawn at the new width (the page resized)', async () => {
  const { context, page, requests, errors } = await open(2);
  const drawnAtSize = () => [...document.querySelectorAll('canvas')]
    .filter((c) => c.dataset.testid !== 'pareto-plot' && c.clientWidth > 0)
    .every((c) => c.width === Math.round(c.clientWidth * 2));
  await page.waitForFunction(drawnAtSize);
  const before = await page.$eval('[data-testid="flux-plot"]', (c) => ({ cw: c.clientWidth, w: c.width }));
  await page.setViewportSize({ width: 420, height: 900 });
  // The layout narrows the canvas; its picture follows without any edit.
  await page.waitForFunction((w0) => document.querySelector('[data-testid="flux-plot"]').clientWidth < w0, before.cw);
  await page.waitForFunction(drawnAtSize);
  const after = await page.$eval('[data-testid="flux-plot"]', (c) => ({ cw: c.clientWidth, w: c.width }));
  assert.ok(after.cw < before.cw && after.w < before.w, `${JSON.stringify(before)} -> ${JSON.stringify(after)}`);
  const ink = await canvasInk(page, 'flux-plot');
  assert.ok(ink.ink > 0.01 && ink.colours > 3, `flux-plot drawn: ${JSON.stringify(ink)}`);
  await page.locator('[data-testid="flux-plot"]').screenshot({ path: join(OUT, 'names-flux-narrow.png') });
  assert.deepEqual(requests, []);
  assert.deepEqual(errors, []);
  await context.close();
});

test('the Pv–B chart states the temperature and the fitted range of the material in use', async () => {
  const { context, page, requests, errors } = await open();
  const m = cli(['materials']).find((x) => x.name === 'MnZn-200k');
  const caption = await page.textContent('[data-testid="pv-b-caption"]');
  assert.match(caption, /MnZn-200k/);
  assert.match(caption, new RegExp(`least loss, ${m.temp_factor.least_loss_c.toFixed(0)} °C`));
  assert.match(caption, /20\.0 kHz – 300 kHz/);
  // Frequencies inside the fitted range, first and last at its ends.
  const f = (await page.getAttribute('[data-testid="pv-b-caption"]', 'data-frequencies')).split(' ').map(Number);
  assert.ok(f.length >= 3);
  assert.ok(close(f[0], m.steinmetz.f_min) && close(f[f.length - 1], m.steinmetz.f_max), f.join(' '));
  // The material data show the temperature factor in its own form.
  assert.ok(close(await shown(page, 'mat-tref'), m.temp_factor.least_loss_c));
  assert.ok(close(await shown(page, 'mat-curvature'), m.temp_factor.curvature));
  assert.deepEqual(requests, []);
  assert.deepEqual(errors, []);
  await context.close();
});

test('a version-1 design file opens converted, with a note', async () => {
  const { context, page, requests, errors } = await open();
  // A version-1 file with an own material and the old quadratic factor
  // 1.2e-4·T² − 0.024·T + 2.5 = 1.3·(1 + (1.2e-4/1.3)·(T − 100)²).
  const d = cli(['demo', 'flyback']);
  const m = cli(['materials']).find((x) => x.name === 'MnZn-200k');
  d.version = 1;
  d.spec.hot_spot_max = d.spec.temperature_max;
  delete d.spec.temperature_max;
  d.material = { from: 'custom', material: { ...m, name: 'Old grade', temp_factor: { ct2: 1.2e-4, ct1: 0.024, ct0: 2.5 } } };
  const text = JSON.stringify(d, null, 2);
  await chooseWithKeyboard(page, 'open', { name: 'old.json', mimeType: 'application/json', buffer: Buffer.from(text) });
  await page.waitForFunction(() => /Opened old\.json/.test(document.querySelector('[data-testid="file-status"]')?.textContent || ''));
  const status = await page.textContent('[data-testid="file-status"]');
  assert.match(status, /version 1.*converted to version 3/);
  assert.match(status, /least loss at 100/);
  assert.match(status, /hot_spot_max is now spec\.temperature_max/);
  // The saved design is version 3 in the new form, with the scale folded into k.
  await page.waitForFunction(() => JSON.parse(localStorage.getItem('magwright.design') || '{}').material?.material?.name === 'Old grade');
  const saved = JSON.parse(await page.evaluate(() => localStorage.getItem('magwright.design')));
  assert.equal(saved.version, 3);
  assert.equal(saved.spec.temperature_max, d.spec.hot_spot_max);
  assert.equal(saved.spec.hot_spot_max, undefined);
  const tf = saved.material.material.temp_factor;
  assert.ok(close(tf.least_loss_c, 100) && close(tf.curvature, 1.2e-4 / 1.3));
  assert.ok(close(saved.material.material.steinmetz.k, m.steinmetz.k * 1.3));
  // The page's result equals the CLI's for the old file.
  const want = cli(['evaluate', '-'], text);
  assert.ok(close(await shown(page, 'total-loss'), want.losses.total, 1e-9));
  await page.screenshot({ path: join(OUT, 'names-old-file.png') });
  assert.deepEqual(requests, []);
  assert.deepEqual(errors, []);
  await context.close();
});

test('labels say what is computed: core temperature, margins in K, tight, Bsat at core temperature', async () => {
  const { context, page, requests, errors } = await open();
  const want = cli(['evaluate', '-'], cliText(['demo', 'forward']));
  // The form's limit and the results' check and tile.
  assert.equal(await page.textContent('label[for="f-temperature_max"]'), 'Core temp. max');
  assert.match(await page.getAttribute('label[for="f-temperature_max"]', 'title'), /mean surface temperature.*McLyman.*hottest point runs higher/);
  const row = page.locator('[data-testid="check-temperature"]');
  assert.match(await row.locator('th').textContent(), /^Core temperature/);
  // The temperature margin in kelvin: limit − value of the engine's check.
  const t = want.checks.find((c) => c.key === 'temperature');
  assert.equal((await page.textContent('[data-testid="margin-temperature"]')).trim(), `+${(t.limit - t.value).toFixed(1)} K`);
  assert.match(await page.locator('[data-testid="check-saturation"] th').textContent(), /Bsat at core temp\./);
  // A check under 10 % margin (duty of the demo) is tagged "tight".
  const tight = want.checks.filter((c) => c.pass && c.tight).map((c) => c.key);
  assert.ok(tight.length > 0);
  for (const k of tight) assert.match(await page.locator(`[data-testid="check-${k}"] th`).textContent(), /tight/);
  assert.doesNotMatch(await page.innerText('[data-testid="panel-results"]'), /binding|Hot spot/);
  assert.doesNotMatch(await page.innerText('main'), /Hot spot|hot-spot/i);
  // Fields in the units the results use.
  const demo = cli(['demo', 'forward']);
  assert.equal(Number(await page.inputValue('[id="f-duty_max"]')) / 100, demo.spec.duty_max);
  assert.equal(await page.textContent('.field:has([id="f-duty_max"]) .unit'), '%');
  assert.equal(await page.textContent('.field:has([id="f-choices.insulation.tape_thickness"]) .unit'), 'mm');
  await page.screenshot({ path: join(OUT, 'names-labels.png'), fullPage: true });
  assert.deepEqual(requests, []);
  assert.deepEqual(errors, []);
  await context.close();
});

