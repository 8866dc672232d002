// The first vertical slice: type a rate and two deflections with units, read
// the stored energy, enter bad input and see the message at the field.
import { BASE_URL, launch, shot, assert, assertEq, assertClean, typeInto } from '../lib.mjs';

export const tests = {
  async 'energy follows typed input and bad input is named at the field'() {
    const b = await launch();
    try {
      const { page } = b;
      await page.goto(BASE_URL);
      await page.locator('#energy').waitFor({ timeout: 20000 });
      await typeInto(page.locator('#rate'), '2,5 N/mm');
      await typeInto(page.locator('#x-latched'), '2 in');
      await typeInto(page.locator('#x-released'), '10 mm');
      // ½·2.5 N/mm·((50.8 mm)² − (10 mm)²) = 3.1008 J (Hooke's law; 1 in = 25.4 mm exactly, NIST SP 811)
      await page.waitForFunction(() => document.querySelector('#energy')?.textContent === '3.101 J');
      await typeInto(page.locator('#rate'), '1,200 N/mm');
      await page.locator('#rate-error').filter({ hasText: '1200' }).waitFor();
      assert((await page.locator('#energy').textContent()).startsWith('Cannot compute'), 'figure says why it is missing');
      assertEq(await page.locator('#rate').inputValue(), '1,200 N/mm', 'typed text kept');
      await shot(page, 'slice-800');
      assertClean(b.log, 'slice');
    } finally {
      await b.close();
    }
  },
};
