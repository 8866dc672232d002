//! The buffer sizing view: the limits a buffer must respect (peak force,
//! peak and mean deceleration, available stroke) and, for each buffer type
//! the core sizes, the stroke, rate or force level needed with the margin
//! of every limit, or why no buffer of that type can meet them. The duty
//! (mass, impact speed, energy, propelling force) is the same impact the
//! assessment computes.

use crate::controls::{bind, qty, tick};
use crate::html::{esc, push_esc, push_text};
use crate::state::Sheet;
use crate::system::DisplaySystem;
use crate::verdict::verdict_badge_html;
use joulewise_core::figure::Figure;
use joulewise_core::report::Report;
use joulewise_core::scenario::SizingSpec;
use joulewise_core::sizing::{BufferType, Infeasibility, SizedBuffer, SizingOutcome, SizingResult};
use joulewise_core::units::{format_quantity, format_sig, render, Dim, UnitSystem};
use leptos::prelude::*;
use std::fmt::Write;

/// Stable key of a buffer type, for element ids and tests.
pub fn buffer_key(b: &BufferType) -> &'static str {
    match b {
        BufferType::LinearSpring => "linear_spring",
        BufferType::PowerLaw { .. } => "power_law",
        BufferType::ConstantForce { .. } => "constant_force",
        BufferType::Orifice { .. } => "orifice",
        BufferType::GasSpring { .. } => "gas_spring",
    }
}

/// The buffer type with the parameter it was sized for, in words.
fn buffer_title(b: &BufferType, sys: UnitSystem) -> String {
    let label = b.label();
    match *b {
        BufferType::LinearSpring => label.to_string(),
        BufferType::PowerLaw { exponent } => format!("{label}, n = {}", format_sig(exponent, 3)),
        BufferType::ConstantForce { efficiency } => {
            format!("{label}, efficiency η = {}", format_sig(efficiency, 3))
        }
        BufferType::Orifice { residual_speed } => format!(
            "{label}, handing the part to the end stop at {}",
            format_quantity(residual_speed, Dim::Speed, sys)
        ),
        BufferType::GasSpring {
            progression,
            polytropic_index,
        } => format!(
            "{label}, progression {} and polytropic index κ = {}",
            format_sig(progression, 3),
            format_sig(polytropic_index, 3)
        ),
    }
}

/// Why no buffer of a type meets the limits, in the display units (the
/// core's words, its quantities written in `sys`).
pub fn explain(i: &Infeasibility, sys: UnitSystem) -> String {
    render(&i.explain(), sys).into_owned()
}

fn value_text(f: &Figure, sys: UnitSystem) -> String {
    f.value.map_or_else(
        || "—".to_string(),
        |v| format_quantity(v, f.dim, sys).to_string(),
    )
}

fn design_table(o: &SizingOutcome, designs: &[(&str, &SizedBuffer)], sys: UnitSystem) -> String {
    let figs: Vec<Vec<Figure>> = designs.iter().map(|(_, d)| o.design_figures(d)).collect();
    let mut out =
        String::from(r#"<table class="sizing-table"><thead><tr><th scope="col">Figure</th>"#);
    for (title, _) in designs {
        out.push_str(r#"<th scope="col">"#);
        push_esc(&mut out, title);
        out.push_str("</th>");
    }
    out.push_str("</tr></thead><tbody>");
    if let Some(first) = figs.first() {
        for (row, f) in first.iter().enumerate() {
            out.push_str(r#"<tr><th scope="row">"#);
            push_esc(&mut out, &f.label);
            out.push_str("</th>");
            for col in &figs {
                out.push_str("<td>");
                if let Some(g) = col.get(row) {
                    push_esc(&mut out, &value_text(g, sys));
                }
                out.push_str("</td>");
            }
            out.push_str("</tr>");
        }
    }
    out.push_str("</tbody></table>");
    // Margins of the first design against each limit.
    if let Some((_, d)) = designs.first() {
        if !d.margins.is_empty() {
            out.push_str(r#"<table class="sizing-table margins-table"><caption>Margins of the design at the least stroke</caption><thead><tr><th scope="col">Limit</th><th scope="col">Limit value</th><th scope="col">Design</th><th scope="col">Limit ÷ design</th><th scope="col">Verdict</th></tr></thead><tbody>"#);
            for m in &d.margins {
                let dim = m.limit.dim();
                let _ = write!(
                    out,
                    r#"<tr><th scope="row">{}</th><td>{}</td><td>{}</td><td>{}</td><td>{}</td></tr>"#,
                    esc(m.limit.label()),
                    esc(&format_quantity(m.limit_value, dim, sys).to_string()),
                    esc(&format_quantity(m.value, dim, sys).to_string()),
                    m.ratio.map_or("—".to_string(), |r| format_sig(r, 3)),
                    verdict_badge_html(m.verdict)
                );
            }
            out.push_str("</tbody></table>");
        }
    }
    // How the figures are found.
    if let Some(f) = figs.first() {
        out.push_str(r#"<details class="figure-how"><summary>How it is found</summary><dl>"#);
        for g in f.iter().filter(|g| !g.method.is_empty()) {
            out.push_str("<dt>");
            push_esc(&mut out, &g.label);
            out.push_str("</dt><dd>");
            push_text(&mut out, &g.method, sys);
            if !g.source.is_empty() {
                out.push_str(" — ");
                push_text(&mut out, &g.source, sys);
            }
            out.push_str("</dd>");
        }
        out.push_str("</dl></details>");
    }
    out
}

/// One buffer type's answer as markup.
pub fn outcome_html(o: &SizingOutcome, sys: UnitSystem) -> String {
    let mut out = format!(
        r#"<article class="sizing" id="sizing-{}">"#,
        buffer_key(&o.buffer)
    );
    out.push_str("<h3>");
    push_esc(&mut out, &buffer_title(&o.buffer, sys));
    out.push_str("</h3>");
    match &o.result {
        SizingResult::Feasible {
            required,
            governing,
            using_available_stroke,
            stops_unaided_within,
        } => {
            if let Some(g) = governing {
                let _ = write!(
                    out,
                    r#"<p class="sizing-verdict" data-feasible="true">Can meet the limits; the {} limit sets the least stroke.</p>"#,
                    esc(g.label())
                );
            } else {
                out.push_str(
                    r#"<p class="sizing-verdict" data-feasible="true">Can meet the limits.</p>"#,
                );
            }
            if let Some(d) = stops_unaided_within {
                let _ = write!(
                    out,
                    r#"<p>The part stops unaided within {}.</p>"#,
                    esc(&format_quantity(*d, Dim::Length, sys).to_string())
                );
            }
            let mut designs: Vec<(&str, &SizedBuffer)> = Vec::new();
            if let Some(d) = required {
                designs.push(("At the least stroke that meets the limits", d));
            }
            if let Some(d) = using_available_stroke {
                designs.push(("Using the whole available stroke", d));
            }
            if !designs.is_empty() {
                out.push_str(&design_table(o, &designs, sys));
            }
        }
        SizingResult::Infeasible { reasons } => {
            out.push_str(r#"<p class="sizing-verdict" data-feasible="false">No buffer of this type meets the limits:</p><ul class="sizing-reasons">"#);
            for r in reasons {
                out.push_str("<li>");
                push_esc(&mut out, &explain(r, sys));
                out.push_str("</li>");
            }
            out.push_str("</ul>");
        }
    }
    out.push_str("</article>");
    out
}

/// The duty every type is sized for, and each type's answer; or why there
/// is nothing to show.
pub fn sizing_html(r: &Report, asked: bool, sys: UnitSystem) -> String {
    if !asked {
        return r#"<p class="quiet">Tick “Size a buffer for this impact” and give at least one limit.</p>"#.into();
    }
    let Some(first) = r.sizing.first() else {
        let why = r
            .notes
            .iter()
            .find(|n| n.starts_with("Buffer sizing"))
            .cloned()
            .or_else(|| {
                (!r.errors.is_empty())
                    .then(|| "The inputs have problems: fix them on the assessment view first.".to_string())
            })
            .or_else(|| {
                r.figure(joulewise_core::figure::ids::RELEASE_CONTACT_SPEED)
                    .filter(|f| f.value.is_none())
                    .map(|f| render(&crate::figure_card::missing_text(&f.missing), sys).into_owned())
            })
            .unwrap_or_else(|| {
                "Nothing to size: the part does not reach the end of its travel, or no limit is given."
                    .into()
            });
        let mut out = String::from(r#"<p class="sizing-none">"#);
        push_text(&mut out, &why, sys);
        out.push_str("</p>");
        return out;
    };
    let q = |v: f64, d: Dim| esc(&format_quantity(v, d, sys).to_string());
    let mut out = format!(
        r#"<dl class="duty"><div><dt>Moving mass at the buffer</dt><dd>{}</dd></div><div><dt>Impact speed</dt><dd>{}</dd></div><div><dt>Kinetic energy</dt><dd>{}</dd></div><div><dt>Net propelling force during the stroke</dt><dd>{}</dd></div></dl>"#,
        q(first.part_mass, Dim::Mass),
        q(first.impact_speed, Dim::Speed),
        q(first.kinetic_energy, Dim::Energy),
        q(first.propelling_force, Dim::Force)
    );
    for o in &r.sizing {
        out.push_str(&outcome_html(o, sys));
    }
    out
}

/// The view.
pub fn sizing_view() -> AnyView {
    let sheet = Sheet::get();
    let sys = DisplaySystem::expect();
    let asked = bind(
        |s| Some(s.sizing.is_some()),
        |s, on| {
            if on != s.sizing.is_some() {
                s.sizing = on.then_some(SizingSpec {
                    peak_force: None,
                    peak_deceleration: None,
                    mean_deceleration: None,
                    stroke: None,
                });
            }
        },
        false,
    );
    let fields = move || {
        asked.get().then(|| {
            view! {
                <div class="grid-2">
                    {qty("sizing.peak_force", Dim::Force)}
                    {qty("sizing.peak_deceleration", Dim::Acceleration)}
                    {qty("sizing.mean_deceleration", Dim::Acceleration)}
                    {qty("sizing.stroke", Dim::Length)}
                </div>
            }
        })
    };
    let html = Memo::new(move |_| {
        let s = sys.get();
        let on = asked.get();
        sheet.report.with(|r| sizing_html(r, on, s))
    });
    view! {
        <div class="view-grid">
            <form class="inputs" aria-label="Sizing limits" on:submit=|ev| ev.prevent_default()>
                <fieldset class="section" id="sec-sizing">
                    <legend><h2>"Limits for the buffer"</h2></legend>
                    <p class="hint">"The same impact as on the assessment: the part's mass, its speed at contact and the forces along its motion. Give the limits the buffer must respect; blank means no limit."</p>
                    {tick("f-sizing-on", "Size a buffer for this impact", asked)}
                    {fields}
                </fieldset>
            </form>
            <section class="results" aria-labelledby="sizing-title">
                <h2 id="sizing-title">"Buffer sizing"</h2>
                <div id="sizing-results" aria-live="polite" inner_html=html></div>
            </section>
        </div>
    }
    .into_any()
}
