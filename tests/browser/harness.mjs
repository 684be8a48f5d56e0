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

// Opens the page from file:// and records requests other than the page itself.
export async function openPage(browser, { url = pathToFileURL(PAGE).href, viewport = { width: 1280, height: 900 } } = {}) {
  const context = await browser.newContext({ viewport });
  const page = await context.newPage();
  const requests = [];
  const errors = [];
  page.on('request', (r) => {
    const u = r.url();
    if (u !== url && !u.startsWith('data:') && !u.startsWith('blob:')) requests.push(u);
  });
  page.on('pageerror', (e) => errors.push(String(e)));
  page.on('console', (m) => { if (m.type() === 'error') errors.push(m.text()); });
  await page.goto(url);
  await page.waitForSelector('[data-testid="np"]', { timeout: 15000 });
  return { context, page, requests, errors };
}

// Runs the native CLI; returns parsed JSON.
export function cli(args, input) {
  const out = execFileSync(CLI, args, { input, encoding: 'utf8' });
  return JSON.parse(out);
}

// The SI value the page shows for a result (its data-si attribute).
export async function shown(page, id) {
  const v = await page.getAttribute(`[data-testid="${id}"]`, 'data-si');
  if (v === null) throw new Error(`no value shown for ${id}`);
  return Number(v);
}

// Replaces a field's text by typing it with the keyboard, as a user would.
export async function typeInto(page, key, text) {
  const sel = `#f-${key}`;
  await page.click(sel, { clickCount: 3 });
  await page.keyboard.press('Control+A');
  await page.keyboard.press('Backspace');
  if (text.length) await page.keyboard.type(text, { delay: 15 });
}

export function close(a, b, rel = 1e-9) {
  return Math.abs(a - b) <= rel * Math.max(Math.abs(a), Math.abs(b), 1e-30);
}
