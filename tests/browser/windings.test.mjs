// The stack-up editor: interleaving and a fixed conductor changed with the
// keyboard give the CLI's copper losses for the same design; a conductor
// that cannot fit is refused at the editor; the exported stack-up is the
// CLI's byte for byte; the offline flyback shows its safety cautions.
// No network.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync } from 'node:fs';
import { execFileSync } from 'node:child_process';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { launch, openPage, cli, close, canvasInk, CLI, OUT, chooseWithKeyboard } from './harness.mjs';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..', '..');
let browser;
before(async () => { browser = await launch(); });
after(async () => { await browser?.close(); });

// The design on screen, as the page saved it (after the last good edit).
async function savedDesign(page) {
  const text = await page.evaluate(() => localStorage.getItem('magwright.design'));
  assert.ok(text, 'the page saved its design');
  return text;
}

// Every winding row of the table: { name: { fr, loss, rdc, turns } } from data-si.
async function table(page) {
  return page.$$eval('[data-testid="windings-table"] tbody tr', (rows) => Object.fromEntries(rows.map((r) => {
    const name = r.querySelector('th').textContent.trim();
    const si = (k) => Number(r.querySelector(`[data-testid^="${k}-"]`).dataset.si);
    return [name, { fr: si('fr'), loss: si('loss'), rdc: si('rdc'), turns: si('turns') }];
  })));
}

// The table agrees with `magwright evaluate` on the page's own design.
async function matchesCli(page, what) {
  const design = await savedDesign(page);
  const want = cli(['evaluate', '-'], design);
  const got = await table(page);
  assert.deepEqual(Object.keys(got).sort(), want.operating.copper.windings.map((w) => w.name).sort(), `${what}: windings`);
  for (const w of want.operating.copper.windings) {
    // Same engine, same f64 arithmetic; the wasm and native libm may differ
    // in the last bit of pow/exp, amplified a little by the thermal loop.
    assert.ok(close(got[w.name].fr, w.fr, 1e-6), `${what}: Fr of ${w.name}: page ${got[w.name].fr}, CLI ${w.fr}`);
    assert.ok(close(got[w.name].loss, w.total_loss, 1e-6), `${what}: loss of ${w.name}: page ${got[w.name].loss}, CLI ${w.total_loss}`);
    assert.ok(close(got[w.name].rdc, w.rdc, 1e-6), `${what}: Rdc of ${w.name}`);
  }
  return { design: JSON.parse(design), want };
}

// Waits until the table's figure `id` differs from `old`.
async function changed(page, id, old) {
  await page.waitForFunction(([i, v]) => {
    const e = document.querySelector(`[data-testid="${i}"]`);
    return e && e.dataset.si !== String(v);
  }, [id, old], { timeout: 10000 });
}

// Replaces an entry's text with the keyboard.
async function typeAt(page, id, text) {
  await page.focus(`[id="${id}"]`);
  await page.keyboard.press('Control+A');
  await page.keyboard.press('Backspace');
  if (text.length) await page.keyboard.type(text, { delay: 20 });
}

test('interleaving and a fixed conductor, by keyboard, give the CLI\'s losses; the export is the CLI\'s stack-up', async () => {
  const { context, page, requests, errors } = await openPage(browser);
  await page.waitForSelector('[data-testid="windings-table"]');
  const start = await matchesCli(page, 'demo');
  assert.equal(start.design.choices.interleave, 'auto');
  // The demo interleaves by loss: its primary split around the secondary (P-S-P), the reset outside.
  assert.equal(start.want.winding_choice.interleave, 'split_primary');
  assert.equal(start.want.stackup.items.filter((i) => i.Section?.winding === 'primary').length, 2);
  // The line says what was weighed and at which turns: at the flux limit's
  // turns, then the close ones again at the design's (the engine's
  // winding_choice.tried).
  const why = await page.textContent('[data-testid="interleave-choice"]');
  const np = start.want.turns.primary;
  for (const t of start.want.winding_choice.tried) {
    const at = t.primary_turns === np ? '' : ` at Np = ${t.primary_turns}`;
    assert.ok(why.includes(`${t.interleave.replace(/_/g, ' ')} `) && (at === '' || why.includes(at)), `${JSON.stringify(t)} in "${why}"`);
  }
  assert.ok(start.want.winding_choice.tried.some((t) => t.primary_turns !== np), 'the demo weighed its interleavings at the flux limit first');
  assert.ok(why.includes(`again at Np = ${np}`), why);

  // Interleaving: Auto → Sequential with the arrow key on the drop-down.
  const fr0 = Number(await page.getAttribute('[data-testid="fr-primary"]', 'data-si'));
  await page.focus('#f-interleave');
  await page.keyboard.press('ArrowDown');
  await changed(page, 'fr-primary', fr0);
  const seq = await matchesCli(page, 'sequential');
  assert.equal(seq.design.choices.interleave, 'sequential');
  assert.equal(seq.want.stackup.items.filter((i) => i.Section?.winding === 'primary').length, 1, 'one primary section');
  // The conductors are searched again for the order asked: without the
  // split the copper loses more and the leakage is larger (the automatic
  // interleaving was chosen by loss).
  assert.ok(seq.want.operating.copper.total > start.want.operating.copper.total, 'no interleave: more copper loss');
  assert.ok(seq.want.leakage > start.want.leakage, 'no interleave: more leakage');
  const order = await page.$$eval('[data-testid="stackup-order"] li', (li) => li.map((l) => l.textContent));
  assert.equal(order.length, seq.want.stackup.items.length);
  assert.match(order[0], new RegExp(`^primary — ${seq.want.turns.primary} turns of `));

  // Fix the secondary to 2 × AWG 20 round wire, all by keyboard.
  const loss0 = Number(await page.getAttribute('[data-testid="loss-secondary-1"]', 'data-si'));
  await page.focus('#f-wire-secondary-1');
  await page.keyboard.press('ArrowDown'); // automatic → round enamelled
  await page.waitForSelector('[id="f-wire-secondary-1-a"]', { state: 'visible' });
  await typeAt(page, 'f-wire-secondary-1-a', '20');
  await page.keyboard.press('Tab');
  await page.keyboard.press('Control+A');
  await page.keyboard.type('2', { delay: 20 });
  await page.waitForFunction(() => document.querySelector('[data-testid="parallel-secondary-1"]')?.dataset.si === '2');
  await changed(page, 'loss-secondary-1', loss0);
  const fixed = await matchesCli(page, 'fixed secondary');
  assert.deepEqual(fixed.design.choices.wires, [{ winding: 'secondary 1', wire: { kind: 'round', awg: 20, parallel: 2 } }]);
  assert.match(await page.textContent('[data-testid="wire-of-secondary-1"]'), /^round 0\.812 mm \(fixed\)$/);
  await page.locator('[data-testid="panel-windings"]').screenshot({ path: join(OUT, 'windings-edited.png') });
  const { ink, colours } = await canvasInk(page, 'window-plot');
  assert.ok(ink > 0.05 && colours > 5, `the window is drawn (ink ${ink}, ${colours} colours)`);
  await page.locator('[data-testid="window-plot"]').screenshot({ path: join(OUT, 'windings-window.png') });

  // The exported stack-up is `magwright stackup` for the same design, byte
  // for byte (the CLI's println adds the one final newline).
  const design = await savedDesign(page);
  await page.focus('[data-testid="export-stackup"]');
  const [dl] = await Promise.all([page.waitForEvent('download'), page.keyboard.press('Enter')]);
  assert.equal(dl.suggestedFilename(), 'magwright-stackup.json');
  const got = readFileSync(await dl.path(), 'utf8');
  const want = execFileSync(CLI, ['stackup', '-'], { input: design, encoding: 'utf8' });
  assert.equal(got + '\n', want);
  assert.match(got, /"magwright\.stackup\/2"/);

  // The per-layer losses open on demand.
  await page.click('[data-testid="layer-losses"] summary');
  const layers = await page.$$eval('[data-testid="layer-losses"] tbody tr', (r) => r.length);
  const wantLayers = fixed.want.operating.copper.windings.reduce((n, w) => n + w.layers.length, 0);
  assert.equal(layers, wantLayers);
  assert.deepEqual(requests, []);
  assert.deepEqual(errors, []);
  await context.close();
});

test('a conductor that cannot fit is refused at the editor, and automatic undoes it', async () => {
  const { context, page, requests, errors } = await openPage(browser);
  await page.waitForSelector('[data-testid="windings-table"]');
  await page.focus('#f-wire-secondary-1');
  await page.keyboard.press('ArrowDown');
  await page.keyboard.press('ArrowDown'); // litz
  await page.waitForSelector('[id="f-wire-secondary-1-a"]', { state: 'visible' });
  await typeAt(page, 'f-wire-secondary-1-a', '2000');
  await page.waitForSelector('[data-testid="windings-error"]');
  const msg = await page.textContent('[data-testid="windings-error"]');
  // The engine's own message for the same design.
  const d = cli(['demo', 'forward']);
  d.choices.wires = [{ winding: 'secondary 1', wire: { kind: 'litz', strands: 2000, strand_awg: 38 } }];
  let cliMsg = '';
  try { execFileSync(CLI, ['evaluate', '-'], { input: JSON.stringify(d), encoding: 'utf8', stdio: ['pipe', 'pipe', 'pipe'] }); } catch (e) { cliMsg = String(e.stderr); }
  assert.match(cliMsg, /do not fit/);
  assert.match(msg, /the windings do not fit this core's window/);
  const core = cliMsg.replace(/^magwright: /, '').replace(/\s+$/, '').replace(/^\[[^\]]*\]\s*/, '');
  assert.ok(msg.includes(core.split(': ').slice(-1)[0]), `page "${msg}" carries the engine's "${core}"`);
  // The editor stays, the table is gone (no stale numbers).
  assert.equal(await page.isVisible('#f-wire-secondary-1'), true);
  assert.equal(await page.isVisible('[data-testid="windings-table"]'), false);
  await page.locator('[data-testid="panel-windings"]').screenshot({ path: join(OUT, 'windings-refused.png') });
  // Back to automatic: the design returns.
  await page.focus('#f-wire-secondary-1');
  await page.keyboard.press('Home');
  await page.waitForSelector('[data-testid="windings-table"]');
  assert.equal(await page.isVisible('[data-testid="windings-error"]'), false);
  await matchesCli(page, 'automatic again');
  assert.deepEqual(requests, []);
  assert.deepEqual(errors, []);
  await context.close();
});

test('the offline flyback shows its safety cautions first and its stack-up', async () => {
  const { context, page, requests, errors } = await openPage(browser);
  const text = readFileSync(join(root, 'examples', 'flyback-offline-24w.json'), 'utf8');
  await chooseWithKeyboard(page, 'open', { name: 'flyback-offline-24w.json', mimeType: 'application/json', buffer: Buffer.from(text) });
  await page.waitForFunction(() => document.querySelector('[data-testid="file-status"]')?.textContent.includes('Opened'));
  const want = cli(['evaluate', join(root, 'examples', 'flyback-offline-24w.json')]);
  await page.waitForFunction((np) => document.querySelector('[data-testid="np"]')?.dataset.si === String(np), want.turns.primary);
  assert.ok(want.cautions.length >= 2);
  assert.equal(await page.isVisible('[data-testid="cautions"]'), true);
  const shownCautions = await page.$$eval('[data-testid="cautions"] li', (li) => li.map((l) => l.textContent));
  assert.deepEqual(shownCautions, want.cautions);
  assert.match(shownCautions.join(' '), /IEC 62368-1/);
  // The cautions come before the checks in the results.
  const before = await page.evaluate(() => {
    const c = document.querySelector('[data-testid="cautions"]');
    const t = document.querySelector('[data-testid="checks"]');
    return !!(c.compareDocumentPosition(t) & Node.DOCUMENT_POSITION_FOLLOWING);
  });
  assert.ok(before, 'cautions above the checks');
  await matchesCli(page, 'offline flyback');
  // Reinforced insulation, built by loss: triple-insulated secondaries, no margins.
  assert.match(await page.textContent('[data-testid="wire-of-secondary-1"]'), /triple-insulated/);
  assert.match(await page.textContent('[data-testid="stackup-order"]'), /margins none/);
  assert.match(await page.textContent('[data-testid="construction-built"]'), /triple-insulated secondaries, no margins/);
  await page.locator('[data-testid="panel-results"]').screenshot({ path: join(OUT, 'results-offline-flyback.png') });
  await page.locator('[data-testid="panel-windings"]').screenshot({ path: join(OUT, 'windings-offline-flyback.png') });
  // The other construction, by keyboard: margins at both flanges and any conductor, as the CLI builds it.
  await page.focus('#f-construction');
  await page.keyboard.press('End');
  await page.waitForFunction(() => /margins at both flanges/.test(document.querySelector('[data-testid="construction-built"]')?.textContent ?? ''));
  const margined = await matchesCli(page, 'offline flyback, margin-wound');
  assert.equal(margined.design.choices.insulation.construction, 'margin_wound');
  assert.equal(margined.want.winding_choice.construction, 'margin_wound');
  assert.match(await page.textContent('[data-testid="stackup-order"]'), /margins 3\.0 mm each flange/);
  assert.doesNotMatch(await page.textContent('[data-testid="wire-of-secondary-1"]'), /triple-insulated/);
  assert.deepEqual(requests, []);
  assert.deepEqual(errors, []);
  await context.close();
});

test('results at a glance: verdict, failing checks first and red, tight marked', async () => {
  const { context, page, requests, errors } = await openPage(browser);
  const want = cli(['evaluate', '-'], execFileSync(CLI, ['demo', 'forward'], { encoding: 'utf8' }));
  assert.match(await page.textContent('[data-testid="verdict"]'), /^Passes every check — tightest: Duty/);
  for (const c of want.checks) {
    const row = `[data-testid="check-${c.key}"]`;
    assert.equal(await page.getAttribute(row, 'data-tight'), String(c.tight), `${c.key} tight`);
    assert.ok(close(Number(await page.getAttribute(`[data-testid="margin-${c.key}"]`, 'data-si')), c.margin, 1e-6));
  }
  assert.ok(close(Number(await page.getAttribute('[data-testid="leakage"]', 'data-si')), want.leakage, 1e-6));
  assert.equal(Number(await page.getAttribute('[data-testid="nreset"]', 'data-si')), want.turns.reset);
  // A core temperature limit below the operating temperature fails; it goes first, in red.
  await page.focus('#f-temperature_max');
  await page.keyboard.press('Control+A');
  await page.keyboard.type('55', { delay: 20 });
  await page.waitForFunction(() => document.querySelector('[data-testid="verdict"]')?.dataset.pass === 'false');
  const first = await page.$eval('[data-testid="checks"] tbody tr', (r) => ({ id: r.dataset.testid, colour: getComputedStyle(r.querySelector('th')).color }));
  assert.equal(first.id, 'check-temperature');
  const [r, g, b] = first.colour.match(/\d+/g).map(Number);
  assert.ok(r > 130 && g < 60 && b < 60, `failing row is red (${first.colour})`);
  assert.match(await page.textContent('[data-testid="verdict"]'), /^Fails 1 check — Core temperature \(-[\d.]+ K\)/);
  await page.locator('[data-testid="panel-results"]').screenshot({ path: join(OUT, 'results-failing.png') });
  assert.deepEqual(requests, []);
  assert.deepEqual(errors, []);
  await context.close();
});

test('a custom order by keyboard: seeded from the stack-up as wound, the secondary moved first, the CLI\'s losses', async () => {
  const { context, page, requests, errors } = await openPage(browser);
  await page.waitForSelector('[data-testid="windings-table"]');
  const start = await matchesCli(page, 'demo');
  const wound = (want) => want.stackup.items.filter((i) => i.Section).map((i) => i.Section.winding);
  const order = (d) => d.choices.section_order.map((s) => ({ winding: s.winding, turns: s.turns ?? null }));
  const asWound = wound(start.want);
  assert.deepEqual(asWound, ['primary', 'secondary 1', 'primary', 'reset'], 'the demo winds P-S-P-R');
  assert.equal(await page.isVisible('[data-testid="order-editor"]'), false, 'no order editor until Custom');

  // Custom: the list starts as the stack-up was wound, so nothing changes.
  await page.focus('#f-interleave');
  await page.keyboard.press('End');
  await page.waitForSelector('[data-testid="order-editor"]', { state: 'visible' });
  await page.waitForFunction(() => document.querySelectorAll('[data-testid="order-edit"] li').length === 4);
  const seeded = await matchesCli(page, 'custom, as wound');
  assert.equal(seeded.design.choices.interleave, 'custom');
  assert.deepEqual(order(seeded.design), asWound.map((w) => ({ winding: w, turns: null })));
  for (const w of start.want.operating.copper.windings) {
    const now = seeded.want.operating.copper.windings.find((x) => x.name === w.name);
    assert.ok(close(now.total_loss, w.total_loss, 1e-12), `seeding changes nothing: ${w.name}`);
  }
  assert.equal(await page.getAttribute('#order-up-1', 'aria-label'), 'Move secondary 1 section 1 up');
  assert.equal(await page.getAttribute('#order-split-2', 'aria-label'), 'Split primary section 2 in two');

  // The secondary first (S-P-P-R) with the keyboard; the focus stays on it.
  const fr0 = Number(await page.getAttribute('[data-testid="fr-primary"]', 'data-si'));
  await page.focus('#order-up-1');
  await page.keyboard.press('Enter');
  await changed(page, 'fr-primary', fr0);
  const moved = await matchesCli(page, 'secondary first');
  assert.equal(moved.design.choices.interleave, 'custom');
  const want = ['secondary 1', 'primary', 'primary', 'reset'];
  assert.deepEqual(order(moved.design), want.map((w) => ({ winding: w, turns: null })));
  assert.deepEqual(wound(moved.want), want, 'the engine winds the order given');
  const shown = await page.$$eval('[data-testid="stackup-order"] li.section .what', (e) => e.map((x) => x.textContent));
  assert.deepEqual(shown, want);
  assert.equal(await page.evaluate(() => document.activeElement?.id), 'order-down-0');
  await page.locator('[data-testid="panel-windings"]').screenshot({ path: join(OUT, 'windings-custom-order.png') });

  // Without a reset section the engine refuses, at the editor; adding one back heals it.
  await page.focus('#order-remove-3');
  await page.keyboard.press('Enter');
  await page.waitForSelector('[data-testid="order-error"]');
  assert.match(await page.textContent('[data-testid="order-error"]'), /the winding "reset" has no section in the order/);
  await page.focus('#f-order-add');
  await page.selectOption('#f-order-add', { label: 'reset' });
  await page.focus('[data-testid="order-add"]');
  await page.keyboard.press('Enter');
  await page.waitForSelector('[data-testid="windings-table"]');
  assert.equal(await page.isVisible('[data-testid="order-error"]'), false);
  const healed = await matchesCli(page, 'reset added outside');
  assert.deepEqual(wound(healed.want), ['secondary 1', 'primary', 'primary', 'reset']);
  assert.deepEqual(requests, []);
  assert.deepEqual(errors, []);
  await context.close();
});
