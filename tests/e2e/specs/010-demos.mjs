// Each demo loads from the picker and shows every figure exactly as the
// command-line program prints it for the same demo (one core, one
// formatting function), in SI and in US customary units; the verdict
// counts agree too. One figure per demo that has a closed form is also
// checked against it.
import { launch, assert, assertEq, assertClean, openSheet, loadDemo, pageFigures, cliFigures, cli } from '../lib.mjs';

const DEMOS = ['guard-door', 'carriage-stop', 'brake-springs', 'ejector'];

function domId(id) {
  return `fig-${id.replaceAll('.', '-')}`;
}

async function compare(page, key, units) {
  const expected = cliFigures(key, units);
  const shown = await pageFigures(page);
  assertEq(shown.map((f) => f.id).join(' '), expected.map((f) => domId(f.id)).join(' '), `${key}: same figures in the same order`);
  for (const [i, f] of expected.entries()) {
    const s = shown[i];
    assertEq(s.label, f.label, `${key}: label of ${f.id}`);
    if (f.value === '—') {
      assert(s.value.startsWith('Not computed'), `${key} ${units}: ${f.id} missing on both: ${s.value}`);
    } else {
      assertEq(s.value, f.value, `${key} ${units}: ${f.id}`);
    }
  }
  return expected.length;
}

export const tests = Object.fromEntries(DEMOS.map((key) => [
  `demo ${key}: every figure and the verdict as the CLI prints them, SI and US`,
  async () => {
    const b = await launch({ viewport: { width: 1440, height: 900 } });
    try {
      const { page } = b;
      await openSheet(page);
      await loadDemo(page, key);
      const n = await compare(page, key, 'si');
      assert(n >= 10, `${key}: ${n} figures`);
      // Verdict line: "Verdict: exceeds limit (5 within, 4 exceeding, 0 not checkable)".
      const line = cli(['assess', '-', '--format', 'text'], cli(['demo', key])).split('\n').find((l) => l.startsWith('Verdict:'));
      const [, word, pass, fail, unknown] = line.match(/^Verdict: (.+?) \((\d+) within, (\d+) exceeding, (\d+) not checkable\)/);
      const counts = (await page.locator('#overall .counts').textContent()).trim();
      const shownWord = (await page.locator('#overall .verdict-word').textContent()).trim();
      if (Number(pass) + Number(fail) + Number(unknown) > 0) {
        assertEq(shownWord, word, `${key}: verdict`);
        assert(counts.startsWith(`${pass} within, ${fail} exceeding, ${unknown} not checkable`), `${key}: counts ${counts}`);
      } else {
        // The sheet says plainly that nothing was checked rather than "within limit".
        assertEq(shownWord, 'not applicable', `${key}: no check, no pass`);
      }
      await page.locator('label[for=units-us]').click();
      await compare(page, key, 'us');
      assert(!(await page.locator('body').textContent()).includes('NaN'), 'never NaN');
      assertClean(b.log, key);
    } finally {
      await b.close();
    }
  },
]));

tests['ejector: stored energy is ½·k·x² and the released energy the same (the striker leaves the spring)'] = async () => {
  const b = await launch();
  try {
    const { page } = b;
    await openSheet(page);
    await loadDemo(page, 'ejector');
    // Hooke's law, E = ½·k·x² (common practice): ½ · 8 N/mm · (30 mm)² = 3.6 J;
    // the striker leaves the spring at its free length, so all of it is released.
    const stored = (await page.locator('#fig-energy-stored_latched .figure-value').textContent()).trim();
    const released = (await page.locator('#fig-energy-released .figure-value').textContent()).trim();
    assert(/^3\.60* J$/.test(stored), `stored ${stored}`);
    assertEq(released, stored, 'released = stored');
    assertClean(b.log, 'ejector');
  } finally {
    await b.close();
  }
};
