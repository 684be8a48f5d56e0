// The flyback's conduction mode as wound: the page shows the engine's
// "mode" check and its mode and ripple ratio per corner, and asking for the
// CCM/DCM boundary (ripple ratio 2, typed with the keyboard) gives the
// boundary at Vin min after the turns are rounded, as the CLI computes it.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { launch, openPage, shown, typeInto, close, engineFor, waitChanged, OUT, PAGE } from './harness.mjs';

let browser;
before(async () => { browser = await launch(); });
after(async () => { await browser?.close(); });

const EXAMPLES = resolve(PAGE, '..', '..', 'examples');

test('flyback mode and ripple ratio per corner, boundary held as wound', async () => {
  const { context, page, requests, errors } = await openPage(browser);
  const name = 'flyback-offline-24w.json';
  const text = readFileSync(join(EXAMPLES, name), 'utf8');
  await page.setInputFiles('[data-testid="open-file"]', { name, mimeType: 'application/json', buffer: Buffer.from(text) });
  await page.waitForFunction((n) => document.querySelector('[data-testid="file-status"]')?.textContent.includes(`Opened ${n}`), name);
  await page.waitForSelector('[data-testid="check-mode"]');
  let { report: r } = await engineFor(page);
  assert.ok(close(await shown(page, 'mode'), r.conduction.corners[0].ripple_ratio), 'ripple ratio at Vin min');
  assert.equal(await page.getAttribute('[data-testid="check-mode"]', 'data-pass'), 'true');
  assert.match(await page.textContent('[data-testid="mode"]'), /^CCM \/ (CCM|DCM)$/);

  const old = await shown(page, 'mode');
  await typeInto(page, 'flyback.ripple_ratio', '2');
  await waitChanged(page, 'mode', old);
  ({ report: r } = await engineFor(page));
  assert.equal(r.conduction.requested, 'boundary');
  assert.equal(r.conduction.corners[0].mode, 'boundary');
  assert.ok(close(await shown(page, 'mode'), 2, 1e-6), 'r = 2 as wound at Vin min');
  assert.match(await page.textContent('[data-testid="mode"]'), /^boundary \/ DCM$/);
  assert.equal(await page.getAttribute('[data-testid="check-mode"]', 'data-pass'), 'true');
  await page.screenshot({ path: join(OUT, 'mode-boundary.png'), fullPage: true });
  assert.deepEqual(requests, []);
  assert.deepEqual(errors, []);
  await context.close();
});
