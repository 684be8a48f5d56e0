// The frequency study on the page: both curves (redesigned at each
// frequency, this transformer as wound) and, asked for by keyboard, the
// best library material at each frequency, each named in the sweep plot's
// legend (the figure's data-legend); the material's data band and the
// marked points are the engine's (the native CLI's `sweep --as-wound
// --envelope` for the same design, range and points); no request is made.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { join } from 'node:path';
import { launch, openPage, cli, canvasInk, close, waitSaved, frames, OUT } from './harness.mjs';

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
  // What holds each least loss where it is: the engine's notes, shown as given.
  const limits = await page.$$eval('[data-testid="sweep-limits"] li', (els) => els.map((e) => e.textContent));
  const want = [
    ...s.redesigned.minimum_limits.map((l) => `Least loss, redesigned: ${l.note}.`),
    ...w.minimum_limits.map((l) => `Least loss, as wound: ${l.note}.`),
  ];
  assert.deepEqual(limits, want);
  // The forward demo's redesigned loss still falls where its material's data end.
  assert.ok(s.redesigned.minimum_limits.some((l) => l.by === 'data'), JSON.stringify(s.redesigned.minimum_limits));

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

// The sweep is live: typed key by key with no pause, every valid prefix of
// the frequency is a design of its own (1234 Hz, 12345 Hz, then 123456 Hz),
// each starting a sweep run that the next key drops. Whenever the figure
// says its sweep is current (data-sweep-ready="true"), that sweep is for
// the design shown (data-swept-hz = data-design-hz); at the end it is the
// final design's, point by point the CLI's sweep of the saved design file.
test('sweep: live on every keystroke, never an earlier design\'s sweep shown as current, = CLI', async (t) => {
  const { context, page, requests, errors } = await openPage(browser);
  await page.waitForSelector(`${FIG}[data-sweep-ready="true"][data-sweep-totals]`, { timeout: 20000 });
  // The figure's state at every animation frame (what can be painted),
  // recorded in the page while the keys go in.
  await page.evaluate((sel) => {
    const fig = document.querySelector(sel);
    const log = [];
    window.__sweepLog = log;
    const note = () => {
      const e = { ready: fig.dataset.sweepReady, swept: fig.dataset.sweptHz, design: fig.dataset.designHz, legend: fig.dataset.legend };
      const last = log[log.length - 1];
      if (!last || last.ready !== e.ready || last.swept !== e.swept || last.design !== e.design || last.legend !== e.legend) log.push(e);
      if (!window.__sweepLogStop) requestAnimationFrame(note);
    };
    note();
  }, FIG);
  const FINAL = '123456';
  await page.click('[id="f-frequency"]', { clickCount: 3 });
  await page.keyboard.press('Control+A');
  await page.keyboard.press('Backspace');
  await page.keyboard.type(FINAL); // key by key, no delay between keys
  await page.waitForFunction((v) => document.querySelector('[id="f-frequency"]').value === v, FINAL);
  await page.waitForSelector(`${FIG}[data-design-hz="${FINAL}"]`);
  await page.waitForSelector(`${FIG}[data-sweep-ready="true"][data-swept-hz="${FINAL}"]`, { timeout: 30000 });
  await waitSaved(page, (d, f) => d.spec?.frequency === f, Number(FINAL));

  await frames(page, 2); // the final state recorded too
  const log = await page.evaluate(() => { window.__sweepLogStop = true; return window.__sweepLog; });
  const current = log.filter((e) => e.ready === 'true');
  for (const e of current) assert.equal(e.swept, e.design, `a sweep shown as current for another design: ${JSON.stringify(e)}`);
  assert.ok(log.some((e) => e.ready === 'false'), 'the figure was marked as being recomputed while typing');
  // While it is being recomputed the figure stays one picture of the design
  // swept: its legend ("this design: … W" included) is the last current one.
  let lastCurrent = null;
  for (const e of log) {
    if (e.ready === 'true') lastCurrent = e;
    else if (lastCurrent) assert.equal(e.legend, lastCurrent.legend, `the stale figure changed its legend: ${JSON.stringify(e)}`);
  }
  const designs = [...new Set(log.map((e) => e.design))];
  assert.ok(designs.includes('12345'), `the intermediate designs were shown: ${designs}`);
  assert.equal(await attr(page, 'data-design-hz'), FINAL);

  // The sweep shown is the CLI's for the saved design file.
  const design = await pageDesign(page);
  assert.equal(JSON.parse(design).spec.frequency, Number(FINAL));
  const from = Number(await attr(page, 'data-from-hz'));
  const to = Number(await attr(page, 'data-to-hz'));
  assert.ok(close(from, Number(FINAL) / 10) && close(to, Number(FINAL) * 10), `range ${from}–${to}`);
  const s = cli(['sweep', '-', String(from), String(to), String(POINTS), '--as-wound'], design);
  let exact = 0;
  for (const [name, curve] of [['data-sweep-totals', s.redesigned], ['data-wound-totals', s.as_wound]]) {
    const shownTotals = (await attr(page, name)).split(' ');
    assert.equal(shownTotals.length, POINTS, name);
    curve.points.forEach((p, i) => {
      const got = shownTotals[i];
      if (!p.values) return assert.equal(got, '-', `${name} point ${i} (${p.x} Hz): the CLI built no design`);
      assert.ok(close(Number(got), p.values.total), `${name} point ${i} (${p.x} Hz): page ${got} W, CLI ${p.values.total} W`);
      if (Number(got) === p.values.total) exact += 1;
    });
  }
  const min = await attr(page, 'data-min-hz');
  if (s.redesigned.minimum === null) assert.equal(min, null);
  else assert.ok(close(Number(min), s.redesigned.points[s.redesigned.minimum].x), 'redesigned minimum');
  t.diagnostic(`${log.length} figure states over the frames, ${current.length} current; runs dropped ${await attr(page, 'data-sweep-dropped')}; `
    + `${exact} of ${2 * POINTS} totals bit-equal to the CLI's; the final run ${await attr(page, 'data-sweep-ms')} ms of engine time`);
  const { ink } = await canvasInk(page, 'sweep-plot');
  assert.ok(ink > 0.02, `sweep plot looks blank (ink ${ink})`);
  await page.locator(FIG).screenshot({ path: join(OUT, 'sweep-live.png') });

  assert.deepEqual(requests, []);
  assert.deepEqual(errors, []);
  await context.close();
});
