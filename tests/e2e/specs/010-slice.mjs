// The sheet's first promise: type a number with a unit and the figures
// follow; bad input is named at the field, the typed text is kept, and the
// figures that depend on it say why they are missing.
import { launch, shot, assert, assertEq, assertClean, typeInto, openSheet, figureText } from '../lib.mjs';

export const tests = {
  async 'energy follows typed input and bad input is named at the field'() {
    const b = await launch();
    try {
      const { page } = b;
      await openSheet(page);
      // ½·k·x² = ½ · 0.25 N/mm · (180 mm)² = 4.05 J (Hooke's law, exact).
      assertEq(await figureText(page, 'fig-energy-stored_latched'), '4.05 J', 'demo stored energy');
      await typeInto(page.locator('#spring-rate'), '2,5 N/mm');
      // ½ · 2500 N/m · (0.18 m)² = 40.5 J (Hooke's law, exact); decimal comma accepted.
      await page.waitForFunction(() =>
        document.querySelector('#fig-energy-stored_latched .figure-value')?.textContent.trim() === '40.5 J');
      await typeInto(page.locator('#spring-rate'), '1,200 N/mm');
      await page.locator('#spring-rate-error').filter({ hasText: '1200' }).waitFor();
      assertEq(await page.locator('#spring-rate').getAttribute('aria-invalid'), 'true', 'marked invalid');
      const missing = await figureText(page, 'fig-energy-stored_latched');
      assert(missing.startsWith('Not computed') && missing.includes('Spring rate'), `says why: ${missing}`);
      assertEq(await page.locator('#spring-rate').inputValue(), '1,200 N/mm', 'typed text kept');
      const verdict = await page.locator('#overall .verdict-word').textContent();
      assertEq(verdict, 'cannot check', 'no figure, no verdict');
      assert(!(await page.locator('body').textContent()).includes('NaN'), 'never NaN');
      await shot(page, 'bad-input-800');
      assertClean(b.log, 'slice');
    } finally {
      await b.close();
    }
  },
};
