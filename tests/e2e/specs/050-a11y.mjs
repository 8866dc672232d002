// Accessibility audit with axe-core: no serious or critical violation on
// the tablet and laptop layouts, light and dark.
import { launch, assert, assertClean, openSheet, axeAudit } from '../lib.mjs';

const cases = [
  { width: 800, height: 1280, colorScheme: 'light' },
  { width: 1440, height: 900, colorScheme: 'light' },
  { width: 800, height: 1280, colorScheme: 'dark' },
];

export const tests = Object.fromEntries(cases.map((c) => [
  `axe finds no serious violation at ${c.width}x${c.height} ${c.colorScheme}`,
  async () => {
    const b = await launch({ viewport: { width: c.width, height: c.height }, colorScheme: c.colorScheme });
    try {
      const { page } = b;
      await openSheet(page);
      // Open one disclosure so its content is audited too.
      await page.locator('#fig-release-contact_speed summary').click();
      const { bad, all } = await axeAudit(page);
      if (all.length) console.log(`     axe (${c.width} ${c.colorScheme}): ${all.map((v) => `${v.id}/${v.impact}×${v.nodes}`).join(', ')}`);
      assert(bad.length === 0, `serious/critical: ${JSON.stringify(bad, null, 1)}`);
      assertClean(b.log, 'axe');
    } finally {
      await b.close();
    }
  },
]));
