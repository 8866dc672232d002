// The tolerance study runs in slices without freezing the page: progress
// is shown, then the percentiles, the exceedance probabilities with their
// intervals, the worst-case corners and the histogram; a change of input
// restarts it.
import { launch, shot, assert, assertEq, assertClean, typeInto, openSheet, loadDemo, settled, fieldId } from '../lib.mjs';

async function watchLongTasks(page) {
  await page.evaluate(() => {
    window.__longTasks = [];
    new PerformanceObserver((l) => l.getEntries().forEach((e) => window.__longTasks.push(e.duration)))
      .observe({ type: 'longtask', buffered: false });
  });
}

export const tests = {
  async 'carriage stop: Monte Carlo with progress, percentiles, exceedance and histogram'() {
    const b = await launch({ viewport: { width: 1440, height: 900 } });
    try {
      const { page } = b;
      await openSheet(page);
      await page.locator('#show-study').click();
      await watchLongTasks(page);
      await loadDemo(page, 'carriage-stop');
      // Progress is shown while it runs (the bar moves before the end).
      await page.waitForFunction(() => {
        const p = document.querySelector('#study-progress');
        return p && p.value > 0 && p.value < 1;
      }, null, { timeout: 10000 });
      await page.locator('#study-status', { hasText: /^Done in/ }).waitFor({ timeout: 60000 });
      assertEq(await page.locator('#study-progress').evaluate((p) => p.value), 1, 'progress complete');
      const status = await page.locator('#study-status').textContent();
      assert(status.includes('10000 Monte Carlo samples'), status);
      assert(await page.locator('#plot-study rect.bar').count() >= 5, 'histogram bars');
      const pct = await page.locator('#study-percentiles').textContent();
      for (const h of ['P50', 'P95', 'P99', 'Highest']) assert(pct.includes(h), `percentile column ${h}`);
      assert(pct.includes('Peak force per buffer'), 'headline figure listed');
      const ex = await page.locator('#study-exceedance').textContent();
      assert(ex.includes('Frame design load') && /\d %/.test(ex) && ex.includes(' to '), `exceedance with interval: ${ex.slice(0, 300)}`);
      assert((await page.locator('#study-worst').textContent()).includes('Highest found'), 'worst-case corners');
      const inputs = await page.locator('#study-inputs').textContent();
      assert(inputs.includes('Moving mass') && inputs.includes('Force at full stroke'), `inputs that vary: ${inputs.slice(0, 200)}`);
      const long = await page.evaluate(() => window.__longTasks);
      console.log(`     long tasks during the study: ${long.length}, longest ${Math.max(0, ...long).toFixed(0)} ms`);
      await shot(page, 'study-1440x900');

      // A change of input starts the study again.
      await page.locator('#show-assessment').click();
      await typeInto(page.locator(fieldId('part.mass')), '90 kg');
      await settled(page);
      await page.locator('#show-study').click();
      await page.locator('#study-status', { hasText: /^Done in/ }).waitFor({ timeout: 60000 });
      assert((await page.locator('#study-inputs').textContent()).includes('90 kg'), 'restarted with the new nominal');
      assertClean(b.log, 'study');
    } finally {
      await b.close();
    }
  },

  async 'guard door: worst-case corners only until the Monte Carlo is ticked; stop works'() {
    const b = await launch();
    try {
      const { page } = b;
      await openSheet(page);
      await page.locator('#show-study').click();
      await page.locator('#study-status', { hasText: /^Done in/ }).waitFor({ timeout: 30000 });
      assert((await page.locator('#study-results').textContent()).includes('Monte Carlo part is off'), 'says the Monte Carlo is off');
      assert((await page.locator('#plot-study').textContent()).length > 0, 'histogram frame says why it is empty');
      // Enough samples that the run outlasts the Stop click (10 000 can end
      // between Playwright's check that the button is enabled and the click).
      await typeInto(page.locator('#f-study-samples'), '100000');
      await page.locator('#f-study-monte_carlo').check();
      await settled(page);
      await page.locator('#study-status', { hasText: 'Running' }).waitFor({ timeout: 10000 });
      await page.locator('#study-stop').click();
      assert((await page.locator('#study-status').textContent()).includes('Stopped'), 'stopped');
      await page.locator('#study-restart').click();
      await page.locator('#study-status', { hasText: /^Done in/ }).waitFor({ timeout: 60000 });
      assert(await page.locator('#plot-study rect.bar').count() >= 5, 'histogram after the Monte Carlo');
      assertClean(b.log, 'guard door study');
    } finally {
      await b.close();
    }
  },
};
