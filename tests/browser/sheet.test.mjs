// The printed build sheet of the full design: print media shows the sheet
// alone, its turns and stack-up are the CLI's for the same design, and it
// prints to one A4 page; plus the pictures and the layout at two widths.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync, writeFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { launch, openPage, cli, shown, canvasInk, close, drawn, OUT, chooseWithKeyboard } from './harness.mjs';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..', '..');
let browser;
before(async () => { browser = await launch(); });
after(async () => { await browser?.close(); });

// The page's own design and the CLI's report of it.
async function engineView(page) {
  const design = await page.evaluate(() => localStorage.getItem('magwright.design'));
  assert.ok(design, 'the page saved its design');
  return { design: JSON.parse(design), want: cli(['evaluate', '-'], design) };
}

// Checks the sheet against the CLI's report; returns its text.
async function checkSheet(page, want, name) {
  const screen = page.viewportSize();
  await page.setViewportSize({ width: 794, height: 1123 }); // A4 at 96 px per inch
  await page.emulateMedia({ media: 'print' });
  assert.equal(await page.isVisible('[data-testid="build-sheet"]'), true);
  for (const hidden of ['main', 'header.top', '[data-testid="panel-suggest"]', '[data-testid="save"]']) {
    assert.equal(await page.isVisible(hidden), false, `${hidden} is not printed`);
  }
  const sheet = await page.innerText('[data-testid="build-sheet"]');
  for (const h of ['Specification', 'Core and material', 'Windings, bobbin outward', 'Expected losses', 'Cautions', 'Checked by']) {
    assert.match(sheet, new RegExp(h), `sheet has "${h}"`);
  }
  assert.equal(Number(await page.getAttribute('[data-testid="sheet-np"]', 'data-si')), want.turns.primary);
  assert.equal(Number(await page.getAttribute('[data-testid="sheet-ns"]', 'data-si')), want.turns.secondaries[0]);
  if (want.turns.reset != null) {
    assert.equal(Number(await page.getAttribute('[data-testid="sheet-nreset"]', 'data-si')), want.turns.reset);
  }
  assert.equal(await page.textContent('[data-testid="sheet-core"]'), want.core.designation);
  assert.equal(await page.textContent('[data-testid="sheet-material"]'), want.material.name);
  // Every item of the engine's stack-up, in order, with its turns.
  const rows = await page.$$eval('[data-testid="sheet-stack"] tbody tr', (r) => r.map((x) => x.textContent));
  assert.equal(rows.length, want.stackup.items.length);
  for (const [i, item] of want.stackup.items.entries()) {
    if (item.Section) {
      assert.equal(Number(await page.textContent(`[data-testid="sheet-turns-${i}"]`)), item.Section.turns, `item ${i + 1} turns`);
      assert.ok(rows[i].includes(item.Section.winding), `item ${i + 1} is ${item.Section.winding}`);
    } else {
      assert.match(rows[i], /^\d+Tape: /, `item ${i + 1} is a tape`);
    }
  }
  // Same engine; wasm and native libm may differ in the last bit.
  assert.ok(close(Number(await page.getAttribute('[data-testid="sheet-total"]', 'data-si')), want.losses.total, 1e-9), 'total loss');
  assert.ok(close(Number(await page.getAttribute('[data-testid="sheet-inductance"]', 'data-si')), want.inductance, 1e-9), 'inductance');
  for (const c of want.cautions) assert.ok(sheet.includes(c), `caution on the sheet: ${c.slice(0, 40)}…`);
  assert.doesNotMatch(sheet, /NaN|Infinity|undefined/);
  await page.screenshot({ path: join(OUT, `build-sheet-${name}.png`), fullPage: true });
  const pdf = await page.pdf({ format: 'A4' });
  writeFileSync(join(OUT, `build-sheet-${name}.pdf`), pdf);
  assert.equal(pdf.subarray(0, 5).toString(), '%PDF-');
  assert.match(pdf.toString('latin1'), /\/Count 1\b/, 'the build sheet fits one A4 page');
  await page.emulateMedia({ media: 'screen' });
  await page.setViewportSize(screen);
  assert.equal(await page.isVisible('[data-testid="build-sheet"]'), false, 'not on screen');
  return sheet;
}

test('print build sheet of the forward demo: the sheet only, the engine\'s turns and stack-up', async () => {
  const { context, page, requests, errors } = await openPage(browser);
  // The button calls window.print(); record the call instead of opening a dialog.
  await page.evaluate(() => { window.__printed = 0; window.print = () => { window.__printed++; }; });
  await page.focus('[data-testid="print"]');
  await page.keyboard.press('Enter');
  assert.equal(await page.evaluate(() => window.__printed), 1);
  const { want } = await engineView(page);
  const sheet = await checkSheet(page, want, 'forward');
  assert.match(sheet, /single-switch forward/);
  assert.match(sheet, /none: mated halves/);
  assert.deepEqual(requests, []);
  assert.deepEqual(errors, []);
  await context.close();
});

test('build sheet of the offline flyback: gap, insulation and the safety cautions', async () => {
  const { context, page, requests, errors } = await openPage(browser);
  const text = readFileSync(join(root, 'examples', 'flyback-offline-24w.json'), 'utf8');
  await chooseWithKeyboard(page, 'open', { name: 'flyback-offline-24w.json', mimeType: 'application/json', buffer: Buffer.from(text) });
  await page.waitForFunction(() => document.querySelector('[data-testid="file-status"]')?.textContent.includes('Opened'));
  const want = cli(['evaluate', join(root, 'examples', 'flyback-offline-24w.json')]);
  await page.waitForFunction((np) => document.querySelector('[data-testid="np"]')?.dataset.si === String(np), want.turns.primary);
  const sheet = await checkSheet(page, want, 'flyback');
  assert.match(await page.textContent('[data-testid="sheet-gap"]'), new RegExp(`${(want.gap.gap * 1e3).toFixed(3)} mm ground in the centre leg`));
  // Reinforced insulation as the engine built it: triple-insulated secondary, no margin tapes.
  assert.equal(want.winding_choice.construction, 'triple_insulated');
  assert.match(sheet, /secondary 1\t\d+\t(\d+ × )?triple-insulated [\d.]+ mm/);
  assert.doesNotMatch(sheet, /mm each flange/);
  assert.match(sheet, /IEC 62368-1/);
  assert.match(await page.textContent('[data-testid="sheet-name"]'), /Offline 24 W flyback/);
  assert.deepEqual(requests, []);
  assert.deepEqual(errors, []);
  await context.close();
});

test('every picture is drawn', async () => {
  const { context, page, requests, errors } = await openPage(browser);
  await page.waitForSelector('[data-testid="sweep-figure"][data-sweep-ready="true"]', { timeout: 20000 });
  await drawn(page, ['flux-plot', 'sweep-plot', 'window-plot']);
  for (const id of ['flux-plot', 'sweep-plot', 'window-plot']) {
    const { ink, colours } = await canvasInk(page, id);
    assert.ok(ink > 0.02 && colours > 3, `${id} looks blank (ink ${ink}, ${colours} colours)`);
    await page.locator(`[data-testid="${id}"]`).screenshot({ path: join(OUT, `plot-${id}.png`) });
  }
  assert.deepEqual(requests, []);
  assert.deepEqual(errors, []);
  await context.close();
});

for (const [name, viewport] of [['laptop', { width: 1280, height: 800 }], ['tablet', { width: 768, height: 1024 }]]) {
  test(`layout at ${name} width (${viewport.width}px): no sideways scroll, every field labelled`, async () => {
    const { context, page, requests, errors } = await openPage(browser, { viewport });
    // Laid out in full: the sweep drawn (the last part to appear).
    await page.waitForSelector('[data-testid="sweep-figure"][data-sweep-ready="true"]', { timeout: 20000 });
    await drawn(page, ['sweep-plot']);
    const { sw, w } = await page.evaluate(() => ({ sw: document.documentElement.scrollWidth, w: window.innerWidth }));
    assert.ok(sw <= w, `page is ${sw}px wide in a ${w}px window`);
    await page.screenshot({ path: join(OUT, `layout-${name}.png`) });
    await page.screenshot({ path: join(OUT, `layout-${name}-full.png`), fullPage: true });
    const unlabelled = await page.$$eval('main input[id^="f-"], main select', (els) =>
      els.filter((e) => !document.querySelector(`label[for="${CSS.escape(e.id)}"]`)).map((e) => e.id));
    assert.deepEqual(unlabelled, []);
    assert.ok((await shown(page, 'np')) > 0);
    assert.deepEqual(requests, []);
    assert.deepEqual(errors, []);
    await context.close();
  });
}
