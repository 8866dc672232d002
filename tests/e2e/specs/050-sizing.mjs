// Buffer sizing view: the limits, the duty, and for each buffer type the
// stroke, rate or force level needed with its margins, or why none can.
import { launch, shot, assert, assertClean, typeInto, openSheet, loadDemo, settled, fieldId } from '../lib.mjs';

const TYPES = ['linear_spring', 'power_law', 'constant_force', 'orifice', 'gas_spring'];

export const tests = {
  async 'carriage stop: every buffer type with its design or its reasons; more stroke makes a spring feasible'() {
    const b = await launch({ viewport: { width: 1440, height: 900 } });
    try {
      const { page } = b;
      await openSheet(page);
      await loadDemo(page, 'carriage-stop');
      await page.locator('#show-sizing').click();
      const duty = await page.locator('#sizing-results .duty').textContent();
      assert(duty.includes('Impact speed') && duty.includes('m/s'), `duty: ${duty}`);
      for (const t of TYPES) {
        const art = page.locator(`#sizing-${t}`);
        assert(await art.count() === 1, `${t} shown`);
        const text = await art.textContent();
        assert(text.includes('Can meet the limits') || text.includes('No buffer of this type meets the limits'), `${t} says whether it can: ${text.slice(0, 120)}`);
      }
      // 60 mm is too short for a linear spring at a 5 kN peak force; 150 mm is not.
      assert(await page.locator('#sizing-linear_spring .sizing-reasons').count() === 1, 'linear spring: reasons');
      assert((await page.locator('#sizing-linear_spring').textContent()).includes('shorter than'), 'says the stroke is too short');
      await typeInto(page.locator(fieldId('sizing.stroke')), '150 mm');
      await settled(page);
      await page.locator('#sizing-linear_spring .sizing-table').first().waitFor();
      const table = await page.locator('#sizing-linear_spring').textContent();
      assert(table.includes('Required buffer stroke') && table.includes('Spring rate') && table.includes('within limit'), `design with margins: ${table.slice(0, 300)}`);
      await shot(page, 'sizing-1440x900');
      assertClean(b.log, 'sizing');
    } finally {
      await b.close();
    }
  },

  async 'ejector: sizing asked for on the spot'() {
    const b = await launch();
    try {
      const { page } = b;
      await openSheet(page);
      await loadDemo(page, 'ejector');
      await page.locator('#show-sizing').click();
      assert((await page.locator('#sizing-results').textContent()).includes('Size a buffer'), 'says how to start');
      await page.locator('#f-sizing-on').check();
      await typeInto(page.locator(fieldId('sizing.peak_force')), '500 N');
      await settled(page);
      await page.locator('#sizing-linear_spring').waitFor();
      assertClean(b.log, 'ejector sizing');
    } finally {
      await b.close();
    }
  },
};
