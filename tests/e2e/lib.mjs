// Shared harness for the end-to-end tests: launches Debian's Chromium
// headless through playwright-core with a fresh profile, records every
// request (no request may leave the page's origin), and tallies results.
import { chromium } from 'playwright-core';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';

export const BASE_URL = process.env.BASE_URL ?? 'http://127.0.0.1:8080/';
export const ARTIFACTS = path.resolve(process.env.ARTIFACTS_DIR ?? 'artifacts/e2e');
fs.mkdirSync(ARTIFACTS, { recursive: true });

// Flags that keep Chromium from calling home (its background requests are
// refused on a closed network and would pollute the request log).
export const CHROMIUM_ARGS = [
  '--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
  '--disable-background-networking', '--disable-component-update', '--disable-sync',
  '--disable-dev-shm-usage',
];

// Console messages that are not our errors.
const HARMLESS = [/integrity attribute is currently ignored for preload/i];

/**
 * Launch a browser context with a fresh (or given) profile folder. `origin`
 * (default: BASE_URL's) is the one origin requests may go to.
 */
export async function launch({ viewport = { width: 800, height: 1280 }, userDataDir, offline = false, origin = new URL(BASE_URL).origin } = {}) {
  const dir = userDataDir ?? fs.mkdtempSync(path.join(os.tmpdir(), 'jw-profile-'));
  const context = await chromium.launchPersistentContext(dir, {
    executablePath: '/usr/bin/chromium',
    headless: true,
    args: CHROMIUM_ARGS,
    viewport,
    offline,
  });
  const log = { requests: [], foreign: [], errors: [] };
  context.on('request', (req) => {
    const url = req.url();
    log.requests.push(url);
    const u = new URL(url);
    const local = u.origin === origin || u.protocol === 'data:' || u.protocol === 'blob:' || u.protocol === 'file:';
    if (!local) log.foreign.push(url);
  });
  const attach = (page) => {
    page.on('pageerror', (e) => log.errors.push(`pageerror: ${e.message}`));
    page.on('console', (m) => {
      if (m.type() === 'error' && !HARMLESS.some((r) => r.test(m.text()))) log.errors.push(`console: ${m.text()}`);
    });
  };
  context.pages().forEach(attach);
  context.on('page', attach);
  const page = context.pages()[0] ?? (await context.newPage());
  return {
    context, page, log, dir,
    async close({ keepProfile = false } = {}) {
      await context.close();
      if (!keepProfile && !userDataDir) fs.rmSync(dir, { recursive: true, force: true });
    },
  };
}

/** Save a screenshot under the artifacts folder and return its path. */
export async function shot(page, name) {
  const file = path.join(ARTIFACTS, `${name}.png`);
  await page.screenshot({ path: file, fullPage: true });
  return file;
}

export function assert(cond, message) {
  if (!cond) throw new Error(`assertion failed: ${message}`);
}

export function assertEq(actual, expected, message) {
  if (actual !== expected) throw new Error(`${message}: expected ${JSON.stringify(expected)}, got ${JSON.stringify(actual)}`);
}

/** Fail if the page logged errors or asked for anything outside its origin. */
export function assertClean(log, what) {
  assert(log.foreign.length === 0, `${what}: requests left the origin: ${log.foreign.join(', ')}`);
  assert(log.errors.length === 0, `${what}: page errors: ${log.errors.join(' | ')}`);
}

/** Type into a field the way a person does: clear it, then real key events. */
export async function typeInto(locator, text) {
  await locator.click();
  await locator.press('Control+A');
  await locator.press('Delete');
  await locator.pressSequentially(text, { delay: 5 });
}
