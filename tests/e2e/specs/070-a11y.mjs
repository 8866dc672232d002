// Accessibility audit with axe-core of every view (assessment, buffer
// sizing, tolerance study) on the tablet and laptop layouts, light and
// dark: no serious or critical violation.
import { launch, assert, assertClean, openSheet, loadDemo, axeAudit } from '../lib.mjs';

const layouts = [
  { width: 800, height: 1280, colorScheme: 'light' },
  { width: 1440, height: 900, colorScheme: 'light' },
  { width: 800, height: 1280, colorScheme: 'dark' },
];
const views = ['assessment', 'sizing', 'study', 'checked'];

export const tests = Object.fromEntries(layouts.map((c) => [
  `axe finds no serious violation in any view at ${c.width}x${c.height} ${c.colorScheme}`,
  async () => {
    const b = await launch({ viewport: { width: c.width, height: c.height }, colorScheme: c.colorScheme });
    try {
      const { page } = b;
      await openSheet(page);
      await loadDemo(page, 'carriage-stop');
      // Open one disclosure and show the tolerance boxes so they are audited too.
      await page.locator('#fig-release-contact_speed summary').click();
      await page.locator('#f-show-tolerances').check();
      for (const v of views) {
        await page.locator(`#show-${v}`).click();
        if (v === 'study') await page.locator('#study-status', { hasText: /^Done in/ }).waitFor({ timeout: 60000 });
        if (v === 'checked') await page.locator('.checked-subject summary').first().click();
        const { bad, all } = await axeAudit(page);
        if (all.length) console.log(`     axe (${v} ${c.width} ${c.colorScheme}): ${all.map((x) => `${x.id}/${x.impact}×${x.nodes}`).join(', ')}`);
        assert(bad.length === 0, `${v}: serious/critical: ${JSON.stringify(bad, null, 1)}`);
      }
      assertClean(b.log, 'axe');
    } finally {
      await b.close();
    }
  },
]));
