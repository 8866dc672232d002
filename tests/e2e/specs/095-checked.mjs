// "How figures are checked": the page lists every model and limit set with
// its checks, from the same catalogue as the tests and DEVELOPERS.md.
import fs from 'node:fs';
import path from 'node:path';
import { launch, assert, assertEq, assertClean, openSheet, ARTIFACTS } from '../lib.mjs';

export const tests = {
  async 'the checked view shows the same catalogue as DEVELOPERS.md'() {
    const dev = fs.readFileSync(path.resolve('DEVELOPERS.md'), 'utf8');
    const total = Number(dev.match(/\| \*\*total\*\* \| \*\*(\d+)\*\* \|/)[1]);
    const subjects = (dev.slice(dev.indexOf('## How the figures are checked')).match(/^#### /gm) ?? []).length;
    const b = await launch({ viewport: { width: 800, height: 1280 } });
    try {
      const { page } = b;
      await openSheet(page);
      await page.locator('#show-checked').click();
      await page.locator('#checked-total').waitFor();
      assertEq(Number((await page.locator('#checked-total').textContent()).trim()), total, 'checks in all');
      assertEq(await page.locator('.checked-subject').count(), subjects, 'models and limit sets');
      const first = page.locator('.checked-subject').first();
      await first.locator('summary').click();
      const rows = await first.locator('tbody tr').count();
      assert(rows > 0, 'the first model lists its checks');
      await page.screenshot({ path: path.join(ARTIFACTS, 'checked-800.png') });
      assertClean(b.log, 'checked view');
    } finally {
      await b.close();
    }
  },
};
