// The benchmark hook on window: demo keys, per-run assessment times (a
// recompute stays well under a frame) and the Monte Carlo run in slices.
import { launch, assert, assertEq, assertClean, openSheet } from '../lib.mjs';

export const tests = {
  async 'window.__joulewise_bench times the demos and their studies'() {
    const b = await launch();
    try {
      const { page } = b;
      await openSheet(page);
      const demos = await page.evaluate(() => window.__joulewise_bench.demos);
      assertEq(demos.join(' '), 'guard-door carriage-stop brake-springs ejector', 'demo keys');
      for (const key of demos) {
        const ms = await page.evaluate((k) => window.__joulewise_bench.assessDemo(k, 25), key);
        assertEq(ms.length, 25, `${key}: one time per run`);
        const sorted = [...ms].sort((a, c) => a - c);
        const median = sorted[12];
        console.log(`     assess ${key}: median ${median.toFixed(2)} ms, max ${sorted[24].toFixed(2)} ms`);
        // A frame at 60 Hz is 16.7 ms; a recompute must leave most of it for drawing.
        assert(median < 8, `${key}: median ${median} ms`);
      }
      const mc = await page.evaluate(() => window.__joulewise_bench.monteCarlo('carriage-stop'));
      console.log(`     monte carlo carriage-stop: ${mc.samples} samples in ${mc.ms.toFixed(0)} ms`);
      assertEq(mc.samples, 10000, 'all samples run');
      assert(mc.ms > 0, 'timed');
      assertEq((await page.evaluate(() => window.__joulewise_bench.assessDemo('no-such-demo', 3))).length, 0, 'unknown key: nothing');
      assertClean(b.log, 'bench');
    } finally {
      await b.close();
    }
  },
};
