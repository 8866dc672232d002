//! The checks of the verification catalogue, grouped by the subject they
//! mainly cover, each with its reference, tolerance and runner. Tolerances
//! are the named constants below, each with its reason; a check never
//! carries a bare number.

use super::Basis::{self, *};
use super::{Check, Reference, Runner, Tolerance, ToleranceKind};
use crate::figure::SourceStatus::{self as S};

// ── Tolerances ───────────────────────────────────────────────────────────

/// Exact definitions or closed forms on both sides.
const FLOAT: Tolerance = Tolerance {
    relative: 1e-12,
    kind: ToleranceKind::FloatRounding,
    why: "both sides evaluate exact definitions or closed forms in double precision: only a few units of rounding (2.2e-16 each) separate them",
};
/// Agreement to the last bit (the same arithmetic in both).
const LAST_BIT: Tolerance = Tolerance {
    relative: 1e-15,
    kind: ToleranceKind::FloatRounding,
    why: "the core evaluates the interpolation as numpy 2.x does, so the results agree to the last bit; 1e-15 allows one unit in the last place",
};
/// NIST SP 811 prints factors to 7 significant figures.
const SP811_7SF: Tolerance = Tolerance {
    relative: 5e-7,
    kind: ToleranceKind::PrintedDigits,
    why: "NIST SP 811 prints rounded factors to 7 significant figures: half a unit in the 7th figure is at most 5e-7 relative",
};
/// Values printed to 5 figures (reference table tolerance).
const PRINTED_5SF: Tolerance = Tolerance {
    relative: 1e-4,
    kind: ToleranceKind::PrintedDigits,
    why: "the reference value is printed to 4–5 significant figures; the project's reference table states 1e-4 for these rows",
};
/// Values printed to 4 figures.
const PRINTED_4SF: Tolerance = Tolerance {
    relative: 5e-4,
    kind: ToleranceKind::PrintedDigits,
    why: "the reference value is printed to 4 significant figures: half a unit in the 4th figure is at most 5e-4 relative",
};
/// Values printed to 3–4 figures (reference table tolerance 1e-3).
const PRINTED_3SF: Tolerance = Tolerance {
    relative: 1e-3,
    kind: ToleranceKind::PrintedDigits,
    why: "the reference value is printed to 3–4 significant figures (e.g. 1.314 N/mm, 149.9 mm); the reference table states 1e-3 for these rows",
};
/// A pass/fail decision must agree.
const DECISION: Tolerance = Tolerance {
    relative: 0.0,
    kind: ToleranceKind::Decision,
    why: "a verdict at a published boundary must agree exactly; a value at the limit itself passes",
};
/// Closed form against the core's ODE at product settings.
const ODE_CLOSED_FORM: Tolerance = Tolerance {
    relative: 1e-7,
    kind: ToleranceKind::OdeTolerance,
    why: "Dormand–Prince 5(4) at the product setting rtol 1e-8 against an exact solution: global error about 0.5·rtol per quarter period (measured in the ODE tests), bound 1e-7",
};
/// Two tight integrations of the same equations.
const ODE_TIGHT: Tolerance = Tolerance {
    relative: 1e-8,
    kind: ToleranceKind::OdeTolerance,
    why: "Joulewise at rtol 1e-12 against scipy DOP853 at rtol 1e-12, atol 1e-14 times the state scale: each global error is below 1e-10 over a release or a stop, events are located to machine precision on both dense outputs, and peaks are searched on order-4 (Joulewise) and order-7 (DOP853) interpolants; 1e-8 leaves a hundredfold margin yet exposes any wrong term in the equations (a missing friction or gravity term moves the figures by percent)",
};
/// Product settings against a tight reference.
const ODE_DEFAULT: Tolerance = Tolerance {
    relative: 2e-6,
    kind: ToleranceKind::OdeTolerance,
    why: "Joulewise at its product settings (rtol 1e-8, atol 1e-12) against scipy DOP853 at rtol 1e-12: the local error per step is held below 1e-8 and a release plus stop takes up to ~100 steps, so the global error is bounded by ~1e-6; 2e-6 is the bound every figure the user sees must meet",
};
/// Power-law buffers with an exponent below one.
const ODE_NON_SMOOTH: Tolerance = Tolerance {
    relative: 1e-5,
    kind: ToleranceKind::OdeTolerance,
    why: "a power law a·xⁿ with n < 1 has an unbounded slope at first contact, where both integrators lose their order over the first steps (measured 8e-7 in the core's tests at product settings); 1e-5",
};
/// Quadrature of a smooth integrand.
const QUADRATURE: Tolerance = Tolerance {
    relative: 1e-10,
    kind: ToleranceKind::Quadrature,
    why: "scipy.integrate.quad (QUADPACK QAGS, epsabs 0, epsrel 1e-13) of a smooth force law against the core's closed-form or exact-interpolant work: the quadrature error estimate stays below 1e-12 relative, 1e-10 leaves room for the core's series inversion (bisection to 2⁻⁶⁰ of the bracket) and rounding",
};
/// Exact piecewise-polynomial integrals.
const PIECEWISE_POLY: Tolerance = Tolerance {
    relative: 1e-11,
    kind: ToleranceKind::FloatRounding,
    why: "both integrate the same cubic Hermite pieces exactly (scipy via PPoly antiderivatives, the core via the Hermite basis integrals): rounding of sums of a few dozen terms, well below 1e-11",
};
/// GUM propagation by central differences against automatic derivatives.
const GUM_DIFFERENCES: Tolerance = Tolerance {
    relative: 1e-7,
    kind: ToleranceKind::Quadrature,
    why: "the core takes sensitivity coefficients by central differences with a step of 1e-6 of each input (truncation ~1e-12, rounding ~1e-16/1e-6 = 1e-10 relative); uncertainties differentiates exactly; 1e-7 on the combined uncertainty, far below its own meaning (two figures)",
};
/// Rayleigh's one-third against the exact continuous spring.
const RAYLEIGH: Tolerance = Tolerance {
    relative: 3e-3,
    kind: ToleranceKind::ModelApproximation,
    why: "Rayleigh's one-third spring mass gives β² = r/(1 + r/3) where the exact fixed–free spring gives β·tan β = r (r = spring mass / load): to leading order the frequencies differ by r²/90 and a rate identified from a period (∝ ω²) by r²/45, 2.0e-3 at r = 0.3, the largest ratio checked; 3e-3",
};
/// A fine chain of masses against the continuous spring.
const CHAIN: Tolerance = Tolerance {
    relative: 1e-5,
    kind: ToleranceKind::Quadrature,
    why: "a uniform spring discretised into 2 000 masses and springs: the lowest eigenfrequency differs from the continuum's by (π/N)²/24 ≈ 1e-7 relative; 1e-5",
};
/// Sizing fed back into the impact model.
const ROUND_TRIP: Tolerance = Tolerance {
    relative: 1e-8,
    kind: ToleranceKind::OdeTolerance,
    why: "the sized stroke, peak force and stopping time are closed forms, or quadratures placed on the limit to 1e-9 (the sizing module's boundary tolerance); the impact model integrates the stroke at rtol 1e-10, a global error below 1e-9; 1e-8 covers both, and a design at its governing limit is allowed 1e-8 past it",
};

// ── References ───────────────────────────────────────────────────────────

const fn r(basis: Basis, name: &'static str, detail: &'static str, status: S) -> Reference {
    Reference {
        basis,
        name,
        detail,
        status,
    }
}

const SOLVE_IVP: &str = "scipy.integrate.solve_ivp";
const DOP853: &str =
    "DOP853, rtol 1e-12, atol 1e-14 × state scale; events located on the dense output";
const QUAD: &str = "scipy.integrate.quad";
const QUAD_DETAIL: &str =
    "QAGS, epsabs 0, epsrel 1e-13, of a force law written from the model's formula";
const PINT: &str = "pint";
const BHANDARI: &str = "Bhandari, Design of Machine Elements, 3rd ed.";
const SHIGLEY10: &str = "Shigley's Mechanical Engineering Design, 10th ed.";
const SHIGLEY8: &str = "Shigley's Mechanical Engineering Design, 8th ed.";
const NIST: &str = "NIST SP 811 (2008)";
const SDOF: &str = "SDOF closed forms (reference table §10)";
const ISO15066: &str = "ISO/TS 15066:2016";
const ISO13854: &str = "ISO 13854:2017";
const EN81: &str = "EN 81-20:2014/2020";
const CALT8: &str = "Cal. Code Regs. Title 8";
const CFR179: &str = "29 CFR 1910.179";
const EN12453: &str = "EN 12453:2000/2017";
const ISO14120: &str = "ISO 14120:2015";
const ROUND: &str = "Joulewise round trip";
const MECHANICS: &str = "closed forms of mechanics";

const fn core(
    id: &'static str,
    title: &'static str,
    covers: &'static [&'static str],
    reference: Reference,
    tolerance: Tolerance,
    path: &'static str,
) -> Check {
    Check {
        id,
        title,
        covers,
        reference,
        tolerance,
        runner: Runner::CoreUnitTest { path },
    }
}

const fn cross(
    id: &'static str,
    title: &'static str,
    covers: &'static [&'static str],
    reference: Reference,
    tolerance: Tolerance,
    file: &'static str,
    name: &'static str,
) -> Check {
    Check {
        id,
        title,
        covers,
        reference,
        tolerance,
        runner: Runner::CrossCrateTest { file, name },
    }
}

const fn py(
    id: &'static str,
    title: &'static str,
    covers: &'static [&'static str],
    reference: Reference,
    tolerance: Tolerance,
) -> Check {
    Check {
        id,
        title,
        covers,
        reference,
        tolerance,
        runner: Runner::PythonSuite,
    }
}

// Subjects covered, named once.
const UNITS: &[&str] = &["units"];
const HELICAL: &[&str] = &["spring.helical"];
const TORSION: &[&str] = &["spring.torsion"];
const DISC: &[&str] = &["spring.disc"];
const TRANSLATING: &[&str] = &["release.translating"];
const ROTATING: &[&str] = &["release.rotating"];
const BODY: &[&str] = &["contact.body"];
const SIZING: &[&str] = &["sizing"];

pub(super) static CHECKS: &[Check] = &[
    // ── Units ────────────────────────────────────────────────────────────
    py(
        "py.units.pint_factors",
        "Every unit of the table: its factor to SI against pint's conversion of the unit's pint expression",
        UNITS,
        r(ReferenceLibrary, PINT, "Quantity(1, expr).to(SI unit of the kind).magnitude", S::Secondary),
        FLOAT,
    ),
    py(
        "py.units.parser",
        "Every spelling of every unit: parse_quantity(\"1 <spelling>\") against pint's value of one such unit in SI",
        UNITS,
        r(ReferenceLibrary, PINT, "Quantity(1, expr).to(SI unit of the kind).magnitude", S::Secondary),
        FLOAT,
    ),
    core(
        "core.units.nist_lbf",
        "Pound-force in newtons",
        UNITS,
        r(PublishedValue, NIST, "Appendix B.8: 4.448 222 N", S::Secondary),
        SP811_7SF,
        "units::format::tests::nist_pound_force",
    ),
    core(
        "core.units.nist_ft_lbf",
        "Foot pound-force in joules",
        UNITS,
        r(PublishedValue, NIST, "Appendix B.8: 1.355 818 J", S::Secondary),
        SP811_7SF,
        "units::format::tests::nist_foot_pound_force",
    ),
    core(
        "core.units.nist_lbf_in",
        "Pound-force inch in newton metres",
        UNITS,
        r(PublishedValue, NIST, "Appendix B.8: 0.112 984 8 N·m", S::Secondary),
        SP811_7SF,
        "units::format::tests::nist_pound_force_inch",
    ),
    core(
        "core.units.nist_lbf_per_in",
        "Pound-force per inch in newtons per metre",
        UNITS,
        r(PublishedValue, NIST, "Appendix B.8: 175.126 8 N/m", S::Secondary),
        SP811_7SF,
        "units::format::tests::nist_pound_force_per_inch",
    ),
    core(
        "core.units.nist_psi",
        "Pound-force per square inch in pascals",
        UNITS,
        r(PublishedValue, NIST, "Appendix B.8: 6 894.757 Pa (listing from memory)", S::FromMemory),
        SP811_7SF,
        "units::format::tests::nist_psi",
    ),
    core(
        "core.units.nist_gn_feet",
        "Standard gravity in ft/s²",
        UNITS,
        r(PublishedValue, NIST, "Appendix B.8: g_n = 9.806 65 m/s² exactly; 32.174 05 ft/s²", S::Secondary),
        SP811_7SF,
        "units::format::tests::nist_standard_gravity_in_feet",
    ),
    core(
        "core.units.nist_exact",
        "Exact base definitions: inch, foot, pound, kilogram-force",
        UNITS,
        r(PublishedValue, NIST, "Appendix B.8, exact definitions", S::Secondary),
        FLOAT,
        "units::format::tests::nist_exact_base_definitions",
    ),
    // ── Springs ──────────────────────────────────────────────────────────
    py(
        "py.spring.linear_energy",
        "Linear spring: work between deflections against the quadrature of F = k·q",
        &["spring.linear"],
        r(ReferenceLibrary, QUAD, QUAD_DETAIL, S::Derived),
        QUADRATURE,
    ),
    py(
        "py.spring.helical_rate_energy",
        "Helical spring: rate G·d⁴/(8·D³·n) recomputed from the geometry, and the work against the quadrature of its force",
        HELICAL,
        r(ReferenceLibrary, QUAD, QUAD_DETAIL, S::Confirmed),
        QUADRATURE,
    ),
    core(
        "core.helical.bhandari_10_1",
        "Helical spring rate, deflection and free length",
        HELICAL,
        r(PublishedValue, BHANDARI, "Ex. 10.1: k = 41.203 N/mm, free length 109.34 mm", S::Confirmed),
        PRINTED_5SF,
        "spring::helical::tests::t1_bhandari_ex_10_1_rate_and_free_length",
    ),
    cross(
        "cross.helical.bhandari_10_5",
        "Helical spring rate of a spring balance",
        HELICAL,
        r(PublishedValue, BHANDARI, "Ex. 10.5: d = 7, D = 42 mm, N = 22, G = 81 370 N/mm² ⇒ 14.98 N/mm", S::Confirmed),
        PRINTED_4SF,
        "published_values.rs",
        "bhandari_ex_10_5_spring_balance_rate",
    ),
    cross(
        "cross.helical.bhandari_10_6",
        "Helical rate and total coils of a wagon buffer spring",
        HELICAL,
        r(PublishedValue, BHANDARI, "Ex. 10.6: d = 20, D = 120 mm, N = 13 ⇒ 72.44 N/mm; N_t = 15", S::Confirmed),
        PRINTED_4SF,
        "published_values.rs",
        "bhandari_ex_10_6_wagon_buffer_spring_rate",
    ),
    cross(
        "cross.helical.bhandari_10_10",
        "Solid length of a squared-and-ground spring",
        HELICAL,
        r(PublishedValue, BHANDARI, "Ex. 10.10: d = 18 mm, N = 10, N_t = 12 ⇒ solid length 216 mm", S::Confirmed),
        FLOAT,
        "published_values.rs",
        "bhandari_ex_10_10_solid_length",
    ),
    core(
        "core.helical.shigley_10e",
        "Helical rate, Bergsträsser factor, force at yield (SI example)",
        HELICAL,
        r(PublishedValue, SHIGLEY10, "Problem 10-3: k = 1.314 N/mm, K_B = 1.117, F_s = 167.9 N", S::Confirmed),
        PRINTED_3SF,
        "spring::helical::tests::t2_t5_shigley_10e_problem_10_3",
    ),
    core(
        "core.helical.shigley_8e",
        "Helical rate and force at yield in US units",
        &["spring.helical", "units"],
        r(PublishedValue, SHIGLEY8, "Problem 10-3: k = 11.55 lbf/in, F_s = 45.2 lbf", S::Confirmed),
        PRINTED_3SF,
        "spring::helical::tests::t3_shigley_8e_problem_10_3_us_units",
    ),
    core(
        "core.helical.stress_factors",
        "Bergsträsser and Wahl factors and their difference",
        HELICAL,
        r(PublishedValue, SHIGLEY10, "Problem 10-1: K_W(4) = 1.40375, K_B(4) = 1.38462, 1.363 % and 0.743 %", S::Confirmed),
        PRINTED_5SF,
        "spring::helical::tests::t4_bergstrasser_and_wahl",
    ),
    core(
        "core.helical.buckling",
        "Critical free length against buckling",
        HELICAL,
        r(PublishedValue, SHIGLEY10, "Problem 10-3, Eq. 10-10: (L₀)_cr = 149.9 mm", S::Confirmed),
        PRINTED_3SF,
        "spring::helical::tests::t6_buckling_against_shigley",
    ),
    core(
        "core.helical.rayleigh_t10",
        "Spring mass and its one-third share; launch speed with and without it",
        &["spring.helical", "release.translating"],
        r(CommonPractice, "Rayleigh spring-mass correction", "reference table T10 (derived; one third confirmed)", S::Derived),
        PRINTED_3SF,
        "spring::helical::tests::t10_spring_mass_and_rayleigh_share",
    ),
    core(
        "core.material.music_wire",
        "Tensile strength of music wire from S_ut = A/d^m",
        HELICAL,
        r(PublishedValue, SHIGLEY10, "Problem 10-3: S_ut = 1 936 MPa at d = 2.5 mm", S::Confirmed),
        PRINTED_4SF,
        "spring::material::tests::music_wire_strength_matches_shigley_problem_10_3",
    ),
    core(
        "core.material.en10270_moduli",
        "Shear and Young's moduli of EN 10270-1 wire",
        HELICAL,
        r(PublishedValue, "EN 10270-1 data as quoted by a spring maker", "G = 81 500, E = 206 000 N/mm²", S::Secondary),
        FLOAT,
        "spring::material::tests::en10270_1_moduli_as_quoted",
    ),
    py(
        "py.spring.rayleigh_exact",
        "One-third spring mass: natural frequency of a load on a helical spring against the exact fixed–free spring (β·tan β = m_s/m)",
        &["spring.helical", "identify"],
        r(CommonPractice, "scipy.optimize.brentq", "root of β·tan β = m_s/m; Rayleigh's m_s/3 (reference table §10, confirmed)", S::Confirmed),
        RAYLEIGH,
    ),
    py(
        "py.spring.surge_chain",
        "Surge frequency ½·√(k/m_s) against the lowest mode of the spring discretised into a chain of masses",
        HELICAL,
        r(ReferenceLibrary, "scipy.linalg.eigh_tridiagonal", "2 000 masses, fixed–fixed", S::CommonPractice),
        CHAIN,
    ),
    py(
        "py.spring.extension_energy",
        "Extension spring with initial tension: force and work against the quadrature of F = F₀ + k·s",
        &["spring.extension"],
        r(ReferenceLibrary, QUAD, QUAD_DETAIL, S::FromMemory),
        QUADRATURE,
    ),
    py(
        "py.spring.torsion_energy",
        "Torsion spring: rate E·d⁴/(64·D·n) from the geometry and work against the quadrature of its torque",
        TORSION,
        r(ReferenceLibrary, QUAD, QUAD_DETAIL, S::Confirmed),
        QUADRATURE,
    ),
    core(
        "core.torsion.bhandari_10_21",
        "Torsion spring coils for a given rate",
        TORSION,
        r(PublishedValue, BHANDARI, "Ex. 10.21: n = E·d⁴/(64·D·k) = 392.53", S::Confirmed),
        PRINTED_5SF,
        "spring::torsion::tests::t11_bhandari_ex_10_21_coils",
    ),
    core(
        "core.torsion.door_energy",
        "Energy of a door spring unwinding from 2.0 to 0.5 rad",
        TORSION,
        r(DerivedClosedForm, SDOF, "T12: ΔE = 3.75 J", S::Derived),
        FLOAT,
        "spring::torsion::tests::t12_door_energy",
    ),
    py(
        "py.spring.gas_energy",
        "Gas spring: force on both branches and work against the quadrature of a polytropic law written from gas volumes (p·V^κ = const)",
        &["spring.gas"],
        r(ReferenceLibrary, QUAD, QUAD_DETAIL, S::CommonPractice),
        QUADRATURE,
    ),
    core(
        "core.gas.isothermal",
        "Isothermal gas spring energy in its logarithmic closed form",
        &["spring.gas"],
        r(DerivedClosedForm, MECHANICS, "isothermal ideal gas: W = F₁·V₁/A·ln(V₁/V₂)", S::CommonPractice),
        FLOAT,
        "spring::gas::tests::isothermal_energy_has_the_log_form",
    ),
    py(
        "py.spring.disc_energy",
        "Disc-spring stacks (K₁ and M constants, series and parallel, friction): force and work against the quadrature of the Almen–László force",
        DISC,
        r(ReferenceLibrary, QUAD, QUAD_DETAIL, S::FromMemory),
        QUADRATURE,
    ),
    core(
        "core.disc.bhandari_10_26",
        "Belleville spring flat force with the textbook constant M",
        DISC,
        r(PublishedValue, BHANDARI, "Ex. 10.26: M = 0.62684, F_flat = 4 500 N", S::Confirmed),
        PRINTED_3SF,
        "spring::disc::tests::t13_bhandari_ex_10_26_flat_force_with_m",
    ),
    core(
        "core.disc.series_a_40",
        "Disc spring 40 × 20.4 × 2.25 at 0.75·h₀ with DIN K₁",
        DISC,
        r(PublishedValue, "DIN 2093 / EN 16983 dimension table", "series A 40: F ≈ 6 500 N (catalogue value from memory)", S::FromMemory),
        PRINTED_3SF,
        "spring::disc::tests::t14_din_k1_series_a_40",
    ),
    py(
        "py.spring.table_pchip",
        "Measured table: loading and unloading forces and work against scipy's monotone cubic interpolant and its exact integral",
        &["spring.table"],
        r(ReferenceLibrary, "scipy.interpolate.PchipInterpolator", "values and PPoly.integrate", S::Derived),
        PIECEWISE_POLY,
    ),
    core(
        "core.table.scipy_pchip",
        "Measured table against PchipInterpolator values printed by hand",
        &["spring.table"],
        r(ReferenceLibrary, "scipy.interpolate.PchipInterpolator", "values and integrals printed with repr", S::Derived),
        FLOAT,
        "spring::table::tests::matches_scipy_pchip",
    ),
    py(
        "py.spring.series_parallel",
        "Series and parallel combinations (helical, extension with initial tension, gas, disc, table): shared force by root finding, work against the quadrature of the combined force",
        &["spring.combine"],
        r(ReferenceLibrary, QUAD, "QAGS of the series force found by scipy.optimize.brentq on Σ q_i(F) = q", S::CommonPractice),
        QUADRATURE,
    ),
    // ── Identification ───────────────────────────────────────────────────
    py(
        "py.identify.gum",
        "Static sag, timed oscillation, two-point gauge and frequency from sag: values and combined standard uncertainties against first-order propagation by the uncertainties package",
        &["identify"],
        r(ReferenceLibrary, "uncertainties", "ufloat arithmetic (first-order propagation, exact derivatives)", S::CommonPractice),
        GUM_DIFFERENCES,
    ),
    core(
        "core.identify.t27",
        "Natural frequency from static deflection, 15.76/√δ[mm] Hz",
        &["identify"],
        r(CommonPractice, "SDOF theory", "reference table T27: 15.761, 6.434, 3.152 Hz", S::Secondary),
        PRINTED_3SF,
        "identify::static_sag::tests::t27_frequency_from_static_deflection",
    ),
    // ── Integrator ───────────────────────────────────────────────────────
    core(
        "core.ode.tableau",
        "Dormand–Prince coefficients meet the fifth-order quadrature conditions",
        &["ode"],
        r(PublishedValue, "Dormand & Prince, J. Comput. Appl. Math. 6 (1980)", "RK5(4)7M tableau", S::CommonPractice),
        FLOAT,
        "ode::tableau::tests::fifth_order_weights_meet_the_quadrature_conditions",
    ),
    core(
        "core.ode.shm",
        "Simple harmonic motion follows its sine",
        &["ode"],
        r(DerivedClosedForm, MECHANICS, "x = A·sin(ωt): rtol 1e-8", S::CommonPractice),
        ODE_CLOSED_FORM,
        "ode::tests::shm_follows_a_sine",
    ),
    core(
        "core.ode.free_fall",
        "Free fall lands at √(2h/g)",
        &["ode"],
        r(DerivedClosedForm, MECHANICS, "free fall: t = √(2h/g), event located on the dense output", S::CommonPractice),
        ODE_CLOSED_FORM,
        "ode::tests::free_fall_lands_at_the_closed_form_time",
    ),
    py(
        "py.ode.product_settings",
        "Every release and impact case of the suite at the product solver settings against scipy at rtol 1e-12",
        &["ode", "release.translating", "release.rotating", "buffer.linear", "buffer.power_law", "buffer.spring_model", "buffer.ideal_absorber", "buffer.orifice", "buffer.constant_force"],
        r(ReferenceLibrary, SOLVE_IVP, DOP853, S::CommonPractice),
        ODE_DEFAULT,
    ),
    // ── Release ──────────────────────────────────────────────────────────
    py(
        "py.release.translating",
        "Sliding part: contact speed, time to contact, where it leaves its spring, stall position; with friction, drive, incline, viscous damping and the spring's mass share",
        TRANSLATING,
        r(ReferenceLibrary, SOLVE_IVP, DOP853, S::CommonPractice),
        ODE_TIGHT,
    ),
    py(
        "py.release.rotating",
        "Hinged part: torsion spring at the hinge and gas strut with exact geometry, gravity torque on a tilted hinge from a 3-D rotation, hinge friction, drive torque: edge speed, time to contact, stall angle",
        ROTATING,
        r(ReferenceLibrary, SOLVE_IVP, DOP853, S::CommonPractice),
        ODE_TIGHT,
    ),
    core(
        "core.release.energy",
        "Frictionless release conserves energy",
        TRANSLATING,
        r(DerivedClosedForm, MECHANICS, "work–energy theorem: ½·M·v² = W_spring, rtol 1e-12", S::CommonPractice),
        Tolerance {
            relative: 1e-9,
            kind: ToleranceKind::OdeTolerance,
            why: "energy at rtol 1e-12: error about 0.5·rtol per quarter period of the motion; 1e-9",
        },
        "release::tests::frictionless_release_conserves_energy",
    ),
    core(
        "core.mechanism.t10",
        "Launch speed with the spring's one-third mass share",
        TRANSLATING,
        r(DerivedClosedForm, SDOF, "T10: 7.217 m/s with m_s/3, 8.119 m/s without", S::Derived),
        PRINTED_3SF,
        "mechanism::tests::t10_spring_mass_share_lowers_the_launch_speed",
    ),
    core(
        "core.mechanism.t12",
        "Spring-closed door: edge speed and effective mass I/r²",
        ROTATING,
        r(DerivedClosedForm, SDOF, "T12: ω = 3.5355 rad/s, v = 2.1213 m/s, m_eff = 1.667 kg", S::Derived),
        PRINTED_5SF,
        "mechanism::tests::t12_spring_closed_door_edge_speed_and_effective_mass",
    ),
    core(
        "core.release.t12_time",
        "Spring-closed door closes at the reference speed and the SHM time",
        ROTATING,
        r(DerivedClosedForm, SDOF, "T12, SHM arc-cosine time", S::Derived),
        PRINTED_5SF,
        "release::tests::t12_door_closes_at_the_reference_speed_and_the_shm_time",
    ),
    core(
        "core.release.lid_strut",
        "Lid on a gas strut under gravity matches the energy balance",
        ROTATING,
        r(DerivedClosedForm, MECHANICS, "work–energy theorem: exact strut work split at the over-centre point", S::CommonPractice),
        ODE_CLOSED_FORM,
        "release::tests::lid_on_a_strut_under_gravity_matches_the_energy_balance",
    ),
    // ── Buffers ──────────────────────────────────────────────────────────
    py(
        "py.impact.linear",
        "Linear spring buffers with drive, incline, friction and two buffers: stroke, peak force and deceleration, stop time, mean deceleration, energy, rebound speed, time above a deceleration",
        &["buffer.linear"],
        r(ReferenceLibrary, SOLVE_IVP, DOP853, S::CommonPractice),
        ODE_TIGHT,
    ),
    py(
        "py.impact.power_law",
        "Elastomer buffers F = a·xⁿ (n = 1.5, 3) with drive and restitution: the same figures",
        &["buffer.power_law"],
        r(ReferenceLibrary, SOLVE_IVP, DOP853, S::CommonPractice),
        ODE_TIGHT,
    ),
    py(
        "py.impact.power_law_soft",
        "Degressive elastomer buffer F = a·x^0.6: the same figures",
        &["buffer.power_law"],
        r(ReferenceLibrary, SOLVE_IVP, DOP853, S::CommonPractice),
        ODE_NON_SMOOTH,
    ),
    py(
        "py.impact.table_unloading",
        "Buffer from a measured table with an unloading curve: the rebound follows the unloading curve",
        &["buffer.spring_model", "spring.table"],
        r(ReferenceLibrary, SOLVE_IVP, "DOP853 on scipy's PchipInterpolator of the same table", S::CommonPractice),
        ODE_TIGHT,
    ),
    py(
        "py.impact.gas_spring",
        "Preloaded gas-spring buffer with a friction band: stroke, peak force, rebound",
        &["buffer.spring_model", "spring.gas"],
        r(ReferenceLibrary, SOLVE_IVP, DOP853, S::CommonPractice),
        ODE_TIGHT,
    ),
    py(
        "py.impact.constant_force",
        "Constant-force buffer with drive and friction",
        &["buffer.constant_force"],
        r(ReferenceLibrary, SOLVE_IVP, DOP853, S::CommonPractice),
        ODE_TIGHT,
    ),
    py(
        "py.impact.ideal_absorber",
        "Ideal hydraulic absorbers (η = 1 and 0.8) with drive, gravity and friction: force level from E_T/s, stroke, stop time, peak force",
        &["buffer.ideal_absorber"],
        r(ReferenceLibrary, SOLVE_IVP, DOP853, S::CommonPractice),
        ODE_TIGHT,
    ),
    py(
        "py.impact.orifice",
        "Orifice dampers F = c·v² with and without drive: residual speed at the end of the stroke, compression time, peak force and energy",
        &["buffer.orifice"],
        r(ReferenceLibrary, SOLVE_IVP, DOP853, S::CommonPractice),
        ODE_TIGHT,
    ),
    py(
        "py.release_impact.continuous",
        "Release followed by the buffer stroke with the mechanism still acting: an ejector pushing into a gas-spring buffer, a spring-closed door on a linear buffer at a radius",
        &["release.translating", "release.rotating", "buffer.linear", "buffer.spring_model"],
        r(ReferenceLibrary, SOLVE_IVP, DOP853, S::CommonPractice),
        ODE_TIGHT,
    ),
    core(
        "core.buffer.t8",
        "Mass striking a linear spring: stroke, peak force, stop time, mean deceleration",
        &["buffer.linear"],
        r(DerivedClosedForm, SDOF, "T8: 44.72 mm, 894.43 N, 35.12 ms, 56.94 m/s²", S::Derived),
        PRINTED_5SF,
        "contact::buffer::tests::t8_mass_striking_a_linear_spring",
    ),
    core(
        "core.buffer.t7",
        "Railway wagon on two spring buffers",
        &["buffer.linear"],
        r(PublishedValue, BHANDARI, "Ex. 10.6: KE = 1 687.5 J, P = 11 250 N per spring", S::Confirmed),
        Tolerance {
            relative: 1e-6,
            kind: ToleranceKind::OdeTolerance,
            why: "KE and P are exact in the example; the stroke comes from the ODE at rtol 1e-8 (the reference table states 1e-6)",
        },
        "contact::buffer::tests::t7_railway_wagon_on_two_spring_buffers",
    ),
    core(
        "core.buffer.t9",
        "Drop onto a spring, standalone and as one continuous simulation",
        &["buffer.linear", "release.translating"],
        r(DerivedClosedForm, SDOF, "T9: x = 21.864 mm, F = 218.64 N", S::Derived),
        PRINTED_5SF,
        "contact::buffer::tests::t9_drop_onto_a_spring_standalone_and_continuous",
    ),
    core(
        "core.buffer.linear_drive",
        "Linear spring with a drive force against the SDOF closed form",
        &["buffer.linear"],
        r(DerivedClosedForm, SDOF, "x = (F_D + √(F_D² + k·m·v²))/k", S::Derived),
        ODE_CLOSED_FORM,
        "contact::buffer::tests::linear_spring_with_a_drive_force",
    ),
    core(
        "core.buffer.time_above",
        "Time above a deceleration threshold against (π/2 − asin(a/a_peak))/ω",
        &["buffer.linear"],
        r(DerivedClosedForm, SDOF, "time above a threshold on a sine", S::Derived),
        Tolerance {
            relative: 1e-5,
            kind: ToleranceKind::OdeTolerance,
            why: "crossing times from the order-4 dense derivative, one order less accurate than the state: 1e-5 at rtol 1e-8",
        },
        "contact::buffer::tests::time_above_a_deceleration_threshold",
    ),
    core(
        "core.buffer.power_law",
        "Power-law stroke ((n + 1)·E/a)^(1/(n+1)) and restitution rebound e·v",
        &["buffer.power_law"],
        r(DerivedClosedForm, MECHANICS, "work–energy theorem; Newton's impact law: reference table §10", S::Derived),
        ODE_CLOSED_FORM,
        "contact::buffer::tests::power_law_buffer_stroke",
    ),
    core(
        "core.buffer.unloading_curve",
        "Rebound from an unloading branch returning 60 % of the energy",
        &["buffer.spring_model"],
        r(DerivedClosedForm, MECHANICS, "energy balance: v_out = √0.6·v", S::Derived),
        ODE_CLOSED_FORM,
        "contact::buffer::tests::a_measured_unloading_curve_sets_the_rebound",
    ),
    core(
        "core.buffer.constant_force",
        "Constant-force stroke and stop time",
        &["buffer.constant_force"],
        r(DerivedClosedForm, MECHANICS, "constant deceleration: x = ½·m·v²/(F₀ − F_D)", S::CommonPractice),
        ODE_CLOSED_FORM,
        "contact::buffer::tests::constant_force_buffer_stroke",
    ),
    core(
        "core.buffer.t28",
        "Ideal absorber and linear spring with drive energy",
        &["buffer.ideal_absorber", "buffer.linear"],
        r(DerivedClosedForm, SDOF, "T28: E_T = 137.5 J, 2 750 N ideal, 5 500 N spring, 82 500 J/h", S::Derived),
        Tolerance {
            relative: 1e-6,
            kind: ToleranceKind::OdeTolerance,
            why: "the reference table states 1e-6 for T28; the ideal absorber's constant force is integrated exactly up to the stop event",
        },
        "contact::buffer::tests::t28_ideal_absorber_and_linear_spring_with_drive_energy",
    ),
    core(
        "core.buffer.orifice",
        "Orifice damper residual speed v₀·e^(−c·s/m) and compression time",
        &["buffer.orifice"],
        r(DerivedClosedForm, MECHANICS, "separation of variables: v(x) = v₀·e^(−c·x/m)", S::CommonPractice),
        ODE_CLOSED_FORM,
        "contact::buffer::tests::orifice_damper_bottoms_with_the_exponential_residual_speed",
    ),
    core(
        "core.buffer.damped_peak",
        "Peak deceleration of a damped part driven into a linear buffer, reached before the standstill",
        &["buffer.linear", "release.translating"],
        r(DerivedClosedForm, MECHANICS, "damped SDOF: u = e^(−σt)·(A·cos ω_d t + B·sin ω_d t), peak where d³x/dt³ = 0", S::Derived),
        Tolerance {
            relative: 1e-9,
            kind: ToleranceKind::OdeTolerance,
            why: "integration at rtol 1e-12 (global error ~1e-11) against the closed form; the peak located by golden-section search on the order-4 dense derivative to ~1e-10",
        },
        "contact::buffer::tests::peak_deceleration_of_a_damped_part_is_found_between_steps",
    ),
    core(
        "core.buffer.door",
        "Spring-closed door keeps pressing its buffer: absorbed energy includes the spring's work during the stroke",
        &["buffer.linear", "release.rotating"],
        r(DerivedClosedForm, MECHANICS, "work–energy theorem: E = ½·I·ω² + ∫T_spring dθ", S::CommonPractice),
        ODE_CLOSED_FORM,
        "contact::buffer::tests::spring_closed_door_keeps_pressing_its_buffer",
    ),
    // ── Body contact and gaps ────────────────────────────────────────────
    py(
        "py.body.two_body",
        "Transient contact: two masses on the body spring (with a pad in series that may bottom) integrated in time; peak force, transferred energy and the speed at which the force reaches its limit",
        BODY,
        r(ReferenceLibrary, SOLVE_IVP, "DOP853 of the two-mass system, peak at the relative standstill", S::Secondary),
        ODE_TIGHT,
    ),
    py(
        "py.body.clamping",
        "Quasi-static clamping with the spring relaxing as body and pad yield: static balance solved by root finding",
        BODY,
        r(ReferenceLibrary, "scipy.optimize.brentq", "F = F₀ − k_s·δ(F)", S::CommonPractice),
        FLOAT,
    ),
    core(
        "core.body.t15",
        "Transfer energy for hand, chest and abdomen",
        &["contact.body", "limits.body_regions"],
        r(PublishedValue, ISO15066, "Annex A, Tables A.2 and A.3: 0.5227 J, 1.568 J, 2.420 J (T15)", S::Secondary),
        PRINTED_4SF,
        "contact::body::tests::t15_transfer_energy_hand_chest_abdomen",
    ),
    core(
        "core.body.t16",
        "Permissible speed of a hand contact",
        BODY,
        r(PublishedValue, ISO15066, "Annex A: v = 1.359 m/s (m_R = 10 kg), 1.397 m/s (5 kg) (T16)", S::Secondary),
        PRINTED_4SF,
        "contact::body::tests::t16_permissible_speed_hand",
    ),
    core(
        "core.body.t17",
        "Pressure route and the lower speed governing",
        BODY,
        r(PublishedValue, ISO15066, "Annex A: 1.844 m/s by pressure, force governs (T17)", S::Secondary),
        PRINTED_4SF,
        "contact::body::tests::t17_pressure_route_and_lower_governs",
    ),
    core(
        "core.body.t18",
        "No transient contact with skull, forehead or face",
        &["contact.body", "limits.body_regions"],
        r(PublishedValue, ISO15066, "A.3.2; Table A.2 footnote c (T18)", S::Secondary),
        DECISION,
        "contact::body::tests::t18_head_and_face_not_permissible",
    ),
    core(
        "core.body.table_1c",
        "Permissible speeds per region for m_R = 5 and 10 kg",
        BODY,
        r(PublishedValue, ISO15066, "Annex A, derived table §1c", S::Derived),
        Tolerance {
            relative: 1.4e-3,
            kind: ToleranceKind::PrintedDigits,
            why: "speeds printed to 3 decimals: half a unit is 5e-4 m/s, up to 1.4e-3 relative at 0.357 m/s",
        },
        "contact::body::tests::table_1c_permissible_speeds",
    ),
    py(
        "py.gap.hinged_edge",
        "Gap at the edge of a hinged lid (chord, arc, normal) from rotated position vectors, and the angle back from the gap",
        &["contact.gap"],
        r(ReferenceLibrary, "numpy", "rotation of the edge point; distance, arc and height", S::CommonPractice),
        FLOAT,
    ),
    core(
        "core.gap.t19",
        "Gaps against the minimum gaps: 24 mm fails and 25 mm passes for a finger, 49/50 mm for toes",
        &["contact.gap", "limits.crushing_gaps"],
        r(PublishedValue, ISO13854, "Table 1 (T19)", S::Secondary),
        DECISION,
        "contact::gap::tests::t19_iso_13854_comparisons",
    ),
    // ── Sizing ───────────────────────────────────────────────────────────
    py(
        "py.sizing.solve_ivp",
        "Sized buffers of every type (linear, power law, ideal absorber, gas spring, orifice) integrated forward: stroke, peak force, stop time and every limit",
        SIZING,
        r(ReferenceLibrary, SOLVE_IVP, DOP853, S::Derived),
        ODE_TIGHT,
    ),
    cross(
        "cross.sizing.impact_round_trip",
        "Sized buffers of every type fed back into the impact model meet every limit",
        &["sizing", "buffer.linear", "buffer.power_law", "buffer.ideal_absorber", "buffer.orifice", "buffer.spring_model"],
        r(RoundTrip, ROUND, "sizing::size_buffer → contact::buffer::impact", S::Derived),
        ROUND_TRIP,
        "sizing_round_trip.rs",
        "sized_buffers_meet_every_limit_in_the_impact_model",
    ),
    core(
        "core.sizing.t7",
        "Railway wagon buffers sized from the stroke",
        SIZING,
        r(PublishedValue, BHANDARI, "Ex. 10.6: k = 75 N/mm per spring", S::Confirmed),
        FLOAT,
        "sizing::tests::t7_railway_wagon_on_two_spring_buffers",
    ),
    core(
        "core.sizing.t8",
        "Linear buffer sized from its peak force",
        SIZING,
        r(DerivedClosedForm, SDOF, "T8", S::Derived),
        PRINTED_5SF,
        "sizing::tests::t8_mass_striking_a_linear_spring_sized_from_its_peak_force",
    ),
    core(
        "core.sizing.t25_t26",
        "Constant-deceleration strokes of crane bumpers",
        &["sizing", "limits.crane"],
        r(PublishedValue, CFR179, "(e)(2), (e)(3): 0.889 in, 9.70 mm (T25, T26)", S::Confirmed),
        PRINTED_3SF,
        "sizing::tests::t25_t26_constant_deceleration_strokes_of_crane_bumpers",
    ),
    core(
        "core.sizing.t28",
        "Drive-force energy, ideal absorber and spring",
        SIZING,
        r(DerivedClosedForm, SDOF, "T28", S::Derived),
        FLOAT,
        "sizing::tests::t28_drive_force_energy_ideal_and_spring",
    ),
    // ── Statistics of the tolerance study ────────────────────────────────
    py(
        "py.stats.quantile",
        "Type-7 quantiles of samples with ties, spreads and extremes against numpy.quantile",
        &["tolerance"],
        r(ReferenceLibrary, "numpy", "numpy.quantile(method=\"linear\")", S::CommonPractice),
        LAST_BIT,
    ),
    py(
        "py.stats.wilson",
        "Wilson 95 % intervals of exceedance probabilities against scipy",
        &["tolerance"],
        r(ReferenceLibrary, "scipy.stats.binomtest", "proportion_ci(confidence_level=0.95, method=\"wilson\")", S::CommonPractice),
        FLOAT,
    ),
    core(
        "core.stats.numpy",
        "Type-7 quantiles against numpy values printed by hand",
        &["tolerance"],
        r(ReferenceLibrary, "numpy", "numpy.quantile printed with repr", S::CommonPractice),
        LAST_BIT,
        "tolerance::stats::tests::type7_quantile_matches_numpy_bit_for_bit",
    ),
    // ── Limit sets ───────────────────────────────────────────────────────
    py(
        "py.limits.transcription",
        "Every entry of every limit set against an independent transcription of the published value (or rule) with its status",
        &["limits.guards", "limits.body_regions", "limits.crushing_gaps", "limits.lift_en81", "limits.lift_us", "limits.crane", "limits.gates"],
        r(PublishedValue, "reference table (project's shared/reference-values.md)", "values as published; status per row", S::Secondary),
        FLOAT,
    ),
    py(
        "py.limits.us_rules",
        "US rules written in feet, inches, ft/min and lbf, converted with pint: gravity stopping distance, oil-buffer stroke, hoist strokes, crane decelerations and check speeds",
        &["limits.lift_us", "limits.crane", "limits.guards"],
        r(ReferenceLibrary, PINT, "rules in their published units converted to SI", S::Confirmed),
        FLOAT,
    ),
    core(
        "core.guards.iso14120",
        "Guard closing force and energy limits",
        &["limits.guards"],
        r(PublishedValue, ISO14120, "75 N / 4 J, 150 N / 10 J (from memory: clause not confirmed)", S::FromMemory),
        DECISION,
        "limits::guards::tests::iso_14120_values_from_memory",
    ),
    core(
        "core.guards.t12",
        "Spring-closed door T12 against the 4 J limit",
        &["limits.guards"],
        r(PublishedValue, ISO14120, "4 J (from memory)", S::FromMemory),
        DECISION,
        "limits::guards::tests::spring_closed_door_t12_against_the_4_j_limit",
    ),
    core(
        "core.guards.us_edge",
        "US garage-door edge sensor 15 lbf, informative",
        &["limits.guards"],
        r(PublishedValue, "16 CFR 1211", "1211.12(a)(1): 15 lbf = 66.7 N", S::Confirmed),
        FLOAT,
        "limits::guards::tests::us_edge_sensor_15_lbf_is_informative",
    ),
    core(
        "core.limits_body.tables",
        "Forces, stiffnesses and masses per body region",
        &["limits.body_regions"],
        r(PublishedValue, ISO15066, "Tables A.2 and A.3", S::Secondary),
        FLOAT,
        "limits::body::tests::table_a2_a3_values_per_region",
    ),
    core(
        "core.limits_body.pressures",
        "Pressures per specific area",
        &["limits.body_regions"],
        r(PublishedValue, ISO15066, "Table A.2", S::Secondary),
        FLOAT,
        "limits::body::tests::table_a2_specific_area_pressures",
    ),
    core(
        "core.limits_body.energy",
        "Transfer energies per region",
        &["limits.body_regions"],
        r(PublishedValue, ISO15066, "Annex A, derived table §1c and T15", S::Derived),
        PRINTED_4SF,
        "limits::body::tests::transfer_energy_t15_and_section_1c",
    ),
    core(
        "core.gaps.table_1",
        "Minimum gaps per body part",
        &["limits.crushing_gaps"],
        r(PublishedValue, ISO13854, "Table 1", S::Secondary),
        FLOAT,
        "limits::gaps::tests::table_1_values",
    ),
    core(
        "core.gaps.t19",
        "Gap checks at the boundaries",
        &["limits.crushing_gaps"],
        r(PublishedValue, ISO13854, "Table 1 (T19)", S::Secondary),
        DECISION,
        "limits::gaps::tests::t19_boundaries",
    ),
    core(
        "core.lift.t20",
        "Linear buffer stroke 0.135·v², at least 65 mm",
        &["limits.lift_en81"],
        r(PublishedValue, EN81, "5.8.2.1.1 (T20)", S::Secondary),
        DECISION,
        "limits::lift::tests::t20_linear_buffer_stroke",
    ),
    core(
        "core.lift.t21",
        "Energy-dissipation buffer stroke 0.0674·v²",
        &["limits.lift_en81"],
        r(PublishedValue, EN81, "5.8.2.2.1 (T21)", S::Secondary),
        DECISION,
        "limits::lift::tests::t21_dissipation_buffer_stroke",
    ),
    core(
        "core.lift.t22",
        "Energy-accumulation buffers only up to 1.0 m/s",
        &["limits.lift_en81"],
        r(PublishedValue, EN81, "5.8.1.5, 5.8.1.6 (T22)", S::Secondary),
        DECISION,
        "limits::lift::tests::t22_speed_applicability",
    ),
    core(
        "core.lift.coefficients",
        "EN 81 coefficients equal the gravity stopping distance at 115 % speed",
        &["limits.lift_en81"],
        r(PublishedValue, EN81, "0.0674 = (1.15)²/(2·g_n) printed to 3 figures; 0.135 twice that", S::Secondary),
        Tolerance {
            relative: 3.8e-3,
            kind: ToleranceKind::PrintedDigits,
            why: "EN 81-20 prints 0.135 for 0.134857: half a unit in the last digit is 3.7e-3 relative",
        },
        "limits::lift::tests::en81_coefficients_match_gravity_stopping_distance",
    ),
    core(
        "core.lift.t24",
        "Retardation acceptance, EN 81 and US",
        &["limits.lift_en81", "limits.lift_us"],
        r(PublishedValue, EN81, "5.8.2.2.3; Cal. T8 §3108(b) (T24)", S::Secondary),
        DECISION,
        "limits::lift::tests::t24_retardation_acceptance_en81_and_us",
    ),
    core(
        "core.lift.reduced_stroke",
        "Reduced stroke not below 0.42 m",
        &["limits.lift_en81"],
        r(PublishedValue, EN81, "5.8.2.2.2", S::Secondary),
        DECISION,
        "limits::lift::tests::reduced_stroke_floor_042_m",
    ),
    core(
        "core.lift.nonlinear",
        "Non-linear buffer peak 6 g_n and return speed 1 m/s",
        &["limits.lift_en81"],
        r(PublishedValue, EN81, "5.8.2.1.2", S::Secondary),
        DECISION,
        "limits::lift::tests::nonlinear_peak_and_return_speed",
    ),
    core(
        "core.lift.t23",
        "US gravity stopping distance S = V²/19 320",
        &["limits.lift_us"],
        r(PublishedValue, CALT8, "§3108(a)(3) (T23): 2.738 in at 230 ft/min", S::Confirmed),
        PRINTED_4SF,
        "limits::lift::tests::t23_us_gravity_stopping_distance",
    ),
    core(
        "core.lift.hoist_bands",
        "Hoist spring-buffer stroke bands",
        &["limits.lift_us"],
        r(PublishedValue, CALT8, "§1604.14(a)(1), (b)(1)", S::Confirmed),
        DECISION,
        "limits::lift::tests::us_hoist_spring_buffer_bands",
    ),
    core(
        "core.lift.us_spring_speed",
        "Elevator spring buffers only to 200 ft/min",
        &["limits.lift_us"],
        r(PublishedValue, CALT8, "§3031(a)(3)", S::Confirmed),
        DECISION,
        "limits::lift::tests::us_elevator_spring_buffers_only_to_200_fpm",
    ),
    core(
        "core.crane.t25",
        "Bridge bumper: check speed, stroke, energy",
        &["limits.crane"],
        r(PublishedValue, CFR179, "(e)(2)(i) (T25)", S::Confirmed),
        PRINTED_3SF,
        "limits::crane::tests::t25_bridge_bumper",
    ),
    core(
        "core.crane.t26",
        "Trolley bumper: check speed, stroke, energy",
        &["limits.crane"],
        r(PublishedValue, CFR179, "(e)(3)(i) (T26)", S::Confirmed),
        PRINTED_3SF,
        "limits::crane::tests::t26_trolley_bumper",
    ),
    core(
        "core.gates.t30",
        "Gate force acceptance",
        &["limits.gates"],
        r(PublishedValue, EN12453, "400 N within 0.75 s, 150 N residual (T30; gap split from memory)", S::Secondary),
        DECISION,
        "limits::gates::tests::t30_gate_force_acceptance",
    ),
    core(
        "core.gates.gap_width",
        "Dynamic force limit by gap width",
        &["limits.gates"],
        r(PublishedValue, EN12453, "Annex A: 50–500 mm and over 500 mm (from memory)", S::FromMemory),
        DECISION,
        "limits::gates::tests::dynamic_limit_by_gap_width_from_memory",
    ),
    core(
        "core.user.compare",
        "User-defined limits compare and say they are user-supplied",
        &["limits.user"],
        r(DerivedClosedForm, MECHANICS, "margin definitions: utilisation x/L, headroom L − x", S::UserSupplied),
        DECISION,
        "limits::user::tests::compares_and_says_it_is_user_supplied",
    ),
    core(
        "core.limits.boundary",
        "A figure exactly at its limit passes with utilisation 1",
        &["limits.user", "limits.lift_en81"],
        r(DerivedClosedForm, MECHANICS, "margin definitions: 135 mm typed against 0.135 m", S::Derived),
        DECISION,
        "limits::tests::exactly_at_the_limit_passes_with_unit_utilisation",
    ),
];
