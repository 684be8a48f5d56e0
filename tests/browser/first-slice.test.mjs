// The first design slice end to end: the offline page computes the forward
// transformer exactly as the engine (through the native CLI) does.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { createServer } from 'node:http';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { launch, openPage, cli, shown, typeInto, close, OUT, PAGE } from './harness.mjs';

let browser;
before(async () => { browser = await launch(); });
after(async () => { await browser?.close(); });

const IDS = { np: 'primary_turns', ns: 'secondary_turns', 'core-loss': 'core_loss', 'cu-loss': 'copper_loss',
  'total-loss': 'total_loss', 'delta-b': 'delta_b', 'duty-min': 'duty_at_vin_min' };

async function assertMatchesEngine(page, spec) {
  const want = cli(['forward', '-'], JSON.stringify(spec));
  for (const [id, key] of Object.entries(IDS)) {
    const got = await shown(page, id);
    assert.ok(close(got, want[key]), `${id}: page ${got} vs engine ${want[key]}`);
  }
  return want;
}

test('demo design, an edit, invalid entries, no network', async () => {
  const { context, page, requests, errors } = await openPage(browser);
  const demo = cli(['forward-demo']);
  const before = await assertMatchesEngine(page, demo);

  // Edit the frequency as a user types it, with an SI prefix.
  await typeInto(page, 'frequency', '100k');
  await page.waitForFunction((v) => document.querySelector('[data-testid="ns"]')?.dataset.si !== String(v), before.secondary_turns);
  const after = await assertMatchesEngine(page, { ...demo, frequency: 100e3 });
  assert.ok(after.secondary_turns > before.secondary_turns, 'halving f must add secondary turns');
  assert.equal(await page.inputValue('#f-frequency'), '100k', 'the field keeps exactly what was typed');
  await page.screenshot({ path: join(OUT, 'first-slice.png'), fullPage: true });

  // A decimal typed key by key is not mangled.
  await typeInto(page, 'duty_max', '0.42');
  assert.equal(await page.inputValue('#f-duty_max'), '0.42');
  await assertMatchesEngine(page, { ...demo, frequency: 100e3, duty_max: 0.42 });

  // Invalid entries: a message at the field, results say why they are missing.
  await typeInto(page, 'duty_max', '0.6');
  await page.waitForSelector('[data-testid="missing"]');
  assert.match(await page.textContent('#e-duty_max'), /0\.5/);
  assert.equal(await page.$('[data-testid="np"]'), null, 'no stale results while invalid');
  await typeInto(page, 'duty_max', '0.45');
  await page.waitForSelector('[data-testid="np"]');

  await typeInto(page, 'frequency', '0');
  await page.waitForSelector('[data-testid="missing"]');
  assert.match(await page.textContent('#e-frequency'), /greater than zero/);
  await typeInto(page, 'frequency', '');
  assert.match(await page.textContent('#e-frequency'), /enter a value/);
  await typeInto(page, 'vin_min', 'abc');
  assert.match(await page.textContent('#e-vin_min'), /not a number/);
  const missing = await page.textContent('[data-testid="missing"]');
  assert.match(missing, /Vin min/);
  assert.doesNotMatch(await page.innerText('main'), /NaN|Infinity|undefined/);
  await page.screenshot({ path: join(OUT, 'first-slice-invalid.png'), fullPage: true });

  assert.deepEqual(requests, [], 'the page made no network requests');
  assert.deepEqual(errors, [], 'no errors in the console');
  await context.close();
});

test('the same page served on 127.0.0.1', async () => {
  const html = readFileSync(PAGE);
  const server = createServer((req, res) => { res.writeHead(200, { 'content-type': 'text/html' }); res.end(html); });
  await new Promise((r) => server.listen(0, '127.0.0.1', r));
  const url = `http://127.0.0.1:${server.address().port}/`;
  try {
    const { context, page, requests } = await openPage(browser, { url });
    const demo = cli(['forward-demo']);
    await assertMatchesEngine(page, demo);
    assert.deepEqual(requests, []);
    await context.close();
  } finally {
    server.close();
  }
});
