//! The results of the assessment sheet: the verdict, the inputs to fix, the
//! figures in groups with the cautions beside the figures that bring them
//! up, the checks with their margins, the plots (force–deflection with the
//! stored energy shaded; position, speed and force against time with the
//! contact marked) and the cautions panel. Everything here formats the
//! core's report; nothing physical is computed.

use crate::cautions_panel::CautionsPanel;
use crate::check_row::CheckList;
use crate::figure_card::{push_missing_html, FigureGroup};
use crate::html::{esc, push_esc};
use crate::labels::{field_dom_id, label_of};
use crate::plot::line::HLine;
use crate::plot::{Axis, LineChart, LinePlot, MarginOverview, Marker, Series, Shade};
use crate::state::Sheet;
use crate::system::DisplaySystem;
use crate::verdict::verdict_badge_html;
use joulewise_core::figure::{ids, Figure};
use joulewise_core::release::HistoryPoint;
use joulewise_core::report::Report;
use joulewise_core::scenario::PartInput;
use joulewise_core::spring::Axis as SpringAxis;
use joulewise_core::units::{format_quantity, Dim, UnitSystem};
use leptos::prelude::*;

/// The verdict in words and icon with the count of checks per verdict.
pub fn verdict_html(r: &Report) -> String {
    let c = r.counts;
    let total = c.pass + c.fail + c.unknown + c.not_applicable;
    // With no check at all there is nothing to be within: say so, not "pass".
    let mut out = verdict_badge_html(if total == 0 {
        joulewise_core::figure::Verdict::NotApplicable
    } else {
        r.verdict
    });
    if total == 0 {
        out.push_str(r#" <span class="counts">no limit set applies yet: choose the limits that apply</span>"#);
    } else {
        out.push_str(&format!(
            r#" <span class="counts">{} within, {} exceeding, {} not checkable, {} not applicable</span>"#,
            c.pass, c.fail, c.unknown, c.not_applicable
        ));
    }
    out
}

/// The inputs the core could not use, each with its message and a link to
/// its field (empty when all read).
pub fn problems_html(r: &Report) -> String {
    if r.errors.is_empty() {
        return String::new();
    }
    let mut out = String::from(r#"<h2 id="problems-title">Inputs to fix</h2><ul>"#);
    for e in &r.errors {
        let base = e.field.strip_suffix(".tol").unwrap_or(&e.field);
        out.push_str(&format!(
            r##"<li><a href="#{}">{}</a>: {}</li>"##,
            esc(&field_dom_id(base)),
            esc(&label_of(&e.field)),
            esc(&e.message())
        ));
    }
    out.push_str("</ul>");
    out
}

/// Figure groups by the first part of the figure id.
const GROUPS: &[(&str, &[&str])] = &[
    (
        "Spring and stored energy",
        &["spring", "energy", "identify"],
    ),
    ("Release", &["release"]),
    ("Impact on the buffer", &["impact"]),
    ("Contact with the body", &["body"]),
    ("Closing gap", &["gap"]),
];

fn group_of(id: &str) -> usize {
    let head = id.split('.').next().unwrap_or("");
    GROUPS
        .iter()
        .position(|(_, heads)| heads.contains(&head))
        .unwrap_or(GROUPS.len())
}

fn figures_in(r: &Report, group: usize) -> Vec<Figure> {
    r.figures
        .iter()
        .filter(|f| group_of(&f.id) == group)
        .cloned()
        .collect()
}

/// Key figures for the sticky summary: stored energy, speed at contact and
/// the contact force, where computed.
pub fn headline_html(r: &Report, sys: UnitSystem) -> String {
    let mut out = String::new();
    for id in [
        ids::ENERGY_STORED_LATCHED,
        ids::RELEASE_CONTACT_SPEED,
        ids::IMPACT_PEAK_FORCE,
        ids::BODY_TRANSIENT_FORCE,
    ] {
        if let Some(f) = r.figure(id) {
            if let Some(v) = f.value {
                out.push_str(r#"<span class="head-fig"><span class="head-label">"#);
                push_esc(&mut out, &f.label);
                out.push_str("</span> <strong>");
                push_esc(&mut out, &format_quantity(v, f.dim, sys).to_string());
                out.push_str("</strong></span>");
            }
        }
    }
    out
}

/// The figures, checks, plots and cautions.
pub fn results() -> AnyView {
    let sheet = Sheet::get();
    let sys = DisplaySystem::expect();
    let report = sheet.report;
    let cautions = Signal::derive(move || report.with(|r| r.cautions.clone()));
    let groups = (0..=GROUPS.len())
        .map(|g| {
            let title = GROUPS.get(g).map_or("Other figures", |x| x.0);
            let figs = Memo::new(move |_| report.with(|r| figures_in(r, g)));
            view! {
                <div hidden=move || figs.with(Vec::is_empty)>
                    <FigureGroup title=title figures=figs cautions=cautions />
                </div>
            }
        })
        .collect_view();
    let notes = Memo::new(move |_| {
        report.with(|r| {
            if r.notes.is_empty() {
                return String::new();
            }
            let mut out = String::from("<h3>Notes from the models</h3><ul>");
            let s = sys.get();
            for n in &r.notes {
                out.push_str("<li>");
                crate::html::push_text(&mut out, n, s);
                out.push_str("</li>");
            }
            out.push_str("</ul>");
            out
        })
    });
    let checks = Memo::new(move |_| report.with(|r| r.checks.clone()));
    let no_checks = move || checks.with(Vec::is_empty);
    view! {
        <section aria-labelledby="figures-title">
            <h2 id="figures-title">"Figures"</h2>
            {groups}
            <div class="notes" hidden=move || notes.with(String::is_empty) inner_html=notes></div>
        </section>
        <section aria-labelledby="checks-title">
            <h2 id="checks-title">"Checks"</h2>
            <p class="quiet" hidden=move || !no_checks()>
                "No limit set applies yet: choose them in “The limits that apply”."
            </p>
            <CheckList checks=checks />
            <div hidden=no_checks>
                <MarginOverview id="plot-margins" checks=checks />
            </div>
        </section>
        <section aria-labelledby="plots-title">
            <h2 id="plots-title">"Plots"</h2>
            {plots()}
        </section>
        <CautionsPanel cautions=cautions />
    }
    .into_any()
}

/// Why a figure is missing, as plain text for a plot's empty message.
fn why_missing(r: &Report, id: &str, otherwise: &str, sys: UnitSystem) -> String {
    match r.figure(id) {
        Some(f) if f.value.is_none() => {
            let mut out = String::new();
            push_missing_html(&mut out, &f.missing, sys);
            strip_tags(&out)
        }
        _ => otherwise.to_string(),
    }
}

fn strip_tags(html: &str) -> String {
    let mut out = String::with_capacity(html.len());
    let mut inside = false;
    for c in html.chars() {
        match c {
            '<' => inside = true,
            '>' => inside = false,
            c if !inside => out.push(c),
            _ => {}
        }
    }
    out.replace("&amp;", "&")
        .replace("&lt;", "<")
        .replace("&gt;", ">")
        .replace("&quot;", "\"")
        .replace("&#39;", "'")
}

/// Force–deflection of the spring with the energy given up between the
/// latched and released states shaded, and every named state marked.
pub fn spring_chart(r: &Report, sys: UnitSystem) -> LineChart {
    let rotary = r
        .spring_curve
        .as_ref()
        .is_some_and(|c| c.axis == SpringAxis::Rotary);
    let (x, y) = if rotary {
        (
            Axis::new("Wind-up angle", Dim::Angle),
            Axis::new("Spring torque", Dim::Torque),
        )
    } else {
        (
            Axis::new("Deflection", Dim::Length),
            Axis::new("Spring force", Dim::Force),
        )
    };
    let title = if rotary {
        "Spring torque against wind-up angle"
    } else {
        "Spring force against deflection"
    };
    let mut c = LineChart::new(title, x, y);
    let Some(curve) = &r.spring_curve else {
        c.empty = why_missing(
            r,
            ids::ENERGY_STORED_LATCHED,
            "No spring in this assessment.",
            sys,
        );
        return c;
    };
    let pts = |v: &[[f64; 2]]| v.iter().map(|p| (p[0], p[1])).collect::<Vec<_>>();
    c.series.push(Series {
        name: "loading".into(),
        points: pts(&curve.loading),
    });
    if let Some(u) = &curve.unloading {
        c.series.push(Series {
            name: "unloading".into(),
            points: pts(u),
        });
    }
    if let (Some(a), Some(b)) = (curve.latched, curve.released) {
        let released = r
            .value(ids::ENERGY_RELEASED)
            .map(|e| format_quantity(e, Dim::Energy, sys).to_string())
            .unwrap_or_else(|| "not computed".into());
        c.shade = Some(Shade {
            series: c.series.len() - 1,
            from: b,
            to: a,
            label: format!("energy released between the states, {released}"),
        });
    }
    for (name, q) in &curve.states {
        c.markers.push(Marker {
            x: *q,
            y: None,
            label: joulewise_core::units::render(name, sys).into_owned(),
        });
    }
    c
}

/// Named curves from the history: (legend, value of a point).
type Pick = (&'static str, fn(&HistoryPoint) -> f64);

fn motion_chart(r: &Report, title: &str, y: Axis, picks: &[Pick], sys: UnitSystem) -> LineChart {
    let mut c = LineChart::new(title, Axis::new("Time from release", Dim::Time), y);
    c.empty = why_missing(
        r,
        ids::RELEASE_CONTACT_SPEED,
        "The motion could not be computed.",
        sys,
    );
    if r.history.is_empty() {
        return c;
    }
    for (name, f) in picks {
        c.series.push(Series {
            name: (*name).into(),
            points: r.history.iter().map(|p| (p.time, f(p))).collect(),
        });
    }
    let contact = r.value(ids::RELEASE_TIME_TO_CONTACT).or_else(|| {
        r.contact_index
            .and_then(|i| r.history.get(i))
            .map(|p| p.time)
    });
    if let Some(t) = contact {
        c.markers.push(Marker {
            x: t,
            y: None,
            label: "contact".into(),
        });
    }
    c
}

fn plots() -> AnyView {
    let sheet = Sheet::get();
    let sys = DisplaySystem::expect();
    let report = sheet.report;
    let rotary = Memo::new(move |_| {
        sheet
            .settled
            .with(|s| matches!(s.part, PartInput::Rotating(_)))
    });
    let spring = Signal::derive(move || report.with(|r| spring_chart(r, sys.get())));
    let position = Signal::derive(move || {
        report.with(|r| {
            let rot = rotary.get();
            let y = if rot {
                Axis::new("Angle from the latch", Dim::Angle)
            } else {
                Axis::new("Position from the latch", Dim::Length)
            };
            motion_chart(
                r,
                "Position against time",
                y,
                &[("position", |p| p.position)],
                sys.get(),
            )
        })
    });
    let speed = Signal::derive(move || {
        report.with(|r| {
            motion_chart(
                r,
                "Speed of the closing edge against time",
                Axis::new("Speed", Dim::Speed),
                &[("speed", |p| p.hazard_speed)],
                sys.get(),
            )
        })
    });
    let force = Signal::derive(move || {
        report.with(|r| {
            let rot = rotary.get();
            let mut c = if rot {
                motion_chart(
                    r,
                    "Buffer force against time",
                    Axis::new("Force", Dim::Force),
                    &[("buffer force", |p| p.buffer_force)],
                    sys.get(),
                )
            } else {
                motion_chart(
                    r,
                    "Forces against time",
                    Axis::new("Force", Dim::Force),
                    &[
                        ("spring force", |p| p.spring_force),
                        ("buffer force", |p| p.buffer_force),
                    ],
                    sys.get(),
                )
            };
            for ch in r
                .checks
                .iter()
                .filter(|ch| ch.figure == ids::IMPACT_PEAK_FORCE)
            {
                if let Some(l) = ch.limit {
                    c.hlines.push(HLine {
                        y: l,
                        label: format!("limit: {}", ch.label),
                    });
                }
            }
            c
        })
    });
    let torque = Signal::derive(move || {
        report.with(|r| {
            motion_chart(
                r,
                "Spring torque against time",
                Axis::new("Torque", Dim::Torque),
                &[("spring torque", |p| p.spring_force)],
                sys.get(),
            )
        })
    });
    let has_buffer_force =
        Memo::new(move |_| report.with(|r| r.history.iter().any(|p| p.buffer_force != 0.0)));
    view! {
        <LinePlot id="plot-spring" chart=spring />
        <LinePlot id="plot-position" chart=position />
        <LinePlot id="plot-speed" chart=speed />
        <div hidden=move || rotary.get() && !has_buffer_force.get()>
            <LinePlot id="plot-force" chart=force />
        </div>
        <div hidden=move || !rotary.get()>
            <LinePlot id="plot-torque" chart=torque />
        </div>
    }
    .into_any()
}
