// Screenshots of every view at tablet (800×1280) and laptop (1440×900)
// sizes, SI and US, light and dark, and a printout (PDF), saved under
// artifacts/e2e/ for people to look at.
import fs from 'node:fs';
import path from 'node:path';
import { launch, shot, assert, assertClean, openSheet, loadDemo, ARTIFACTS } from '../lib.mjs';

async function screens(name, opts, { us = false, demo = 'guard-door' } = {}) {
  const b = await launch(opts);
  try {
    const { page } = b;
    await openSheet(page);
    if (demo !== 'guard-door') await loadDemo(page, demo);
    if (us) await page.locator('label[for=units-us]').click();
    await page.screenshot({ path: path.join(ARTIFACTS, `${name}-top.png`) });
    await shot(page, `${name}-full`);
    for (const v of ['sizing', 'study']) {
      await page.locator(`#show-${v}`).click();
      if (v === 'study') await page.locator('#study-status', { hasText: /^Done in/ }).waitFor({ timeout: 60000 });
      await page.screenshot({ path: path.join(ARTIFACTS, `${name}-${v}.png`) });
    }
    assertClean(b.log, name);
  } finally {
    await b.close();
  }
}

export const tests = {
  async 'tablet 800x1280, SI'() { await screens('sheet-800x1280-si', { viewport: { width: 800, height: 1280 } }); },
  async 'tablet 800x1280, US customary, carriage stop'() {
    await screens('sheet-800x1280-us', { viewport: { width: 800, height: 1280 } }, { us: true, demo: 'carriage-stop' });
  },
  async 'laptop 1440x900, SI, carriage stop'() {
    await screens('sheet-1440x900-si', { viewport: { width: 1440, height: 900 } }, { demo: 'carriage-stop' });
  },
  async 'laptop 1440x900, dark, ejector'() {
    await screens('sheet-1440x900-dark', { viewport: { width: 1440, height: 900 }, colorScheme: 'dark' }, { demo: 'ejector' });
  },

  async 'printout has no controls and opens every disclosure'() {
    const b = await launch({ viewport: { width: 800, height: 1280 } });
    try {
      const { page } = b;
      await openSheet(page);
      await page.emulateMedia({ media: 'print' });
      const hidden = await page.evaluate(() => ['.system-switch', '.qty', '.qty-unit', '.views', '.demo-picker']
        .map((s) => getComputedStyle(document.querySelector(s)).display));
      assert(hidden.every((d) => d === 'none'), `controls hidden in print: ${hidden}`);
      const printed = await page.locator('.field:has(#f-spring-model-rate) .qty-print').textContent();
      assert(printed.includes('1.8 N·m/rad'), `typed value printed as text: ${printed}`);
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
