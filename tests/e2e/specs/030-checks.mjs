// Checks: figure against limit with margin, verdict in words and icon, the
// source with its status (a limit from memory says so), attached cautions
// that lead to their text.
import { launch, assert, assertEq, assertClean, typeInto, openSheet, figureText } from '../lib.mjs';

const num = (s) => parseFloat(s.replace('−', '-'));

export const tests = {
  async 'check rows read figure, limit, margin, verdict and source'() {
    const b = await launch();
    try {
      const { page } = b;
      await openSheet(page);
      const row = page.locator('#check-guard-kinetic_energy');
      const fig = await figureText(page, 'fig-release-kinetic_energy');
      assertEq((await row.locator('.check-value').textContent()).trim(), fig, 'the row shows the figure card value');
      const status = await row.locator('.status').textContent();
      assertEq(status, 'from memory: confirm against the current edition', 'memory status visible');
      assert(await row.locator('.verdict .verdict-icon').count() === 1, 'an icon beside the word');

      const user = page.locator('#check-user-peak_buffer_force_against_the_rating_of_its_mount');
      const value = num(await user.locator('.check-value').textContent());
      const limit = num((await user.locator('.check-limit').textContent()).replace('at most', ''));
      assertEq(limit, 500, 'user limit as typed');
      const word = (await user.locator('.verdict-word').textContent()).trim();
      assertEq(word, value > limit ? 'exceeds limit' : 'within limit', 'verdict agrees with the numbers shown');
      const ratio = num((await user.locator('.check-ratio').textContent()).replace('uses', ''));
      assert(Math.abs(ratio - (100 * value) / limit) <= 0.005 * ratio + 0.05, `ratio ${ratio} matches ${value}/${limit}`);
      assertEq((await user.locator('.status').textContent()), 'supplied by the user: not checked by Joulewise', 'user status');

      await typeInto(page.locator('#limit-mount'), '2 kN');
      await page.waitForFunction(() =>
        document.querySelector('#check-user-peak_buffer_force_against_the_rating_of_its_mount .verdict-word')?.textContent === 'within limit');
      assertEq((await page.locator('#overall .verdict-word').textContent()), 'within limit', 'overall verdict follows');

      // The caution attached to a check leads to its text.
      await row.locator('.check-cautions a').first().click();
      assert(page.url().endsWith('#caution-values-from-memory'), page.url());
      assert(await page.locator('#caution-values-from-memory').isVisible(), 'caution shown');
      const general = await page.locator('.caution[data-general=true]').count();
      assert(general >= 3, `general cautions always shown (${general})`);
      assertClean(b.log, 'checks');
    } finally {
      await b.close();
    }
  },

  async 'figures open their method, source and assumptions by keyboard'() {
    const b = await launch();
    try {
      const { page } = b;
      await openSheet(page);
      const card = page.locator('#fig-release-contact_speed');
      await card.locator('summary').focus();
      await page.keyboard.press('Enter');
      assert(await card.locator('details').evaluate((d) => d.open), 'opened by keyboard');
      const how = await card.locator('details dl').textContent();
      assert(how.includes('Method') && how.includes('Source') && how.includes('Dormand'), how);
      // An open disclosure stays open while the user types.
      await typeInto(page.locator('#part-mass'), '4 kg');
      await page.waitForFunction(() => document.querySelector('#fig-release-effective_mass .num')?.textContent === '4');
      assert(await card.locator('details').evaluate((d) => d.open), 'still open after recomputation');
      assertClean(b.log, 'figures');
    } finally {
      await b.close();
    }
  },
};
