// The printed build sheet, the pictures and the layout at laptop and tablet width.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { launch, openPage, cli, shown, typeInto, canvasInk, close, OUT } from './harness.mjs';

let browser;
before(async () => { browser = await launch(); });
after(async () => { await browser?.close(); });

test('print build sheet: the sheet only, with the engine numbers', async () => {
  const { context, page, requests, errors } = await openPage(browser);
  const demo = cli(['demo']);
  const want = cli(['forward', '-'], JSON.stringify(demo));
  // The button calls window.print(); record the call instead of opening a dialog.
  await page.evaluate(() => { window.__printed = 0; window.print = () => { window.__printed++; }; });
  await page.focus('[data-testid="print"]');
  await page.keyboard.press('Enter');
  assert.equal(await page.evaluate(() => window.__printed), 1);

  await page.emulateMedia({ media: 'print' });
  assert.equal(await page.isVisible('[data-testid="build-sheet"]'), true);
  assert.equal(await page.isVisible('#f-vin_min'), false, 'inputs are not printed');
  assert.equal(await page.isVisible('[data-testid="save"]'), false);
  const sheet = await page.innerText('[data-testid="build-sheet"]');
  for (const h of ['Specification', 'Core and material', 'Windings', 'Expected losses', 'Cautions']) assert.match(sheet, new RegExp(h));
  assert.equal(Number(await page.textContent('[data-testid="sheet-np"]')), want.primary_turns);
  assert.equal(Number(await page.textContent('[data-testid="sheet-ns"]')), want.secondary_turns);
  assert.equal(await page.textContent('[data-testid="sheet-core"]'), demo.core);
  assert.match(sheet, /AWG 22/);
  assert.doesNotMatch(sheet, /NaN|Infinity|undefined/);
  await page.screenshot({ path: join(OUT, 'build-sheet-print.png'), fullPage: true });
  const pdf = await page.pdf({ format: 'A4' });
  writeFileSync(join(OUT, 'build-sheet.pdf'), pdf);
  assert.equal(pdf.subarray(0, 5).toString(), '%PDF-');
  assert.match(pdf.toString('latin1'), /\/Count 1\b/, 'the build sheet fits one A4 page');
  await page.emulateMedia({ media: 'screen' });
  assert.equal(await page.isVisible('[data-testid="build-sheet"]'), false, 'not on screen');
  assert.deepEqual(requests, []);
  assert.deepEqual(errors, []);
  await context.close();
});

test('every picture is drawn', async () => {
  const { context, page, requests, errors } = await openPage(browser);
  await page.waitForTimeout(300);
  for (const id of ['flux-plot', 'sweep-plot', 'window-plot']) {
    const { ink, colours } = await canvasInk(page, id);
    assert.ok(ink > 0.02 && colours > 3, `${id} looks blank (ink ${ink}, ${colours} colours)`);
  }
  // After an edit the pictures follow; while invalid they are hidden, not stale.
  await typeInto(page, 'duty_max', '0.7');
  await page.waitForSelector('[data-testid="missing"]');
  assert.equal(await page.isVisible('[data-testid="flux-plot"]'), false);
  await typeInto(page, 'duty_max', '0.4');
  await page.waitForSelector('[data-testid="np"]');
  assert.equal(await page.isVisible('[data-testid="sweep-plot"]'), true);
  for (const id of ['flux-plot', 'sweep-plot', 'window-plot']) {
    await page.locator(`[data-testid="${id}"]`).screenshot({ path: join(OUT, `plot-${id}.png`) });
  }
  // The sweep downloads as CSV: the engine's numbers, one row per point.
  const [dl] = await Promise.all([page.waitForEvent('download'), page.click('[data-testid="sweep-csv"]')]);
  assert.equal(dl.suggestedFilename(), 'magwright-sweep.csv');
  const rows = readFileSync(await dl.path(), 'utf8').trim().split('\n');
  assert.equal(rows[0], 'frequency_hz,design,total_loss_w,core_loss_w,copper_loss_w,secondary_turns,b_peak_t');
  assert.equal(rows.length, 201);
  const mid = rows[100].split(',');
  const at = cli(['forward', '-'], JSON.stringify({ ...cli(['demo']), duty_max: 0.4, frequency: Number(mid[0]) }));
  assert.ok(close(Number(mid[2]), at.total_loss) && Number(mid[5]) === at.secondary_turns, `CSV row ${rows[100]} vs engine`);

  // A low flux limit at a low frequency: no design below a few kHz, shaded.
  await typeInto(page, 'b_max', '20m');
  await typeInto(page, 'frequency', '20k');
  await page.waitForFunction(() => document.querySelector('#f-frequency').value === '20k');
  await page.waitForSelector('[data-testid="np"]');
  const shaded = await page.$eval('canvas[data-testid="sweep-plot"]', (c) => {
    const d = c.getContext('2d').getImageData(0, 0, c.width, c.height).data;
    let n = 0;
    for (let i = 0; i < d.length; i += 4) if (d[i] > 240 && d[i + 1] > 200 && d[i + 1] < 235 && d[i + 2] < 235 && d[i] - d[i + 2] > 15) n++;
    return n;
  });
  assert.ok(shaded > 500, `the no-design band is drawn (${shaded} reddish pixels)`);
  await page.locator('[data-testid="sweep-plot"]').screenshot({ path: join(OUT, 'plot-sweep-no-design.png') });
  assert.deepEqual(requests, []);
  assert.deepEqual(errors, []);
  await context.close();
});

for (const [name, viewport] of [['laptop', { width: 1280, height: 800 }], ['tablet', { width: 768, height: 1024 }]]) {
  test(`layout at ${name} width (${viewport.width}px): no sideways scroll, keyboard order`, async () => {
    const { context, page, requests, errors } = await openPage(browser, { viewport });
    await page.waitForTimeout(300);
    const { sw, w } = await page.evaluate(() => ({ sw: document.documentElement.scrollWidth, w: window.innerWidth }));
    assert.ok(sw <= w, `page is ${sw}px wide in a ${w}px window`);
    await page.screenshot({ path: join(OUT, `layout-${name}.png`) });
    await page.screenshot({ path: join(OUT, `layout-${name}-full.png`), fullPage: true });
    // Tab walks the form in reading order.
    await page.focus('#f-vin_min');
    await page.keyboard.press('Tab');
    assert.equal(await page.evaluate(() => document.activeElement.id), 'f-vin_max');
    // Every field has a label.
    const unlabelled = await page.$$eval('main input[id^="f-"], main select', (els) =>
      els.filter((e) => !document.querySelector(`label[for="${e.id}"]`)).map((e) => e.id));
    assert.deepEqual(unlabelled, []);
    assert.ok((await shown(page, 'np')) > 0);
    assert.deepEqual(requests, []);
    assert.deepEqual(errors, []);
    await context.close();
  });
}
