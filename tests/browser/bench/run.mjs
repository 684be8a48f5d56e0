// The browser side of `scripts/bench` (a benchmark, not a test: no timing
// ever goes into a test). It
//  1. opens the throwaway wasm benchmark page (tools/bench-wasm bundled into
//     template.html) in headless Chromium and collects its JSON: the same
//     design workloads the native benchmark times, timed with
//     performance.now() inside the page;
//  2. opens dist/magwright.html from file:// and measures page load to ready
//     and edit-to-render (a real keystroke into a field until the results
//     and the plots are updated);
//  3. reads the native benchmark's JSON and prints one table with the
//     wasm/native ratios and every target, met or missed.
//
// node tests/browser/bench/run.mjs --native native.json --wasm-page bench.html
//   [--page dist/magwright.html] [--scale 1] [--edits 20] [--loads 5] [--out results.json]
//   [--load-start L]  (the 1-minute load average before the native run, for the report)
//
// How the page is measured (an init script, instrument() below, runs before
// the page's own scripts):
//  * canvas drawing calls (stroke, fill, fillText, ...) are wrapped to record
//    the time of the last one; a MutationObserver records the time of the
//    last DOM change; a capturing keydown listener records the keystroke's
//    event.timeStamp (when the browser received the key);
//  * edit-to-render = last DOM change or canvas draw caused by the keystroke
//    minus the keystroke's timestamp: the main-thread work that must fit in
//    one 16 ms frame. The first animation frame after it is shown too
//    (informational: it includes waiting for the next vsync). The
//    frequency sweep is not part of it: it runs in slices after the
//    keystroke's frame, and the keystroke's own changes are those before its
//    figure's data-sweep-ready turns "true" again;
//  * keystroke to sweep drawn = the last change or draw once that run has
//    ended (the sweep drawn for the value typed) minus the keystroke's
//    timestamp (informational, median and worst);
//  * ready = navigation start (performance.now() = 0) to the first results
//    in the DOM and the first plot drawn, whichever is later.
import { launch } from '../harness.mjs';
import { readFileSync, statSync, writeFileSync } from 'node:fs';
import { gzipSync } from 'node:zlib';
import { cpus, loadavg } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));
const root = resolve(here, '..', '..', '..');

function options(argv) {
  const o = {
    native: null, wasmPage: null, page: join(root, 'dist', 'magwright.html'), scale: 1, edits: 20, loads: 5, out: null,
    loadStart: null,
    field: process.env.BENCH_FIELD || 'frequency', result: process.env.BENCH_RESULT || '[data-si]',
  };
  for (let i = 2; i < argv.length; i += 2) {
    const k = argv[i].replace(/^--/, '').replace(/-([a-z])/g, (_, c) => c.toUpperCase());
    if (!(k in o) || argv[i + 1] === undefined) throw new Error(`unknown or incomplete option ${argv[i]}`);
    o[k] = ['scale', 'edits', 'loads', 'loadStart'].includes(k) ? Number(argv[i + 1]) : argv[i + 1];
  }
  if (!o.native || !o.wasmPage) throw new Error('need --native FILE and --wasm-page FILE');
  return o;
}

// Rejects as soon as the page reports an error, so a trap does not hang us.
function watchErrors(page) {
  const errors = [];
  let fail;
  const failed = new Promise((_, reject) => { fail = reject; });
  failed.catch(() => {});
  page.on('pageerror', (e) => { errors.push(String(e)); fail(new Error(`page error: ${e}`)); });
  page.on('console', (m) => {
    if (m.type() === 'error') { errors.push(m.text()); fail(new Error(`console error: ${m.text()}`)); }
    else if (m.text().startsWith('wasm: ')) process.stderr.write(`${m.text()}\n`);
  });
  return { errors, failed };
}

async function wasmSamples(browser, file, scale) {
  const context = await browser.newContext();
  const page = await context.newPage();
  const { failed } = watchErrors(page);
  await page.goto(`${pathToFileURL(resolve(file)).href}?scale=${scale}`, { waitUntil: 'commit' });
  const done = page.waitForFunction(() => document.getElementById('out')?.dataset.done === '1', null,
    { timeout: 900_000, polling: 500 });
  await Promise.race([done, failed]);
  const json = JSON.parse(await page.textContent('#out'));
  await context.close();
  return json;
}

// Runs in the page before its own scripts (see the header comment).
function instrument(resultSelector) {
  const mw = { lastMut: 0, lastDraw: 0, draws: 0, firstResult: null, firstDraw: null, key: null, frame: null, changes: [], sweepDone: null, rafs: [] };
  window.__mwBench = mw;
  // The start of every animation-frame callback (the sweep's slices run in them).
  const raf = window.requestAnimationFrame.bind(window);
  window.requestAnimationFrame = (cb) => raf((ts) => {
    if (mw.rafs.length < 100000) mw.rafs.push(performance.now());
    return cb(ts);
  });
  const P = CanvasRenderingContext2D.prototype;
  for (const name of ['clearRect', 'fillRect', 'strokeRect', 'fill', 'stroke', 'fillText', 'strokeText', 'drawImage', 'putImageData']) {
    const orig = P[name];
    if (typeof orig !== 'function') continue;
    P[name] = function (...a) {
      const t = performance.now();
      mw.lastDraw = t;
      if (mw.changes.length < 100000) mw.changes.push(t);
      mw.draws += 1;
      if (mw.firstDraw === null) mw.firstDraw = t;
      return orig.apply(this, a);
    };
  }
  new MutationObserver((records) => {
    const t = performance.now();
    // The sweep's run ended: its figure says its sweep is current again.
    if (records.some((r) => r.attributeName === 'data-sweep-ready' && r.target.dataset.sweepReady === 'true')) mw.sweepDone = t;
    mw.lastMut = t;
    if (mw.changes.length < 100000) mw.changes.push(t);
    if (mw.firstResult === null && document.querySelector(resultSelector)) mw.firstResult = t;
  }).observe(document, { subtree: true, childList: true, attributes: true, characterData: true });
  addEventListener('keydown', (e) => {
    mw.key = e.timeStamp;
    requestAnimationFrame(() => { mw.frame = performance.now(); });
  }, true);
}

async function openInstrumented(browser, url, o) {
  const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
  await context.addInitScript(instrument, o.result);
  const page = await context.newPage();
  const requests = [];
  page.on('request', (r) => { if (r.url() !== url && !/^(data|blob):/.test(r.url())) requests.push(r.url()); });
  const watch = watchErrors(page);
  await page.goto(url);
  const ready = page.waitForFunction(() => {
    const mw = window.__mwBench;
    const plot = document.querySelector('canvas');
    return mw.firstResult !== null && (plot === null || mw.firstDraw !== null)
      && performance.now() - Math.max(mw.lastMut, mw.lastDraw) > 100;
  }, null, { timeout: 30_000, polling: 50 });
  await Promise.race([ready, watch.failed]);
  const t = await page.evaluate(() => {
    const mw = window.__mwBench;
    return { ready: Math.max(mw.firstResult, mw.firstDraw ?? 0) };
  });
  return { context, page, requests, watch, ready: t.ready };
}

// The page's frequency sweep runs in slices after the keystroke
// (web/src/panels/sweep_run.rs): the first in the second animation frame
// after it, the rest as tasks of their own. It changes nothing in the DOM
// until its last slice (its figure's data-sweep-ready turns "true"): the
// changes before the last animation-frame callback that started before
// then belong to the keystroke itself.

const median = (xs) => { const s = [...xs].sort((a, b) => a - b); const m = s.length >> 1; return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2; };

async function pageTimings(browser, o) {
  const url = pathToFileURL(resolve(o.page)).href;
  const loads = [];
  let last = null; // the last load stays open for the edits
  for (let i = 0; i < Math.max(1, o.loads); i++) {
    if (last) await last.context.close();
    last = await openInstrumented(browser, url, o);
    loads.push(last.ready);
  }
  const { context, page, requests, watch } = last;
  // The field to edit: #f-<field>, else the first field whose text starts with a digit 1-9.
  const sel = await page.evaluate((key) => {
    const pick = (el) => el && /^[1-9]/.test(el.value) ? `#${el.id}` : null;
    return pick(document.getElementById(`f-${key}`))
      ?? [...document.querySelectorAll('input[id^="f-"]')].map(pick).find(Boolean) ?? null;
  }, o.field);
  if (!sel) throw new Error(`no field #f-${o.field} (nor any f-* field starting with a digit) to edit`);
  const original = await page.inputValue(sel);
  const digits = [original[0] === '1' ? '2' : '1', original[0]];
  const edits = [];
  const sweeps = [];
  const frames = [];
  for (let i = 0; i < o.edits + 2; i++) {
    const digit = digits[i % 2];
    const before = await page.evaluate((s) => [...document.querySelectorAll(s)].map((e) => e.getAttribute('data-si') ?? e.textContent).join('|'), o.result);
    await page.evaluate((s) => {
      const el = document.querySelector(s);
      el.focus();
      el.setSelectionRange(0, 1);
      Object.assign(window.__mwBench, { lastMut: 0, lastDraw: 0, draws: 0, key: null, frame: null, changes: [], sweepDone: null, rafs: [] });
    }, sel);
    await page.keyboard.type(digit); // one real keystroke: keydown, input, keyup
    const settled = page.waitForFunction(() => {
      const mw = window.__mwBench;
      const sweep = document.querySelector('[data-testid="sweep-figure"]') === null || mw.sweepDone !== null;
      return sweep && mw.key !== null && mw.frame !== null && performance.now() - Math.max(mw.key, mw.lastMut, mw.lastDraw) > 150;
    }, null, { timeout: 10_000, polling: 20 });
    await Promise.race([settled, watch.failed]);
    const r = await page.evaluate((s) => {
      const mw = window.__mwBench;
      const after = [...document.querySelectorAll(s)].map((e) => e.getAttribute('data-si') ?? e.textContent).join('|');
      const plot = document.querySelector('canvas');
      return { ...mw, after, plot: plot !== null && plot.offsetParent !== null };
    }, o.result);
    const value = await page.inputValue(sel);
    const want = digit + original.slice(1);
    if (value !== want) throw new Error(`typing into ${sel} gave "${value}", expected "${want}"`);
    if (r.after === before) throw new Error(`editing ${sel} to "${value}" did not change the results`);
    if (r.plot && r.draws === 0) throw new Error(`editing ${sel} to "${value}" did not redraw the plot`);
    if (i < 2) continue; // warm-up edits (first compilation tiers) are not counted
    const done = Math.max(r.lastMut, r.lastDraw);
    // What the keystroke itself renders is everything before the frame
    // callback in which the sweep's run ended (the last one to start before
    // its figure turned ready; the observer sees that only after the
    // callback's own drawing); the sweep is drawn for this value by the
    // last change.
    const end = r.sweepDone === null ? Infinity : Math.max(r.key, ...r.rafs.filter((t) => t <= r.sweepDone));
    const immediate = Math.max(r.key, ...r.changes.filter((t) => t < end));
    edits.push(immediate - r.key);
    if (r.sweepDone !== null) sweeps.push(done - r.key);
    if (r.frame >= immediate) frames.push(r.frame - r.key);
  }
  const { errors } = watch;
  await context.close();
  return { loads, edits, sweeps, frames, field: sel, original, requests, errors };
}

function fmt(t) {
  if (!Number.isFinite(t)) return '—';
  if (t < 1e-3) return `${(t * 1e6).toFixed(1)} µs`;
  if (t < 1) return `${(t * 1e3).toFixed(t < 10e-3 ? 2 : 1)} ms`;
  return `${t.toFixed(2)} s`;
}
const pad = (s, n) => String(s).padEnd(n);
const lpad = (s, n) => String(s).padStart(n);
const verdict = (ok) => (ok ? 'met' : 'MISSED');

async function main() {
  const o = options(process.argv);
  const loadAtStart = loadavg()[0];
  const native = JSON.parse(readFileSync(o.native, 'utf8'));
  const browser = await launch();
  const version = browser.version();
  process.stderr.write('wasm: running the design workloads in Chromium\n');
  const wasm = await wasmSamples(browser, o.wasmPage, o.scale);
  process.stderr.write('page: load to ready, edit to render\n');
  const pg = await pageTimings(browser, o);
  await browser.close();
  const html = readFileSync(o.page);
  const size = statSync(o.page).size;
  const gz = gzipSync(html, { level: 9 }).length;

  const limits = { evaluate: 100e-6, sweep: 1.5e-3, optimise: 1 };
  const targetText = { evaluate: '< 100 µs', sweep: '< 1.5 ms', optimise: '< 1 s' };
  const label = { evaluate: 'evaluate', sweep: '200-point sweep', optimise: 'optimiser, library' };
  const rows = native.samples.map((n) => {
    const w = wasm.samples.find((x) => x.workload === n.workload && x.demo === n.demo);
    if (!w) throw new Error(`wasm run lacks ${n.workload} ${n.demo}`);
    const ratio = w.best_s / n.best_s;
    return { workload: n.workload, demo: n.demo, native: n.best_s, wasm: w.best_s, ratio, note: n.note,
      target: targetText[n.workload], nativeMet: n.best_s < limits[n.workload], ratioMet: ratio <= 2 };
  });

  // Other work on the machine slows one side more than the other: say so.
  const cores = cpus().length;
  const load = [o.loadStart ?? loadAtStart, loadAtStart, loadavg()[0]].filter(Number.isFinite);
  const lines = [];
  lines.push(`load average (1 min) ${load.map((l) => l.toFixed(1)).join(' → ')} on ${cores} cores${
    Math.max(...load) > 0.75 * cores ? ': the machine was busy, figures (above all the ratios) are unreliable' : ''}`);
  lines.push(`native: ${native.platform}, release profile · wasm: ${wasm.platform}, wasm profile, Chromium ${version} headless`);
  lines.push('engine workloads (best batch mean per call; absolute targets on native, and wasm within 2× of native)');
  lines.push(`${pad('workload', 30)}${lpad('native', 10)}${lpad('wasm', 11)}${lpad('wasm/native', 13)}  ${pad('target', 9)}${pad('native', 8)}${pad('≤ 2×', 8)}note`);
  for (const r of rows) {
    lines.push(`${pad(`${label[r.workload]} ${r.demo}`, 30)}${lpad(fmt(r.native), 10)}${lpad(fmt(r.wasm), 11)}${lpad(`${r.ratio.toFixed(2)}×`, 13)}  ${pad(r.target, 9)}${pad(verdict(r.nativeMet), 8)}${pad(verdict(r.ratioMet), 8)}${r.note}`);
  }
  const edit = median(pg.edits);
  const ready = median(pg.loads);
  const pageRows = [
    [`edit to render (${pg.field} ${pg.original}, ${pg.edits.length} keystrokes)`,
      `median ${fmt(edit / 1e3)}, worst ${fmt(Math.max(...pg.edits) / 1e3)}`, '≤ 16 ms', verdict(edit <= 16)],
    ['  last keystroke to sweep drawn for its value (info)',
      `median ${fmt(median(pg.sweeps) / 1e3)}, worst ${fmt(Math.max(...pg.sweeps) / 1e3)}`, '', ''],
    [`page load to ready (${pg.loads.length} loads)`, `median ${fmt(ready / 1e3)}, worst ${fmt(Math.max(...pg.loads) / 1e3)}`, '< 1 s', verdict(ready < 1000)],
    ['single file dist/magwright.html', `${(size / 1e6).toFixed(2)} MB (${Math.round(gz / 1e3)} kB gzipped)`, '< 2 MB', verdict(size < 2e6)],
  ];
  lines.push('');
  lines.push('page (dist/magwright.html from file://)');
  for (const [a, b, c, d] of pageRows) lines.push(`${pad(a, 52)}${pad(b, 34)}${pad(c, 10)}${d}`);
  if (pg.requests.length) lines.push(`note: the page made network requests: ${pg.requests.join(', ')}`);
  if (pg.errors.length) lines.push(`note: page errors: ${pg.errors.join('; ')}`);
  const missed = rows.filter((r) => !r.nativeMet || !r.ratioMet).length + pageRows.filter((r) => r[3] === 'MISSED').length;
  lines.push('');
  lines.push(missed ? `${missed} row(s) miss a target` : 'every target met');
  console.log(lines.join('\n'));

  if (o.out) {
    writeFileSync(o.out, JSON.stringify({ chromium: version, native, wasm, rows, page: { ...pg, size, gzipped: gz } }, null, 2));
  }
}

main().catch((e) => { console.error(`bench: ${e.message}`); process.exit(1); });
