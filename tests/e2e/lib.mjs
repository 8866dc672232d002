// Shared harness for the end-to-end tests: launches Debian's Chromium
// headless through playwright-core with a fresh profile, records every
// request (no request may leave the page's origin), and tallies results.
import { chromium } from 'playwright-core';
import { spawnSync } from 'node:child_process';
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
export async function launch({ viewport = { width: 800, height: 1280 }, userDataDir, offline = false, colorScheme = 'light', origin = new URL(BASE_URL).origin } = {}) {
  const dir = userDataDir ?? fs.mkdtempSync(path.join(os.tmpdir(), 'jw-profile-'));
  const context = await chromium.launchPersistentContext(dir, {
    executablePath: '/usr/bin/chromium',
    headless: true,
    args: CHROMIUM_ARGS,
    viewport,
    offline,
    colorScheme,
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

/** Open the sheet and wait until the WebAssembly app has mounted. */
export async function openSheet(page) {
  await page.goto(BASE_URL);
  await page.locator('#overall .verdict').waitFor({ timeout: 20000 });
  await settled(page);
}

/** Wait until the report has caught up with the inputs (no pending change). */
export async function settled(page) {
  await page.locator('main[data-pending="false"]').waitFor({ timeout: 10000 });
}

/** Start from demo `key` (or `blank`) with the picker. */
export async function loadDemo(page, key) {
  await page.locator('#demo-pick').selectOption(key);
  await page.locator('#demo-load').click();
  await settled(page);
}

/** Text of the value line of figure card `id` (`fig-…` element id). */
export async function figureText(page, id) {
  return (await page.locator(`#${id} .figure-value`).textContent()).trim();
}

/** Wait until figure card `id` shows `text`. */
export async function waitFigure(page, id, text) {
  await page.waitForFunction(([i, t]) =>
    document.querySelector(`#${i} .figure-value`)?.textContent.trim() === t, [id, text], { timeout: 10000 });
}

/** Every figure card on the assessment view: [{ id, label, value }]. */
export async function pageFigures(page) {
  return page.evaluate(() => [...document.querySelectorAll('#view-assessment .figure')].map((el) => ({
    id: el.id,
    label: el.querySelector('.figure-label').textContent.trim(),
    value: el.querySelector('.figure-value').textContent.trim(),
  })));
}

/** Element id of the control for input `path` (as the sheet names it). */
export function fieldId(path) {
  return `#f-${path.replaceAll('.', '-')}`;
}

/**
 * Run the command-line program (built from this workspace) and return
 * stdout. Its exit code says the verdict (0 within limits, 1 a limit
 * exceeded, 2 cannot assess), so only a missing output is an error here.
 */
export function cli(args, input) {
  const r = spawnSync('cargo', ['run', '-q', '-p', 'joulewise-core', '--features', 'cli', '--bin', 'joulewise', '--', ...args],
    { input, encoding: 'utf8', maxBuffer: 64 << 20 });
  if (r.error || r.status === null || r.status > 2 || !r.stdout) {
    throw new Error(`joulewise ${args.join(' ')} failed (${r.status}): ${r.stderr}`);
  }
  return r.stdout;
}

/**
 * The figures the command-line program prints for demo `key` in `units`
 * (`si` or `us`): [{ id, label, value }] with the value formatted by the
 * same core function as the sheet, `—` when missing.
 */
export function cliFigures(key, units = 'si') {
  const scenario = cli(['demo', key]);
  const report = JSON.parse(cli(['assess', '-', '--format', 'json'], scenario));
  const text = cli(['assess', '-', '--format', 'text', '--units', units], scenario).split('\n');
  const start = text.indexOf('Figures') + 1;
  return report.figures.map((f, i) => {
    const line = text[start + i];
    const rest = line.slice(2 + Math.max(40, [...f.label].length) + 1);
    return { id: f.id, label: f.label, value: rest.trimStart().split('   ')[0].trim() };
  });
}

/**
 * Run axe-core (from node_modules) on the page and return the violations
 * whose impact is serious or critical, plus a one-line summary of all.
 */
export async function axeAudit(page) {
  // Evaluated through the DevTools protocol, not as a <script> tag: the
  // page's Content-Security-Policy (rightly) refuses inline scripts.
  const axeSource = fs.readFileSync(path.resolve('node_modules/axe-core/axe.min.js'), 'utf8');
  await page.evaluate(axeSource);
  const result = await page.evaluate(async () => {
    // eslint-disable-next-line no-undef
    const r = await axe.run(document, { resultTypes: ['violations'] });
    return r.violations.map((v) => ({ id: v.id, impact: v.impact, help: v.help, nodes: v.nodes.length,
      targets: v.nodes.slice(0, 3).map((n) => n.target.join(' ')) }));
  });
  const bad = result.filter((v) => v.impact === 'serious' || v.impact === 'critical');
  return { bad, all: result };
}
