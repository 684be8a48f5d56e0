// The frequency study on the page: both curves (redesigned at each
// frequency, this transformer as wound) and, asked for by keyboard, the
// best library material at each frequency, each named in the sweep plot's
// legend (the figure's data-legend); the material's data band and the
// marked points are the engine's (the native CLI's `sweep --as-wound
// --envelope` for the same design, range and points); no request is made.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { join } from 'node:path';
import { launch, openPage, cli, canvasInk, close, OUT } from './harness.mjs';

let browser;
before(async () => { browser = await launch(); });
after(async () => { await browser?.close(); });

const POINTS = 100; // pictures::SWEEP_POINTS
const ENVELOPE_POINTS = 50; // pictures::ENVELOPE_POINTS
const FIG = '[data-testid="sweep-figure"]';

async function pageDesign(page) {
  const text = await page.evaluate(() => localStorage.getItem('magwright.design'));
  assert.ok(text, 'the page keeps its design in localStorage');
  return text;
}

async function attr(page, name) {
  return page.getAttribute(FIG, name);
}

test('sweep: both curves and the best-material envelope, named in the legend, = engine', async (t) => {
  const { context, page, requests, errors } = await openPage(browser);
  await page.waitForSelector(`${FIG}[data-sweep-ready="true"][data-min-hz][data-legend*="as wound"]`, { timeout: 20000 });
  const design = await pageDesign(page);
  const from = Number(await attr(page, 'data-from-hz'));
  const to = Number(await attr(page, 'data-to-hz'));

  // Both curves in the legend, and no envelope before it is asked for.
  let legend = await attr(page, 'data-legend');
  assert.ok(legend.includes('total, redesigned at each frequency'), legend);
  assert.ok(legend.includes('total, this transformer as wound'), legend);
  assert.ok(!legend.includes('best library material'), legend);

  // The engine's curves for the same design and range.
  const s = cli(['sweep', '-', String(from), String(to), String(POINTS), '--as-wound'], design);
  assert.equal(s.redesigned.x_axis.unit, 'Hz');
  assert.ok(close(Number(await attr(page, 'data-min-hz')), s.redesigned.points[s.redesigned.minimum].x), 'redesigned minimum');
  const w = s.as_wound;
  assert.notEqual(w.minimum, null, 'the design as wound passes somewhere');
  assert.ok(close(Number(await attr(page, 'data-wound-min-hz')), w.points[w.minimum].x), 'as-wound minimum');
  // The shaded band is the engine's (the material's data by its rule).
  assert.ok(close(Number(await attr(page, 'data-band-min-hz')), s.redesigned.band.min));
  assert.ok(close(Number(await attr(page, 'data-band-max-hz')), s.redesigned.band.max));
  assert.ok(legend.includes(`${s.redesigned.material} data`), legend);
  // No point outside the data is feasible (the engine's rule, as shown).
  for (const p of s.redesigned.points) assert.ok(p.in_data || !p.feasible, `${p.x} Hz`);

  // The envelope, asked for with the keyboard.
  const toggle = '[data-testid="envelope-toggle"]';
  assert.equal(await page.getAttribute(toggle, 'aria-pressed'), 'false');
  await page.focus(toggle);
  await page.waitForFunction(() => document.activeElement?.dataset?.testid === 'envelope-toggle');
  await page.keyboard.press('Space');
  await page.waitForSelector(`${toggle}[aria-pressed="true"]`);
  await page.waitForSelector(`${FIG}[data-legend*="best library material"]`, { timeout: 60000 });
  legend = await attr(page, 'data-legend');
  for (const name of ['redesigned at each frequency', 'this transformer as wound', 'best library material']) {
    assert.ok(legend.includes(name), `legend lacks "${name}": ${legend}`);
  }
  const e = cli(['sweep', '-', String(from), String(to), String(ENVELOPE_POINTS), '--envelope'], design).envelope;
  // The materials named, in order of first appearance, and where the winner changes.
  const named = [];
  for (const p of e.points) if (p.material && !named.includes(p.material)) named.push(p.material);
  assert.ok(named.length >= 1);
  await page.waitForSelector('[data-testid="envelope-materials"][data-materials]');
  assert.equal(await page.getAttribute('[data-testid="envelope-materials"]', 'data-materials'), named.join(', '));
  const changes = (await attr(page, 'data-envelope-changes-hz')).split(' ').filter((x) => x).map(Number);
  assert.equal(changes.length, e.changes.length);
  changes.forEach((x, i) => assert.ok(close(x, e.points[e.changes[i]].x), `change ${i}: ${x} Hz`));
  // Each material named where it takes over is also in the legend (a marker).
  for (const i of e.changes) assert.ok(legend.includes(e.points[i].material), `${e.points[i].material} not marked`);
  const { ink, colours } = await canvasInk(page, 'sweep-plot');
  assert.ok(ink > 0.02 && colours > 3, `sweep plot looks blank (ink ${ink})`);
  t.diagnostic(`envelope over ${e.materials.length} materials: ${named.join(', ')}; ${e.changes.length} changes`);
  await page.locator(FIG).screenshot({ path: join(OUT, 'sweep-envelope.png') });

  // And off again, by keyboard: the legend drops the envelope.
  await page.keyboard.press('Space');
  await page.waitForSelector(`${toggle}[aria-pressed="false"]`);
  await page.waitForFunction((sel) => !document.querySelector(sel).dataset.legend.includes('best library material'), FIG);

  assert.deepEqual(requests, []);
  assert.deepEqual(errors, []);
  await context.close();
});
