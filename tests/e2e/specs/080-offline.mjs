// Offline use (issue 8) and the Content-Security-Policy (issue 11):
// - the served page carries the CSP as a meta tag, holds no inline script,
//   and runs without a single CSP violation; its manifest and icons load;
// - served from /tools/joulewise/ on another server, the app installs its
//   service worker, then works with the server stopped and the network off;
//   a new deployment, while the user is mid-edit, shows the update notice,
//   which never reloads by itself and brings the new version when asked;
// - the single file runs from file:// with the network off and fetches
//   nothing but itself.
// No request may leave the page's origin at any point (lib.mjs assertClean).
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { BASE_URL, launch, shot, assert, assertEq, assertClean, typeInto } from '../lib.mjs';
import { serveFolder } from '../static-server.mjs';
import { saved } from '../keep.mjs';

const DIST_DIR = path.resolve(process.env.DIST_DIR ?? 'dist');
const SINGLE_FILE = path.resolve(process.env.SINGLE_FILE ?? path.join(path.dirname(DIST_DIR), 'dist-single', 'joulewise.html'));

// The sheet as these tests use it: the one place to update when the sheet changes.
const SHEET = {
  ready: '#overall .verdict',
  /** Load a demo, type a spring and read the stored energy the app computes. */
  async compute(page) {
    await page.locator('#demo-pick').selectOption('ejector');
    await page.locator('#demo-load').click();
    await typeInto(page.locator('#f-spring-model-rate'), '2,5 N/mm');
    await typeInto(page.locator('#f-spring-mount-deflection_at_latch'), '1.5 in');
    // ½·2.5 N/mm·(38.1 mm)² = 1.81451 J (Hooke's law, common practice; 1 in = 25.4 mm exactly, NIST SP 811)
    await page.waitForFunction(() => document.querySelector('#fig-energy-stored_latched .figure-value')?.textContent.trim() === '1.815 J', null, { timeout: 10000 });
  },
  /** A field to be in the middle of editing when the update notice comes. */
  editField: '#f-spring-model-rate',
};
// The policy of the served page (issue 11).
const CSP = "default-src 'self'; script-src 'self' 'wasm-unsafe-eval'; object-src 'none'; base-uri 'none'";
const SINGLE_FILE_BUDGET = 900_000; // bytes raw (xtask/src/dist.rs SINGLE_FILE_BUDGET)

/** Record `securitypolicyviolation` events in every page of the context. */
async function watchCsp(context) {
  await context.addInitScript(() => {
    window.__cspViolations = [];
    document.addEventListener('securitypolicyviolation', (e) => {
      window.__cspViolations.push(`${e.violatedDirective} blocked ${e.blockedURI || '(inline)'}`);
    });
  });
}

async function assertNoCspViolation(page, what) {
  const seen = await page.evaluate(() => window.__cspViolations);
  assert(Array.isArray(seen) && seen.length === 0, `${what}: CSP violations: ${JSON.stringify(seen)}`);
}

async function cspMeta(page) {
  return page.evaluate(() => document.querySelector('meta[http-equiv="Content-Security-Policy"]')?.content ?? null);
}

async function open(page, url) {
  const response = await page.goto(url);
  await page.locator(SHEET.ready).waitFor({ timeout: 20000 });
  return response;
}

async function reload(page) {
  const response = await page.reload();
  await page.locator(SHEET.ready).waitFor({ timeout: 20000 });
  return response;
}

/** Names of this origin's caches and how many entries each holds. */
async function cacheState(page) {
  return page.evaluate(async () => {
    const out = {};
    for (const name of await caches.keys()) out[name] = (await (await caches.open(name)).keys()).length;
    return out;
  });
}

function filesUnder(dir) {
  return fs.readdirSync(dir, { recursive: true, withFileTypes: true }).filter((d) => d.isFile()).length;
}

export const tests = {
  async 'served page: CSP meta, no inline script, no violation, manifest and icons load'() {
    const b = await launch();
    try {
      const { page, context } = b;
      await watchCsp(context);
      await open(page, BASE_URL);
      await SHEET.compute(page);
      assertEq(await cspMeta(page), CSP, 'CSP meta tag of the served page');
      assertEq(await page.locator('script:not([src])').count(), 0, 'inline scripts in the served page');
      assertEq(await page.locator('#jw-notice').count(), 0, 'no notice on a served page');
      const manifest = await page.evaluate(async () => {
        const href = document.querySelector('link[rel=manifest]').href;
        const m = await (await fetch(href)).json();
        const icons = [];
        for (const icon of m.icons) {
          const img = new Image();
          img.src = new URL(icon.src, href).href;
          await img.decode();
          icons.push({ sizes: icon.sizes, purpose: icon.purpose, got: `${img.naturalWidth}x${img.naturalHeight}` });
        }
        return { ...m, icons };
      });
      assertEq(manifest.start_url, '.', 'manifest start_url');
      assertEq(manifest.scope, '.', 'manifest scope');
      assertEq(manifest.display, 'standalone', 'manifest display');
      for (const want of ['192x192', '512x512']) {
        const icon = manifest.icons.find((i) => i.sizes === want && i.purpose === 'any');
        assert(icon && icon.got === want, `an icon of ${want}: ${JSON.stringify(manifest.icons)}`);
      }
      assert(manifest.icons.some((i) => i.purpose === 'maskable' && i.got === '512x512'), 'a maskable icon');
      await assertNoCspViolation(page, 'served page');
      assertClean(b.log, 'served page');
    } finally {
      await b.close();
    }
  },

  async 'under /tools/joulewise/: works with the server down and the network off, then offers a new version'() {
    const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'jw-deploy-'));
    const site = path.join(tmp, 'site');
    fs.cpSync(DIST_DIR, site, { recursive: true });
    const prefix = '/tools/joulewise/';
    let server = await serveFolder(site, prefix);
    const b = await launch({ origin: server.origin });
    try {
      const { page, context } = b;
      await watchCsp(context);
      await open(page, server.url);
      await page.waitForFunction(() => navigator.serviceWorker.controller !== null, null, { timeout: 20000 });
      const first = await cacheState(page);
      const names = Object.keys(first);
      assertEq(names.length, 1, `one cache after the first visit: ${JSON.stringify(first)}`);
      assert(names[0].startsWith(`joulewise ${prefix} `), `cache named by path and build hash: ${names[0]}`);
      assertEq(first[names[0]], filesUnder(site) - 1, 'every file of the build precached (all but sw.js)');

      // Offline: the server is stopped and the browser has no network.
      await server.close();
      await context.setOffline(true);
      const offline = await reload(page);
      assert(offline.fromServiceWorker(), 'the page came from the service worker');
      await SHEET.compute(page);
      await shot(page, 'offline-reloaded');
      await assertNoCspViolation(page, 'offline');
      // Autosave works offline: the edit is stored, and a reload with the
      // network still off brings it back as typed.
      await saved(page);
      await reload(page);
      await page.locator(SHEET.ready).waitFor({ timeout: 20000 });
      assertEq(await page.locator(SHEET.editField).inputValue(), '2,5 N/mm', 'kept offline across a reload');

      // Back online, the user is in the middle of an edit in the open tab...
      await context.setOffline(false);
      server = await serveFolder(site, prefix, server.port);
      let navigations = 0;
      page.on('framenavigated', (f) => { if (f === page.mainFrame()) navigations += 1; });
      await typeInto(page.locator(SHEET.editField), '3 N/mm');

      // ...when a new build is deployed: another page and another cache name.
      const index = path.join(site, 'index.html');
      fs.writeFileSync(index, fs.readFileSync(index, 'utf8')
        .replace('</title>', '</title>\n    <meta name="jw-test-build" content="next" />'));
      const sw = path.join(site, 'sw.js');
      const swText = fs.readFileSync(sw, 'utf8');
      const nextSw = swText.replace(/(const CACHE = `\$\{PREFIX\})([0-9a-f]{16})`/, '$1$2-next`');
      assert(nextSw !== swText, 'sw.js names its cache by the build hash');
      fs.writeFileSync(sw, nextSw);

      // The tab comes back to the front (a tablet keeps the app open for days):
      // the app looks for a new version and says so.
      await page.evaluate(() => document.dispatchEvent(new Event('visibilitychange')));
      const notice = page.locator('#jw-notice');
      await notice.filter({ hasText: 'new version' }).waitFor({ timeout: 20000 });
      assert((await notice.textContent()).includes('Your work is saved'), 'the notice says work is saved');
      assertEq(await page.locator('meta[name=jw-test-build]').count(), 0, 'still the old version');

      // Nothing reloads by itself: the edit stays as typed.
      await page.waitForTimeout(1500);
      assertEq(navigations, 0, 'page navigations while the notice waits');
      assertEq(await page.locator(SHEET.editField).inputValue(), '3 N/mm', 'the edit is untouched');
      await shot(page, 'offline-update-notice');

      // The user chooses Reload: the new version runs, the old cache is gone.
      await Promise.all([
        page.waitForEvent('load', { timeout: 20000 }),
        notice.getByRole('button', { name: 'Reload now' }).click(),
      ]);
      await page.locator(SHEET.ready).waitFor({ timeout: 20000 });
      assertEq(await page.locator('meta[name=jw-test-build]').count(), 1, 'the new version is running');
      assertEq(await notice.count(), 0, 'no notice after the reload');
      // "Your work is saved" held: the edit made before the update is there.
      assertEq(await page.locator(SHEET.editField).inputValue(), '3 N/mm', 'the edit survived the update');
      const after = Object.keys(await cacheState(page));
      assert(after.length === 1 && after[0].endsWith('-next'), `only the new cache is left: ${after}`);

      // And the new version works offline too.
      await server.close();
      await context.setOffline(true);
      await reload(page);
      assertEq(await page.locator('meta[name=jw-test-build]').count(), 1, 'new version offline');
      await SHEET.compute(page);
      await assertNoCspViolation(page, 'after update');
      assertClean(b.log, 'offline and update');
    } finally {
      await b.close();
      await server.close();
      fs.rmSync(tmp, { recursive: true, force: true });
    }
  },

  async 'single file runs from file:// with the network off and fetches nothing else'() {
    const size = fs.statSync(SINGLE_FILE).size;
    // The size goal is a budget of `cargo xtask bench`, not a test: print it.
    console.log(`     single file: ${size} bytes (budget ${SINGLE_FILE_BUDGET}, checked by cargo xtask bench)`);
    const b = await launch({ offline: true, origin: 'null' });
    try {
      const { page, context } = b;
      await watchCsp(context);
      const url = pathToFileURL(SINGLE_FILE).href;
      await open(page, url);
      await SHEET.compute(page);
      // Autosave where the browser allows storage for a file page; where it
      // does not, the page says the work is kept in this tab only.
      await saved(page);
      console.log(`     single file, save state: ${(await page.locator('#save-state').textContent()).trim()}`);
      const notice = page.locator('#jw-notice');
      await notice.filter({ hasText: 'Opened from a file' }).waitFor();
      assert((await notice.textContent()).includes('Export'), 'the notice points to export');
      await shot(page, 'offline-single-file');
      await notice.getByRole('button', { name: 'Got it' }).click();
      assertEq(await notice.count(), 0, 'the notice can be dismissed');

      const csp = await cspMeta(page);
      assert(csp && /script-src 'sha256-[^']+' 'sha256-[^']+' 'wasm-unsafe-eval';/.test(csp), `single-file CSP: ${csp}`);
      assert(!csp.includes('unsafe-inline') && csp.includes("object-src 'none'") && csp.includes("base-uri 'none'"), `single-file CSP: ${csp}`);
      await assertNoCspViolation(page, 'single file');
      const others = b.log.requests.filter((u) => u !== url && !u.startsWith('data:'));
      assertEq(others.length, 0, `requests besides the file itself: ${others.join(', ')}`);
      assertClean(b.log, 'single file');
    } finally {
      await b.close();
    }
  },
};
