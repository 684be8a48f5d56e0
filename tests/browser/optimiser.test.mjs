// The optimiser run from the page, checked against the
// native CLI's `magwright optimise` for the same design file (the one the page
// keeps in localStorage), with Cancel, "Use" and the Pareto plot.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { join } from 'node:path';
import { launch, openPage, cli, shown, typeInto, canvasInk, close, frames, OUT } from './harness.mjs';

let browser;
before(async () => { browser = await launch(); });
after(async () => { await browser?.close(); });

const si = (page, id) => shown(page, id);
const designText = (page) => page.evaluate(() => localStorage.getItem('magwright.design'));

// Every shown row of the ranked list: core, material, SI values, Pareto mark.
async function rows(page) {
  return page.$$eval('[data-testid="ranked-row"]', (trs) => trs.map((tr) => {
    const v = (id) => tr.querySelector(`[data-testid="${id}"]`);
    return {
      core: v('ranked-core').textContent,
      material: v('ranked-material').textContent,
      volume: Number(v('ranked-volume').dataset.si),
      total_loss: Number(v('ranked-loss').dataset.si),
      temperature: Number(v('ranked-temperature').dataset.si),
      primary_turns: Number(v('ranked-np').dataset.si),
      pareto: v('ranked-pareto').dataset.pareto === 'true',
    };
  }));
}

function sameCandidate(got, want, what) {
  assert.equal(got.core, want.core, `${what}: core`);
  assert.equal(got.material, want.material, `${what}: material`);
  assert.ok(close(got.total_loss, want.total_loss, 1e-9), `${what}: loss ${got.total_loss} vs CLI ${want.total_loss}`);
  assert.ok(close(got.volume, want.volume, 1e-12), `${what}: volume ${got.volume} vs CLI ${want.volume}`);
  assert.ok(close(got.temperature, want.temperature, 1e-9), `${what}: core temperature`);
  assert.equal(got.primary_turns, want.primary_turns, `${what}: Np`);
  assert.equal(got.pareto, want.pareto, `${what}: Pareto mark`);
}

test('run: progress advances, the ranking matches the CLI, the Pareto plot is drawn', async () => {
  const { context, page, requests, errors } = await openPage(browser);
  const text = await designText(page);
  assert.ok(text, 'the page keeps its design in localStorage');
  const want = cli(['optimise', '-'], text);
  assert.ok(want.passed > 15, 'the demo design passes on many library candidates');

  // Progress: every evaluated count the page shows is recorded in the page
  // (a MutationObserver sees each change), until the run is done.
  await page.evaluate(() => {
    window.__seen = [];
    const read = () => { const e = document.querySelector('[data-testid="suggest-evaluated"]'); if (e) window.__seen.push(Number(e.dataset.si)); };
    read();
    new MutationObserver(read).observe(document.body, { subtree: true, attributes: true, attributeFilter: ['data-si'], childList: true });
  });
  await page.click('[data-testid="suggest-run"]');
  await page.waitForFunction((n) => Number(document.querySelector('[data-testid="suggest-evaluated"]')?.dataset.si) >= n, want.evaluated, { timeout: 60000 });
  const seen = new Set(await page.evaluate(() => window.__seen));
  const mid = [...seen].filter((n) => n > 0 && n < want.evaluated);
  assert.ok(mid.length >= 2, `progress seen part-way at least twice (saw ${[...seen].join(', ')})`);
  await page.waitForFunction(() => /^Done/.test(document.querySelector('[data-testid="suggest-status"]').textContent));
  assert.equal(await si(page, 'suggest-total'), want.evaluated);
  assert.equal(await si(page, 'suggest-evaluated'), want.evaluated);
  assert.equal(await si(page, 'suggest-passed'), want.passed);
  assert.equal(await page.getAttribute('[data-testid="suggest-progress"]', 'value'), String(want.evaluated));
  assert.equal(await page.isVisible('[data-testid="suggest-partial"]'), false);

  // Failure reasons with their counts, as the engine grouped them.
  const failures = await page.$$eval('[data-testid="failure"]', (lis) => lis.map((li) => ({
    reason: li.querySelector('.reason').textContent, count: Number(li.dataset.count),
  })));
  assert.deepEqual(failures, want.failures);
  assert.equal(want.passed + failures.reduce((a, f) => a + f.count, 0), want.evaluated, 'every candidate passes or is counted as failed');

  // Lowest loss first (the default order): the CLI's list, row by row.
  let got = await rows(page);
  assert.equal(got.length, 15, 'a short list first');
  sameCandidate(got[0], want.by_loss[0], 'best by loss');
  got.forEach((r, i) => sameCandidate(r, want.by_loss[i], `by loss #${i + 1}`));

  // Smallest volume first.
  await page.check('[data-testid="order-volume"]');
  await page.waitForFunction((c) => document.querySelector('[data-testid="ranked-core"]').textContent === c, want.by_volume[0].core);
  got = await rows(page);
  got.forEach((r, i) => sameCandidate(r, want.by_volume[i], `by volume #${i + 1}`));

  // The whole list, and the Pareto marks on it.
  await page.click('[data-testid="show-all"]');
  got = await rows(page);
  assert.equal(got.length, want.passed);
  assert.deepEqual(got.filter((r) => r.pareto).map((r) => `${r.core} / ${r.material}`), want.pareto.map((r) => `${r.core} / ${r.material}`));
  await page.click('[data-testid="show-all"]');
  await page.check('[data-testid="order-loss"]');
  await page.waitForFunction((c) => document.querySelector('[data-testid="ranked-core"]').textContent === c, want.by_loss[0].core);

  const { ink, colours } = await canvasInk(page, 'pareto-plot');
  assert.ok(ink > 0.02 && colours > 3, `Pareto plot looks blank (ink ${ink}, ${colours} colours)`);
  // The front's colour (orange, plot::ORANGE = rgb(204,102,0)) is on the canvas.
  const orange = await page.$eval('canvas[data-testid="pareto-plot"]', (c) => {
    const d = c.getContext('2d').getImageData(0, 0, c.width, c.height).data;
    let n = 0;
    for (let i = 0; i < d.length; i += 4) if (Math.abs(d[i] - 204) < 12 && Math.abs(d[i + 1] - 102) < 12 && d[i + 2] < 20) n++;
    return n;
  });
  assert.ok(orange > 50, `the Pareto front is drawn (${orange} orange pixels)`);
  assert.doesNotMatch(await page.innerText('[data-testid="panel-suggest"]'), /NaN|Infinity|undefined/);
  await page.locator('[data-testid="panel-suggest"]').screenshot({ path: join(OUT, 'suggest-panel.png') });
  await page.locator('[data-testid="pareto-plot"]').screenshot({ path: join(OUT, 'suggest-pareto.png') });
  assert.deepEqual(requests, []);
  assert.deepEqual(errors, []);
  await context.close();
});

test('cancel mid-run keeps a partial ranking; the page stays usable while it runs', async () => {
  const { context, page, requests, errors } = await openPage(browser);
  const text = await designText(page);
  const want = cli(['optimise', '-'], text);
  const cores = cli(['cores']).map((c) => c.designation);
  const materials = cli(['materials']).map((m) => m.name);
  assert.equal(cores.length * materials.length, want.evaluated);
  // Slow the CPU so that a cancel lands part-way on any machine.
  const cdp = await context.newCDPSession(page);
  await cdp.send('Emulation.setCPUThrottlingRate', { rate: 4 });

  await page.click('[data-testid="suggest-run"]');
  await page.waitForFunction(() => Number(document.querySelector('[data-testid="suggest-evaluated"]').dataset.si) >= 24);
  // The page still takes typing while the optimiser runs.
  const before = await si(page, 'suggest-evaluated');
  await typeInto(page, 'ambient', '41');
  assert.equal(await page.inputValue('#f-ambient'), '41');
  assert.ok(await page.isEnabled('[data-testid="suggest-cancel"]'), 'still running after typing');
  assert.ok((await si(page, 'suggest-evaluated')) > before, 'the optimiser went on while typing');
  await page.click('[data-testid="suggest-cancel"]');
  await page.waitForSelector('[data-testid="suggest-partial"]');
  const stopped = await si(page, 'suggest-evaluated');
  // Many frames later (the search yields to the page between candidates),
  // the count has not moved.
  await frames(page, 30);
  assert.equal(await si(page, 'suggest-evaluated'), stopped, 'nothing more is evaluated after Cancel');
  assert.ok(stopped > 0 && stopped < want.evaluated, `stopped part-way (${stopped} of ${want.evaluated})`);
  assert.match(await page.textContent('[data-testid="suggest-partial"]'), new RegExp(`Partial: stopped after ${stopped} of ${want.evaluated}`));
  assert.match(await page.textContent('[data-testid="suggest-status"]'), /^Stopped/);
  assert.ok(await page.isDisabled('[data-testid="suggest-cancel"]'));
  // The specification changed (ambient) after Run: the list says so.
  assert.equal(await page.isVisible('[data-testid="suggest-stale"]'), true);

  // The partial ranking is the CLI's ranking restricted to the first
  // `stopped` candidates in the search order (cores outer, materials inner).
  const first = new Set();
  for (let i = 0; i < stopped; i++) first.add(`${cores[Math.floor(i / materials.length)]} / ${materials[i % materials.length]}`);
  const inFirst = (r) => first.has(`${r.core} / ${r.material}`);
  const wantPassed = want.by_loss.filter(inFirst);
  assert.equal(await si(page, 'suggest-passed'), wantPassed.length);
  if (wantPassed.length > 0) {
    const got = await rows(page);
    assert.equal(got[0].core, wantPassed[0].core);
    assert.equal(got[0].material, wantPassed[0].material);
    assert.ok(close(got[0].total_loss, wantPassed[0].total_loss, 1e-9));
  }
  await page.locator('[data-testid="panel-suggest"]').screenshot({ path: join(OUT, 'suggest-cancelled.png') });

  // Undo the edit: the list is for the form's specification again.
  await typeInto(page, 'ambient', String(JSON.parse(text).spec.ambient));
  await page.waitForSelector('[data-testid="suggest-stale"]', { state: 'hidden' });
  await cdp.send('Emulation.setCPUThrottlingRate', { rate: 1 });
  assert.deepEqual(requests, []);
  assert.deepEqual(errors, []);
  await context.close();
});

test('"Use" loads the candidate into the form and the results show its design', async () => {
  const { context, page, requests, errors } = await openPage(browser);
  const text = await designText(page);
  const want = cli(['optimise', '-'], text);
  const start = JSON.parse(text);
  await page.click('[data-testid="suggest-run"]');
  await page.waitForFunction(() => /^Done/.test(document.querySelector('[data-testid="suggest-status"]').textContent));

  // The best by loss that is not the design already on the form.
  const onForm = (r) => start.core.designation === r.core && start.material.name === r.material;
  const i = want.by_loss.slice(0, 15).findIndex((r) => !onForm(r));
  assert.ok(i >= 0);
  const pick = want.by_loss[i];
  await page.locator('[data-testid="use"]').nth(i).click();
  await page.waitForFunction(([c, m]) => document.querySelector('#f-core').value === c && document.querySelector('#f-material').value === m, [pick.core, pick.material]);
  await page.waitForFunction((v) => Math.abs(Number(document.querySelector('[data-testid="total-loss"]').dataset.si) - v) <= 1e-9 * v, pick.total_loss);
  assert.equal(await si(page, 'np'), pick.primary_turns);
  assert.ok(close(await si(page, 'temperature'), pick.temperature, 1e-9));
  assert.equal(await page.textContent('[data-testid="sheet-core"]'), pick.core, 'the build sheet names the core');
  assert.match(await page.textContent('[data-testid="verdict"]'), /^Passes every check/);
  assert.match(await page.textContent('[data-testid="suggest-message"]'), new RegExp(`Loaded ${pick.core} in ${pick.material}`));
  // The row in use is marked; the list is still for this specification.
  assert.equal(await page.locator('[data-testid="ranked-row"]').nth(i).getAttribute('class'), 'current');
  assert.equal(await page.isVisible('[data-testid="suggest-stale"]'), false);
  // The design the page keeps is the CLI's design for that candidate.
  await page.waitForFunction((c) => JSON.parse(localStorage.getItem('magwright.design')).core.designation === c, pick.core);
  const kept = await designText(page);
  const ev = cli(['evaluate', '-'], kept);
  assert.ok(close(ev.losses.total, pick.total_loss, 1e-9), `CLI evaluate of the loaded design: ${ev.losses.total} vs ${pick.total_loss}`);
  await frames(page, 2);
  await page.screenshot({ path: join(OUT, 'suggest-used.png'), fullPage: true });
  assert.deepEqual(requests, []);
  assert.deepEqual(errors, []);
  await context.close();
});
