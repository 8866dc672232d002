// Typing: numbers with units by real key events, the unit chooser, and the
// SI / US customary switch, which changes what figures are shown in and
// never what the user typed.
import { launch, assert, assertEq, assertClean, typeInto, openSheet, loadDemo, waitFigure, settled, fieldId } from '../lib.mjs';

export const tests = {
  async 'a latched deflection typed in inches gives the closed-form energy in J and ft·lbf'() {
    const b = await launch();
    try {
      const { page } = b;
      await openSheet(page);
      await loadDemo(page, 'ejector');
      const latch = page.locator(fieldId('spring.mount.deflection_at_latch'));
      await typeInto(latch, '1.2 in');
      // ½ · 8000 N/m · (1.2 × 0.0254 m)² = 3.7161216 J (Hooke's law, common practice;
      // 1 in = 0.0254 m exactly, NIST SP 811 (2008) App. B.8).
      await waitFigure(page, 'fig-energy-stored_latched', '3.716 J');
      const chosen = await page.locator(`${fieldId('spring.mount.deflection_at_latch')}-unit`).evaluate((s) => s.selectedOptions[0].textContent.trim());
      assertEq(chosen, 'in', 'the chooser follows the typed unit');
      await page.locator('label[for=units-us]').click();
      // 3.7161216 J / (0.3048 m × 4.4482216152605 N) = 2.74088 ft·lbf (NIST SP 811 (2008) App. B.8, exact factors).
      await waitFigure(page, 'fig-energy-stored_latched', '2.741 ft·lbf');
      assertEq(await latch.inputValue(), '1.2 in', 'typed text unchanged by the switch');
      assertEq(await page.locator(fieldId('spring.model.rate')).inputValue(), '8 N/mm', 'typed text unchanged by the switch');
      // 8000 N/m / (4.4482216152605 N / 0.0254 m) = 45.6815 lbf/in (NIST SP 811 (2008) App. B.8).
      assertEq((await page.locator(`${fieldId('spring.model.rate')}-reads`).textContent()).trim(), '= 45.68 lbf/in', 'reading in US units');
      assert((await page.locator('#plot-spring > svg').textContent()).includes('Deflection (in)'), 'plot axis in inches');
      await page.locator('label[for=units-si]').click();
      await waitFigure(page, 'fig-energy-stored_latched', '3.716 J');
      assertClean(b.log, 'inches');
    } finally {
      await b.close();
    }
  },

  async 'the unit chooser rewrites only the unit and a unit of another kind is refused'() {
    const b = await launch();
    try {
      const { page } = b;
      await openSheet(page);
      await loadDemo(page, 'ejector');
      const rate = page.locator(fieldId('spring.model.rate'));
      await typeInto(rate, '8');
      await settled(page);
      await page.locator(`${fieldId('spring.model.rate')}-unit`).selectOption({ label: 'lbf/in' });
      assertEq(await rate.inputValue(), '8 lbf/in', 'unit part rewritten, number kept');
      // ½ · (8 × 175.126835 N/m) · (0.03 m)² = 0.630457 J (NIST SP 811 (2008) App. B.8: 1 lbf/in = 4.4482216152605 N / 0.0254 m).
      await waitFigure(page, 'fig-energy-stored_latched', '0.6305 J');
      await typeInto(rate, '8 kg');
      const msg = await page.locator(`${fieldId('spring.model.rate')}-error`).textContent();
      assert(msg.length > 10, `says what a spring rate is: ${msg}`);
      assertEq(await rate.getAttribute('aria-invalid'), 'true', 'marked invalid');
      const chosen = await page.locator(`${fieldId('spring.model.rate')}-unit`).evaluate((s) => s.selectedOptions[0].textContent.trim());
      assertEq(chosen, 'unit?', 'chooser says the unit is not one of this kind');
      assertClean(b.log, 'chooser');
    } finally {
      await b.close();
    }
  },

  async 'identity and choices are kept as typed'() {
    const b = await launch();
    try {
      const { page } = b;
      await openSheet(page);
      await typeInto(page.locator('#f-identity-title'), 'Hopper lid, line 2 ');
      await settled(page);
      assertEq((await page.locator('.sheet-title').textContent()), 'Hopper lid, line 2 ', 'title shown as typed');
      await page.locator('#f-contact-kind').selectOption({ label: 'An end-of-travel buffer' });
      await page.locator(fieldId('contact.law.rate')).waitFor();
      await page.locator('#f-contact-kind').selectOption({ label: 'A part of a person\'s body' });
      // The body region typed before comes back as it was.
      assertEq(await page.locator(fieldId('contact.area.length')).inputValue(), '80 mm', 'body inputs kept when switching back');
      // Loading a demo replaces the sheet; the assessment left comes back once asked.
      await loadDemo(page, 'ejector');
      assertEq(await page.locator('#f-identity-title').inputValue(), 'Part ejector, tray filler', 'demo loaded');
      await page.locator('#demo-undo').click();
      await settled(page);
      assertEq(await page.locator('#f-identity-title').inputValue(), 'Hopper lid, line 2 ', 'work brought back');
      assert(await page.locator('#demo-undo').isHidden(), 'only once');
      assertClean(b.log, 'identity');
    } finally {
      await b.close();
    }
  },
};
