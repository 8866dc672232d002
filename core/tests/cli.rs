//! The command-line front end, run as a user runs it: every subcommand, the
//! three exit codes, file errors that name the file, line or field, the
//! schema against the demos and against broken files, and a batch register.
#![forbid(unsafe_code)]
// Test helpers may panic: a panic here is a failed test, not a user-facing crash.
#![allow(clippy::unwrap_used, clippy::expect_used)]

use std::io::Write;
use std::process::{Command, Output, Stdio};

fn bin() -> Command {
    Command::new(env!("CARGO_BIN_EXE_joulewise"))
}

fn run(args: &[&str]) -> Output {
    bin().args(args).output().expect("the binary runs")
}

fn run_stdin(args: &[&str], input: &str) -> Output {
    let mut child = bin()
        .args(args)
        .stdin(Stdio::piped())
        .stdout(Stdio::piped())
        .stderr(Stdio::piped())
        .spawn()
        .unwrap();
    child
        .stdin
        .take()
        .unwrap()
        .write_all(input.as_bytes())
        .unwrap();
    child.wait_with_output().unwrap()
}

fn text(b: &[u8]) -> String {
    String::from_utf8_lossy(b).into_owned()
}

fn tmp(name: &str, content: &str) -> std::path::PathBuf {
    let dir = std::env::temp_dir().join(format!("joulewise-cli-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let p = dir.join(name);
    std::fs::write(&p, content).unwrap();
    p
}

const DEMOS: [(&str, i32); 4] = [
    ("guard-door", 1),
    ("carriage-stop", 1),
    ("brake-springs", 0),
    ("ejector", 0),
];

#[test]
fn demo_lists_and_prints_scenarios_that_read_back() {
    let out = run(&["demo", "--list"]);
    assert!(out.status.success());
    for (key, _) in DEMOS {
        assert!(text(&out.stdout).contains(key));
        let out = run(&["demo", key]);
        assert!(out.status.success());
        joulewise_core::scenario::Scenario::from_json(&text(&out.stdout)).unwrap();
    }
    let out = run(&["demo", "no-such-demo"]);
    assert_eq!(out.status.code(), Some(2));
    assert!(text(&out.stderr).contains("guard-door"));
}

#[test]
fn assess_exit_codes_follow_the_verdict() {
    for (key, code) in DEMOS {
        let scenario = text(&run(&["demo", key]).stdout);
        let out = run_stdin(&["assess", "-"], &scenario);
        assert_eq!(
            out.status.code(),
            Some(code),
            "{key}: {}",
            text(&out.stderr)
        );
        let report: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
        assert_eq!(report["scenario_hash"].as_str().unwrap().len(), 64);
        assert!(!report["cautions"].as_array().unwrap().is_empty());
    }
}

#[test]
fn assess_text_and_csv_carry_figures_checks_and_cautions() {
    let scenario = text(&run(&["demo", "guard-door"]).stdout);
    let out = run_stdin(&["assess", "-", "--format", "text"], &scenario);
    let t = text(&out.stdout);
    for needle in [
        "Figures",
        "Checks",
        "Cautions",
        "Speed at contact",
        "ISO 13854",
        "competent person",
    ] {
        assert!(t.contains(needle), "text output lacks {needle}:\n{t}");
    }
    let out = run_stdin(
        &["assess", "-", "--format", "text", "--units", "us"],
        &scenario,
    );
    assert!(text(&out.stdout).contains("ft/s"), "US units shown");
    let out = run_stdin(&["assess", "-", "--format", "csv"], &scenario);
    let t = text(&out.stdout);
    assert!(t.starts_with("kind,id,label,value_si"));
    assert!(t.lines().any(|l| l.starts_with("check,")));
    // Quantities inside texts (formulas, labels, reasons) are written in the
    // units asked for, never as the internal tag.
    for key in ["guard-door", "carriage-stop", "brake-springs", "ejector"] {
        let scenario = text(&run(&["demo", key]).stdout);
        for units in ["si", "us"] {
            let out = run_stdin(
                &["assess", "-", "--format", "text", "--units", units],
                &scenario,
            );
            let t = text(&out.stdout);
            assert!(!t.contains('⟦') && !t.contains('⟧'), "{key} {units}:\n{t}");
        }
    }
}

#[test]
fn bad_files_exit_2_naming_the_file_and_field() {
    let p = tmp(
        "broken.json",
        "{\"schema_version\": 1, \"part\": {\"kind\": \"translating\"",
    );
    let out = run(&["assess", p.to_str().unwrap()]);
    assert_eq!(out.status.code(), Some(2));
    let e = text(&out.stderr);
    assert!(e.contains("broken.json") && e.contains("line 1"), "{e}");

    let mut v: serde_json::Value =
        serde_json::from_str(&text(&run(&["demo", "ejector"]).stdout)).unwrap();
    v["part"]["mass"]["text"] = "two kilograms".into();
    let p = tmp("bad-mass.json", &v.to_string());
    let out = run(&["assess", p.to_str().unwrap()]);
    assert_eq!(out.status.code(), Some(2));
    let e = text(&out.stderr);
    assert!(e.contains("part.mass") && e.contains("mass"), "{e}");
    // The partial report still comes out on stdout.
    let report: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    assert!(report["figures"].as_array().unwrap().len() > 3);

    let out = run(&["assess", "/no/such/file.json"]);
    assert_eq!(out.status.code(), Some(2));
    assert!(text(&out.stderr).contains("/no/such/file.json"));
}

#[test]
fn the_schema_accepts_the_demos_and_rejects_broken_files() {
    let schema: serde_json::Value = serde_json::from_slice(&run(&["schema"]).stdout).unwrap();
    let validator = jsonschema::validator_for(&schema).unwrap();
    for (key, _) in DEMOS {
        let v: serde_json::Value = serde_json::from_slice(&run(&["demo", key]).stdout).unwrap();
        let errors: Vec<String> = validator.iter_errors(&v).map(|e| e.to_string()).collect();
        assert!(errors.is_empty(), "{key}: {errors:?}");
        let mut broken = v.clone();
        broken["part"]["kind"] = "flying".into();
        assert!(
            !validator.is_valid(&broken),
            "{key}: unknown part kind accepted"
        );
        let mut broken = v.clone();
        broken.as_object_mut().unwrap().remove("part");
        assert!(!validator.is_valid(&broken), "{key}: missing part accepted");
        let mut broken = v;
        broken["part"]["mass"] = serde_json::json!(85);
        assert!(
            !validator.is_valid(&broken),
            "{key}: bare number accepted for a Value"
        );
    }
}

#[test]
fn batch_streams_a_register_with_one_row_per_mechanism() {
    let reg = text(&run(&["demo-register", "200", "--seed", "7"]).stdout);
    let p = tmp("reg.csv", &reg);
    let out = run(&["batch", p.to_str().unwrap()]);
    assert_eq!(out.status.code(), Some(1), "{}", text(&out.stderr));
    let mut rdr = csv::Reader::from_reader(out.stdout.as_slice());
    let rows: Vec<csv::StringRecord> = rdr.records().map(Result::unwrap).collect();
    assert_eq!(rows.len(), 200);
    assert!(text(&out.stderr).contains("200 rows"));
    // JSON output, same rows.
    let out = run(&["batch", p.to_str().unwrap(), "--format", "json"]);
    let v: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    assert_eq!(v.as_array().unwrap().len(), 200);
}

#[test]
fn batch_names_the_line_and_column_of_a_bad_row() {
    let template = text(&run(&["register-template"]).stdout);
    let mut lines: Vec<String> = template.lines().map(str::to_string).collect();
    // Second data row: mass typed as a force.
    lines.push(
        lines[1]
            .replace("85 kg", "85 N")
            .replace("L4-EB-01", "L4-EB-02"),
    );
    let p = tmp("reg-bad.csv", &(lines.join("\n") + "\n"));
    let out = run(&["batch", p.to_str().unwrap()]);
    assert_eq!(out.status.code(), Some(2));
    let t = text(&out.stdout);
    assert!(t.contains("line 3, mass"), "{t}");
    let p = tmp("reg-col.csv", "id,weight\nA,3 kg\n");
    let out = run(&["batch", p.to_str().unwrap()]);
    assert_eq!(out.status.code(), Some(2));
    assert!(text(&out.stderr).contains("unknown column `weight`"));
}

#[test]
fn batch_reads_json_lines() {
    let a = text(&run(&["demo", "ejector"]).stdout).replace('\n', "");
    let b = text(&run(&["demo", "brake-springs"]).stdout).replace('\n', "");
    let p = tmp("reg.jsonl", &format!("{a}\n{b}\n"));
    let out = run(&["batch", p.to_str().unwrap()]);
    assert_eq!(out.status.code(), Some(0), "{}", text(&out.stderr));
    let t = text(&out.stdout);
    assert!(t.contains("TF-3-EJ") && t.contains("TR-7-BRK"), "{t}");
}
