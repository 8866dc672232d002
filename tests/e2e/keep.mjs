// Helpers for the specs on keeping the user's work (autosave, library,
// export/import, share links, storage faults): read and write the page's
// IndexedDB records, catch downloads, import files.
import fs from 'node:fs';
import { openSheet } from './lib.mjs';

/** Wait until the library has loaded (autosave runs from then on). */
export async function ready(page) {
  await page.locator('main[data-keep="ready"]').waitFor({ timeout: 20000 });
}

/** Open the sheet and wait for the library. */
export async function openKept(page) {
  await openSheet(page);
  await ready(page);
}

/** Wait until the open assessment is stored (no unsaved change). */
export async function saved(page) {
  await page.waitForFunction(() => {
    const s = document.querySelector('#save-state');
    return s && s.dataset.dirty === 'false' && /^(Saved|Kept in this tab only,)/.test(s.textContent);
  }, null, { timeout: 10000 });
}

/** Every record in the page's IndexedDB: [{ key, value }]. */
export async function stored(page) {
  return page.evaluate(() => new Promise((resolve, reject) => {
    const open = indexedDB.open('joulewise');
    open.onerror = () => reject(open.error);
    open.onsuccess = () => {
      const db = open.result;
      const tx = db.transaction('assessments', 'readonly');
      const st = tx.objectStore('assessments');
      const keys = st.getAllKeys();
      const vals = st.getAll();
      tx.oncomplete = () => { db.close(); resolve(keys.result.map((k, i) => ({ key: k, value: vals.result[i] }))); };
      tx.onerror = () => reject(tx.error);
    };
  }));
}

/** Write `value` (any value) under `key` in the page's IndexedDB, by hand. */
export async function putRaw(page, key, value) {
  await page.evaluate(([k, v]) => new Promise((resolve, reject) => {
    const open = indexedDB.open('joulewise');
    open.onsuccess = () => {
      const db = open.result;
      const tx = db.transaction('assessments', 'readwrite');
      tx.objectStore('assessments').put(v, k);
      tx.oncomplete = () => { db.close(); resolve(); };
      tx.onerror = () => reject(tx.error);
    };
    open.onerror = () => reject(open.error);
  }), [key, value]);
}

/** Click `selector` and return the downloaded file: { name, bytes, text }. */
export async function download(page, selector) {
  const [dl] = await Promise.all([page.waitForEvent('download'), page.locator(selector).click()]);
  const p = await dl.path();
  const bytes = fs.readFileSync(p);
  return { name: dl.suggestedFilename(), bytes, text: bytes.toString('utf8') };
}

/** Import `files` (paths or {name, mimeType, buffer}) through the library's file input; returns the report's text. */
export async function importFiles(page, files) {
  await page.locator('#show-library').click();
  const before = Number(await page.locator('#import-report').getAttribute('data-count'));
  await page.locator('#import-file').setInputFiles(files);
  await page.waitForFunction((n) => Number(document.querySelector('#import-report').dataset.count) > n, before, { timeout: 60000 });
  return (await page.locator('#import-report').textContent()).replace(/\s+/g, ' ').trim();
}

/** Titles in the library list, in order. */
export async function libraryTitles(page) {
  return page.evaluate(() => [...document.querySelectorAll('#lib-list .lib-item')].map((li) => {
    const h = li.querySelector('.lib-title');
    return h ? h.childNodes[0].textContent.trim() : '';
  }));
}

/** Screenshot of what is in view (banners sit at the top), for people to look at. */
export async function snap(page, name) {
  const { ARTIFACTS } = await import('./lib.mjs');
  const path = await import('node:path');
  await page.evaluate(() => window.scrollTo(0, 0));
  await page.screenshot({ path: path.join(ARTIFACTS, `${name}.png`) });
}
