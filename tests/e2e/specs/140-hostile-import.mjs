// Every file of the hostile import corpus (HOSTILE_CORPUS_DIR, written by
// `cargo xtask test`, or `cargo run -p joulewise-tests --bin hostile-corpus
// -- DIR`) imported through the page's file input, one at a time, the 50 MB
// ones included: each refused with a message naming the problem (and the
// field path where the manifest gives one), the page still working, the
// library untouched. Prints the counts.
import fs from 'node:fs';
import path from 'node:path';
import { launch, assert, assertEq, assertClean, typeInto } from '../lib.mjs';
import { openKept, saved, stored, importFiles, libraryTitles } from '../keep.mjs';

const DIR = process.env.HOSTILE_CORPUS_DIR;

export const tests = {
  async 'every hostile file is refused with a clear message; the library is untouched'() {
    if (!DIR || !fs.existsSync(path.join(DIR, 'manifest.json'))) {
      throw new Error('HOSTILE_CORPUS_DIR is not set or has no manifest.json (run through cargo xtask test)');
    }
    const manifest = JSON.parse(fs.readFileSync(path.join(DIR, 'manifest.json'), 'utf8'));
    const b = await launch();
    try {
      const { page } = b;
      await openKept(page);
      await typeInto(page.locator('#f-identity-title'), 'Existing work');
      await saved(page);
      const before = await stored(page);
      let tried = 0;
      let rejected = 0;
      const failures = [];
      for (const f of manifest) {
        tried += 1;
        const report = await importFiles(page, path.join(DIR, f.name));
        const refused = /0 added, 0 waiting for your choice, 1 refused/.test(report) && /not imported/.test(report);
        if (refused) rejected += 1;
        const lower = report.toLowerCase();
        const says = f.message_has.length === 0 || f.message_has.some((w) => lower.includes(w.toLowerCase()));
        const names = !f.path || report.includes(f.path);
        if (!refused || !says || !names) failures.push(`${f.name} (${f.category}): ${report.slice(0, 300)}`);
      }
      console.log(`     hostile import: ${tried} files tried, ${rejected} rejected, ${failures.length} without the expected message`);
      assert(failures.length === 0, `not refused clearly:\n${failures.slice(0, 10).join('\n')}`);
      assertEq(rejected, manifest.length, 'every file refused');
      const after = await stored(page);
      assertEq(JSON.stringify(after), JSON.stringify(before), 'library untouched');
      // Still working: the sheet saves a change and the library lists it.
      await page.locator('#show-assessment').click();
      await typeInto(page.locator('#f-identity-title'), 'Existing work, still editable');
      await saved(page);
      await page.locator('#show-library').click();
      assertEq(JSON.stringify(await libraryTitles(page)), JSON.stringify(['Existing work, still editable']), 'library');
      assertClean(b.log, 'hostile import');
    } finally {
      await b.close();
    }
  },
};
