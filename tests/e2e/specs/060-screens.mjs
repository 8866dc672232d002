// Screenshots of the sheet at tablet (800×1280) and laptop (1440×900) sizes,
// in SI and US customary, light and dark, and a printout (PDF), saved under
// artifacts/e2e/ for people to look at.
import fs from 'node:fs';
import path from 'node:path';
import { launch, shot, assert, assertClean, openSheet, ARTIFACTS } from '../lib.mjs';

async function screens(name, opts, us = false) {
  const b = await launch(opts);
  try {
    const { page } = b;
    await openSheet(page);
    if (us) await page.locator('label[for=units-us]').click();
    await page.screenshot({ path: path.join(ARTIFACTS, `${name}-top.png`) });
    await shot(page, `${name}-full`);
    assertClean(b.log, name);
  } finally {
    await b.close();
  }
}

export const tests = {
  async 'tablet 800x1280, SI'() { await screens('sheet-800x1280-si', { viewport: { width: 800, height: 1280 } }); },
  async 'tablet 800x1280, US customary'() { await screens('sheet-800x1280-us', { viewport: { width: 800, height: 1280 } }, true); },
  async 'laptop 1440x900, SI'() { await screens('sheet-1440x900-si', { viewport: { width: 1440, height: 900 } }); },
  async 'laptop 1440x900, dark'() {
    await screens('sheet-1440x900-dark', { viewport: { width: 1440, height: 900 }, colorScheme: 'dark' });
  },

  async 'printout has no controls and opens every disclosure'() {
    const b = await launch({ viewport: { width: 800, height: 1280 } });
    try {
      const { page } = b;
      await openSheet(page);
      await page.emulateMedia({ media: 'print' });
      const hidden = await page.evaluate(() => ['.system-switch', '.qty', '.qty-unit']
        .map((s) => getComputedStyle(document.querySelector(s)).display));
      assert(hidden.every((d) => d === 'none'), `controls hidden in print: ${hidden}`);
      const printed = await page.locator('.field:has(#spring-rate) .qty-print').textContent();
      assert(printed.includes('0.25 N/mm'), `typed value printed as text: ${printed}`);
      const pdf = path.join(ARTIFACTS, 'sheet-a4.pdf');
      await page.pdf({ path: pdf, format: 'A4', printBackground: true });
      assert(fs.statSync(pdf).size > 10000, 'pdf written');
      const closed = await page.locator('details:not([open])').count();
      assert(closed === 0, `${closed} disclosures stayed closed in the printout`);
      assertClean(b.log, 'print');
    } finally {
      await b.close();
    }
  },
};
