// The inductor kind and the output choke on the page: the forward demo's
// choke figures equal the CLI's for the same design file; the buck example
// opens to the engine's figures, and a typed target inductance comes back
// as wound. Nothing touches the network.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { launch, openPage, shown, typeInto, close, engineFor, OUT, PAGE } from './harness.mjs';

let browser;
before(async () => { browser = await launch(); });
after(async () => { await browser?.close(); });

const EXAMPLES = resolve(PAGE, '..', '..', 'examples');

test('the forward demo shows its output choke as the CLI designs it', async () => {
  const { context, page, requests, errors } = await openPage(browser);
  await page.waitForSelector('[data-testid="choke"]');
  const { report: r } = await engineFor(page);
  const c = r.choke;
  assert.ok(c, 'the CLI report carries the choke');
  assert.equal(c.topology, 'inductor');
  const want = {
    'choke-turns': c.turns.primary,
    'choke-inductance': c.inductance,
    'choke-gap': c.gap.gap,
    'choke-b-peak': c.waveforms.worst.find((w) => w.quantity === 'b_peak').value,
    'choke-core-loss': c.losses.core,
    'choke-cu-loss': c.losses.copper,
    'choke-total-loss': c.losses.total,
    'choke-temperature': c.thermal.temperature,
  };
  for (const [id, v] of Object.entries(want)) {
    const got = await shown(page, id);
    assert.ok(close(got, v), `${id}: page ${got} vs CLI ${v}`);
  }
  assert.equal((await page.textContent('[data-testid="choke-core"]')).trim(), c.core.designation);
  assert.equal(await page.getAttribute('[data-testid="choke"]', 'data-pass'), String(c.pass));
  assert.equal(await page.getAttribute('[data-testid="check-choke"]', 'data-pass'), String(c.pass));
  await page.locator('[data-testid="choke"]').screenshot({ path: join(OUT, 'choke-forward.png') });
  assert.deepEqual(requests, []);
  assert.deepEqual(errors, []);
  await context.close();
});

test('the inductor kind: the buck example opens to the CLI figures and a typed L is wound', async () => {
  const { context, page, requests, errors } = await openPage(browser);
  const name = 'buck-choke-24v.json';
  const text = readFileSync(join(EXAMPLES, name), 'utf8');
  await page.setInputFiles('[data-testid="open-file"]', { name, mimeType: 'application/json', buffer: Buffer.from(text) });
  await page.waitForFunction((n) => JSON.parse(localStorage.getItem('magwright.design') || '{}').name === n, JSON.parse(text).name);
  let { design, report: r } = await engineFor(page);
  assert.deepEqual(design, JSON.parse(text), 'the example opens unchanged');
  const figures = async (r) => {
    for (const [id, v] of Object.entries({
      np: r.turns.primary, inductance: r.inductance, 'core-loss': r.losses.core,
      'cu-loss': r.losses.copper, 'total-loss': r.losses.total, temperature: r.thermal.temperature,
    })) {
      const got = await shown(page, id);
      assert.ok(close(got, v), `${id}: page ${got} vs CLI ${v}`);
    }
  };
  await figures(r);
  assert.match(await page.textContent('[data-testid="verdict"]'), /Passes every check/);
  assert.equal(await page.$('[data-testid="choke"]'), null, 'an inductor has no choke member');

  // A target inductance typed with the keyboard, with an SI prefix.
  await typeInto(page, 'inductor.inductance', '22u');
  await page.waitForFunction(() => JSON.parse(localStorage.getItem('magwright.design')).spec.inductor?.inductance === 22e-6);
  ({ design, report: r } = await engineFor(page));
  await figures(r);
  assert.ok(close(r.inductance, 22e-6, 1e-6), `as wound ${r.inductance}`);
  assert.equal(await page.inputValue('[id="f-inductor.inductance"]'), '22u');
  await page.screenshot({ path: join(OUT, 'choke-inductor.png'), fullPage: true });

  // Too little inductance runs discontinuous: refused at the field.
  await typeInto(page, 'inductor.inductance', '1u');
  await page.waitForSelector('[data-testid="missing"]');
  assert.match(await page.textContent('[id="e-inductor.inductance"]'), /discontinuous/);
  assert.deepEqual(requests, []);
  assert.deepEqual(errors, []);
  await context.close();
});
