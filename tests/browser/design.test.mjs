// The main flow end to end: the offline page designs exactly as the engine
// (through the native CLI) does, every edit recomputes, invalid entries are
// explained at their field, each topology's example opens to a passing
// design whose stack-up exports as the engine writes it, and nothing touches
// the network.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { createServer } from 'node:http';
import { readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { launch, openPage, cli, cliText, shown, typeInto, close, engineFor, waitChanged, OUT, PAGE } from './harness.mjs';

let browser;
before(async () => { browser = await launch(); });
after(async () => { await browser?.close(); });

const EXAMPLES = resolve(PAGE, '..', '..', 'examples');

// The page's figures against the engine's report for the same design.
async function assertMatchesEngine(page) {
  const { design, report: r } = await engineFor(page);
  const want = {
    np: r.turns.primary,
    ns: r.turns.secondaries[0],
    'core-loss': r.losses.core,
    'cu-loss': r.losses.copper,
    'total-loss': r.losses.total,
    temperature: r.thermal.temperature,
    inductance: r.inductance,
  };
  for (const [id, v] of Object.entries(want)) {
    const got = await shown(page, id);
    assert.ok(close(got, v), `${id}: page ${got} vs engine ${v}`);
  }
  return { design, report: r };
}

test('demo design, edits, invalid entries, no network', async () => {
  const { context, page, requests, errors } = await openPage(browser);
  const first = await assertMatchesEngine(page);
  assert.deepEqual(first.design, cli(['demo', 'forward']), 'a first visit opens on the forward demo');
  assert.match(await page.textContent('[data-testid="verdict"]'), /Passes every check/);

  // Edit the frequency as a user types it, with an SI prefix.
  await typeInto(page, 'frequency', '100k');
  await page.waitForFunction(() => JSON.parse(localStorage.getItem('magwright.design')).spec.frequency === 100e3);
  const after = await assertMatchesEngine(page);
  assert.ok(after.report.turns.primary > first.report.turns.primary, 'halving f must add primary turns');
  assert.equal(await page.inputValue('[id="f-frequency"]'), '100k', 'the field keeps exactly what was typed');

  // A decimal typed key by key is not mangled.
  // Duty max is entered in % (the results show duty in %).
  await typeInto(page, 'duty_max', '42.5');
  assert.equal(await page.inputValue('[id="f-duty_max"]'), '42.5');
  await page.waitForFunction(() => JSON.parse(localStorage.getItem('magwright.design')).spec.duty_max === 0.425);
  await typeInto(page, 'duty_max', '42');
  await page.waitForFunction(() => JSON.parse(localStorage.getItem('magwright.design')).spec.duty_max === 0.42);
  await assertMatchesEngine(page);
  await page.screenshot({ path: join(OUT, 'design-edited.png'), fullPage: true });

  // Invalid entries: a message at the field; the results say what to fix and
  // keep showing the last good design, marked as not the form's.
  await typeInto(page, 'frequency', '0');
  await page.waitForSelector('[data-testid="missing"]');
  assert.match(await page.textContent('[id="e-frequency"]'), /between|greater than zero/);
  assert.match(await page.textContent('[data-testid="stale-note"]'), /last good design/);
  assert.ok(await page.$eval('[data-testid="np"]', (e) => !!e.closest('.stale')), 'the results shown are marked as not the form\'s');
  await typeInto(page, 'frequency', '');
  assert.match(await page.textContent('[id="e-frequency"]'), /enter a value/);
  await typeInto(page, 'input.min', 'abc');
  assert.match(await page.textContent('[id="e-input.min"]'), /not a number/);
  await typeInto(page, 'outputs[0].voltage', '-5');
  const missing = await page.textContent('[data-testid="missing"]');
  assert.match(missing, /Vin min/);
  assert.doesNotMatch(await page.innerText('main'), /NaN|Infinity|undefined/);
  await page.screenshot({ path: join(OUT, 'design-invalid.png'), fullPage: true });

  assert.deepEqual(requests, [], 'the page made no network requests');
  assert.deepEqual(errors, [], 'no errors in the console');
  await context.close();
});

test('each topology: its example opens to a passing design and its stack-up exports as the engine writes it', async () => {
  const { context, page, requests, errors } = await openPage(browser);
  for (const name of ['forward-48v-bus.json', 'flyback-offline-24w.json', 'push-pull-24v.json']) {
    const text = readFileSync(join(EXAMPLES, name), 'utf8');
    // (files.test.mjs drives the Open button with the keyboard; here the
    // file goes straight to its input.)
    await page.setInputFiles('[data-testid="open-file"]', { name, mimeType: 'application/json', buffer: Buffer.from(text) });
    await page.waitForFunction((n) => document.querySelector('[data-testid="file-status"]')?.textContent.includes(`Opened ${n}`), name);
    await page.waitForFunction((d) => localStorage.getItem('magwright.design') && JSON.parse(localStorage.getItem('magwright.design')).name === d, JSON.parse(text).name);
    const { design } = await assertMatchesEngine(page);
    assert.deepEqual(design, JSON.parse(text), `${name} opens unchanged`);
    assert.match(await page.textContent('[data-testid="verdict"]'), /Passes every check/, name);
    const [dl] = await Promise.all([page.waitForEvent('download'), page.click('[data-testid="export-stackup"]')]);
    const exported = readFileSync(await dl.path(), 'utf8');
    assert.equal(exported, cliText(['stackup', join(EXAMPLES, name)]).replace(/\n$/, ''), `${name}: exported stack-up`);
    assert.equal(JSON.parse(exported).schema, 'magwright.stackup/2');
    await page.screenshot({ path: join(OUT, `design-${name.replace('.json', '')}.png`), fullPage: true });
  }
  assert.deepEqual(requests, []);
  assert.deepEqual(errors, []);
  await context.close();
});

test('the same page served on 127.0.0.1', async () => {
  const html = readFileSync(PAGE);
  const server = createServer((req, res) => { res.writeHead(200, { 'content-type': 'text/html' }); res.end(html); });
  await new Promise((r) => server.listen(0, '127.0.0.1', r));
  const url = `http://127.0.0.1:${server.address().port}/`;
  try {
    const { context, page, requests } = await openPage(browser, { url });
    await assertMatchesEngine(page);
    assert.deepEqual(requests, []);
    await context.close();
  } finally {
    server.close();
  }
});
