// Keyboard only: load a demo, tab to a field, change its value, and open a
// figure's "How it is found", all without the mouse; focus is visible.
import { launch, assert, assertEq, assertClean, openSheet, settled } from '../lib.mjs';

async function tabTo(page, id, max = 400) {
  for (let i = 0; i < max; i += 1) {
    await page.keyboard.press('Tab');
    const at = await page.evaluate(() => document.activeElement?.id ?? '');
    if (at === id) return i + 1;
  }
  throw new Error(`never reached #${id} by Tab`);
}

export const tests = {
  async 'keyboard walkthrough of the ejector demo'() {
    const b = await launch();
    try {
      const { page } = b;
      await openSheet(page);
      await page.locator('body').focus();
      await tabTo(page, 'demo-pick');
      // Choose the ejector with the arrow keys, then Tab to Load and press Enter.
      for (let i = 0; i < 3; i += 1) await page.keyboard.press('ArrowDown');
      assertEq(await page.locator('#demo-pick').inputValue(), 'ejector', 'picked by keyboard');
      await page.keyboard.press('Tab');
      await page.keyboard.press('Enter');
      await settled(page);
      assert((await page.locator('.sheet-title').textContent()).includes('ejector'), 'ejector loaded');

      await tabTo(page, 'f-spring-model-rate');
      const outline = await page.evaluate(() => getComputedStyle(document.activeElement).outlineStyle);
      assert(outline !== 'none', `focus is visible (outline ${outline})`);
      await page.keyboard.press('Control+A');
      await page.keyboard.type('10 N/mm');
      await settled(page);
      // ½ · 10 000 N/m · (0.03 m)² = 4.5 J (Hooke's law, common practice).
      assertEq((await page.locator('#fig-energy-stored_latched .figure-value').textContent()).trim(), '4.5 J', 'figure follows');

      // On to the figure's disclosure: Tab reaches its summary, Enter opens it.
      await page.locator('#fig-energy-stored_latched summary').evaluate((s) => s.setAttribute('id', 'how-stored'));
      await tabTo(page, 'how-stored');
      await page.keyboard.press('Enter');
      const open = await page.locator('#fig-energy-stored_latched details').evaluate((d) => d.open);
      assert(open, 'opened by keyboard');
      assert((await page.locator('#fig-energy-stored_latched details').textContent()).includes('Method'), 'method shown');
      assertClean(b.log, 'keyboard');
    } finally {
      await b.close();
    }
  },
};
