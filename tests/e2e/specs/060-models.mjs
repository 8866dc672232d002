// Every input model renders its fields and computes: each spring model,
// field identification (the identified rate with its uncertainty), table
// rows added and removed, series members, hinged-part shapes, every buffer
// type, every limit set and a limit of one's own with its figure picker.
import { launch, assert, assertEq, assertClean, typeInto, openSheet, loadDemo, settled, fieldId, figureText, waitFigure } from '../lib.mjs';

async function fill(page, pairs) {
  for (const [path, text] of pairs) await typeInto(page.locator(fieldId(path)), text);
  await settled(page);
}

async function pick(page, id, label) {
  await page.locator(id).selectOption({ label });
}

export const tests = {
  async 'blank sheet to figures: a linear spring on a sliding part'() {
    const b = await launch();
    try {
      const { page } = b;
      await openSheet(page);
      await loadDemo(page, 'blank');
      await fill(page, [
        ['part.mass', '2 kg'], ['part.travel', '40 mm'],
        ['spring.model.rate', '5 N/mm'], ['spring.model.max_deflection', '60 mm'],
        ['spring.mount.deflection_at_latch', '50 mm'],
      ]);
      // ½·k·x² = ½ · 5000 N/m · (0.05 m)² = 6.25 J (Hooke's law, common practice).
      await waitFigure(page, 'fig-energy-stored_latched', '6.25 J');
      // Released from 50 mm to 10 mm: ½ · 5000 · (0.05² − 0.01²) = 6 J (Hooke's law, common practice).
      await waitFigure(page, 'fig-energy-released', '6 J');
      assertEq(await page.locator('#problems').isHidden(), true, 'nothing left to fix');
      assertClean(b.log, 'blank to figures');
    } finally {
      await b.close();
    }
  },

  async 'every spring model shows its own inputs'() {
    const b = await launch();
    try {
      const { page } = b;
      await openSheet(page);
      await loadDemo(page, 'blank');
      const sel = '#f-spring-model-model';
      const cases = [
        ['Helical compression spring, from its geometry (EN 13906-1)', ['spring.model.wire_diameter', 'spring.model.active_coils', 'spring.model.material']],
        ['Extension spring, initial tension and rate', ['spring.model.initial_tension']],
        ['Torsion spring, rate per angle', ['spring.model.max_angle']],
        ['Gas spring (gas strut)', ['spring.model.nominal_force', 'spring.model.progression', 'spring.model.force_reference']],
        ['Disc-spring stack (EN 16984)', ['spring.model.cone_height', 'spring.model.in_series']],
        ['Measured force–deflection table', ['spring.model.loading.0.deflection', 'spring.model.axis']],
        ['Spring measured in the field (no data sheet)', ['spring.model.method.sag']],
        ['Springs in series (same force, deflections add)', ['spring.model.members.1.model']],
        ['Springs in parallel (same deflection, forces add)', ['spring.model.members.0.model']],
        ['Linear spring, rate given', ['spring.model.rate']],
      ];
      for (const [label, ids] of cases) {
        await pick(page, sel, label);
        for (const id of ids) await page.locator(fieldId(id)).waitFor({ timeout: 5000 });
      }
      assertClean(b.log, 'models');
    } finally {
      await b.close();
    }
  },

  async 'field identification: static sag gives k = m·g/δ with its uncertainty'() {
    const b = await launch();
    try {
      const { page } = b;
      await openSheet(page);
      await loadDemo(page, 'ejector');
      await pick(page, '#f-spring-model-model', 'Spring measured in the field (no data sheet)');
      await fill(page, [
        ['spring.model.method.mass', '5 kg'], ['spring.model.method.sag', '9.80665 mm'],
        ['spring.model.method.resolution', '0.1 mm'], ['spring.model.max_deflection', '45 mm'],
      ]);
      // k = m·g_n/δ = 5 kg · 9.806 65 m/s² / 0.009 806 65 m = 5000 N/m = 5 N/mm
      // (Hooke's law, common practice; g_n = 9.806 65 m/s², standard gravity, NIST SP 811 (2008) App. B.8).
      const ident = await page.locator('#identified-rate').textContent();
      assert(ident.includes('5 N/mm') && ident.includes('±'), `identified rate with uncertainty: ${ident}`);
      await waitFigure(page, 'fig-identify-rate', '5 N/mm');
      // A cross-check by oscillation: 5 kg on 5000 N/m, T = 2π·√(m/k) =
      // 0.198692 s (simple harmonic motion, common practice), 20 periods in
      // 3.97384 s: the same rate, and the two agree (E ≤ 2, JCGM 100:2008 6.3.3).
      await pick(page, '#f-spring-model-cross_check-method', 'Oscillation');
      await fill(page, [
        ['spring.model.cross_check.mass', '5 kg'], ['spring.model.cross_check.oscillations', '20'],
        ['spring.model.cross_check.time', '3.97384 s'], ['spring.model.cross_check.timing_uncertainty', '0.05 s'],
      ]);
      await waitFigure(page, 'fig-identify-rate_check', '5 N/mm');
      const e = await figureText(page, 'fig-identify-disagreement');
      assert(Number.parseFloat(e) < 0.01, `the two rates agree: E = ${e}`);
      assertEq(await page.locator('#problems').isHidden(), true, 'cross-check inputs complete');
      assertClean(b.log, 'identification');
    } finally {
      await b.close();
    }
  },

  async 'table rows and series members are added and removed'() {
    const b = await launch();
    try {
      const { page } = b;
      await openSheet(page);
      await loadDemo(page, 'blank');
      await pick(page, '#f-spring-model-model', 'Measured force–deflection table');
      const rows = () => page.locator('[id^="f-spring-model-loading-"][id$="-force"]').count();
      assertEq(await rows(), 3, 'three blank rows to start');
      await page.locator('#f-spring-model-loading-add').click();
      assertEq(await rows(), 4, 'a row added');
      await page.locator('#f-spring-model-loading-1-remove').click();
      assertEq(await rows(), 3, 'a row removed');
      await page.locator('#f-spring-model-unloading-add').click();
      await page.locator(fieldId('spring.model.unloading.0.force')).waitFor();

      await pick(page, '#f-spring-model-model', 'Springs in series (same force, deflections add)');
      await fill(page, [
        ['part.mass', '1 kg'], ['part.travel', '10 mm'], ['spring.mount.deflection_at_latch', '20 mm'],
        ['spring.model.members.0.rate', '10 N/mm'], ['spring.model.members.0.max_deflection', '50 mm'],
        ['spring.model.members.1.rate', '10 N/mm'], ['spring.model.members.1.max_deflection', '50 mm'],
      ]);
      // Springs in series: 1/k = 1/k₁ + 1/k₂ (common practice): two 10 N/mm springs give 5 N/mm.
      await waitFigure(page, 'fig-spring-rate', '5 N/mm');
      await page.locator('#f-spring-model-members-add').click();
      await page.locator(fieldId('spring.model.members.2.model')).waitFor();
      await page.locator('#f-spring-model-members-2-remove').click();
      assertEq(await page.locator(fieldId('spring.model.members.2.model')).count(), 0, 'member removed');
      assertClean(b.log, 'rows');
    } finally {
      await b.close();
    }
  },

  async 'hinged part shapes, strut mount, buffer types and limit sets'() {
    const b = await launch();
    try {
      const { page } = b;
      await openSheet(page);
      // Guard door: a hinged plate.
      for (const [label, field] of [
        ['Rod pivoted at one end, I = m·L²/3', 'part.inertia.length'],
        ['Disc turning about its centre, I = m·R²/2', 'part.inertia.radius'],
        ['Mass concentrated at a radius, I = m·r²', 'part.inertia.radius'],
        ['Known inertia about its centre of mass, offset from the hinge', 'part.inertia.inertia_about_cg'],
        ['Moment of inertia given directly', 'part.inertia.cg_radius'],
        ['Plate hinged along one edge, I = m·w²/3', 'part.inertia.width'],
      ]) {
        await pick(page, '#f-part-inertia-shape', label);
        await page.locator(fieldId(field)).waitFor();
      }
      assertEq(await page.locator(fieldId('part.inertia.width')).inputValue(), '550 mm', 'plate width kept');
      await pick(page, '#f-spring-mount-kind', 'As a strut pinned between the frame and the part');
      await page.locator(fieldId('spring.mount.frame_x')).waitFor();
      await pick(page, '#f-contact-kind', 'An end-of-travel buffer');
      for (const [label, field] of [
        ['Progressive elastomer, F = a·xⁿ', 'contact.law.exponent'],
        ['A spring model (gas spring, measured table…)', 'contact.law.model.nominal_force'],
        ['Constant force (set hydraulic absorber, friction brake)', 'contact.law.force'],
        ['Self-adjusting hydraulic absorber', 'contact.law.efficiency'],
        ['Orifice damper, F = c·v²', 'contact.law.coefficient'],
        ['Linear spring buffer, F = k·x', 'contact.law.rate'],
      ]) {
        await pick(page, '#f-contact-law-type', label);
        await page.locator(fieldId(field)).waitFor();
      }
      await page.locator(fieldId('contact.radius')).waitFor();
      for (const [tick, field] of [
        ['#f-limits-lift_en81', 'limits.lift_en81.rated_speed'],
        ['#f-limits-lift_us', 'limits.lift_us.rated_speed'],
        ['#f-limits-crane', 'limits.crane.rated_speed'],
        ['#f-limits-gate', 'limits.gate.gap_width'],
      ]) {
        await page.locator(tick).check();
        await page.locator(fieldId(field)).waitFor();
      }
      await fill(page, [['limits.gate.gap_width', '300 mm']]);
      assert(await page.locator('[id^="check-gate"]').count() > 0, 'gate checks appear');
      assertClean(b.log, 'shapes');
    } finally {
      await b.close();
    }
  },

  async 'a limit of your own on a figure from the picker'() {
    const b = await launch();
    try {
      const { page } = b;
      await openSheet(page);
      await loadDemo(page, 'ejector');
      await page.locator('#f-limits-user-add').click();
      await page.locator('#f-limits-user-0-figure').selectOption({ label: 'Speed at contact' });
      await typeInto(page.locator('#f-limits-user-0-name'), 'Striker speed rating');
      await fill(page, [['limits.user.0.threshold', '0.5 m/s']]);
      const check = page.locator('.check', { hasText: 'Striker speed rating' });
      await check.waitFor();
      assert((await check.textContent()).includes('exceeds limit'), 'checked against the figure');
      assertClean(b.log, 'own limit');
    } finally {
      await b.close();
    }
  },
};
