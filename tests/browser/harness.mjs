// Shared helpers for the browser tests: launch Debian's Chromium headless,
// open the offline page, record every network request, run the CLI.
import { chromium } from 'playwright-core';
import { execFileSync } from 'node:child_process';
import { mkdirSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));
const root = resolve(here, '..', '..');
export const PAGE = process.env.MAGWRIGHT_PAGE || join(root, 'dist', 'magwright.html');
export const CLI = process.env.MAGWRIGHT_CLI || join(root, 'target', 'release', 'magwright');
export const OUT = join(here, 'output');
mkdirSync(OUT, { recursive: true });

export async function launch() {
  return chromium.launch({
    executablePath: process.env.CHROMIUM || '/usr/bin/chromium',
    args: [
      '--no-sandbox', '--headless', '--disable-gpu', '--disable-quic', '--no-first-run',
      '--disable-background-networking', '--disable-component-update', '--disable-sync',
    ],
  });
}

// Opens the page from file:// in a fresh context (empty storage) and
// records requests other than the page itself.
export async function openPage(browser, { url = PAGE_URL, viewport = { width: 1280, height: 900 }, wait = '[data-testid="np"]' } = {}) {
  const context = await browser.newContext({ viewport, acceptDownloads: true });
  const { page, requests, errors } = await attach(context, url, { wait });
  return { context, page, requests, errors };
}

export const PAGE_URL = pathToFileURL(PAGE).href;

// A new page in an existing context (sharing its localStorage), recording
// requests (other than the page's own address, fragment aside) and errors.
export async function attach(context, url = PAGE_URL, { wait = '[data-testid="np"]', requests = [], errors = [] } = {}) {
  const page = await context.newPage();
  const base = url.split('#')[0];
  page.on('request', (r) => {
    const u = r.url();
    if (u.split('#')[0] !== base && !u.startsWith('data:') && !u.startsWith('blob:')) requests.push(u);
  });
  page.on('pageerror', (e) => errors.push(String(e)));
  page.on('console', (m) => { if (m.type() === 'error') errors.push(m.text()); });
  await page.goto(url);
  if (wait) await page.waitForSelector(wait, { timeout: 15000 });
  return { page, requests, errors };
}

// Runs the native CLI; returns parsed JSON.
export function cli(args, input) {
  const out = execFileSync(CLI, args, { input, encoding: 'utf8' });
  return JSON.parse(out);
}

// Runs the native CLI; returns its stdout as text.
export function cliText(args, input) {
  return execFileSync(CLI, args, { input, encoding: 'utf8' });
}

// The SI value the page shows for a result (its data-si attribute).
export async function shown(page, id) {
  const v = await page.getAttribute(`[data-testid="${id}"]`, 'data-si');
  if (v === null) throw new Error(`no value shown for ${id}`);
  return Number(v);
}

// Replaces a field's text by typing it with the keyboard, as a user would.
export async function typeInto(page, key, text) {
  const sel = `[id="f-${key}"]`;
  await page.click(sel, { clickCount: 3 });
  await page.keyboard.press('Control+A');
  await page.keyboard.press('Backspace');
  if (text.length) await page.keyboard.type(text, { delay: 15 });
}

export function close(a, b, rel = 1e-9) {
  return Math.abs(a - b) <= rel * Math.max(Math.abs(a), Math.abs(b), 1e-30);
}

// The text of every input and select of the form, by element id.
export async function formState(page) {
  // The own-core entries (f-cc-*) are a scratch pad that starts from the
  // core in use; they are not part of the design.
  return page.$$eval('main input[id^="f-"], main select[id^="f-"]',
    (els) => Object.fromEntries(els.filter((e) => !e.id.startsWith('f-cc-')).map((e) => [e.id, e.value])));
}

// Share of a canvas's pixels that are not white, and how many distinct colours.
export async function canvasInk(page, testid) {
  return page.$eval(`canvas[data-testid="${testid}"]`, (c) => {
    const d = c.getContext('2d').getImageData(0, 0, c.width, c.height).data;
    let ink = 0; const colours = new Set();
    for (let i = 0; i < d.length; i += 4) {
      if (d[i] < 245 || d[i + 1] < 245 || d[i + 2] < 245) ink++;
      if (i % 64 === 0) colours.add((d[i] >> 4) * 256 + (d[i + 1] >> 4) * 16 + (d[i + 2] >> 4));
    }
    return { ink: ink / (c.width * c.height), colours: colours.size };
  });
}

// The engine's report (native CLI) for the design the page has saved.
export async function engineFor(page) {
  const text = await page.evaluate(() => localStorage.getItem('magwright.design'));
  if (!text) throw new Error('the page saved no design');
  return { design: JSON.parse(text), report: cli(['evaluate', '-'], text) };
}

// Waits until the page's saved design satisfies `pred` (run here, in node:
// the page's CSP forbids evaluating strings). Each round waits for the
// stored text to change, never for a fixed time.
export async function waitSaved(page, pred, arg, timeout = 30000) {
  const end = Date.now() + timeout;
  for (;;) {
    const text = await page.evaluate(() => localStorage.getItem('magwright.design') || '{}');
    if (pred(JSON.parse(text), arg)) return;
    const left = end - Date.now();
    if (left <= 0) throw new Error(`waitSaved: the saved design did not satisfy ${pred} within ${timeout} ms`);
    await page
      .waitForFunction((t) => (localStorage.getItem('magwright.design') || '{}') !== t, text, { timeout: left })
      .catch(() => {});
  }
}

// Opens the file chooser of the button `testid` with the keyboard (focus,
// Space) and gives it `file`. The chooser is intercepted only once a
// listener is registered in the browser: one is registered for the page's
// life, with a round trip to the page, before the first Space (without it
// the chooser could open first and the wait time out under load).
export async function chooseWithKeyboard(page, testid, file) {
  if (!page.__chooserListener) {
    page.__chooserListener = () => {};
    page.on('filechooser', page.__chooserListener);
    await page.evaluate(() => true);
  }
  await page.focus(`[data-testid="${testid}"]`);
  await page.waitForFunction((t) => document.activeElement?.dataset?.testid === t, testid);
  const [chooser] = await Promise.all([page.waitForEvent('filechooser'), page.keyboard.press('Space')]);
  await chooser.setFiles(file);
}

// Waits for `n` rendered frames of the page (requestAnimationFrame): the
// condition "the page has drawn n times since", for checks that something
// did NOT happen (never a fixed sleep).
export async function frames(page, n = 2) {
  await page.evaluate((k) => new Promise((done) => {
    let i = 0;
    const step = () => (++i >= k ? done() : requestAnimationFrame(step));
    requestAnimationFrame(step);
  }), n);
}

// Waits until every canvas named has ink (the picture is drawn).
export async function drawn(page, ids, { timeout = 20000 } = {}) {
  await page.waitForFunction((list) => list.every((id) => {
    const c = document.querySelector(`canvas[data-testid="${id}"]`);
    if (!c || !c.width || !c.height) return false;
    const d = c.getContext('2d').getImageData(0, 0, c.width, c.height).data;
    let ink = 0;
    for (let i = 0; i < d.length; i += 16) if (d[i] < 245 || d[i + 1] < 245 || d[i + 2] < 245) ink++;
    return ink / (d.length / 16) > 0.02;
  }), ids, { timeout });
}

// Waits until a result shows a value other than `old`.
export async function waitChanged(page, id, old) {
  await page.waitForFunction(([i, v]) => { const e = document.querySelector(`[data-testid="${i}"]`); return e && e.dataset.si !== String(v); }, [id, old]);
}
