// Design files: save → open gives the same design; malformed and foreign
// files are refused with a message and change nothing. Typed with the
// keyboard; no network.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { launch, openPage, cli, shown, typeInto, close, formState, waitChanged, OUT, chooseWithKeyboard } from './harness.mjs';

const R = { np: (r) => r.turns.primary, ns: (r) => r.turns.secondaries[0], 'total-loss': (r) => r.losses.total };

let browser;
before(async () => { browser = await launch(); });
after(async () => { await browser?.close(); });

// Saves with the keyboard (focus the button, press Enter); returns the file's text.
async function saveWithKeyboard(page) {
  await page.focus('[data-testid="save"]');
  const [dl] = await Promise.all([page.waitForEvent('download'), page.keyboard.press('Enter')]);
  assert.equal(dl.suggestedFilename(), 'magwright-design.json');
  return readFileSync(await dl.path(), 'utf8');
}

// Opens a file through the "Open design…" button (Space on it, then the chooser).
async function openWithKeyboard(page, name, text, { keyboard = true } = {}) {
  const file = { name, mimeType: 'application/json', buffer: Buffer.from(text) };
  if (keyboard) {
    await chooseWithKeyboard(page, 'open', file);
  } else {
    // Headless Chromium stops offering file choosers after a few in a row;
    // later files go straight to the Open button's file input.
    await page.setInputFiles('[data-testid="open-file"]', file);
  }
  // Wait for this file's own outcome (the status may already name the file
  // from an earlier save).
  await page.waitForFunction((n) => {
    const t = document.querySelector('[data-testid="file-status"]')?.textContent || '';
    return t.includes(`Opened ${n}`) || t.includes(`Could not open ${n}`);
  }, name);
  return page.textContent('[data-testid="file-status"]');
}

test('save then open gives the same design', async () => {
  const { context, page, requests, errors } = await openPage(browser);
  const demo = cli(['demo', 'forward']);
  const ns0 = await shown(page, 'ns');
  await typeInto(page, 'frequency', '150k');
  await typeInto(page, 'outputs[0].voltage', '15');
  await page.selectOption('#f-core', 'ETD 39');
  await waitChanged(page, 'ns', ns0);
  const edited = await formState(page);
  const saved = await saveWithKeyboard(page);
  const file = JSON.parse(saved);
  assert.equal(file.schema, 'magwright-design');
  assert.equal(file.version, 3);
  assert.equal(file.spec.frequency, 150e3);
  assert.equal(file.spec.outputs[0].voltage, 15);
  assert.equal(file.core.designation, 'ETD 39');
  const want = cli(['evaluate', '-'], saved);
  assert.ok(close(await shown(page, 'np'), R.np(want)));
  await page.screenshot({ path: join(OUT, 'files-edited.png'), fullPage: true });

  // Change the design, then open the saved file: everything comes back.
  await typeInto(page, 'outputs[0].voltage', '5');
  await typeInto(page, 'outputs[0].current', '2');
  await page.waitForFunction(() => document.getElementById('f-outputs[0].current').value === '2');
  assert.notDeepEqual(await formState(page), edited);
  const msg = await openWithKeyboard(page, 'magwright-design.json', saved);
  assert.match(msg, /Opened magwright-design\.json/);
  assert.deepEqual(await formState(page), edited, 'every field as it was saved');
  for (const id of ['np', 'ns', 'total-loss']) {
    assert.ok(close(await shown(page, id), R[id](want)), `${id} after opening`);
  }
  assert.deepEqual(JSON.parse(await saveWithKeyboard(page)), file, 'saving again gives the same file');
  await page.screenshot({ path: join(OUT, 'files-opened.png'), fullPage: true });
  assert.ok(demo.frequency !== 150e3);
  assert.deepEqual(requests, [], 'no network requests');
  assert.deepEqual(errors, []);
  await context.close();
});

test('malformed, foreign and ill-fitting files are refused and change nothing', async () => {
  const { context, page, requests, errors } = await openPage(browser);
  await typeInto(page, 'input.min', '30');
  await page.waitForFunction(() => document.getElementById('f-input.min').value === '30');
  const before = await formState(page);
  const np = await shown(page, 'np');
  const stored = await page.evaluate(() => localStorage.getItem('magwright.design'));

  const cases = [
    ['broken.json', '{\n  "schema": "magwright-design",\n  "version": 1,\n  "spec": { "frequency": 36,, }\n}', /not valid JSON.*line 4/],
    ['shopping.json', '{"name": "shopping list", "items": ["milk", "eggs"]}', /not a Magwright design file.*no "schema"/],
    ['other.json', '{"schema": "someone-else", "version": 1, "spec": {}}', /not a Magwright design file.*"someone-else"/],
    ['newer.json', '{"schema": "magwright-design", "version": 7, "spec": {}}', /newer Magwright/],
    ['wrongtype.json', (() => { const d = cli(['demo', 'forward']); d.spec.outputs[0].voltage = 'twelve'; return JSON.stringify(d, null, 2); })(),
      /spec\.outputs\[0\]\.voltage: invalid type: string "twelve".*\(line \d+\)/],
    ['missing.json', JSON.stringify({ schema: 'magwright-design', version: 2, spec: { topology: 'forward' } }), /spec\.\w+: the key "\w+" is missing/],
  ];
  for (const [i, [name, text, re]] of cases.entries()) {
    const msg = await openWithKeyboard(page, name, text, { keyboard: i === 0 });
    assert.match(msg, re, `${name}: ${msg}`);
    assert.match(msg, /Nothing was changed/);
    assert.ok(await page.$eval('[data-testid="file-status"]', (e) => e.classList.contains('bad')), 'shown as an error');
    assert.deepEqual(await formState(page), before, `${name} changed the form`);
    assert.equal(await shown(page, 'np'), np);
    assert.equal(await page.evaluate(() => localStorage.getItem('magwright.design')), stored, `${name} changed the saved design`);
    if (name === 'broken.json' || name === 'shopping.json') await page.screenshot({ path: join(OUT, `files-refused-${name.replace('.json', '')}.png`) });
  }
  assert.deepEqual(requests, []);
  assert.deepEqual(errors, []);
  await context.close();
});
