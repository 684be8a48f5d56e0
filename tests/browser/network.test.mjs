// No network, ever: one tour through every panel and every flow of the page,
// recording every request the page makes; there must be none beyond the file
// itself. (Each flow's own test also asserts this; this one does them all in
// one page, in the order a user might.)
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { launch, openPage, typeInto, PAGE, OUT } from './harness.mjs';

let browser;
before(async () => { browser = await launch(); });
after(async () => { await browser?.close(); });

test('every panel and flow, zero requests', async () => {
  const { context, page, requests, errors } = await openPage(browser);
  const download = async (testid) => {
    const [dl] = await Promise.all([page.waitForEvent('download'), page.click(`[data-testid="${testid}"]`)]);
    assert.ok(readFileSync(await dl.path(), 'utf8').length > 0, `${testid} downloaded something`);
  };
  // Specification: edits, an added and removed output, topology and input kind.
  await typeInto(page, 'frequency', '150k');
  await page.click('[data-testid="add-output"]');
  await page.click('[data-testid="remove-output"]');
  await page.selectOption('[id="f-input-kind"]', { index: 1 });
  await page.selectOption('[id="f-input-kind"]', { index: 0 });
  await page.waitForSelector('[data-testid="np"]');
  // Core and material: the library browser, a material, the own-core and fit sections.
  await page.click('[data-testid="browse-cores"]');
  await page.waitForSelector('[data-testid="core-browser"]');
  await page.click('[data-testid="close-browser"]');
  await page.selectOption('#f-material', { index: 2 });
  await page.selectOption('#f-material', 'MnZn-200k');
  for (const summary of await page.$$('details > summary')) await summary.click();
  // Pictures: the corner selector; the sweep and its CSV.
  await page.selectOption('[data-testid="corner-select"]', { index: 1 });
  await page.waitForSelector('[data-testid="sweep-figure"][data-sweep-ready="true"]', { timeout: 20000 });
  await download('sweep-csv');
  // Windings: the stack-up export and an interleaving change.
  await download('export-stackup');
  // Suggest: a run, then cancel.
  await page.click('[data-testid="suggest-run"]');
  // Running (something evaluated) or already done; then Cancel if it runs.
  await page.waitForFunction(() => Number(document.querySelector('[data-testid="suggest-evaluated"]')?.dataset.si) > 0
    || /^Done/.test(document.querySelector('[data-testid="suggest-status"]')?.textContent || ''));
  if (await page.isEnabled('[data-testid="suggest-cancel"]')) await page.click('[data-testid="suggest-cancel"]');
  // Files: save, open, link, print media.
  await download('save');
  const example = readFileSync(join(resolve(PAGE, '..', '..', 'examples'), 'push-pull-24v.json'));
  await page.setInputFiles('[data-testid="open-file"]', { name: 'push-pull-24v.json', mimeType: 'application/json', buffer: example });
  await page.waitForFunction(() => document.querySelector('[data-testid="file-status"]')?.textContent.includes('Opened push-pull-24v.json'));
  await page.click('[data-testid="copy-link"]');
  await page.waitForSelector('[data-testid="share-link"]');
  await page.emulateMedia({ media: 'print' });
  await page.screenshot({ path: join(OUT, 'network-tour-print.png') });
  await page.emulateMedia({ media: 'screen' });
  await page.screenshot({ path: join(OUT, 'network-tour.png'), fullPage: true });
  assert.deepEqual(requests, [], 'the page made no network requests');
  assert.deepEqual(errors, [], 'no errors in the console');
  await context.close();
});
