// Bad input is marked at the field with a message naming what is
// acceptable, the text typed is kept, the figures that depend on it say why
// they are missing (with a link to the field), everything else still
// computes, and nothing shows NaN.
import { launch, shot, assert, assertEq, assertClean, typeInto, openSheet, loadDemo, settled, fieldId, figureText } from '../lib.mjs';

export const tests = {
  async 'unreadable rate: message at the field, reason in the figures, the rest computed'() {
    const b = await launch();
    try {
      const { page } = b;
      await openSheet(page);
      await loadDemo(page, 'ejector');
      const rate = page.locator(fieldId('spring.model.rate'));
      await typeInto(rate, '1,200 N/mm');
      await settled(page);
      const msg = (await page.locator(`${fieldId('spring.model.rate')}-error`).textContent()).trim();
      assert(msg.length > 0, 'a message at the field');
      assertEq(await rate.getAttribute('aria-invalid'), 'true', 'marked invalid');
      assertEq(await rate.inputValue(), '1,200 N/mm', 'typed text kept');
      const missing = await figureText(page, 'fig-energy-stored_latched');
      assert(missing.startsWith('Not computed') && missing.includes('Spring rate'), `says why: ${missing}`);
      const link = page.locator('#fig-energy-stored_latched .figure-value a').first();
      assertEq(await link.getAttribute('href'), fieldId('spring.model.rate'), 'reason links to the field');
      assert((await page.locator('#problems').textContent()).includes('Spring rate'), 'listed in the inputs to fix');
      assert(!(await page.locator('body').textContent()).includes('NaN'), 'never NaN');
      await shot(page, 'bad-input-800');
      assertClean(b.log, 'bad rate');
    } finally {
      await b.close();
    }
  },

  async 'a value the core refuses: its message at the field, unrelated figures still computed'() {
    const b = await launch();
    try {
      const { page } = b;
      await openSheet(page);
      await loadDemo(page, 'carriage-stop');
      const before = await figureText(page, 'fig-impact-peak_force');
      const gap = fieldId('gap.geometry.gap_at_buffer_contact');
      await typeInto(page.locator(gap), '-5 mm');
      await settled(page);
      const msg = (await page.locator(`${gap}-error`).textContent()).trim();
      assert(msg.includes('zero or more'), `core's message at the field: ${msg}`);
      const closing = await figureText(page, 'fig-gap-closing_gap');
      assert(closing.startsWith('Not computed') && closing.includes('Gap at first buffer contact'), `gap needs it: ${closing}`);
      assertEq(await figureText(page, 'fig-impact-peak_force'), before, 'peak force still computed');
      // Corrected, the message goes and the figure comes back.
      await typeInto(page.locator(gap), '140 mm');
      await settled(page);
      assertEq((await page.locator(`${gap}-error`).textContent()).trim(), '', 'message gone');
      assert(!(await figureText(page, 'fig-gap-closing_gap')).startsWith('Not computed'), 'gap back');
      assertClean(b.log, 'core refusal');
    } finally {
      await b.close();
    }
  },

  async 'a blank assessment says what is needed and shows no NaN'() {
    const b = await launch();
    try {
      const { page } = b;
      await openSheet(page);
      await loadDemo(page, 'blank');
      assertEq(await page.locator(fieldId('part.mass')).inputValue(), '', 'blank');
      const problems = await page.locator('#problems').textContent();
      assert(problems.includes('Moving mass') && problems.includes('a value is required'), `lists what is needed: ${problems.slice(0, 200)}`);
      assert((await figureText(page, 'fig-energy-stored_latched')).startsWith('Not computed'), 'missing, with reasons');
      assertEq((await page.locator('#overall .verdict-word').textContent()).trim(), 'not applicable', 'no check applies yet');
      assert((await page.locator('#overall .counts').textContent()).includes('no limit set applies'), 'says no limit applies');
      assert(!(await page.locator('body').textContent()).includes('NaN'), 'never NaN');
      assertClean(b.log, 'blank');
    } finally {
      await b.close();
    }
  },
};
