// Units: the unit chooser rewrites only the unit of the typed text; the
// SI / US customary switch changes what figures are shown in, never what
// the user typed.
import { launch, assert, assertEq, assertClean, typeInto, openSheet, figureText } from '../lib.mjs';

export const tests = {
  async 'unit chooser keeps the number and the display switch keeps the typed text'() {
    const b = await launch();
    try {
      const { page } = b;
      await openSheet(page);
      await typeInto(page.locator('#spring-latched'), '7');
      // A bare number takes the field's unit (mm): the chooser shows it.
      const chosen = await page.locator('#spring-latched-unit').evaluate((s) => s.selectedOptions[0].textContent);
      assertEq(chosen.trim(), 'mm', 'bare number read in mm');
      await page.locator('#spring-latched-unit').selectOption({ label: 'in' });
      assertEq(await page.locator('#spring-latched').inputValue(), '7 in', 'unit part rewritten, number kept');
      // ½ · 250 N/m · (7 × 0.0254 m)² = 3.951605 J (Hooke's law; 1 in = 0.0254 m exactly, NIST SP 811 (2008) App. B.8).
      await page.waitForFunction(() =>
        document.querySelector('#fig-energy-stored_latched .figure-value')?.textContent.trim() === '3.952 J');

      await page.locator('label[for=units-us]').click();
      // 3.951605 J / (0.3048 m × 4.448 221 615 260 5 N) = 2.91455 ft·lbf (NIST SP 811 (2008) App. B.8, exact factors).
      await page.waitForFunction(() =>
        document.querySelector('#fig-energy-stored_latched .figure-value')?.textContent.trim() === '2.915 ft·lbf');
      assertEq(await page.locator('#spring-latched').inputValue(), '7 in', 'typed text unchanged by the switch');
      assertEq(await page.locator('#spring-rate').inputValue(), '0.25 N/mm', 'typed text unchanged by the switch');
      // 250 N/m / (4.448 221 615 260 5 N / 0.0254 m) = 1.42754 lbf/in (NIST SP 811 (2008) App. B.8).
      assertEq((await page.locator('#spring-rate-reads').textContent()).trim(), '= 1.428 lbf/in', 'reading in US units');
      assert((await page.locator('#plot-spring > svg').textContent()).includes('Deflection (in)'), 'plot axis in inches');
      assert((await page.locator('#check-guard-kinetic_energy .check-limit').textContent()).includes('ft·lbf'), 'limit in US units');

      await page.locator('label[for=units-si]').click();
      await page.waitForFunction(() =>
        document.querySelector('#fig-energy-stored_latched .figure-value')?.textContent.trim() === '3.952 J');
      assertClean(b.log, 'units');
    } finally {
      await b.close();
    }
  },

  async 'a unit from another kind is refused with a suggestion'() {
    const b = await launch();
    try {
      const { page } = b;
      await openSheet(page);
      await typeInto(page.locator('#limit-mount'), '50 lb');
      const msg = await page.locator('#limit-mount-error').textContent();
      assert(msg.includes('lbf'), `suggests pound-force: ${msg}`);
      const chosen = await page.locator('#limit-mount-unit').evaluate((s) => s.selectedOptions[0].textContent);
      assertEq(chosen.trim(), 'unit?', 'chooser says the unit is not one of this kind');
      await page.locator('#limit-mount-unit').selectOption({ label: 'lbf' });
      assertEq(await page.locator('#limit-mount').inputValue(), '50 lbf', 'fixed by choosing the unit');
      assertEq(await page.locator('#limit-mount').getAttribute('aria-invalid'), 'false', 'valid now');
      assertClean(b.log, 'units refused');
    } finally {
      await b.close();
    }
  },
};
