// Plots: SVG with role=img, a title and a description of the data, text
// readable on a tablet (>= 14 px as rendered), axis units following the
// display system.
import { launch, assert, assertClean, openSheet } from '../lib.mjs';

export const tests = {
  async 'plots are described, readable and follow the unit system'() {
    const b = await launch({ viewport: { width: 800, height: 1280 } });
    try {
      const { page } = b;
      await openSheet(page);
      for (const id of ['plot-spring', 'plot-position', 'plot-speed', 'plot-force', 'plot-study', 'plot-margins']) {
        const svg = page.locator(`#${id} > svg`);
        assert((await svg.getAttribute('role')) === 'img', `${id} role`);
        const title = await svg.locator('title').textContent();
        const desc = await svg.locator('desc').textContent();
        assert(title.length > 5 && desc.length > 20, `${id} title/desc: ${title} / ${desc}`);
        assert(!desc.includes('NaN') && !(await svg.textContent()).includes('NaN'), `${id} no NaN`);
        const px = await svg.evaluate((el) => {
          const t = el.querySelector('text.tick, text.label');
          const scale = el.getBoundingClientRect().width / el.viewBox.baseVal.width;
          return parseFloat(getComputedStyle(t).fontSize) * scale;
        });
        assert(px >= 14, `${id}: text renders at ${px.toFixed(1)} px`);
      }
      const desc = await page.locator('#plot-spring desc').textContent();
      assert(desc.includes('Shaded between') && desc.includes('energy released'), desc);
      assert((await page.locator('#plot-spring > svg .shade-tint').count()) === 1, 'stored-energy area shaded');
      assert((await page.locator('#plot-spring > svg .marker-dot').count()) === 2, 'latched and released states marked');
      await page.locator('label[for=units-us]').click();
      await page.waitForFunction(() => document.querySelector('#plot-force svg')?.textContent.includes('Force (lbf)'));
      assertClean(b.log, 'plots');
    } finally {
      await b.close();
    }
  },
};
