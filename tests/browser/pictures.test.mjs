// The Pictures panel: every canvas draws, the sweep's least-loss point is the
// engine's (the native CLI's `sweep` for the same design, range and points),
// the corner selector redraws, the MMF diagram's data is what the engine's
// report implies (recomputed here from its layers and currents), failing
// ranges are listed with their reason, and the page makes no request.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { join } from 'node:path';
import { launch, openPage, cli, canvasInk, close, OUT } from './harness.mjs';

let browser;
before(async () => { browser = await launch(); });
after(async () => { await browser?.close(); });

const POINTS = 100; // pictures::SWEEP_POINTS

// The design the page shows, as the engine's design file.
async function pageDesign(page) {
  const text = await page.evaluate(() => localStorage.getItem('magwright.design'));
  assert.ok(text, 'the page keeps its design in localStorage');
  return text;
}

async function sweepReady(page) {
  await page.waitForSelector('[data-testid="sweep-figure"][data-sweep-ready="true"][data-min-hz]', { timeout: 20000 });
}

// A field's text replaced by typing (ids hold dots, so an attribute selector).
async function typeField(page, key, text) {
  const sel = `[id="f-${key}"]`;
  await page.click(sel, { clickCount: 3 });
  await page.keyboard.press('Control+A');
  await page.keyboard.press('Backspace');
  if (text.length) await page.keyboard.type(text, { delay: 15 });
}

async function pixels(page, testid) {
  return page.$eval(`canvas[data-testid="${testid}"]`, (c) => c.toDataURL());
}

// The value of a piecewise-linear waveform just before (side -1) or after
// (+1) t: the waveform module's definition, written out again here.
function valueAt(points, t, side) {
  if (side < 0) {
    const i = points.findIndex((p) => p[0] >= t);
    if (points[i][0] === t) return points[i][1];
    const [a, b] = [points[i - 1], points[i]];
    return a[1] + (b[1] - a[1]) * (t - a[0]) / (b[0] - a[0]);
  }
  let j = -1;
  points.forEach((p, k) => { if (p[0] <= t) j = k; });
  if (points[j][0] === t) return points[j][1];
  const [a, b] = [points[j], points[j + 1]];
  return a[1] + (b[1] - a[1]) * (t - a[0]) / (b[0] - a[0]);
}

// The MMF diagram from the report (module docs of engine design::views):
// the primary's current peak sets the instant; forward secondaries count
// negative (dot convention); F = 0 at the bobbin and steps by
// mmf_per_amp × current across each layer.
function expectedMmf(report, corner) {
  const op = report.waveforms[corner === 'vin_min' ? 'at_vin_min' : 'at_vin_max'];
  const prim = op.windings.find((w) => w.name.startsWith('primary'));
  const pts = prim.current.points;
  let k = 0;
  pts.forEach((p, i) => { if (Math.abs(p[1]) > Math.abs(pts[k][1])) k = i; });
  const t = pts[k][0];
  const stepAfter = pts[k + 1] && pts[k + 1][0] === t;
  const stepBefore = k > 0 && pts[k - 1][0] === t;
  const side = stepBefore && !stepAfter ? 1 : -1;
  assert.equal(report.topology, 'forward', 'this check is written for the forward demo');
  const amps = report.stackup.windings.map((def) => {
    const w = op.windings.find((x) => x.name === def.name);
    if (!w) return 0;
    return valueAt(w.current.points, t, side) * (w.name.startsWith('secondary') ? -1 : 1);
  });
  const out = [[0, 0]];
  let f = 0;
  for (const l of report.fit.layers) {
    if (l.h_bottom > out[out.length - 1][0]) out.push([l.h_bottom, f]);
    f += l.mmf_per_amp * amps[l.winding];
    out.push([l.h_bottom + l.height, f]);
  }
  if (report.fit.total_build > out[out.length - 1][0]) out.push([report.fit.total_build, f]);
  return out;
}

function sameProfile(got, want, what) {
  assert.equal(got.length, want.length, `${what}: ${got.length} points vs ${want.length}`);
  const scale = Math.max(...want.map((p) => Math.abs(p[1])), 1);
  got.forEach((p, i) => {
    assert.ok(Math.abs(p[0] - want[i][0]) <= 1e-12, `${what} point ${i} position ${p[0]} vs ${want[i][0]}`);
    assert.ok(Math.abs(p[1] - want[i][1]) <= 1e-9 * scale, `${what} point ${i} MMF ${p[1]} vs ${want[i][1]}`);
  });
}

async function checkSweepMinimum(page) {
  await sweepReady(page);
  const design = await pageDesign(page);
  const f = JSON.parse(design).spec.frequency;
  const fig = '[data-testid="sweep-figure"]';
  const from = Number(await page.getAttribute(fig, 'data-from-hz'));
  const to = Number(await page.getAttribute(fig, 'data-to-hz'));
  // pictures::sweep_range: a decade either side, within 1 kHz–10 MHz.
  assert.ok(close(from, Math.max(f / 10, 1e3)) && close(to, Math.min(f * 10, 10e6)), `range ${from}–${to} for ${f}`);
  assert.equal(Number(await page.getAttribute(fig, 'data-points')), POINTS);
  const s = cli(['sweep', '-', String(from), String(to), String(POINTS)], design);
  assert.equal(s.points.length, POINTS);
  assert.notEqual(s.minimum, null, 'the engine finds a least-loss point');
  const got = Number(await page.getAttribute(fig, 'data-min-hz'));
  assert.ok(close(got, s.points[s.minimum].x), `page marks ${got} Hz, engine ${s.points[s.minimum].x} Hz`);
  return s;
}

test('pictures: all drawn, sweep minimum = engine, corner selector, MMF data = engine, no network', async (t) => {
  const { context, page, requests, errors } = await openPage(browser);
  await sweepReady(page);
  for (const id of ['flux-plot', 'saturation-plot', 'mmf-plot', 'sweep-plot']) {
    const { ink, colours } = await canvasInk(page, id);
    assert.ok(ink > 0.02 && colours > 3, `${id} looks blank (ink ${ink}, ${colours} colours)`);
    await page.locator(`[data-testid="${id}"]`).screenshot({ path: join(OUT, `pictures-${id}-vin_min.png`) });
  }

  // The least-loss frequency is the engine's for the same design and range.
  const s = await checkSweepMinimum(page);
  assert.ok(s.points.some((p) => p.feasible));

  // MMF diagram and saturation figure against the engine's report.
  const design = await pageDesign(page);
  const report = cli(['evaluate', '-'], design);
  const mmfFig = '[data-testid="mmf-figure"]';
  sameProfile(JSON.parse(await page.getAttribute(mmfFig, 'data-mmf')), expectedMmf(report, 'vin_min'), 'Vin min');
  const sat = '[data-testid="saturation-figure"]';
  // The figure shows the Bpk the saturation check judges (in Amin).
  const worstB = report.checks.find((c) => c.key === 'saturation').value;
  assert.ok(close(Number(await page.getAttribute(sat, 'data-b-peak')), worstB, 1e-6), 'Bpk is the check\'s');
  assert.ok(close(Number(await page.getAttribute(sat, 'data-temperature')), report.thermal.temperature));
  const check = report.checks.find((c) => c.key === 'saturation');
  assert.ok(close(Number(await page.getAttribute(sat, 'data-limit')), check.limit), 'the limit is the check\'s');

  // Switching the corner redraws the waveforms and the MMF, by keyboard.
  const before = { waves: await pixels(page, 'flux-plot'), mmf: await pixels(page, 'mmf-plot') };
  await page.focus('[data-testid="corner-select"]');
  await page.keyboard.press('ArrowDown');
  await page.waitForSelector('[data-testid="waves-figure"][data-corner="vin_max"]');
  await page.waitForSelector('[data-testid="mmf-figure"][data-corner="vin_max"]');
  // Redrawn: each canvas's pixels differ from before.
  await page.waitForFunction(([b]) => ['flux-plot', 'mmf-plot'].every((id, k) =>
    document.querySelector(`canvas[data-testid="${id}"]`).toDataURL() !== b[k]), [[before.waves, before.mmf]]);
  assert.notEqual(await pixels(page, 'flux-plot'), before.waves, 'the waveforms redraw for Vin max');
  assert.notEqual(await pixels(page, 'mmf-plot'), before.mmf, 'the MMF redraws for Vin max');
  sameProfile(JSON.parse(await page.getAttribute(mmfFig, 'data-mmf')), expectedMmf(report, 'vin_max'), 'Vin max');
  for (const id of ['flux-plot', 'mmf-plot']) {
    await page.locator(`[data-testid="${id}"]`).screenshot({ path: join(OUT, `pictures-${id}-vin_max.png`) });
  }
  await page.selectOption('[data-testid="corner-select"]', 'vin_min');
  await page.waitForSelector('[data-testid="waves-figure"][data-corner="vin_min"]');

  // An edit: the results follow at once; the sweep follows when typing pauses.
  // The core loss moves with the frequency (the turns may not).
  const lossBefore = await page.getAttribute('[data-testid="core-loss"]', 'data-si');
  await typeField(page, 'frequency', '250k');
  const typed = Date.now();
  await page.waitForFunction(() => document.querySelector('[id="f-frequency"]').value === '250k');
  await page.waitForFunction((v) => document.querySelector('[data-testid="core-loss"]')?.dataset.si !== v, lossBefore);
  const results = Date.now() - typed;
  await checkSweepMinimum(page);
  const swept = Date.now() - typed;
  const ms = Number(await page.getAttribute('[data-testid="sweep-figure"]', 'data-sweep-ms'));
  assert.ok(ms >= 0);
  t.diagnostic(`after the last keystroke: results ${results} ms, sweep shown ${swept} ms; the sweep itself ${ms} ms`);
  await page.locator('[data-testid="panel-pictures"]').screenshot({ path: join(OUT, 'pictures-panel.png') });

  assert.deepEqual(requests, []);
  assert.deepEqual(errors, []);
  await context.close();
});

test('pictures: failing frequencies are shaded and listed with the engine\'s reasons', async () => {
  const { context, page, requests, errors } = await openPage(browser);
  await sweepReady(page);
  // A low core temperature limit makes the high-loss end of the sweep fail.
  await typeField(page, 'temperature_max', '70');
  await page.waitForFunction(() => document.querySelector('[id="f-temperature_max"]').value === '70');
  // The edit reached the design (saved with it); the sweep is then redone for it.
  await page.waitForFunction(() => JSON.parse(localStorage.getItem('magwright.design') || '{}').spec?.temperature_max === 70);
  const s = await checkSweepMinimum(page).catch(async (e) => {
    await page.locator('[data-testid="panel-pictures"]').screenshot({ path: join(OUT, 'pictures-failing-error.png') });
    throw e;
  });
  const failing = s.points.filter((p) => !p.feasible);
  assert.ok(failing.length > 0, 'some frequencies fail with a 70 °C core temperature limit');
  const items = await page.$$eval('[data-testid="sweep-fails"] li', (els) =>
    els.map((e) => ({ from: Number(e.dataset.fromHz), to: Number(e.dataset.toHz), text: e.textContent })));
  assert.ok(items.length > 0, 'the failing ranges are listed');
  const inside = (x) => items.some((r) => x >= r.from * (1 - 1e-12) && x <= r.to * (1 + 1e-12));
  for (const p of s.points) {
    assert.equal(inside(p.x), !p.feasible, `${p.x} Hz: engine says feasible=${p.feasible}`);
  }
  // Each range names every check its points fail (the engine's labels).
  for (const p of failing) {
    const r = items.find((r) => p.x >= r.from * (1 - 1e-12) && p.x <= r.to * (1 + 1e-12));
    // A check's label in full; an engine message up to its details.
    const parts = p.values ? p.reason.split('; ') : [p.reason.split(': ')[0]];
    for (const part of parts) assert.ok(r.text.includes(part), `listed "${r.text}" lacks "${part}" (${p.x} Hz)`);
  }
  // Consecutive failing points make one listed range.
  assert.ok(items.every((r, i) => i === 0 || r.from > items[i - 1].to), 'ranges are disjoint and ordered');
  const { ink } = await canvasInk(page, 'sweep-plot');
  assert.ok(ink > 0.02);
  await page.locator('[data-testid="sweep-figure"]').screenshot({ path: join(OUT, 'pictures-sweep-failing.png') });
  assert.deepEqual(requests, []);
  assert.deepEqual(errors, []);
  await context.close();
});
