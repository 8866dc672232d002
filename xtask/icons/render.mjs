// Renders the app icons (static/icons/*.png) from their SVG sources with the
// project's headless Chromium. Run once after changing an SVG, then commit
// the PNGs:  node xtask/icons/render.mjs
import { chromium } from 'playwright-core';
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const icons = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../static/icons');
const jobs = [
  ['icon.svg', 'icon-192.png', 192],
  ['icon.svg', 'icon-512.png', 512],
  ['icon-maskable.svg', 'icon-maskable-512.png', 512],
];
const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--no-sandbox', '--disable-gpu'] });
try {
  for (const [svg, png, size] of jobs) {
    const page = await browser.newPage({ viewport: { width: size, height: size } });
    const data = fs.readFileSync(path.join(icons, svg)).toString('base64');
    await page.setContent(`<html><body style="margin:0"><img width="${size}" height="${size}" src="data:image/svg+xml;base64,${data}"></body></html>`);
    await page.locator('img').evaluate((img) => img.decode());
    await page.screenshot({ path: path.join(icons, png), omitBackground: true });
    await page.close();
    console.log(`${png}: ${size}x${size} from ${svg}`);
  }
} finally {
  await browser.close();
}
