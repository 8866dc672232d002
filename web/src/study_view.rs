//! The tolerance study view: its settings, its progress while it runs (in
//! slices, see [`crate::study`]), the inputs that vary with their bands, the
//! worst-case corners, the Monte Carlo percentiles (P50, P95, P99, max),
//! the probability of exceeding each limit with its 95 % interval, and the
//! histogram of the headline figure.

use crate::bind::Binding;
use crate::controls::{bind, count, tick};
use crate::html::{esc, push_esc};
use crate::labels::{field_dom_id, label_of};
use crate::plot::{Axis, HistChart, HistogramPlot, Marker};
use crate::state::Sheet;
use crate::system::DisplaySystem;
use joulewise_core::report::{Report, StudyReport};
use joulewise_core::scenario::Spread;
use joulewise_core::tolerance::WorstCaseMethod;
use joulewise_core::units::{format_quantity, format_sig, Dim, UnitSystem};
use leptos::prelude::*;
use std::fmt::Write;

fn figure_label(r: &Report, id: &str) -> String {
    r.figure(id)
        .map(|f| f.label.clone())
        .unwrap_or_else(|| crate::labels::humanise_id(id))
}

/// A probability as a percentage with sensible digits.
pub fn percent(p: f64) -> String {
    if p == 0.0 {
        "0 %".into()
    } else {
        format!("{} %", format_sig(100.0 * p, 2))
    }
}

/// The study's result as markup, in the display units.
pub fn study_html(st: &StudyReport, r: &Report, sys: UnitSystem) -> String {
    let q = |v: f64, d: Dim| esc(&format_quantity(v, d, sys).to_string());
    let mut out = String::new();

    // The inputs that vary.
    out.push_str(r#"<h3>Inputs that vary</h3><table class="study-table" id="study-inputs"><thead><tr><th scope="col">Input</th><th scope="col">Nominal</th><th scope="col">Lowest</th><th scope="col">Highest</th><th scope="col">Spread</th></tr></thead><tbody>"#);
    for i in &st.inputs {
        let _ = write!(
            out,
            r##"<tr><th scope="row"><a href="#{}">{}</a></th><td>{}</td><td>{}</td><td>{}</td><td>{}</td></tr>"##,
            esc(&field_dom_id(&i.path)),
            esc(&label_of(&i.path)),
            q(i.nominal, i.dim),
            q(i.low, i.dim),
            q(i.high, i.dim),
            match i.spread {
                Spread::Uniform => "even",
                Spread::Normal => "bell, band = 3σ",
            }
        );
    }
    out.push_str("</tbody></table>");

    // Worst-case corners.
    if let Some(wc) = &st.worst_case {
        out.push_str("<h3>Worst-case corners</h3>");
        let how = match wc.method {
            WorstCaseMethod::Exhaustive { corners } => {
                format!("every corner of the tolerance bands ({corners} combinations) and the nominal point")
            }
            WorstCaseMethod::SensitivitySearch { budget_exhausted } => format!(
                "a search guided by each input's effect (not guaranteed for a figure that turns back within a band){}",
                if budget_exhausted {
                    "; the search budget ran out"
                } else {
                    ""
                }
            ),
        };
        let _ = write!(
            out,
            r#"<p class="hint">Searched: {}; {} evaluations{}.</p>"#,
            esc(&how),
            wc.evaluations,
            if wc.failed > 0 {
                format!(", {} could not be computed", wc.failed)
            } else {
                String::new()
            }
        );
        out.push_str(r#"<table class="study-table" id="study-worst"><thead><tr><th scope="col">Figure</th><th scope="col">Nominal</th><th scope="col">Lowest found</th><th scope="col">Highest found</th><th scope="col">Highest at</th></tr></thead><tbody>"#);
        for ((id, dim), fx) in st.figures.iter().zip(&wc.figures) {
            let at = fx.max.as_ref().map_or(String::new(), |e| {
                wc.input_names
                    .iter()
                    .zip(&e.levels)
                    .map(|(n, l)| format!("{} {}", label_of(n), l.word()))
                    .collect::<Vec<_>>()
                    .join(", ")
            });
            let _ = write!(
                out,
                r#"<tr><th scope="row">{}</th><td>{}</td><td>{}</td><td>{}</td><td>{}</td></tr>"#,
                esc(&figure_label(r, id)),
                fx.nominal.map_or("—".into(), |v| q(v, *dim)),
                fx.min.as_ref().map_or("—".into(), |e| q(e.value, *dim)),
                fx.max.as_ref().map_or("—".into(), |e| q(e.value, *dim)),
                esc(&at)
            );
        }
        out.push_str("</tbody></table>");
    }

    // Monte Carlo.
    match &st.monte_carlo {
        Some(mc) => {
            let _ = write!(
                out,
                r#"<h3>Monte Carlo</h3><p class="hint">{} samples{}; seed {}; generator {}.</p>"#,
                mc.samples_run,
                if mc.failed > 0 {
                    format!(" ({} could not be computed)", mc.failed)
                } else {
                    String::new()
                },
                mc.seed,
                esc(&mc.generator)
            );
            out.push_str(r#"<table class="study-table" id="study-percentiles"><thead><tr><th scope="col">Figure</th><th scope="col">P50</th><th scope="col">P95</th><th scope="col">P99</th><th scope="col">Highest</th></tr></thead><tbody>"#);
            for ((id, dim), fd) in st.figures.iter().zip(&mc.figures) {
                out.push_str(r#"<tr><th scope="row">"#);
                push_esc(&mut out, &figure_label(r, id));
                out.push_str("</th>");
                match &fd.summary {
                    Some(s) => {
                        for v in [s.p50, s.p95, s.p99, s.max] {
                            let _ = write!(out, "<td>{}</td>", q(v, *dim));
                        }
                    }
                    None => out.push_str(r#"<td colspan="4">no sample gave a value</td>"#),
                }
                out.push_str("</tr>");
            }
            out.push_str("</tbody></table>");
            if !mc.limits.is_empty() {
                out.push_str(r#"<table class="study-table" id="study-exceedance"><caption>Probability of exceeding each limit</caption><thead><tr><th scope="col">Limit</th><th scope="col">Limit value</th><th scope="col">Probability</th><th scope="col">95 % interval</th></tr></thead><tbody>"#);
                for (lim, ex) in st.limits.iter().zip(&mc.limits) {
                    let dim = st
                        .figures
                        .iter()
                        .find(|(id, _)| *id == lim.figure)
                        .map_or(Dim::Ratio, |f| f.1);
                    let interval = ex.interval.map_or("—".into(), |i| {
                        format!("{} to {}", percent(i.low), percent(i.high))
                    });
                    let _ = write!(
                        out,
                        r#"<tr><th scope="row">{}</th><td>{} {}</td><td>{}</td><td>{}{}</td></tr>"#,
                        esc(&joulewise_core::units::render(&lim.label, sys)),
                        if lim.at_most { "at most" } else { "at least" },
                        q(lim.threshold, dim),
                        ex.probability.map_or("—".into(), |p| {
                            format!("{} ({} of {})", percent(p), ex.exceeded, ex.evaluated)
                        }),
                        esc(&interval),
                        match ex.high_if_missing_exceeded {
                            Some(h) if ex.missing > 0 => format!(
                                "; up to {} if every sample without a value had exceeded",
                                percent(h)
                            ),
                            _ => String::new(),
                        }
                    );
                }
                out.push_str("</tbody></table>");
            }
        }
        None => out.push_str(
            r#"<p class="quiet">The Monte Carlo part is off: tick “Run the Monte Carlo” for percentiles and exceedance probabilities.</p>"#,
        ),
    }
    out
}

/// The histogram of the headline figure with its percentiles and the limits
/// on it.
pub fn histogram_chart(st: Option<&StudyReport>, r: &Report, why: &str) -> HistChart {
    let empty = |title: String, x: Axis| HistChart {
        title,
        x,
        low: 0.0,
        high: 0.0,
        counts: Vec::new(),
        markers: Vec::new(),
        empty: why.to_string(),
    };
    let Some(st) = st else {
        return empty(
            "Distribution of the headline figure".into(),
            Axis::new("Value", Dim::Ratio),
        );
    };
    let Some(mc) = &st.monte_carlo else {
        return empty(
            "Distribution of the headline figure".into(),
            Axis::new("Value", Dim::Ratio),
        );
    };
    let Some(h) = &mc.histogram else {
        return empty(
            "Distribution of the headline figure".into(),
            Axis::new("Value", Dim::Ratio),
        );
    };
    let Some((id, dim)) = st.figures.get(h.figure) else {
        return empty("Distribution".into(), Axis::new("Value", Dim::Ratio));
    };
    let label = figure_label(r, id);
    let mut markers = Vec::new();
    if let Some(s) = mc.figures.get(h.figure).and_then(|f| f.summary.as_ref()) {
        for (name, v) in [("P50", s.p50), ("P95", s.p95), ("P99", s.p99)] {
            markers.push(Marker {
                x: v,
                y: None,
                label: name.into(),
            });
        }
    }
    for l in st.limits.iter().filter(|l| l.figure == *id) {
        markers.push(Marker {
            x: l.threshold,
            y: None,
            label: "limit".into(),
        });
    }
    HistChart {
        title: format!("{label} across the tolerances"),
        x: Axis::new(&label, *dim),
        low: h.low,
        high: h.high,
        counts: h.counts.clone(),
        markers,
        empty: String::new(),
    }
}

/// The view.
pub fn study_view() -> AnyView {
    let sheet = Sheet::get();
    let sys = DisplaySystem::expect();
    let st = sheet.study;
    let mc = bind(
        |s| Some(s.study.monte_carlo),
        |s, v| s.study.monte_carlo = v,
        false,
    );
    let samples = bind(
        |s| Some(s.study.samples),
        |s, v| s.study.samples = v,
        10_000,
    );
    let seed_text = RwSignal::new(sheet.scenario.with_untracked(|s| s.study.seed.to_string()));
    let seed: Binding<u64> = bind(|s| Some(s.study.seed), |s, v| s.study.seed = v, 0);
    Effect::new(move |_| {
        let v = seed.get();
        if seed_text.get_untracked().trim().parse::<u64>().ok() != Some(v) {
            seed_text.set(v.to_string());
        }
    });
    let seed_bad = move || seed_text.with(|t| t.trim().parse::<u64>().is_err());
    let status = move || {
        if st.running.get() {
            format!("Running: {} done.", percent(st.progress.get()))
        } else if let Some(r) = st.result.get() {
            let n = r.monte_carlo.as_ref().map_or(0, |m| m.samples_run);
            format!(
                "Done in {} ms{}.",
                format_sig(st.elapsed_ms.get(), 3),
                if n > 0 {
                    format!(", {n} Monte Carlo samples")
                } else {
                    String::new()
                }
            )
        } else {
            st.idle.get()
        }
    };
    let html = Memo::new(move |_| {
        let s = sys.get();
        match st.result.get() {
            Some(res) => sheet.report.with(|r| study_html(&res, r, s)),
            None => String::new(),
        }
    });
    let chart = Signal::derive(move || {
        let res = st.result.get();
        let why = if st.running.get() {
            "The study is running.".to_string()
        } else {
            st.idle.get()
        };
        sheet
            .report
            .with(|r| histogram_chart(res.as_deref(), r, &why))
    });
    let restart = move |_| st.start(sheet.settled.get_untracked(), sheet.report.get_untracked());
    view! {
        <div class="view-grid">
            <form class="inputs" aria-label="Study settings" on:submit=|ev| ev.prevent_default()>
                <fieldset class="section" id="sec-study">
                    <legend><h2>"Study settings"</h2></legend>
                    <p class="hint">"The study varies every input that carries a ± tolerance: first the worst-case corners, then, if ticked, a Monte Carlo with a fixed seed (same seed, same result). It runs by itself after each change."</p>
                    {tick("f-study-monte_carlo", "Run the Monte Carlo", mc)}
                    {count("f-study-samples".into(), "Number of samples".into(), samples, 100, 1_000_000)}
                    <div class="field" data-invalid=move || seed_bad().to_string()>
                        <label for="f-study-seed">"Seed of the generator"</label>
                        <input type="text" inputmode="numeric" id="f-study-seed" autocomplete="off"
                            prop:value=move || seed_text.get()
                            aria-invalid=move || seed_bad().to_string()
                            on:input=move |ev| {
                                let t = event_target_value(&ev);
                                if let Ok(v) = t.trim().parse::<u64>() {
                                    seed.set(v);
                                }
                                seed_text.set(t);
                            } />
                        <p class="field-error" aria-live="polite">{move || seed_bad().then_some("a whole number, 0 or more")}</p>
                    </div>
                </fieldset>
            </form>
            <section class="results" aria-labelledby="study-title">
                <h2 id="study-title">"Tolerance study"</h2>
                <div class="study-status">
                    <p id="study-status" aria-live="polite">{status}</p>
                    <progress id="study-progress" max="1" aria-label="Progress of the study"
                        prop:value=move || st.progress.get()></progress>
                    <div class="buttons">
                        <button type="button" id="study-stop" disabled=move || !st.running.get()
                            on:click=move |_| st.stop()>"Stop"</button>
                        <button type="button" id="study-restart" on:click=restart>"Run again"</button>
                    </div>
                </div>
                <HistogramPlot id="plot-study" chart=chart />
                <div id="study-results" inner_html=html></div>
            </section>
        </div>
    }
    .into_any()
}
