//! Tests of the scenario format and of `assess` on whole scenarios: round
//! trips lose nothing, file errors name their field, one bad input hides only
//! the figures that depend on it, and every demo assesses cleanly.

use super::*;
use crate::assess::{assess, assess_with_study};
use crate::figure::ids;

fn all_demos() -> Vec<(String, Scenario)> {
    demos::all()
        .into_iter()
        .map(|d| (d.key.to_string(), (d.build)()))
        .collect()
}

#[test]
fn every_demo_assesses_without_input_errors_and_without_nan() {
    for (key, s) in all_demos() {
        let r = assess(&s).unwrap();
        assert!(r.errors.is_empty(), "{key}: {:?}", r.errors);
        for f in &r.figures {
            if let Some(v) = f.value {
                assert!(v.is_finite(), "{key}: {} = {v}", f.id);
            } else {
                assert!(
                    !f.missing.is_empty(),
                    "{key}: {} missing without a reason",
                    f.id
                );
            }
        }
        for c in &r.checks {
            for x in [c.value, c.limit, c.margin_ratio, c.margin_difference]
                .into_iter()
                .flatten()
            {
                assert!(x.is_finite(), "{key}: check {} has {x}", c.id);
            }
        }
        assert!(
            !r.cautions.is_empty(),
            "{key}: the general cautions always apply"
        );
        assert_eq!(r.scenario_hash.len(), 64);
    }
}

#[test]
fn json_round_trip_loses_nothing_the_user_typed() {
    for (key, s) in all_demos() {
        let text = s.to_json();
        let back = Scenario::from_json(&text).unwrap_or_else(|e| panic!("{key}: {e}"));
        // `to_json` fills the informative SI values; everything else is equal.
        let mut a = s.clone();
        let mut b = back.clone();
        resolve::visit_values(&mut a, &mut |_, v| v.si = None);
        resolve::visit_values(&mut b, &mut |_, v| v.si = None);
        assert_eq!(a, b, "{key}");
        // And a second trip is byte-identical.
        assert_eq!(back.to_json(), text, "{key}");
    }
}

#[test]
fn to_json_records_the_si_value_beside_the_text() {
    let s = demos::carriage_stop();
    let v: serde_json::Value = serde_json::from_str(&s.to_json()).unwrap();
    assert_eq!(v["part"]["mass"]["text"], "85 kg");
    assert_eq!(v["part"]["mass"]["si"], 85.0);
    // 1.2 m typed, 1.2 m in SI.
    assert_eq!(v["part"]["travel"]["si"], 1.2);
    // 12 kN → 12 000 N.
    assert_eq!(v["contact"]["law"]["force_at_stroke"]["si"], 12000.0);
}

#[test]
fn file_errors_name_the_field_path() {
    let mut v: serde_json::Value = serde_json::from_str(&demos::guard_door().to_json()).unwrap();
    v["part"]["travel"] = serde_json::json!(86);
    let e = Scenario::from_json(&v.to_string()).unwrap_err();
    assert_eq!(e.path, "part.travel", "{e}");
    let e = Scenario::from_json("{\"schema_version\": 1").unwrap_err();
    assert!(e.message.contains("line 1"), "{e}");
    let e = Scenario::from_json("{\"schema_version\": 1, \"bogus\": 2}").unwrap_err();
    assert!(e.message.contains("bogus"), "{e}");
}

#[test]
fn a_bad_contact_input_keeps_the_release_figures() {
    let mut s = demos::carriage_stop();
    if let ContactInput::Buffer(b) = &mut s.contact {
        if let BufferLawInput::PowerLaw { stroke, .. } = &mut b.law {
            *stroke = Value::new("40 kg");
        }
    }
    let r = assess(&s).unwrap();
    assert_eq!(r.errors.len(), 1);
    assert_eq!(r.errors[0].field, "contact.law.stroke");
    assert!(r.errors[0].message().contains("length"), "{}", r.errors[0]);
    assert!(r.value(ids::RELEASE_CONTACT_SPEED).is_some());
    let peak = r.figure(ids::IMPACT_PEAK_FORCE).unwrap();
    assert_eq!(peak.value, None);
    assert!(
        peak.missing
            .iter()
            .any(|m| m.contains("contact.law.stroke")),
        "{:?}",
        peak.missing
    );
}

#[test]
fn a_bad_spring_input_names_itself_in_the_missing_figures() {
    let mut s = demos::ejector();
    if let Some(SpringInput {
        model: SpringModelInput::Linear { rate, .. },
        ..
    }) = &mut s.spring
    {
        *rate = Value::new("-8 N/mm");
    }
    let r = assess(&s).unwrap();
    assert_eq!(r.errors[0].field, "spring.model.rate");
    let e = r.figure(ids::ENERGY_STORED_LATCHED).unwrap();
    assert!(e.value.is_none());
    assert!(
        e.missing.iter().any(|m| m.contains("spring.model.rate")),
        "{:?}",
        e.missing
    );
    // The text typed is kept as typed in the report's input list.
    assert!(r
        .inputs
        .iter()
        .any(|i| i.path == "spring.model.rate" && i.text == "-8 N/mm"));
}

#[test]
fn the_study_reproduces_exactly_with_the_same_seed() {
    let s = demos::carriage_stop();
    let mut s = s;
    s.study.samples = 500;
    let a = assess_with_study(&s).unwrap().study.unwrap();
    let b = assess_with_study(&s).unwrap().study.unwrap();
    assert_eq!(a, b);
    s.study.seed += 1;
    let c = assess_with_study(&s).unwrap().study.unwrap();
    assert_ne!(a.monte_carlo, c.monte_carlo);
    // Toleranced inputs: mass, drive force, buffer force.
    assert_eq!(a.inputs.len(), 3, "{:?}", a.inputs);
}

#[test]
fn residual_energy_of_the_brake_is_what_lockout_must_release() {
    // Hooke's law on the spring states: residual = ½·k·s_rest² with the
    // spring still compressed 9.0 mm on its stop (9.6 mm latched − 0.6 mm
    // travel). Exact for a linear characteristic (basic mechanics).
    let r = assess(&demos::brake_springs()).unwrap();
    let k = r.value(ids::SPRING_RATE).unwrap();
    let residual = r.value(ids::ENERGY_RESIDUAL).unwrap();
    let expected = 0.5 * k * 0.009 * 0.009;
    assert!((residual - expected).abs() <= crate::test_tol::REL_EXACT * 1e3 * expected);
    assert!(r
        .cautions
        .iter()
        .any(|c| c.caution.id == crate::cautions::CautionId::LockOutStoredEnergy));
}

#[test]
fn an_older_schema_version_in_memory_is_refused_not_misread() {
    let mut s = demos::guard_door();
    s.schema_version = 99;
    assert!(assess(&s).is_err());
}

#[test]
fn a_bottoming_buffer_accounts_for_every_joule() {
    // Work–energy theorem over the stroke (basic mechanics): kinetic energy
    // at contact plus the net drive work over the stroke used equals the
    // energy absorbed plus the energy left for the hard stop; the trade's
    // effective mass 2·E/v² uses that whole energy.
    let r = assess(&demos::carriage_stop()).unwrap();
    let ke = r.value(ids::RELEASE_KINETIC_ENERGY).unwrap();
    let stroke = r.value(ids::IMPACT_STROKE_USED).unwrap();
    let absorbed = r.value(ids::IMPACT_ENERGY_PER_CYCLE).unwrap();
    let left = r.value(ids::IMPACT_RESIDUAL_ENERGY).unwrap();
    assert!(left > 0.0, "the demo's elastomer bottoms");
    // Drive 150 N less friction 0.02·85 kg·g_n, along the stroke.
    let net = 150.0 - 0.02 * 85.0 * crate::G_N;
    let expected = ke + net * stroke;
    // Integration at rtol 1e-8 over two phases: 1e-6 relative is ample.
    const REL_ODE_ENERGY: f64 = 1e-6;
    assert!(((absorbed + left) - expected).abs() <= REL_ODE_ENERGY * expected);
    let v = r.value(ids::RELEASE_CONTACT_SPEED).unwrap();
    let me = r.value(ids::IMPACT_EFFECTIVE_MASS).unwrap();
    assert!((me - 2.0 * expected / (v * v)).abs() <= REL_ODE_ENERGY * me);
}

#[test]
fn cautions_name_the_figures_and_checks_that_brought_them_up() {
    let r = assess(&demos::guard_door()).unwrap();
    let find = |id| r.cautions.iter().find(|c| c.caution.id == id).unwrap();
    let lock = find(crate::cautions::CautionId::LockOutStoredEnergy);
    assert!(lock.figures.iter().any(|f| f == ids::ENERGY_STORED_LATCHED));
    let exceeded = find(crate::cautions::CautionId::LimitExceeded);
    let failing: Vec<&str> = r
        .checks
        .iter()
        .filter(|c| c.verdict == crate::figure::Verdict::Fail)
        .map(|c| c.id.as_str())
        .collect();
    assert!(!failing.is_empty());
    for id in failing {
        assert!(exceeded.checks.iter().any(|c| c == id), "{id}");
    }
}

#[test]
fn an_unusable_optional_input_removes_what_depends_on_it_not_more() {
    // Cycles per hour feed only the heat load.
    let mut s = demos::carriage_stop();
    s.cycles_per_hour = Some(Value::new("-5 /h"));
    let r = assess(&s).unwrap();
    let heat = r.figure(ids::IMPACT_HEAT_LOAD).unwrap();
    assert_eq!(heat.value, None);
    assert!(heat.missing.iter().any(|m| m.contains("cycles_per_hour")));
    assert!(r.value(ids::IMPACT_PEAK_FORCE).is_some());
    // A bad mass does not hide the energy stored in the spring.
    let mut s = demos::ejector();
    if let PartInput::Translating(t) = &mut s.part {
        t.mass = Value::new("heavy");
    }
    let r = assess(&s).unwrap();
    assert!(r.value(ids::ENERGY_STORED_LATCHED).is_some());
    let speed = r.figure(ids::RELEASE_CONTACT_SPEED).unwrap();
    assert!(
        speed.missing.iter().any(|m| m.contains("part.mass")),
        "{:?}",
        speed.missing
    );
}

/// Field identification with a cross-check by a second method: the rate
/// used is the first method's; the second is reported beside it with the
/// agreement test E = |k_a − k_b|/√(u_a² + u_b²) ≤ 2 (JCGM 100:2008 6.3.3).
/// The spring is 1000 N/m: 2 kg sags m·g/k = 19.6133 mm (g_n, NIST SP 330)
/// and oscillates with T = 2π·√(m/k) = 0.280993 s (SDOF, spring mass left
/// out), both derived here from the closed forms.
#[test]
fn a_cross_check_by_a_second_method_is_compared_not_used() {
    let measured = |time: &str| {
        SpringModelInput::Measured(MeasuredInput {
            method: IdentifyInput::Static {
                mass: Value::new("2 kg"),
                sag: Value::new("19.6133 mm"),
                resolution: Value::new("0.05 mm"),
            },
            cross_check: Some(IdentifyInput::Dynamic {
                mass: Value::new("2 kg"),
                oscillations: Value::new("20"),
                time: Value::new(time),
                timing_uncertainty: Some(Value::new("0.05 s")),
                spring_mass: None,
            }),
            max_deflection: Value::new("60 mm"),
        })
    };
    let with = |time: &str| {
        let mut s = demos::ejector();
        if let Some(sp) = &mut s.spring {
            sp.model = measured(time);
        }
        assess(&s).unwrap()
    };
    // Agreement: 20 periods of 0.280993 s.
    let r = with("5.61986 s");
    assert!(r.errors.is_empty(), "{:?}", r.errors);
    let k = r.value(crate::identify::ids::IDENTIFY_RATE).unwrap();
    let k2 = r.value(crate::identify::ids::IDENTIFY_RATE_CHECK).unwrap();
    assert!((k - 1000.0).abs() < 0.5, "{k}");
    assert!((k2 - 1000.0).abs() < 0.5, "{k2}");
    let c = r.identification_comparison.as_ref().unwrap();
    assert!(!c.disagree && c.likely_causes.is_empty(), "{c:?}");
    // Natural frequency of the 2 kg on 1000 N/m: (1/2π)·√(g/δ) from the sag
    // and N/t as timed, both (1/2π)·√(k/m) = 3.55881 Hz (SDOF theory,
    // reference-values.md §10; derived closed form).
    let f_static = r
        .value(crate::identify::ids::IDENTIFY_NATURAL_FREQUENCY)
        .unwrap();
    let f_timed = r
        .value(&format!(
            "{}_check",
            crate::identify::ids::IDENTIFY_NATURAL_FREQUENCY
        ))
        .unwrap();
    let f = (1000.0f64 / 2.0).sqrt() / (2.0 * std::f64::consts::PI);
    // The inputs are typed to 6 significant figures.
    const REL_SIX_FIGURES: f64 = 1e-5;
    assert!(
        (f_static - f).abs() < REL_SIX_FIGURES * f,
        "{f_static} vs {f}"
    );
    assert!(
        (f_timed - f).abs() < REL_SIX_FIGURES * f,
        "{f_timed} vs {f}"
    );
    // A slow count (6.5 s: k ≈ 747 N/m) disagrees, and the causes say why.
    let r = with("6.5 s");
    let c = r.identification_comparison.as_ref().unwrap();
    assert!(c.disagree, "{c:?}");
    assert!(c
        .likely_causes
        .iter()
        .any(|x| x.cause == crate::identify::LikelyCause::SpringMassIgnored));
    let e = r
        .value(crate::identify::ids::IDENTIFY_DISAGREEMENT)
        .unwrap();
    assert!(e > 2.0, "{e}");
    // The figures use the first method's rate, not the cross-check.
    assert!((r.value(crate::identify::ids::IDENTIFY_RATE).unwrap() - 1000.0).abs() < 0.5);
    // A broken cross-check names its field and leaves the first rate alone.
    let r = with("fast");
    assert!(
        r.errors
            .iter()
            .any(|e| e.field == "spring.model.cross_check.time"),
        "{:?}",
        r.errors
    );
    assert!(r.value(crate::identify::ids::IDENTIFY_RATE).is_some());
}

#[test]
fn files_in_another_encoding_or_too_large_are_refused_with_the_reason() {
    let text = demos::ejector().to_json();
    // A UTF-8 byte-order mark (Windows editors write one) is skipped.
    let with_bom = [b"\xEF\xBB\xBF".as_slice(), text.as_bytes()].concat();
    assert!(Scenario::from_bytes(&with_bom).is_ok());
    assert!(Scenario::from_json(&format!("\u{feff}{text}")).is_ok());
    let utf16: Vec<u8> = "\u{feff}{}"
        .encode_utf16()
        .flat_map(u16::to_le_bytes)
        .collect();
    let e = Scenario::from_bytes(&utf16).unwrap_err();
    assert!(e.message.contains("UTF-16"), "{e}");
    // Latin-1 writes the ejector's "±" (UTF-8 C2 B1) as the single byte B1.
    let mut bytes = text.clone().into_bytes();
    let at = bytes.windows(2).position(|w| w == [0xC2, 0xB1]).unwrap();
    bytes.remove(at);
    let e = Scenario::from_bytes(&bytes).unwrap_err();
    assert!(
        e.message.contains("not UTF-8") && e.message.contains("0xB1"),
        "{e}"
    );
    let big = vec![b' '; MAX_FILE_BYTES + 1];
    let e = Scenario::from_bytes(&big).unwrap_err();
    assert!(e.message.contains("at most 4 MB"), "{e}");
    assert!(Scenario::from_bytes(b"")
        .unwrap_err()
        .message
        .contains("empty"));
}

#[test]
fn truncated_and_deeply_nested_files_say_so() {
    let text = demos::guard_door().to_json();
    let e = Scenario::from_json(text.get(..text.len() / 2).unwrap_or("")).unwrap_err();
    assert!(e.message.contains("ends before"), "{e}");
    let deep = format!("{}{}", "[".repeat(10_000), "]".repeat(10_000));
    let e = Scenario::from_json(&deep).unwrap_err();
    assert!(e.message.contains("nested deeper"), "{e}");
}

#[test]
fn errors_inside_a_tagged_choice_name_the_exact_field() {
    let base: serde_json::Value = serde_json::from_str(&demos::guard_door().to_json()).unwrap();
    let cases = [
        (
            "/part/travel/text",
            serde_json::json!(5),
            "part.travel.text",
        ),
        (
            "/contact/region",
            serde_json::json!("elbow"),
            "contact.region",
        ),
        (
            "/spring/model/rate/tol",
            serde_json::json!(3),
            "spring.model.rate.tol",
        ),
        (
            "/gap/body_parts/1",
            serde_json::json!(42),
            "gap.body_parts.1",
        ),
    ];
    for (pointer, wrong, want) in cases {
        let mut v = base.clone();
        *v.pointer_mut(pointer).unwrap() = wrong;
        let e = Scenario::from_json(&v.to_string()).unwrap_err();
        assert_eq!(e.path, want, "{e}");
    }
    let mut v = base.clone();
    v["part"]["inertia"]["mass"]["unit"] = serde_json::json!("kg");
    let e = Scenario::from_json(&v.to_string()).unwrap_err();
    assert_eq!(e.path, "part.inertia.mass.unit", "{e}");
}

#[test]
fn a_study_asking_for_too_many_samples_says_so() {
    for samples in [0, MAX_STUDY_SAMPLES + 1, u32::MAX] {
        let mut s = demos::carriage_stop();
        s.study.samples = samples;
        let r = assess(&s).unwrap();
        assert!(
            r.errors.iter().any(|e| e.field == "study.samples"),
            "{samples}: {:?}",
            r.errors
        );
    }
    let mut s = demos::carriage_stop();
    s.study.samples = 2_000;
    assert!(assess(&s).unwrap().errors.is_empty());
}

#[test]
fn absurd_and_non_finite_texts_are_input_errors_naming_the_field() {
    for text in ["NaN", "inf", "-inf", "∞", "1e300 kg", "1e13", "1e-20 kg"] {
        let mut s = demos::carriage_stop();
        if let PartInput::Translating(t) = &mut s.part {
            t.mass = Value::new(text);
        }
        let r = assess(&s).unwrap();
        assert_eq!(r.errors.len(), 1, "{text}: {:?}", r.errors);
        assert_eq!(r.errors[0].field, "part.mass", "{text}");
        assert!(r.value(ids::RELEASE_CONTACT_SPEED).is_none(), "{text}");
    }
}

/// Found by the structure-aware fuzz target: `from_value` let a scenario of
/// another format version through, and `assess` then refused it; the
/// refusal now comes where the value is read, naming the field.
#[test]
fn from_value_refuses_another_format_version() {
    let mut v = serde_json::to_value(demos::ejector()).unwrap();
    v["schema_version"] = serde_json::json!(0);
    let e = Scenario::from_value(v).unwrap_err();
    assert_eq!(e.path, "schema_version", "{e}");
}

/// Found by the structure-aware fuzz target: a measured-table buffer whose
/// unloading curve starts at 20 mm, with a 1 mm preload, cannot be built;
/// the impact figures were missing without a reason and the error sat in
/// the notes under `contact.law.law.preload_deflection`. It is now an input
/// error on `contact.law.preload_deflection` and the reason the impact
/// figures are missing.
#[test]
fn a_buffer_whose_inputs_do_not_fit_together_is_an_input_error() {
    let mut s = demos::carriage_stop();
    let pt = |q: &str, f: &str| PointInput {
        deflection: Value::new(q),
        force: Value::new(f),
    };
    s.contact = ContactInput::Buffer(BufferInput {
        law: BufferLawInput::Spring {
            model: SpringModelInput::Table(TableInput {
                axis: crate::spring::Axis::Linear,
                loading: vec![pt("0", "0"), pt("20", "2000"), pt("40", "9000")],
                unloading: vec![pt("20", "800"), pt("40", "6000")],
            }),
            preload_deflection: Some(Value::new("1 mm")),
        },
        count: 1,
        restitution: None,
        radius: None,
    });
    let r = assess(&s).unwrap();
    assert_eq!(r.errors.len(), 1, "{:?}", r.errors);
    assert_eq!(r.errors[0].field, "contact.law.preload_deflection");
    let f = r.figure(ids::IMPACT_PEAK_FORCE).unwrap();
    assert!(f.value.is_none());
    assert!(
        f.missing.iter().any(|m| m.contains("preload_deflection")),
        "{:?}",
        f.missing
    );
}
