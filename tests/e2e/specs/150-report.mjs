// The printed report, A4 and Letter, through Chromium's PDF printer: its
// text (pdftotext, poppler-utils) carries every figure exactly as the
// screen shows it, the title block (identity, revision, program version,
// scenario hash), the inputs as typed with SI values, checks with their
// sources, cautions and the signature block, and no control; page 1 is
// rendered to PNG (pdftoppm) for people to look at.
import fs from 'node:fs';
import path from 'node:path';
import { spawnSync } from 'node:child_process';
import { launch, assert, assertClean, typeInto, ARTIFACTS, pageFigures } from '../lib.mjs';
import { openKept, saved } from '../keep.mjs';

const norm = (s) => s.replace(/[\s\u00a0\u202f\u2009]+/g, ' ').trim();

function pdfText(file) {
  const r = spawnSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`pdftotext: ${r.stderr}`);
  return r.stdout;
}

export const tests = {
  async 'the printed report (A4 and Letter) shows the same numbers as the screen'() {
    const b = await launch({ viewport: { width: 1280, height: 900 } });
    try {
      const { page } = b;
      await openKept(page);
      await typeInto(page.locator('#f-identity-assessor'), 'P. Lintel');
      await saved(page);
      const figures = (await pageFigures(page)).filter((f) => !/^—/.test(f.value));
      const hash = await page.evaluate(() => document.querySelector('#report-title').textContent.match(/[0-9a-f]{64}/)?.[0]);
      assert(hash, 'the title block carries the scenario hash');
      for (const format of ['A4', 'Letter']) {
        const file = path.join(ARTIFACTS, `report-${format.toLowerCase()}.pdf`);
        await page.pdf({ path: file, format, printBackground: true });
        const text = norm(pdfText(file));
        const missing = figures.filter((f) => !text.includes(norm(f.value)));
        assert(missing.length === 0, `${format}: figures not in the PDF as on screen: ${JSON.stringify(missing.slice(0, 5))}`);
        for (const must of ['Assessment report', 'P. Lintel', 'Scenario hash', hash.slice(0, 32), 'Inputs as typed', 'SI value',
          'Review and sign-off', 'Reviewed and approved by', 'Joulewise 0.', 'Cautions']) {
          assert(text.includes(must), `${format}: the PDF lacks “${must}”`);
        }
        for (const control of ['Export file', 'Share link', 'Print report', 'Start from', 'Buffer sizing']) {
          assert(!text.includes(control), `${format}: a control is printed: ${control}`);
        }
        const pages = (pdfText(file).match(/\f/g) ?? []).length;
        console.log(`     report ${format}: ${pages} pages, ${figures.length} figures found as on screen`);
      }
      const png = path.join(ARTIFACTS, 'report-a4-page1');
      const r = spawnSync('pdftoppm', ['-png', '-r', '70', '-f', '1', '-l', '2', path.join(ARTIFACTS, 'report-a4.pdf'), png]);
      assert(r.status === 0, 'pdftoppm renders the first pages');
      assertClean(b.log, 'report');
    } finally {
      await b.close();
    }
  },
};
