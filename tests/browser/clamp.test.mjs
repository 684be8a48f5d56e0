// The leakage clamp and the conductor choice on the page: the flyback demo,
// opened from a file with the keyboard, shows the switch peak under the
// clamp and the clamp's loss, and explains each winding's conductor (the
// reason and the conductors weighed), all equal to the CLI's report for
// the same design file. A clamp voltage and a limit on wires in hand typed
// with the keyboard go into the saved design and come back as the CLI
// computes them. Nothing touches the network.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { launch, openPage, shown, close, engineFor, waitSaved, chooseWithKeyboard, cliText, OUT } from './harness.mjs';

let browser;
before(async () => { browser = await launch(); });
after(async () => { await browser?.close(); });

// As web/src/panels/windings.rs `slug`: "secondary 1" → "secondary-1".
const slug = (name) => name.replace(/[^A-Za-z0-9]/g, '-').toLowerCase();

// Replaces a field's text with the keyboard only: focus, select all, type.
async function typeKeys(page, key, text) {
  const sel = `[id="f-${key}"]`;
  await page.focus(sel);
  await page.keyboard.press('Control+A');
  await page.keyboard.press('Backspace');
  if (text.length) await page.keyboard.type(text, { delay: 15 });
}

async function sameClamp(page, r) {
  const c = r.clamp;
  assert.ok(c, 'the CLI report carries the clamp');
  assert.equal(c.kind, 'dissipative');
  for (const [id, v] of Object.entries({ 'clamp-switch-peak': c.switch_peak_voltage, 'clamp-loss': c.dissipation })) {
    const got = await shown(page, id);
    assert.ok(close(got, v), `${id}: page ${got} vs CLI ${v}`);
  }
  // The switch-voltage tile's caption names the clamp voltage of its corner.
  const at = c.corners.find((p) => p.corner === c.voltage_corner);
  const caption = await page.evaluate(() => document.querySelector('[data-testid="clamp-switch-peak"]').parentElement.textContent);
  assert.match(caption, /Vin \+ Vc/);
  assert.ok(at.clamp_voltage > at.reflected_voltage);
}

async function sameChoice(page, r) {
  for (const w of r.wires) {
    const s = slug(w.winding);
    assert.equal((await page.textContent(`[data-testid="choice-reason-${s}"]`)).trim(), w.reason, `${w.winding}: reason`);
    assert.equal(await page.getAttribute(`[data-testid="parallel-${s}"]`, 'data-si'), String(w.parallel));
    assert.ok(w.trials.length > 0, `${w.winding}: the CLI lists the trials`);
    const rows = await page.$$eval(`[data-testid="trials-${s}"] tbody tr`, (trs) => trs.map((tr) => {
      const td = [...tr.querySelectorAll('td')];
      return { chosen: tr.classList.contains('chosen'), conductor: td[1].textContent.trim(), parallel: Number(td[2].dataset.si), loss: Number(td[3].dataset.si), build: Number(td[5].dataset.si) };
    }));
    assert.equal(rows.length, w.trials.length, `${w.winding}: one row per trial`);
    w.trials.forEach((t, i) => {
      assert.equal(rows[i].chosen, t.chosen, `${w.winding} trial ${i}: chosen`);
      assert.equal(rows[i].conductor, t.conductor);
      assert.equal(rows[i].parallel, t.parallel);
      assert.ok(close(rows[i].loss, t.loss), `${w.winding} trial ${i}: loss ${rows[i].loss} vs ${t.loss}`);
      assert.ok(close(rows[i].build, t.build), `${w.winding} trial ${i}: build`);
    });
    assert.ok(rows[0].chosen, `${w.winding}: the chosen conductor first`);
  }
  const line = await page.textContent('[data-testid="interleave-choice"]');
  assert.ok(line.includes(r.winding_choice.interleave.replace(/_/g, ' ')), line);
}

test('the flyback demo shows its clamp and conductor choice as the CLI computes them', async () => {
  const { context, page, requests, errors } = await openPage(browser);
  mkdirSync(OUT, { recursive: true });
  const file = join(OUT, 'flyback-demo.json');
  writeFileSync(file, cliText(['demo', 'flyback']));
  await chooseWithKeyboard(page, 'open-file', file);
  await waitSaved(page, (d) => d.spec.topology === 'flyback');
  await page.waitForSelector('[data-testid="clamp-loss"]');
  await page.waitForSelector('[data-testid="conductor-choice"]');
  let { design, report: r } = await engineFor(page);
  assert.equal(design.choices.max_parallel, 6, 'the default in hand is saved');
  assert.equal(design.choices.clamp_voltage, null, 'no clamp voltage: the default 1.5 × Vr');
  assert.equal(r.clamp.default_voltage, true);
  await sameClamp(page, r);
  await sameChoice(page, r);
  await page.locator('[data-testid="conductor-choice"]').screenshot({ path: join(OUT, 'clamp-conductor-choice.png') });

  // A clamp voltage typed with the keyboard: twice the reflected voltage,
  // rounded up to whole volts.
  const vc = Math.ceil(2 * r.clamp.corners[0].reflected_voltage);
  await typeKeys(page, 'choices.clamp_voltage', String(vc));
  await waitSaved(page, (d, v) => d.choices.clamp_voltage === v, vc);
  ({ design, report: r } = await engineFor(page));
  assert.equal(r.clamp.default_voltage, false);
  assert.ok(r.clamp.corners.every((p) => p.clamp_voltage === vc));
  await page.waitForFunction((v) => Number(document.querySelector('[data-testid="clamp-switch-peak"]')?.dataset.si) === v, r.clamp.switch_peak_voltage);
  await sameClamp(page, r);

  // At most two wires in hand: the saved design says so, and the page's
  // conductors are the CLI's under that limit.
  await typeKeys(page, 'choices.max_parallel', '2');
  await waitSaved(page, (d) => d.choices.max_parallel === 2);
  ({ design, report: r } = await engineFor(page));
  assert.ok(r.wires.every((w) => w.parallel <= 2));
  await page.waitForFunction((want) => want.every(([s, t]) => document.querySelector(`[data-testid="choice-reason-${s}"]`)?.textContent.trim() === t),
    r.wires.map((w) => [slug(w.winding), w.reason]));
  await sameChoice(page, r);
  await page.screenshot({ path: join(OUT, 'clamp-flyback.png'), fullPage: true });
  assert.deepEqual(requests, []);
  assert.deepEqual(errors, []);
  await context.close();
});
