// Never lose or twist the user's data (issue 14): an unreadable stored
// design is kept and offered for download or discard, a link keeps the
// stored design one click away, the page refuses exactly what the CLI
// refuses with the same words, and field entries are read as typed or
// refused (comma, %, counts, long entries), while the results keep the last
// good design marked as not matching the form. Keyboard only; no network.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { launch, openPage, attach, cli, cliText, typeInto, formState, waitSaved, CLI, OUT, PAGE_URL } from './harness.mjs';

let browser;
before(async () => { browser = await launch(); });
after(async () => { await browser?.close(); });

const stored = (page) => page.evaluate(() => localStorage.getItem('magwright.design'));

// The CLI's refusal of a design text: its message after "magwright: -: ".
function cliRefusal(text) {
  try {
    execFileSync(CLI, ['evaluate', '-'], { input: text, encoding: 'utf8', stdio: ['pipe', 'pipe', 'pipe'] });
  } catch (e) {
    assert.equal(e.status, 2);
    return e.stderr.trim().replace(/^magwright: -: /, '');
  }
  throw new Error('the CLI accepted the file');
}

function base64url(text) {
  return Buffer.from(text, 'utf8').toString('base64').replace(/\+/g, '-').replace(/\//g, '_').replace(/=+$/, '');
}

test('an unreadable stored design is kept untouched, offered for download or discard', async () => {
  const demo = cliText(['demo', 'forward']);
  const cases = [
    ['newer', demo.replace(/"version": \d+/, '"version": 99'), /newer Magwright/],
    ['corrupt', demo.slice(0, 200), /not valid JSON/],
    ['misspelt', demo.replace('"frequency"', '"frequncy"'), /did you mean "frequency"/],
  ];
  for (const [name, text, why] of cases) {
    const { context, page, requests, errors } = await openPage(browser);
    await page.evaluate((t) => localStorage.setItem('magwright.design', t), text);
    const p = await attach(context, PAGE_URL, { requests, errors });
    await p.page.waitForSelector('[data-testid="storage-problem"]');
    assert.match(await p.page.textContent('[data-testid="storage-problem"]'), why, name);
    assert.match(await p.page.textContent('[data-testid="saved-state"]'), /Not saved/);
    // An edit does not save over it.
    await typeInto(p.page, 'outputs[0].voltage', '9');
    await p.page.waitForFunction(() => document.querySelector('[data-testid="np"]'));
    await p.page.waitForFunction(() => document.getElementById('f-outputs[0].voltage').value === '9');
    assert.equal(await stored(p.page), text, `${name}: the stored text is untouched`);
    if (name === 'newer') await p.page.screenshot({ path: join(OUT, 'safety-stored-unreadable.png') });
    // Download gives it back byte for byte (keyboard: focus, Enter).
    await p.page.focus('[data-testid="stored-download"]');
    const [dl] = await Promise.all([p.page.waitForEvent('download'), p.page.keyboard.press('Enter')]);
    assert.equal(readFileSync(await dl.path(), 'utf8'), text);
    // Discard: removed, and the design on screen is saved from then on.
    await p.page.focus('[data-testid="stored-discard"]');
    await p.page.keyboard.press('Enter');
    await p.page.waitForSelector('[data-testid="storage-problem"]', { state: 'detached' });
    await waitSaved(p.page, (d) => d.spec?.outputs?.[0]?.voltage === 9);
    assert.deepEqual(requests, []);
    assert.deepEqual(errors, []);
    await context.close();
  }
});

test('a link does not lose the different design stored here: one click back to it', async () => {
  const { context, page, requests, errors } = await openPage(browser);
  await typeInto(page, 'outputs[0].voltage', '7');
  await waitSaved(page, (d) => d.spec.outputs[0].voltage === 7);
  const mine = await formState(page);
  const mineText = await stored(page);
  const link = PAGE_URL + '#design=' + base64url(cliText(['demo', 'flyback']));
  const p = await attach(context, link, { requests, errors });
  await p.page.waitForSelector('[data-testid="link-note"]');
  await waitSaved(p.page, (d) => d.spec.topology === 'flyback');
  assert.equal(await p.page.evaluate(() => localStorage.getItem('magwright.design.before-link')), mineText);
  await p.page.screenshot({ path: join(OUT, 'safety-link-kept.png') });
  await p.page.focus('[data-testid="back-to-stored"]');
  await p.page.keyboard.press('Enter');
  await waitSaved(p.page, (d) => d.spec.topology === 'forward' && d.spec.outputs[0].voltage === 7);
  assert.deepEqual(await formState(p.page), mine);
  assert.equal(await p.page.$('[data-testid="link-note"]'), null);
  // The same design as a link: nothing to go back to, no note.
  const same = await attach(context, PAGE_URL + '#design=' + base64url(await stored(p.page)), { requests, errors });
  await same.page.waitForSelector('[data-testid="file-status"]:has-text("Opened the design from the link")');
  assert.equal(await same.page.$('[data-testid="link-note"]'), null);
  assert.deepEqual(requests, []);
  assert.deepEqual(errors, []);
  await context.close();
});

test('the page refuses exactly what the CLI refuses, with the same message', async () => {
  const { context, page, requests, errors } = await openPage(browser);
  const before = await formState(page);
  const d = cli(['demo', 'flyback']);
  const mut = (f) => { const c = structuredClone(d); f(c); return JSON.stringify(c, null, 2); };
  const files = {
    'outputs-1000.json': mut((c) => { c.spec.outputs = Array(1000).fill(c.spec.outputs[0]); }),
    'misspelt-ripple.json': mut((c) => { c.spec.flyback.ripple_ratoi = 0.9; delete c.spec.flyback.ripple_ratio; }),
    'turns-extra.json': mut((c) => { c.choices.turns = { rule: 'least_loss', turns: 9 }; }),
    'input-type.json': mut((c) => { c.spec.input.vac_min = 'low'; }),
    'bulk-negative.json': mut((c) => { c.spec.input.bulk.farads = -1; }),
  };
  for (const [name, text] of Object.entries(files)) {
    const want = cliRefusal(text);
    assert.match(want, /^spec\.|^choices\./, `${name}: the CLI names the full path: ${want}`);
    await page.setInputFiles('[data-testid="open-file"]', { name, mimeType: 'application/json', buffer: Buffer.from(text) });
    await page.waitForFunction((n) => (document.querySelector('[data-testid="file-status"]')?.textContent || '').includes(`Could not open ${n}`), name);
    const got = await page.textContent('[data-testid="file-status"]');
    assert.ok(got.includes(want), `${name}: page "${got}" vs CLI "${want}"`);
    assert.deepEqual(await formState(page), before, `${name} changed the form`);
  }
  // And a file both accept opens whole (a BOM before it, as editors write).
  const ok = '\uFEFF' + JSON.stringify(d, null, 2);
  cli(['evaluate', '-'], ok);
  await page.setInputFiles('[data-testid="open-file"]', { name: 'bom.json', mimeType: 'application/json', buffer: Buffer.from(ok) });
  await page.waitForSelector('[data-testid="file-status"]:has-text("Opened bom.json")');
  assert.deepEqual(requests, []);
  assert.deepEqual(errors, []);
  await context.close();
});

test('fields: comma refused, % read, counts whole, long entries wrap; results keep the last good design', async () => {
  const { context, page, requests, errors } = await openPage(browser);
  await typeInto(page, 'outputs[0].current', '8');
  await waitSaved(page, (d) => d.spec.outputs[0].current === 8);
  const np = await page.getAttribute('[data-testid="np"]', 'data-si');
  const width = await page.$eval('.col.inputs', (e) => e.getBoundingClientRect().width);

  // "8,500" is not 8.5 A: refused, with a message at the field (typed after
  // the 8 already there, so the last good design is the one for 8 A).
  await page.focus('[id="f-outputs[0].current"]');
  await page.keyboard.press('End');
  await page.keyboard.type(',500', { delay: 15 });
  await page.waitForSelector('[data-testid="stale-note"]');
  assert.match(await page.textContent('[id="e-outputs[0].current"]'), /comma/);
  // The results and pictures still show the last good design, marked.
  assert.equal(await page.getAttribute('[data-testid="np"]', 'data-si'), np);
  assert.ok(await page.$('[data-testid="stale-pictures"]'));
  assert.ok(await page.$eval('[data-testid="np"]', (e) => !!e.closest('.stale')), 'marked as not the form\'s');
  assert.equal(JSON.parse(await stored(page)).spec.outputs[0].current, 8, 'nothing saved from the bad entry');
  await page.screenshot({ path: join(OUT, 'safety-stale-results.png'), fullPage: true });
  await typeInto(page, 'outputs[0].current', '8');
  await page.waitForSelector('[data-testid="stale-note"]', { state: 'detached' });

  // A fraction in percent.
  await typeInto(page, 'duty_max', '45%');
  await waitSaved(page, (d) => d.spec.duty_max === 0.45);

  // Counts: negative and fractional wraps are refused, never made 0.
  for (const [text, re] of [['-1', /below zero/], ['2.5', /whole number/]]) {
    await typeInto(page, 'choices.insulation.section_wraps', text);
    await page.waitForFunction(() => document.getElementById('e-choices.insulation.section_wraps')?.textContent);
    assert.match(await page.textContent('[id="e-choices.insulation.section_wraps"]'), re, text);
    assert.equal(JSON.parse(await stored(page)).choices.insulation.section_wraps, 2);
  }
  await typeInto(page, 'choices.insulation.section_wraps', '3');
  await waitSaved(page, (d) => d.choices.insulation.section_wraps === 3);

  // A very long entry neither widens the column nor the page.
  await typeInto(page, 'frequency', '9'.repeat(120) + 'x');
  await page.waitForSelector('[data-testid="stale-note"]');
  const after = await page.$eval('.col.inputs', (e) => e.getBoundingClientRect().width);
  assert.equal(after, width, 'the inputs column keeps its width');
  const { sw, w } = await page.evaluate(() => ({ sw: document.documentElement.scrollWidth, w: window.innerWidth }));
  assert.ok(sw <= w, `page is ${sw}px wide in a ${w}px window`);
  await page.screenshot({ path: join(OUT, 'safety-long-entry.png') });
  assert.deepEqual(requests, []);
  assert.deepEqual(errors, []);
  await context.close();
});
