// Browser budgets of issue 10, measured in Debian's Chromium through
// playwright-core on the release build served at BASE_URL (cargo xtask bench
// serves dist/ and runs this). Prints progress, then one line
// `bench-browser {json}` that xtask reads.
//
// What the page must provide (the bench hook; nothing else is assumed):
//
//   performance.mark('joulewise:figures-visible')
//       once, when the first demo's figures are in the DOM and painted
//       (e.g. in a requestAnimationFrame after the first render). Its
//       startTime is the time from navigation: the start-up figure.
//
//   window.__joulewise_bench = {
//     demos: ['guard-door', 'carriage-stop', 'brake-springs', 'ejector'],
//     // Run assess (no Monte Carlo, no rendering) on demo `key` `runs`
//     // times; return the duration of each run in ms (performance.now()
//     // around each call).
//     assessDemo(key, runs) -> number[],
//     // Run the demo's tolerance study (worst-case corners, then its 10 000
//     // Monte Carlo samples) the way the page runs it: off the main thread
//     // or in slices. Resolve when done, with the elapsed time in ms and the
//     // number of samples run.
//     monteCarlo(key) -> Promise<{ ms, samples }>,
//   }
//
// Without the hook every figure is reported as "not measured yet: the page
// has no bench hook" and the script still exits 0.
import { chromium } from 'playwright-core';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';

const BASE_URL = process.env.BASE_URL ?? 'http://127.0.0.1:8080/';
const LOADS = Number(process.env.BENCH_LOADS ?? 10);
const RUNS = Number(process.env.BENCH_RUNS ?? 200);
const THROTTLE = 4;
const MARK = 'joulewise:figures-visible';
// How long one load may take before it counts as not reaching the figures.
const LOAD_TIMEOUT_MS = 30_000;
const NO_HOOK = 'not measured yet: the page has no bench hook';

const ARGS = [
  '--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
  '--disable-background-networking', '--disable-component-update', '--disable-sync',
  '--disable-dev-shm-usage',
];

const median = (xs) => {
  const s = [...xs].sort((a, b) => a - b);
  const n = s.length;
  if (n === 0) return null;
  return n % 2 ? s[(n - 1) / 2] : (s[n / 2 - 1] + s[n / 2]) / 2;
};

/** A fresh browser profile (no cache, no service worker) per load. */
async function freshContext() {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'jw-bench-'));
  const context = await chromium.launchPersistentContext(dir, {
    executablePath: '/usr/bin/chromium',
    headless: true,
    args: ARGS,
    viewport: { width: 800, height: 1280 },
  });
  const page = context.pages()[0] ?? (await context.newPage());
  return {
    context,
    page,
    async close() {
      await context.close();
      fs.rmSync(dir, { recursive: true, force: true });
    },
  };
}

/** Start-up: navigation to the page's figures-visible mark, CPU throttled. */
async function startup() {
  const times = [];
  for (let i = 0; i < LOADS; i++) {
    const b = await freshContext();
    try {
      const cdp = await b.context.newCDPSession(b.page);
      await cdp.send('Emulation.setCPUThrottlingRate', { rate: THROTTLE });
      await b.page.goto(BASE_URL, { waitUntil: 'load' });
      const t = await b.page
        .waitForFunction(
          (mark) => performance.getEntriesByName(mark)[0]?.startTime ?? false,
          MARK,
          { timeout: LOAD_TIMEOUT_MS, polling: 50 },
        )
        .then((h) => h.jsonValue())
        .catch(() => null);
      if (t === null) {
        return { status: `not measured yet: the page sets no '${MARK}' performance mark` };
      }
      times.push(t);
      console.log(`startup load ${i + 1}: ${t.toFixed(0)} ms (CPU ${THROTTLE}× throttled)`);
    } finally {
      await b.close();
    }
  }
  return { median_ms: median(times), loads_ms: times, throttle: THROTTLE };
}

async function inPage() {
  const b = await freshContext();
  try {
    await b.page.goto(BASE_URL, { waitUntil: 'load' });
    const hook = await b.page
      .waitForFunction(() => typeof window.__joulewise_bench === 'object', null, { timeout: 10_000 })
      .then(() => true)
      .catch(() => false);
    if (!hook) {
      return { recompute: { status: NO_HOOK }, monte_carlo: { status: NO_HOOK } };
    }
    const keys = await b.page.evaluate(() => window.__joulewise_bench.demos
      ?? ['guard-door', 'carriage-stop', 'brake-springs', 'ejector']);
    const recompute = {};
    for (const key of keys) {
      const ms = await b.page.evaluate(([k, n]) => window.__joulewise_bench.assessDemo(k, n), [key, RUNS]);
      recompute[key] = { median_ms: median(ms), runs: ms.length };
      console.log(`recompute ${key}: median ${median(ms)?.toFixed(3)} ms over ${ms.length} runs`);
    }
    // The Monte Carlo with the Long Tasks API watching the main thread.
    const mc = await b.page.evaluate(async () => {
      const tasks = [];
      const obs = new PerformanceObserver((list) => {
        for (const e of list.getEntries()) tasks.push(e.duration);
      });
      obs.observe({ type: 'longtask', buffered: false });
      const r = await window.__joulewise_bench.monteCarlo('carriage-stop');
      // Let the observer deliver the last entries.
      await new Promise((res) => setTimeout(res, 100));
      obs.disconnect();
      return { ms: r.ms, samples: r.samples, longest_task_ms: tasks.length ? Math.max(...tasks) : 0, long_tasks: tasks.length };
    });
    console.log(`monte carlo: ${mc.ms?.toFixed(1)} ms for ${mc.samples} samples; longest task ${mc.longest_task_ms.toFixed(1)} ms`);
    return { recompute, monte_carlo: mc };
  } finally {
    await b.close();
  }
}

const result = { base_url: BASE_URL };
try {
  result.startup = await startup();
} catch (e) {
  result.startup = { status: `not measured: ${String(e).split('\n')[0]}` };
}
try {
  Object.assign(result, await inPage());
} catch (e) {
  const why = `not measured: ${String(e).split('\n')[0]}`;
  result.recompute = { status: why };
  result.monte_carlo = { status: why };
}
console.log(`bench-browser ${JSON.stringify(result)}`);
