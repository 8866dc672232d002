// Export and import files, share links: a good file, a file that matches
// an assessment already kept (keep both, replace, cancel), a broken file
// (every problem with its field path); export → import → export gives the
// same bytes; a share link opens as a new, unsaved assessment, and a
// damaged one is refused with a message.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { launch, assert, assertEq, assertClean, typeInto, axeAudit } from '../lib.mjs';
import { snap, ready, openKept, saved, stored, download, importFiles, libraryTitles } from '../keep.mjs';

const tmp = () => fs.mkdtempSync(path.join(os.tmpdir(), 'jw-files-'));

export const tests = {
  async 'export then import gives the same file; good, matching and broken files'() {
    const b = await launch();
    const dir = tmp();
    try {
      const { page } = b;
      await openKept(page);
      await typeInto(page.locator('#f-identity-title'), 'Divider guard');
      await typeInto(page.locator('#f-identity-machine_tag'), 'DV-7');
      await saved(page);
      const one = await download(page, '#export-this');
      assert(one.name.endsWith('.joulewise.json'), `file name ${one.name}`);
      const parsed = JSON.parse(one.text);
      assertEq(parsed.schema_version, 1, 'schema version in the file');
      const fileA = path.join(dir, one.name);
      fs.writeFileSync(fileA, one.bytes);

      // The same file again: it matches the kept one, so the page asks.
      let report = await importFiles(page, fileA);
      assert(/already in the library/.test(report), `asks: ${report}`);
      await page.locator('#import-ask').waitFor();
      await snap(page, 'import-ask');
      const { bad } = await axeAudit(page);
      assert(bad.length === 0, `import banner: serious/critical: ${JSON.stringify(bad, null, 1)}`);
      await page.locator('#import-ask button[data-act="import-cancel"]').click();
      await page.waitForTimeout(200);
      assertEq((await stored(page)).length, 1, 'cancel leaves the library as it was');

      await importFiles(page, fileA);
      await page.locator('#import-ask button[data-act="import-both"]').click();
      await page.waitForFunction(() => document.querySelectorAll('#lib-list .lib-item').length === 2);
      assertEq(JSON.stringify(await libraryTitles(page)), JSON.stringify(['Divider guard', 'Divider guard']), 'keep both');

      // Round trip: export the imported copy; byte for byte the same file.
      const ids = await page.locator('#lib-list .lib-item').evaluateAll((els) => els.map((e) => e.dataset.id));
      const current = await page.locator('#lib-list .lib-item[aria-current="true"]').getAttribute('data-id');
      const copyId = ids.find((i) => i !== current);
      const again = await download(page, `#lib-list button[data-act="export"][data-id="${copyId}"]`);
      assert(Buffer.compare(one.bytes, again.bytes) === 0, 'export → import → export is byte-identical');

      // Replace: a changed version of the same assessment (same title and tag).
      const changed = JSON.parse(one.text);
      changed.identity.notes = 'Replaced by import';
      const fileB = path.join(dir, 'changed.json');
      fs.writeFileSync(fileB, JSON.stringify(changed, null, 2));
      await importFiles(page, fileB);
      await page.locator('#import-ask button[data-act="import-replace"]').click();
      await page.waitForFunction(() => true);
      await page.waitForTimeout(400);
      const recs = (await stored(page)).map((r) => String(r.value));
      assertEq(recs.length, 2, 'replace keeps the count');
      assertEq(recs.filter((v) => v.includes('Replaced by import')).length, 1, 'one was replaced');
      await page.locator('#notice button[data-act="undo"]').waitFor();

      // A good new file.
      changed.identity.title = 'Another guard';
      const fileC = path.join(dir, 'another.json');
      fs.writeFileSync(fileC, JSON.stringify(changed));
      report = await importFiles(page, fileC);
      assert(/1 added/.test(report), `good file: ${report}`);
      await page.waitForFunction(() => document.querySelectorAll('#lib-list .lib-item').length === 3);

      // A broken file: the refusal names the field path.
      const broken = JSON.parse(one.text);
      broken.part.hinge_tilt = 12;
      const fileD = path.join(dir, 'broken.json');
      fs.writeFileSync(fileD, JSON.stringify(broken));
      report = await importFiles(page, fileD);
      assert(/not imported/.test(report) && /part\.hinge_tilt/.test(report), `broken file names its path: ${report}`);
      // Texts the core refuses: imported as typed, each problem listed with its path.
      const typo = JSON.parse(one.text);
      typo.identity.title = 'Guard with typos';
      typo.part.inertia.mass.text = '3 bananas';
      const fileE = path.join(dir, 'typo.json');
      fs.writeFileSync(fileE, JSON.stringify(typo));
      report = await importFiles(page, fileE);
      assert(/imported/.test(report) && /part\.inertia\.mass/.test(report), `refused input listed: ${report}`);

      // Export all: one file with every assessment, and it imports.
      const all = await download(page, '#export-all');
      const bundle = JSON.parse(all.text);
      assertEq(bundle.assessments.length, 4, 'export all');
      assertEq(bundle.schema_version, 1, 'schema version in the bundle');
      assertClean(b.log, 'files');
    } finally {
      await b.close();
      fs.rmSync(dir, { recursive: true, force: true });
    }
  },

  async 'a share link opens as a new unsaved assessment; a damaged one is refused'() {
    const b = await launch();
    try {
      const { page } = b;
      await openKept(page);
      await typeInto(page.locator('#f-identity-title'), 'Linked <img src=x onerror=alert(1)> lid');
      await typeInto(page.locator('#f-identity-machine_tag'), 'LK-1');
      await saved(page);
      await page.locator('#share-make').click();
      await page.waitForFunction(() => document.querySelector('#share-url').value.includes('#s='));
      const link = await page.locator('#share-url').inputValue();
      console.log(`     share link: ${link.length} characters`);
      const other = await launch();
      try {
        const p = other.page;
        let dialogs = 0;
        p.on('dialog', (d) => { dialogs += 1; d.dismiss(); });
        await p.goto(link);
        await ready(p);
        assertEq(await p.locator('#f-identity-title').inputValue(), 'Linked <img src=x onerror=alert(1)> lid', 'title from the link');
        assertEq(await p.locator('.sheet-title').textContent(), 'Linked <img src=x onerror=alert(1)> lid', 'shown as text');
        assertEq(await p.locator('img').count(), 0, 'no markup from the link');
        await p.locator('#notice', { hasText: 'Opened from a link' }).waitFor();
        assert(/Not in your library/.test(await p.locator('#save-state').textContent()), 'unsaved');
        assertEq((await stored(p)).length, 0, 'nothing stored yet');
        await snap(p, 'share-link-opened');
        await p.locator('#keep-link').click();
        await saved(p);
        assertEq((await stored(p)).length, 1, 'kept on request');
        assert(!p.url().includes('#s='), 'the link is taken out of the address once kept');
        // Damaged links.
        for (const bad of ['#s=@@@', '#s=AAAA', `#s=${'_'.repeat(4000)}`]) {
          await p.goto(new URL(link).origin + '/' + bad);
          await ready(p);
          await p.locator('#notice', { hasText: 'The link could not be opened' }).waitFor();
        }
        assertEq(dialogs, 0, 'nothing executed');
        assertClean(other.log, 'share link');
      } finally {
        await other.close();
      }
      assertClean(b.log, 'share');
    } finally {
      await b.close();
    }
  },
};
