// Storage faults, each with nothing lost: the disk full in the middle of
// saving (IndexedDB put throws QuotaExceededError), IndexedDB that never
// opens (blocked: localStorage takes over), no storage at all (private
// mode or a policy: the page works in memory and urges an export).
import { launch, assert, assertEq, assertClean, typeInto, axeAudit } from '../lib.mjs';
import { snap, ready, openKept, saved, stored, download, libraryTitles } from '../keep.mjs';

export const tests = {
  async 'quota exceeded mid-save: banner, nothing lost, saved again once there is room'() {
    const b = await launch();
    try {
      const { page, context } = b;
      await context.addInitScript(() => {
        const put = IDBObjectStore.prototype.put;
        IDBObjectStore.prototype.put = function (...args) {
          if (window.__diskFull) throw new DOMException('The quota has been exceeded.', 'QuotaExceededError');
          return put.apply(this, args);
        };
      });
      await page.reload();
      await openKept(page);
      await typeInto(page.locator('#f-identity-title'), 'Before the disk filled');
      await saved(page);
      await page.evaluate(() => { window.__diskFull = true; });
      await typeInto(page.locator('#f-identity-title'), 'Typed while the disk was full');
      await page.locator('#storage-banner', { hasText: 'QuotaExceededError' }).waitFor({ timeout: 5000 });
      console.log(`     quota: ${(await page.locator('#storage-banner p').textContent()).trim()}`);
      await snap(page, 'banner-quota');
      const { bad } = await axeAudit(page);
      assert(bad.length === 0, `quota banner: serious/critical: ${JSON.stringify(bad, null, 1)}`);
      const file = await download(page, '#storage-banner button[data-act="export-all"]');
      assert(file.text.includes('Typed while the disk was full'), 'the export holds the unsaved change');
      // Reload: the rescue copy in localStorage brings the change back.
      await page.reload();
      await ready(page);
      assertEq(await page.locator('#f-identity-title').inputValue(), 'Typed while the disk was full', 'after reload');
      // With room again the store catches up.
      await typeInto(page.locator('#f-identity-location'), 'Hall 3');
      await saved(page);
      assert((await stored(page)).some((r) => String(r.value).includes('Typed while the disk was full')), 'stored once there is room');
      assertEq(await page.locator('#storage-banner').count(), 0, 'the banner goes once saving works');
      assertClean(b.log, 'quota');
    } finally {
      await b.close();
    }
  },

  async 'IndexedDB blocked (never opens): localStorage takes over, a reload keeps the work'() {
    const b = await launch();
    try {
      const { page, context } = b;
      await context.addInitScript(() => {
        IDBFactory.prototype.open = function () { return {}; };
      });
      await page.reload();
      await openKept(page);
      await page.locator('#storage-banner', { hasText: 'would not open its database' }).waitFor();
      await typeInto(page.locator('#f-identity-title'), 'Kept in small storage');
      await saved(page);
      await page.reload();
      await ready(page);
      assertEq(await page.locator('#f-identity-title').inputValue(), 'Kept in small storage', 'after reload');
      const keys = await page.evaluate(() => Object.keys(localStorage).filter((k) => k.startsWith('joulewise.record.')));
      assertEq(keys.length, 1, 'one record in localStorage');
      await snap(page, 'banner-blocked');
      assertClean(b.log, 'blocked');
    } finally {
      await b.close();
    }
  },

  async 'no storage at all: works in memory, says so, export keeps the work'() {
    const b = await launch();
    try {
      const { page, context } = b;
      await context.addInitScript(() => {
        const refuse = () => { throw new DOMException('The operation is insecure.', 'SecurityError'); };
        Object.defineProperty(window, 'indexedDB', { get: refuse, configurable: true });
        Object.defineProperty(window, 'localStorage', { get: refuse, configurable: true });
        Object.defineProperty(window, 'sessionStorage', { get: refuse, configurable: true });
      });
      await page.reload();
      await openKept(page);
      await page.locator('#storage-banner', { hasText: 'not letting Joulewise keep anything' }).waitFor();
      await typeInto(page.locator('#f-identity-title'), 'Only in this tab');
      await saved(page);
      assert(/this tab only/.test(await page.locator('#save-state').textContent()), 'says where it is kept');
      await page.locator('#show-library').click();
      assertEq(JSON.stringify(await libraryTitles(page)), JSON.stringify(['Only in this tab']), 'the library works in memory');
      const file = await download(page, '#storage-banner button[data-act="export-all"]');
      assert(file.text.includes('Only in this tab'), 'export holds the work');
      await snap(page, 'banner-no-storage');
      const { bad } = await axeAudit(page);
      assert(bad.length === 0, `no-storage banner: serious/critical: ${JSON.stringify(bad, null, 1)}`);
      assertClean(b.log, 'no storage');
    } finally {
      await b.close();
    }
  },
};
