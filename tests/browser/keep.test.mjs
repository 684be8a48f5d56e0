// Keeping a design: a reload shows the last good design (localStorage), a
// share link restores it in a fresh browser, and a deliberate panic (the
// test-only route) shows its message while the design stays saved.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { join } from 'node:path';
import { launch, openPage, attach, cli, shown, typeInto, close, formState, waitChanged, engineFor, frames, OUT, PAGE_URL } from './harness.mjs';

let browser;
before(async () => { browser = await launch(); });
after(async () => { await browser?.close(); });

test('a reload keeps the last good design, not an invalid entry', async () => {
  const { context, page, requests, errors } = await openPage(browser);
  const ns0 = await shown(page, 'ns');
  await typeInto(page, 'frequency', '100k');
  await waitChanged(page, 'ns', ns0);
  await typeInto(page, 'outputs[0].current', '8');
  await page.waitForFunction(() => JSON.parse(localStorage.getItem('magwright.design') || '{}').spec?.outputs?.[0]?.current === 8);
  const good = await formState(page);
  // An unreadable entry is not saved: the reload brings back the last good design.
  await typeInto(page, 'outputs[0].voltage', '12x');
  await page.waitForSelector('[data-testid="missing"]');
  await page.reload();
  await page.waitForSelector('[data-testid="np"]');
  assert.deepEqual(await formState(page), good);
  const { design, report: want } = await engineFor(page);
  assert.equal(design.spec.frequency, 100e3);
  assert.equal(design.spec.outputs[0].current, 8);
  assert.ok(close(await shown(page, 'ns'), want.turns.secondaries[0]));
  assert.ok(close(await shown(page, 'total-loss'), want.losses.total));
  await page.screenshot({ path: join(OUT, 'keep-reloaded.png') });
  assert.deepEqual(requests, []);
  assert.deepEqual(errors, []);
  await context.close();
});

test('a share link restores the design in a fresh browser', async () => {
  const { context, page, requests, errors } = await openPage(browser);
  await typeInto(page, 'input.max', '72');
  await typeInto(page, 'choices.bpk_limit', '120m');
  // Choose the next core with the keyboard.
  await page.focus('#f-core');
  await page.keyboard.press('ArrowDown');
  await page.waitForFunction(() => {
    const d = JSON.parse(localStorage.getItem('magwright.design') || '{}');
    return d?.choices?.bpk_limit === 0.12 && d?.core?.designation === 'ETD 39';
  });
  const state = await formState(page);
  await page.focus('[data-testid="copy-link"]');
  await page.keyboard.press('Enter');
  await page.waitForSelector('[data-testid="share-link"]');
  const link = await page.inputValue('[data-testid="share-link"]');
  assert.ok(link.startsWith(PAGE_URL + '#design='), link);
  assert.match(await page.textContent('[data-testid="file-status"]'), /link/i);
  await page.screenshot({ path: join(OUT, 'keep-copy-link.png') });
  const saved = await page.evaluate(() => localStorage.getItem('magwright.design'));
  await context.close();

  // A new context: empty storage, as on another machine.
  const other = await openPage(browser, { url: link });
  assert.deepEqual(await formState(other.page), state);
  const want = cli(['evaluate', '-'], saved);
  for (const [id, v] of [['np', want.turns.primary], ['ns', want.turns.secondaries[0]], ['core-loss', want.losses.core]]) {
    assert.ok(close(await shown(other.page, id), v), id);
  }
  assert.match(await other.page.textContent('[data-testid="file-status"]'), /Opened the design from the link/);
  assert.ok(!other.page.url().includes('#'), 'the fragment is dropped once read, so a reload shows later edits');
  await other.page.screenshot({ path: join(OUT, 'keep-from-link.png') });

  // A damaged link says so and falls back to the demo.
  const bad = await attach(other.context, PAGE_URL + '#design=eyJzY2hlbWEiOiAibWFn');
  assert.match(await bad.page.textContent('[data-testid="file-status"]'), /link's design could not be read: .*not valid JSON/);
  // A link pasted into the open page (only the fragment changes) opens its design too.
  await typeInto(bad.page, 'outputs[0].voltage', '7');
  await bad.page.waitForFunction(() => JSON.parse(localStorage.getItem('magwright.design')).spec.outputs[0].voltage === 7);
  assert.notDeepEqual(await formState(bad.page), state);
  await bad.page.evaluate((h) => { location.hash = h; }, link.slice(link.indexOf('#')));
  await bad.page.waitForFunction(() => document.querySelector('[data-testid="file-status"]').textContent.includes('Opened the design from the link'));
  assert.deepEqual(await formState(bad.page), state);
  assert.deepEqual([...requests, ...other.requests, ...bad.requests], []);
  assert.deepEqual([...errors, ...other.errors, ...bad.errors], []);
  await other.context.close();
});

test('test-only panic route: message shown, design kept, reload continues', async () => {
  const { context, page, requests } = await openPage(browser);
  const ns0 = await shown(page, 'ns');
  await typeInto(page, 'outputs[0].voltage', '5');
  await waitChanged(page, 'ns', ns0);
  await page.waitForFunction(() => JSON.parse(localStorage.getItem('magwright.design') || '{}').spec?.outputs?.[0]?.voltage === 5);
  const state = await formState(page);
  const np = await shown(page, 'np');
  await page.close();

  // Loaded from localStorage with the test fragment: the page panics on purpose.
  const p = await attach(context, PAGE_URL + '#magwright-test-panic');
  await p.page.waitForSelector('[data-testid="panic"]', { timeout: 5000 });
  assert.match(await p.page.textContent('[data-testid="panic"]'),
    /Magwright hit an internal error; your last good design is saved — reload to continue/);
  assert.ok(p.errors.some((e) => /Magwright panicked: .*deliberate test panic/s.test(e)), 'the panic is logged');
  assert.deepEqual(await formState(p.page), state, 'the last good design stays on screen');
  assert.equal(await shown(p.page, 'np'), np);
  assert.equal(JSON.parse(await p.page.evaluate(() => localStorage.getItem('magwright.design'))).spec.outputs[0].voltage, 5);
  assert.equal(await p.page.evaluate(() => document.activeElement?.textContent), 'Reload', 'focus on the Reload button');
  await p.page.screenshot({ path: join(OUT, 'panic.png') });

  // Its Reload button (keyboard) opens the page without the fragment: the design is back.
  await Promise.all([p.page.waitForNavigation(), p.page.keyboard.press('Enter')]);
  await p.page.waitForSelector('[data-testid="np"]');
  assert.equal(p.page.url(), PAGE_URL);
  assert.equal(await p.page.$('[data-testid="panic"]'), null);
  assert.deepEqual(await formState(p.page), state);
  await p.page.screenshot({ path: join(OUT, 'panic-reloaded.png') });

  // Without a saved design (fresh context) the fragment does nothing.
  const fresh = await openPage(browser, { url: PAGE_URL + '#magwright-test-panic' });
  // The page says where its design came from; the panic route is armed
  // only for a design from storage.
  await fresh.page.waitForSelector('header[data-source="demo"]');
  await frames(fresh.page, 12);
  assert.equal(await fresh.page.$('[data-testid="panic"]'), null);
  assert.deepEqual(fresh.errors, []);
  assert.deepEqual([...requests, ...p.requests, ...fresh.requests], []);
  await fresh.context.close();
  await context.close();
});
