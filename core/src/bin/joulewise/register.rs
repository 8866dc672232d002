//! `joulewise batch`: a whole plant register, one mechanism per row, streamed
//! so memory stays flat whatever the register's length.
//!
//! CSV registers have one column per input (see [`COLUMNS`]); every cell
//! takes a number with a unit as in the web sheet (`85 kg`, `3 lbf/in`), and
//! a row may instead point at a full scenario file (`scenario_file`). JSON
//! Lines registers hold one scenario per line; a JSON array is also read (whole,
//! so its memory grows with the register).

use anyhow::{bail, Context, Result};
use joulewise_core::assess::assess_summary;
use joulewise_core::figure::{ids, Verdict};
use joulewise_core::limits::guards::GuardKind;
use joulewise_core::report::Report;
use joulewise_core::scenario::*;
use serde::Serialize;
use std::collections::HashMap;
use std::io::{BufRead, BufReader, Write};
use std::path::{Path, PathBuf};
use std::time::Instant;

/// Register columns with what each means (printed by `register-template`).
pub const COLUMNS: &[(&str, &str)] = &[
    ("id", "row identifier (required)"),
    ("title", "assessment title"),
    ("machine_tag", "machine tag or asset number"),
    ("location", "plant, line, cell"),
    ("part", "translating (default) or rotating"),
    ("mass", "moving mass, e.g. 85 kg"),
    (
        "travel",
        "travel from latch to contact: length (translating) or angle (rotating)",
    ),
    (
        "incline",
        "incline of the travel above horizontal, e.g. -90 deg for falling",
    ),
    ("friction_mu", "Coulomb coefficient"),
    ("friction_force", "fixed friction force"),
    (
        "drive_force",
        "drive force that keeps pushing (translating)",
    ),
    ("inertia_shape", "rotating: plate, rod, point or given"),
    ("size", "rotating: plate width, rod length or point radius"),
    (
        "inertia",
        "rotating, shape given: moment of inertia about the hinge",
    ),
    (
        "cg_radius",
        "rotating, shape given: centre of mass from the hinge",
    ),
    (
        "hinge_tilt",
        "rotating: hinge axis from vertical (90 deg horizontal hinge)",
    ),
    (
        "cg_angle",
        "rotating: centre-of-mass angle above horizontal at the latch",
    ),
    ("hazard_radius", "rotating: closing edge from the hinge"),
    ("drive_torque", "rotating: drive torque"),
    ("spring", "none, linear, torsion, gas or extension"),
    ("spring_rate", "rate (N/mm, N·m/rad...)"),
    (
        "spring_max_deflection",
        "largest admissible deflection (or angle)",
    ),
    (
        "spring_latched",
        "spring deflection (or angle) in the latched position",
    ),
    (
        "spring_detaches",
        "yes if the part leaves the spring at its free length",
    ),
    (
        "spring_sense",
        "unloads (drives the part, default) or loads",
    ),
    ("spring_initial_tension", "extension spring initial tension"),
    ("gas_force", "gas spring nominal force"),
    ("gas_progression", "gas spring progression F2/F1"),
    ("gas_stroke", "gas spring stroke"),
    (
        "contact",
        "none, linear, power_law, constant_force, absorber, orifice or body",
    ),
    ("buffer_rate", "linear buffer rate"),
    ("buffer_stroke", "buffer stroke"),
    (
        "buffer_force",
        "force at full stroke (power_law) or force level (constant_force)",
    ),
    ("buffer_exponent", "power-law exponent"),
    ("buffer_efficiency", "absorber efficiency"),
    ("buffer_coefficient", "orifice coefficient c in F = c·v²"),
    ("buffer_count", "number of buffers acting together"),
    ("restitution", "coefficient of restitution"),
    (
        "body_region",
        "body contact: region, e.g. hand_fingers, chest",
    ),
    ("contact_length", "body contact: edge length"),
    ("contact_width", "body contact: edge width"),
    ("guard", "none, power_operated or self_closing"),
    (
        "protective_device",
        "yes if a protective device stops or reverses the guard",
    ),
    ("cycles_per_hour", "releases per hour"),
    (
        "scenario_file",
        "a JSON scenario file (relative to the register) used instead of the columns",
    ),
];

/// `register-template`: header and one example row.
pub fn template() -> String {
    let mut w = csv::Writer::from_writer(Vec::new());
    let header: Vec<&str> = COLUMNS.iter().map(|c| c.0).collect();
    let example: HashMap<&str, &str> = [
        ("id", "L4-EB-01"),
        ("title", "Carriage end stop (example)"),
        ("mass", "85 kg"),
        ("travel", "1.2 m"),
        ("friction_mu", "0.02"),
        ("drive_force", "150 N"),
        ("contact", "power_law"),
        ("buffer_force", "12 kN"),
        ("buffer_exponent", "2.2"),
        ("buffer_stroke", "40 mm"),
        ("cycles_per_hour", "120 /h"),
    ]
    .into_iter()
    .collect();
    let row: Vec<&str> = header
        .iter()
        .map(|h| example.get(h).copied().unwrap_or(""))
        .collect();
    let _ = w.write_record(&header);
    let _ = w.write_record(&row);
    let bytes = w.into_inner().unwrap_or_default();
    String::from_utf8(bytes).unwrap_or_default()
}

/// `demo-register`: an invented register of `rows` mechanisms (carriage end
/// stops, ejectors, spring-closed doors, drop gates) with values drawn from a
/// seeded generator, to try `batch` on and to measure it. Every row is
/// invented; none describes a real machine.
pub fn demo_register(rows: u64, seed: u64, out: &mut dyn Write) -> Result<()> {
    use rand_core::RngCore;
    let mut rng = rand_pcg::Pcg32::new(seed, 0x0a02_bdbf_7bb3_c0a7);
    let mut uniform = |lo: f64, hi: f64| {
        let u = f64::from(rng.next_u32()) / f64::from(u32::MAX);
        lo + (hi - lo) * u
    };
    let mut w = csv::Writer::from_writer(out);
    let header: Vec<&str> = COLUMNS.iter().map(|c| c.0).collect();
    w.write_record(&header)?;
    for i in 0..rows {
        let mut cells: HashMap<&str, String> = HashMap::new();
        let kind = i % 4;
        cells.insert("id", format!("R{:06}", i + 1));
        match kind {
            0 => {
                cells.insert("title", "Carriage end stop (invented)".into());
                cells.insert("mass", format!("{:.1} kg", uniform(20.0, 200.0)));
                cells.insert("travel", format!("{:.0} mm", uniform(300.0, 2000.0)));
                cells.insert("friction_mu", format!("{:.3}", uniform(0.01, 0.05)));
                cells.insert("drive_force", format!("{:.0} N", uniform(50.0, 400.0)));
                cells.insert("contact", "power_law".into());
                cells.insert("buffer_force", format!("{:.1} kN", uniform(5.0, 25.0)));
                cells.insert("buffer_exponent", format!("{:.2}", uniform(1.5, 3.0)));
                cells.insert("buffer_stroke", format!("{:.0} mm", uniform(25.0, 80.0)));
                cells.insert("cycles_per_hour", format!("{:.0} /h", uniform(10.0, 600.0)));
            }
            1 => {
                cells.insert("title", "Part ejector (invented)".into());
                cells.insert("mass", format!("{:.2} kg", uniform(0.5, 5.0)));
                cells.insert("travel", format!("{:.0} mm", uniform(40.0, 120.0)));
                cells.insert("friction_force", format!("{:.1} N", uniform(1.0, 10.0)));
                cells.insert("spring", "linear".into());
                cells.insert("spring_rate", format!("{:.2} N/mm", uniform(2.0, 20.0)));
                cells.insert("spring_max_deflection", "50 mm".into());
                cells.insert("spring_latched", format!("{:.0} mm", uniform(15.0, 40.0)));
                cells.insert("spring_detaches", "yes".into());
                cells.insert("contact", "linear".into());
                cells.insert("buffer_rate", format!("{:.0} N/mm", uniform(20.0, 100.0)));
                cells.insert("buffer_stroke", format!("{:.0} mm", uniform(10.0, 30.0)));
                cells.insert("restitution", format!("{:.2}", uniform(0.2, 0.6)));
            }
            2 => {
                cells.insert("title", "Spring-closed guard door (invented)".into());
                cells.insert("part", "rotating".into());
                cells.insert("mass", format!("{:.1} kg", uniform(2.0, 12.0)));
                cells.insert("inertia_shape", "plate".into());
                cells.insert("size", format!("{:.0} mm", uniform(300.0, 900.0)));
                cells.insert("hinge_tilt", "0 deg".into());
                let size = cells.get("size").cloned().unwrap_or_default();
                cells.insert("hazard_radius", size);
                cells.insert("travel", format!("{:.0} deg", uniform(60.0, 100.0)));
                cells.insert("spring", "torsion".into());
                cells.insert("spring_rate", format!("{:.2} N·m/rad", uniform(0.5, 4.0)));
                cells.insert("spring_max_deflection", "180 deg".into());
                cells.insert(
                    "spring_latched",
                    format!("{:.0} deg", uniform(100.0, 170.0)),
                );
                cells.insert("contact", "body".into());
                cells.insert("body_region", "hand_fingers".into());
                cells.insert("contact_length", "80 mm".into());
                cells.insert("contact_width", "12 mm".into());
                cells.insert("guard", "self_closing".into());
            }
            _ => {
                cells.insert("title", "Drop gate on a gas strut (invented)".into());
                cells.insert("mass", format!("{:.1} kg", uniform(5.0, 40.0)));
                cells.insert("travel", format!("{:.0} mm", uniform(100.0, 400.0)));
                cells.insert("incline", "-90 deg".into());
                cells.insert("contact", "absorber".into());
                cells.insert("buffer_stroke", format!("{:.0} mm", uniform(20.0, 60.0)));
                cells.insert("buffer_efficiency", "0.85".into());
                cells.insert("guard", "power_operated".into());
                cells.insert("cycles_per_hour", format!("{:.0} /h", uniform(5.0, 60.0)));
            }
        }
        let row: Vec<&str> = header
            .iter()
            .map(|h| cells.get(h).map(String::as_str).unwrap_or(""))
            .collect();
        w.write_record(&row)?;
    }
    w.flush()?;
    Ok(())
}

/// One output row.
#[derive(Serialize)]
struct OutRow {
    line: u64,
    id: String,
    title: String,
    machine_tag: String,
    verdict: String,
    checks_failed: usize,
    checks_unknown: usize,
    input_errors: usize,
    stored_energy_j: Option<f64>,
    residual_energy_j: Option<f64>,
    released_energy_j: Option<f64>,
    contact_speed_m_per_s: Option<f64>,
    kinetic_energy_j: Option<f64>,
    closing_force_n: Option<f64>,
    peak_force_n: Option<f64>,
    peak_deceleration_m_per_s2: Option<f64>,
    stroke_used_m: Option<f64>,
    body_force_n: Option<f64>,
    first_problem: String,
}

fn out_row(line: u64, id: &str, r: &Report) -> OutRow {
    let first_problem = r
        .errors
        .first()
        .map(ToString::to_string)
        .or_else(|| {
            r.checks
                .iter()
                .find(|c| c.verdict == Verdict::Fail && !c.informative)
                .map(|c| format!("exceeds: {}", c.label))
        })
        .unwrap_or_default();
    OutRow {
        line,
        id: id.to_string(),
        title: r.identity.title.clone(),
        machine_tag: r.identity.machine_tag.clone(),
        verdict: if r.errors.is_empty() {
            r.verdict.word().to_string()
        } else {
            "bad input".into()
        },
        checks_failed: r.counts.fail,
        checks_unknown: r.counts.unknown,
        input_errors: r.errors.len(),
        stored_energy_j: r.value(ids::ENERGY_STORED_LATCHED),
        residual_energy_j: r.value(ids::ENERGY_RESIDUAL),
        released_energy_j: r.value(ids::ENERGY_RELEASED),
        contact_speed_m_per_s: r.value(ids::RELEASE_CONTACT_SPEED),
        kinetic_energy_j: r.value(ids::RELEASE_KINETIC_ENERGY),
        closing_force_n: r.value(ids::CLOSING_FORCE_STATIC),
        peak_force_n: r.value(ids::IMPACT_PEAK_FORCE),
        peak_deceleration_m_per_s2: r.value(ids::IMPACT_PEAK_DECELERATION),
        stroke_used_m: r.value(ids::IMPACT_STROKE_USED),
        body_force_n: r.value(ids::BODY_TRANSIENT_FORCE),
        first_problem,
    }
}

fn bad_row(line: u64, id: &str, message: String) -> OutRow {
    OutRow {
        line,
        id: id.to_string(),
        title: String::new(),
        machine_tag: String::new(),
        verdict: "bad input".into(),
        checks_failed: 0,
        checks_unknown: 0,
        input_errors: 1,
        stored_energy_j: None,
        residual_energy_j: None,
        released_energy_j: None,
        contact_speed_m_per_s: None,
        kinetic_energy_j: None,
        closing_force_n: None,
        peak_force_n: None,
        peak_deceleration_m_per_s2: None,
        stroke_used_m: None,
        body_force_n: None,
        first_problem: message,
    }
}

/// Where rows go.
enum Sink<W: Write> {
    Csv(Box<csv::Writer<W>>),
    Json(W, bool),
}

impl<W: Write> Sink<W> {
    fn write(&mut self, row: &OutRow) -> Result<()> {
        match self {
            Sink::Csv(w) => w.serialize(row)?,
            Sink::Json(w, first) => {
                w.write_all(if *first { b"[\n" } else { b",\n" })?;
                *first = false;
                serde_json::to_writer(&mut *w, row)?;
            }
        }
        Ok(())
    }

    fn finish(self) -> Result<()> {
        match self {
            Sink::Csv(mut w) => w.flush()?,
            Sink::Json(mut w, first) => {
                w.write_all(if first { b"[]\n" } else { b"\n]\n" })?;
                w.flush()?;
            }
        }
        Ok(())
    }
}

/// Tally of a batch, for the exit code and the closing line.
#[derive(Default)]
struct Tally {
    rows: u64,
    bad: u64,
    failing: u64,
}

/// `joulewise batch`.
pub fn batch(file: &str, json_out: bool, output: Option<&str>) -> Result<u8> {
    let t0 = Instant::now();
    let out: Box<dyn Write> = match output {
        Some(path) => Box::new(std::io::BufWriter::new(
            std::fs::File::create(path).with_context(|| format!("creating {path}"))?,
        )),
        None => Box::new(std::io::BufWriter::new(std::io::stdout().lock())),
    };
    let mut sink = if json_out {
        Sink::Json(out, true)
    } else {
        Sink::Csv(Box::new(csv::Writer::from_writer(out)))
    };
    let mut tally = Tally::default();
    let lower = file.to_ascii_lowercase();
    let base = Path::new(file)
        .parent()
        .map(Path::to_path_buf)
        .unwrap_or_default();
    let mut emit = |row: OutRow, tally: &mut Tally| -> Result<()> {
        tally.rows += 1;
        if row.verdict == "bad input" {
            tally.bad += 1;
        } else if row.checks_failed + row.checks_unknown > 0 {
            tally.failing += 1;
        }
        if tally.rows.is_multiple_of(5000) {
            let s = t0.elapsed().as_secs_f64();
            eprintln!(
                "joulewise: {} rows ({:.0} rows/s)",
                tally.rows,
                tally.rows as f64 / s.max(1e-9)
            );
        }
        sink.write(&row)
    };
    if lower.ends_with(".csv") {
        let mut rdr = csv::ReaderBuilder::new()
            .flexible(false)
            // Cells are trimmed where they are read (`Row::get`): trimming
            // the whole record would rebuild it for every row.
            .trim(csv::Trim::Headers)
            .from_path(file)
            .with_context(|| format!("reading {file}"))?;
        let headers = rdr
            .headers()
            .with_context(|| format!("{file}: header row"))?
            .clone();
        let known: Vec<&str> = COLUMNS.iter().map(|c| c.0).collect();
        for h in headers.iter() {
            if !known.contains(&h) {
                bail!(
                    "{file}: line 1: unknown column `{h}`; `joulewise register-template` lists the columns"
                );
            }
        }
        if !headers.iter().any(|h| h == "id") {
            bail!("{file}: line 1: the register needs an `id` column");
        }
        let index: HashMap<String, usize> = headers
            .iter()
            .enumerate()
            .map(|(i, h)| (h.to_string(), i))
            .collect();
        let mut record = csv::StringRecord::new();
        loop {
            match rdr.read_record(&mut record) {
                Ok(false) => break,
                Ok(true) => {}
                Err(e) => bail!("{file}: {e}"),
            }
            let line = record.position().map(|p| p.line()).unwrap_or(0);
            let cells = Row {
                index: &index,
                record: &record,
            };
            let id = cells.get("id").to_string();
            let row = match scenario_from_row(&cells, &base) {
                Ok(s) => match assess_summary(&s) {
                    Ok(r) => {
                        let mut row = out_row(line, &id, &r);
                        if let Some(e) = r.errors.first() {
                            row.first_problem = format!(
                                "line {line}, {}: {}",
                                column_of(&e.field).unwrap_or(&e.field),
                                e.message()
                            );
                        }
                        row
                    }
                    Err(e) => bad_row(line, &id, format!("line {line}: {e}")),
                },
                Err(e) => bad_row(line, &id, format!("line {line}: {e}")),
            };
            emit(row, &mut tally)?;
        }
    } else if lower.ends_with(".jsonl") || lower.ends_with(".ndjson") {
        let f = std::fs::File::open(file).with_context(|| format!("reading {file}"))?;
        for (i, line) in BufReader::new(f).lines().enumerate() {
            let line_no = i as u64 + 1;
            let text = line.with_context(|| format!("{file}: line {line_no}"))?;
            if text.trim().is_empty() {
                continue;
            }
            emit(json_row(&text, line_no), &mut tally)?;
        }
    } else if lower.ends_with(".json") {
        let text = std::fs::read_to_string(file).with_context(|| format!("reading {file}"))?;
        let v: serde_json::Value =
            serde_json::from_str(&text).with_context(|| format!("{file}: not JSON"))?;
        let serde_json::Value::Array(items) = v else {
            bail!("{file}: a JSON register is an array of scenarios (or use .jsonl, one per line)");
        };
        for (i, item) in items.iter().enumerate() {
            emit(json_row(&item.to_string(), i as u64 + 1), &mut tally)?;
        }
    } else {
        bail!("{file}: a register is .csv, .jsonl (one scenario per line) or .json (an array)");
    }
    sink.finish()?;
    let secs = t0.elapsed().as_secs_f64();
    eprintln!(
        "joulewise: {} rows in {:.2} s ({:.0} rows/s); {} with failing or uncheckable limits, {} bad input; peak memory {}; CPU {}",
        tally.rows,
        secs,
        tally.rows as f64 / secs.max(1e-9),
        tally.failing,
        tally.bad,
        peak_rss().unwrap_or_else(|| "unknown".into()),
        cpu_seconds().map_or_else(|| "unknown".into(), |c| format!("{c:.2} s"))
    );
    Ok(if tally.bad > 0 {
        2
    } else if tally.failing > 0 {
        1
    } else {
        0
    })
}

fn json_row(text: &str, n: u64) -> OutRow {
    match Scenario::from_json(text) {
        Ok(s) => {
            let id = if s.identity.machine_tag.is_empty() {
                n.to_string()
            } else {
                s.identity.machine_tag.clone()
            };
            match assess_summary(&s) {
                Ok(r) => out_row(n, &id, &r),
                Err(e) => bad_row(n, &id, format!("entry {n}: {e}")),
            }
        }
        Err(e) => bad_row(n, &n.to_string(), format!("entry {n}: {e}")),
    }
}

/// CPU time the main thread has run so far, s (Linux `schedstat`, in
/// nanoseconds): with `rows/s` by the wall clock it tells a slow program
/// from a busy machine.
fn cpu_seconds() -> Option<f64> {
    let text = std::fs::read_to_string("/proc/thread-self/schedstat").ok()?;
    let ns: f64 = text.split_whitespace().next()?.parse().ok()?;
    Some(ns * 1e-9)
}

/// Peak resident memory of this process (Linux `VmHWM`).
fn peak_rss() -> Option<String> {
    let status = std::fs::read_to_string("/proc/self/status").ok()?;
    status
        .lines()
        .find(|l| l.starts_with("VmHWM:"))
        .map(|l| l.trim_start_matches("VmHWM:").trim().to_string())
}

/// Register column of a scenario field path, for messages.
fn column_of(path: &str) -> Option<&'static str> {
    Some(match path {
        "part.mass" | "part.inertia.mass" => "mass",
        "part.travel" => "travel",
        "part.incline" => "incline",
        "part.friction.mu" => "friction_mu",
        "part.friction.force" => "friction_force",
        "part.drive_force" => "drive_force",
        "part.inertia.width" | "part.inertia.length" | "part.inertia.radius" => "size",
        "part.inertia.inertia" => "inertia",
        "part.inertia.cg_radius" => "cg_radius",
        "part.hinge_tilt" => "hinge_tilt",
        "part.cg_angle_at_latch" => "cg_angle",
        "part.hazard_radius" => "hazard_radius",
        "part.drive_torque" => "drive_torque",
        "spring.model.rate" => "spring_rate",
        "spring.model.max_deflection" | "spring.model.max_angle" => "spring_max_deflection",
        "spring.model.initial_tension" => "spring_initial_tension",
        "spring.model.nominal_force" => "gas_force",
        "spring.model.progression" => "gas_progression",
        "spring.model.stroke" => "gas_stroke",
        "spring.mount.deflection_at_latch" => "spring_latched",
        "contact.law.rate" => "buffer_rate",
        "contact.law.stroke" => "buffer_stroke",
        "contact.law.force_at_stroke" | "contact.law.force" => "buffer_force",
        "contact.law.exponent" => "buffer_exponent",
        "contact.law.efficiency" => "buffer_efficiency",
        "contact.law.coefficient" => "buffer_coefficient",
        "contact.restitution" => "restitution",
        "contact.area.length" => "contact_length",
        "contact.area.width" => "contact_width",
        "cycles_per_hour" => "cycles_per_hour",
        _ => return None,
    })
}

fn yes(s: &str) -> Result<bool> {
    match s.to_ascii_lowercase().as_str() {
        "" | "no" | "n" | "false" | "0" => Ok(false),
        "yes" | "y" | "true" | "1" => Ok(true),
        other => bail!("`{other}` is not yes or no"),
    }
}

/// One CSV row, read by column name.
struct Row<'a> {
    index: &'a HashMap<String, usize>,
    record: &'a csv::StringRecord,
}

impl<'a> Row<'a> {
    /// The cell of column `name` without leading and trailing ASCII
    /// whitespace (as `csv::Trim::All` would leave it), empty when the
    /// column is absent.
    fn get(&self, name: &str) -> &'a str {
        self.index
            .get(name)
            .and_then(|&i| self.record.get(i))
            .map_or("", str::trim_ascii)
    }
}

fn req(cell: &Row<'_>, name: &str) -> Result<Value> {
    let v = cell.get(name);
    if v.is_empty() {
        bail!("column `{name}` is required here");
    }
    Ok(Value::new(v))
}

fn opt(cell: &Row<'_>, name: &str) -> Option<Value> {
    let v = cell.get(name);
    (!v.is_empty()).then(|| Value::new(v))
}

fn scenario_from_row(cell: &Row<'_>, base: &Path) -> Result<Scenario> {
    let file = cell.get("scenario_file");
    if !file.is_empty() {
        let path: PathBuf = base.join(file);
        let bytes =
            std::fs::read(&path).with_context(|| format!("scenario_file {}", path.display()))?;
        return Scenario::from_bytes(&bytes)
            .map_err(|e| anyhow::anyhow!("scenario_file {}: {e}", path.display()));
    }
    let rotating = match cell.get("part") {
        "" | "translating" => false,
        "rotating" => true,
        other => bail!("column part: `{other}` is not translating or rotating"),
    };
    let part = if rotating {
        let mass = req(cell, "mass")?;
        let inertia = match cell.get("inertia_shape") {
            "" | "plate" => InertiaInput::Plate {
                mass,
                width: req(cell, "size")?,
            },
            "rod" => InertiaInput::Rod {
                mass,
                length: req(cell, "size")?,
            },
            "point" => InertiaInput::Point {
                mass,
                radius: req(cell, "size")?,
            },
            "given" => InertiaInput::Given {
                inertia: req(cell, "inertia")?,
                mass,
                cg_radius: req(cell, "cg_radius")?,
            },
            other => bail!("column inertia_shape: `{other}` is not plate, rod, point or given"),
        };
        PartInput::Rotating(RotatingInput {
            inertia,
            hinge_tilt: opt(cell, "hinge_tilt"),
            cg_angle_at_latch: opt(cell, "cg_angle"),
            travel: req(cell, "travel")?,
            friction_torque: None,
            drive_torque: opt(cell, "drive_torque"),
            hazard_radius: req(cell, "hazard_radius")?,
        })
    } else {
        let friction = match (opt(cell, "friction_mu"), opt(cell, "friction_force")) {
            (Some(mu), None) => FrictionInput::Coefficient { mu },
            (None, Some(force)) => FrictionInput::Force { force },
            (None, None) => FrictionInput::None,
            (Some(_), Some(_)) => bail!("give friction_mu or friction_force, not both"),
        };
        PartInput::Translating(TranslatingInput {
            mass: req(cell, "mass")?,
            travel: req(cell, "travel")?,
            incline: opt(cell, "incline"),
            friction,
            damping: None,
            drive_force: opt(cell, "drive_force"),
            include_spring_mass: true,
        })
    };
    let spring_model = match cell.get("spring") {
        "" | "none" => None,
        "linear" => Some(SpringModelInput::Linear {
            rate: req(cell, "spring_rate")?,
            max_deflection: req(cell, "spring_max_deflection")?,
        }),
        "torsion" => Some(SpringModelInput::Torsion {
            rate: req(cell, "spring_rate")?,
            max_angle: req(cell, "spring_max_deflection")?,
        }),
        "extension" => Some(SpringModelInput::Extension {
            initial_tension: req(cell, "spring_initial_tension")?,
            rate: req(cell, "spring_rate")?,
            max_deflection: req(cell, "spring_max_deflection")?,
        }),
        "gas" => Some(SpringModelInput::Gas {
            nominal_force: req(cell, "gas_force")?,
            progression: req(cell, "gas_progression")?,
            stroke: req(cell, "gas_stroke")?,
            friction_band: None,
            force_reference: joulewise_core::spring::gas::ForceReference::Extension,
            polytropic_index: None,
        }),
        other => bail!("column spring: `{other}` is not none, linear, torsion, gas or extension"),
    };
    let spring = match spring_model {
        None => None,
        Some(model) => Some(SpringInput {
            model,
            mount: MountInput::Direct {
                deflection_at_latch: req(cell, "spring_latched")?,
                sense: match cell.get("spring_sense") {
                    "" | "unloads" => SenseInput::Unloads,
                    "loads" => SenseInput::Loads,
                    other => bail!("column spring_sense: `{other}` is not unloads or loads"),
                },
                detaches: yes(cell.get("spring_detaches")).context("column spring_detaches")?,
            },
        }),
    };
    let count: u32 = match cell.get("buffer_count") {
        "" => 1,
        c => c.parse().ok().filter(|n| *n >= 1).with_context(|| {
            format!("column buffer_count: `{c}` is not a whole number of 1 or more")
        })?,
    };
    let buffer = |law: BufferLawInput| {
        ContactInput::Buffer(BufferInput {
            law,
            count,
            restitution: opt(cell, "restitution"),
            radius: None,
        })
    };
    let contact = match cell.get("contact") {
        "" | "none" => ContactInput::None,
        "linear" => buffer(BufferLawInput::Linear {
            rate: req(cell, "buffer_rate")?,
            stroke: req(cell, "buffer_stroke")?,
        }),
        "power_law" => buffer(BufferLawInput::PowerLaw {
            force_at_stroke: req(cell, "buffer_force")?,
            exponent: req(cell, "buffer_exponent")?,
            stroke: req(cell, "buffer_stroke")?,
        }),
        "constant_force" => buffer(BufferLawInput::ConstantForce {
            force: req(cell, "buffer_force")?,
            stroke: req(cell, "buffer_stroke")?,
        }),
        "absorber" => buffer(BufferLawInput::Absorber {
            stroke: req(cell, "buffer_stroke")?,
            efficiency: opt(cell, "buffer_efficiency"),
        }),
        "orifice" => buffer(BufferLawInput::Orifice {
            coefficient: req(cell, "buffer_coefficient")?,
            stroke: req(cell, "buffer_stroke")?,
        }),
        "body" => {
            let region: joulewise_core::limits::body::BodyRegion =
                serde_json::from_value(serde_json::Value::String(cell.get("body_region").into()))
                    .map_err(|_| {
                        anyhow::anyhow!(
                            "column body_region: `{}` is not a body region (e.g. hand_fingers, lower_arm_wrist, chest)",
                            cell.get("body_region")
                        )
                    })?;
            ContactInput::Body(BodyInput {
                region,
                specific_area: None,
                area: AreaInput::Edge {
                    length: req(cell, "contact_length")?,
                    width: req(cell, "contact_width")?,
                },
                padding: None,
            })
        }
        other => bail!(
            "column contact: `{other}` is not none, linear, power_law, constant_force, absorber, orifice or body"
        ),
    };
    let guard = match cell.get("guard") {
        "" | "none" => None,
        "power_operated" => Some(GuardKind::PowerOperated),
        "self_closing" => Some(GuardKind::SelfClosing),
        other => bail!("column guard: `{other}` is not none, power_operated or self_closing"),
    }
    .map(|kind| -> Result<GuardChoice> {
        Ok(GuardChoice {
            kind,
            protective_device: yes(cell.get("protective_device"))
                .context("column protective_device")?,
        })
    })
    .transpose()?;
    Ok(Scenario {
        schema_version: SCHEMA_VERSION,
        identity: Identity {
            title: cell.get("title").into(),
            machine_tag: cell.get("machine_tag").into(),
            location: cell.get("location").into(),
            ..Identity::default()
        },
        display_units: Default::default(),
        part,
        spring,
        states: Vec::new(),
        contact,
        gap: None,
        limits: LimitsInput {
            guard,
            ..LimitsInput::default()
        },
        sizing: None,
        study: StudyInput::default(),
        cycles_per_hour: opt(cell, "cycles_per_hour"),
    })
}
