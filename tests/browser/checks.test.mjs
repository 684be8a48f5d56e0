// The energy-balance and material-range checks on the page: shown with
// their margins like every other check and equal to the CLI's; the loss
// share typed in the form fails the loss budget; a frequency far above the
// material's data fails the range check. No network.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { join } from 'node:path';
import { launch, openPage, typeInto, close, engineFor, waitSaved, OUT } from './harness.mjs';

let browser;
before(async () => { browser = await launch(); });
after(async () => { await browser?.close(); });

// Each check row of the page against the CLI's report for the saved design.
async function checksMatchCli(page) {
  const { report } = await engineFor(page);
  for (const key of ['loss_budget', 'material_range']) {
    const c = report.checks.find((k) => k.key === key);
    assert.ok(c, `the engine reports ${key}`);
    const row = `[data-testid="check-${key}"]`;
    await page.waitForSelector(row);
    assert.equal(await page.getAttribute(row, 'data-pass'), String(c.pass), `${key} pass`);
    const margin = Number(await page.getAttribute(`[data-testid="margin-${key}"]`, 'data-si'));
    assert.ok(close(margin, c.margin, 1e-6), `${key}: margin ${margin} vs ${c.margin}`);
  }
  return report;
}

test('loss budget and material range: shown with margins, the share typed, a frequency far outside the data', async () => {
  const { context, page, requests, errors } = await openPage(browser);
  const first = await checksMatchCli(page);
  assert.ok(first.pass, 'the demo passes');

  // A share below the magnetic's actual share of Pin − Pout fails the budget.
  const budget = first.power.input - first.power.output;
  // The field is in per cent: half the magnetic's actual share.
  const pct = (50 * first.losses.total / budget).toFixed(2);
  await typeInto(page, 'choices.magnetic_loss_share', `${pct}%`);
  await waitSaved(page, (d, a) => Math.abs(d.choices.magnetic_loss_share - a) < 1e-12, Number(pct) / 100);
  await page.waitForFunction(() => document.querySelector('[data-testid="check-loss_budget"]')?.dataset.pass === 'false');
  const tight = await checksMatchCli(page);
  assert.equal(tight.checks.find((k) => k.key === 'loss_budget').pass, false);
  assert.match(await page.textContent('[data-testid="verdict"]'), /^Fails 1 check — Loss budget share/);
  await page.locator('[data-testid="panel-results"]').screenshot({ path: join(OUT, 'checks-loss-budget.png') });

  // Back to the default share; 5.1 MHz is 17 × the material's top frequency.
  await typeInto(page, 'choices.magnetic_loss_share', '50%');
  await typeInto(page, 'frequency', '5.1M');
  await waitSaved(page, (d) => d.spec.frequency === 5.1e6 && (d.choices.magnetic_loss_share ?? 0.5) === 0.5);
  await page.waitForFunction(() => document.querySelector('[data-testid="check-material_range"]')?.dataset.pass === 'false');
  const far = await checksMatchCli(page);
  const range = far.checks.find((k) => k.key === 'material_range');
  assert.ok(close(range.value, 17, 1e-9), `factor ${range.value}`);
  assert.match(await page.textContent('[data-testid="check-material_range"]'), /×17\.00/);
  await page.locator('[data-testid="panel-results"]').screenshot({ path: join(OUT, 'checks-material-range.png') });
  assert.deepEqual(requests, []);
  assert.deepEqual(errors, []);
  await context.close();
});
