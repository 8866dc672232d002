//! Line plot: several series on shared axes, a legend, an optional shaded
//! area under one series between two abscissae (the energy a spring gives
//! up between two states is the area under its force–deflection curve),
//! vertical markers for states and events, and horizontal limit lines.
//! Series differ by dash pattern as well as colour; the shaded area is
//! hatched, so the plot reads in greyscale print.

use super::{
    frame, nice_ticks, push_axis_titles, push_empty, push_grid, push_hatch, push_line,
    push_markers, push_text, push_title_desc, scale, view_box, with_unit, Axis, PlotFrame,
};
use crate::html::{push_el, push_esc};
use crate::system::DisplaySystem;
use joulewise_core::units::UnitSystem;
use leptos::prelude::*;
use std::fmt::Write;

/// One curve, points in SI `(x, y)`.
#[derive(Debug, Clone, PartialEq)]
pub struct Series {
    /// Name in the legend.
    pub name: String,
    /// Points in SI, in drawing order.
    pub points: Vec<(f64, f64)>,
}

/// A shaded area under series `series` between `from` and `to` (SI x).
#[derive(Debug, Clone, PartialEq)]
pub struct Shade {
    /// Index of the series whose area is shaded (down to y = 0).
    pub series: usize,
    /// Start, SI.
    pub from: f64,
    /// End, SI.
    pub to: f64,
    /// Legend text, e.g. `energy released, 2.25 J` (formatted by the caller).
    pub label: String,
}

/// A vertical marker at `x`, with a dot at `(x, y)` when `y` is given.
#[derive(Debug, Clone, PartialEq)]
pub struct Marker {
    /// Position, SI.
    pub x: f64,
    /// Height of the dot, SI.
    pub y: Option<f64>,
    /// Label drawn beside the marker.
    pub label: String,
}

/// A horizontal line (a limit), SI.
#[derive(Debug, Clone, PartialEq)]
pub struct HLine {
    /// Height, SI.
    pub y: f64,
    /// Label drawn at its right end.
    pub label: String,
}

/// Everything a line plot shows.
#[derive(Debug, Clone, PartialEq)]
pub struct LineChart {
    /// Title (also the SVG `<title>`).
    pub title: String,
    /// Horizontal axis.
    pub x: Axis,
    /// Vertical axis.
    pub y: Axis,
    /// The curves.
    pub series: Vec<Series>,
    /// Optional shaded area.
    pub shade: Option<Shade>,
    /// Vertical markers.
    pub markers: Vec<Marker>,
    /// Horizontal lines.
    pub hlines: Vec<HLine>,
    /// Include y = 0 in the vertical range.
    pub y_from_zero: bool,
    /// Said in place of the curves when there are none (why not computed).
    pub empty: String,
    /// Extra sentence for the description.
    pub note: String,
}

impl LineChart {
    /// An empty chart with its axes.
    pub fn new(title: &str, x: Axis, y: Axis) -> Self {
        Self {
            title: title.into(),
            x,
            y,
            series: Vec::new(),
            shade: None,
            markers: Vec::new(),
            hlines: Vec::new(),
            y_from_zero: true,
            empty: String::new(),
            note: String::new(),
        }
    }

    /// Whether any series has a point.
    pub fn has_data(&self) -> bool {
        self.series.iter().any(|s| !s.points.is_empty())
    }

    /// The data in words, in the display system: for each series its range
    /// and highest point, then the shaded area, markers and lines.
    pub fn describe(&self, sys: UnitSystem) -> String {
        if !self.has_data() {
            return format!("{}: no data. {}", self.title, self.empty);
        }
        let xs = |v: f64| with_unit(self.x.shown(v, sys), unit(&self.x, sys));
        let ys = |v: f64| with_unit(self.y.shown(v, sys), unit(&self.y, sys));
        let mut out = format!("{}. ", self.title);
        for s in &self.series {
            let (Some(first), Some(last)) = (s.points.first(), s.points.last()) else {
                continue;
            };
            let top = s
                .points
                .iter()
                .copied()
                .fold(*first, |a, b| if b.1 > a.1 { b } else { a });
            out.push_str(&format!(
                "{}: from {} at {} to {} at {}, highest {} at {}. ",
                s.name,
                ys(first.1),
                xs(first.0),
                ys(last.1),
                xs(last.0),
                ys(top.1),
                xs(top.0)
            ));
        }
        if let Some(sh) = &self.shade {
            out.push_str(&format!(
                "Shaded between {} and {}: {}. ",
                xs(sh.from),
                xs(sh.to),
                sh.label
            ));
        }
        for m in &self.markers {
            out.push_str(&format!("Marker {} at {}. ", m.label, xs(m.x)));
        }
        for h in &self.hlines {
            out.push_str(&format!("Line {} at {}. ", h.label, ys(h.y)));
        }
        out.push_str(&self.note);
        out.trim_end().to_string()
    }
}

fn unit(a: &Axis, sys: UnitSystem) -> &'static str {
    joulewise_core::units::display_unit(a.dim, sys).symbol
}

/// Points of `pts` with `from ≤ x ≤ to`, with the curve's values at both
/// ends found on the straight segments between samples (display only).
fn clip(pts: &[(f64, f64)], from: f64, to: f64) -> Vec<(f64, f64)> {
    let (a, b) = (from.min(to), from.max(to));
    let at = |x: f64| -> Option<f64> {
        pts.windows(2).find_map(|w| {
            let [(x0, y0), (x1, y1)] = [w[0], w[1]];
            let (lo, hi) = (x0.min(x1), x0.max(x1));
            (lo <= x && x <= hi).then(|| {
                if x1 == x0 {
                    y0
                } else {
                    y0 + (x - x0) / (x1 - x0) * (y1 - y0)
                }
            })
        })
    };
    let mut out = Vec::new();
    if let Some(y) = at(a) {
        out.push((a, y));
    }
    out.extend(pts.iter().copied().filter(|&(x, _)| a < x && x < b));
    if let Some(y) = at(b) {
        out.push((b, y));
    }
    out
}

fn bounds(vals: impl Iterator<Item = f64>) -> Option<(f64, f64)> {
    vals.filter(|v| v.is_finite())
        .fold(None, |acc, v| match acc {
            None => Some((v, v)),
            Some((lo, hi)) => Some((lo.min(v), hi.max(v))),
        })
}

/// The plot. `id` must be unique in the page (it names the title,
/// description and hatch pattern).
#[component]
pub fn LinePlot(
    /// Unique element id of the figure.
    #[prop(into)]
    id: String,
    /// What to draw (SI).
    #[prop(into)]
    chart: Signal<LineChart>,
) -> impl IntoView {
    let sys = DisplaySystem::expect();
    let svg = {
        let id = id.clone();
        Signal::derive(move || chart.with(|c| render_svg(c, sys.get(), &id)))
    };
    let caption = {
        let id = id.clone();
        Signal::derive(move || chart.with(|c| render_caption(c, &id)))
    };
    view! { <PlotFrame id=id view_box=view_box() svg=svg caption=caption /> }
}

/// The caption: title, legend (series with their line style, the shaded
/// area) and, when there is no data, why.
pub fn render_caption(c: &LineChart, id: &str) -> String {
    let mut out = String::new();
    push_el(&mut out, "span", "plot-title", &c.title);
    out.push_str(r#"<ul class="legend">"#);
    for (i, s) in c.series.iter().enumerate() {
        let _ = write!(
            out,
            r#"<li><svg width="30" height="14" aria-hidden="true" focusable="false"><line x1="2" y1="7" x2="28" y2="7" class="series s{}"/></svg>"#,
            i % 4
        );
        push_esc(&mut out, &s.name);
        out.push_str("</li>");
    }
    if let Some(sh) = &c.shade {
        let _ = write!(
            out,
            r#"<li><svg width="30" height="14" aria-hidden="true" focusable="false"><rect x="2" y="1" width="26" height="12" class="shade-tint"/><rect x="2" y="1" width="26" height="12" fill="url(#{id}-hatch)"/></svg>"#
        );
        push_esc(&mut out, &sh.label);
        out.push_str("</li>");
    }
    out.push_str("</ul>");
    if !c.has_data() {
        push_el(&mut out, "p", "plot-empty", &c.empty);
    }
    out
}

/// The SVG content for one chart in one unit system.
pub fn render_svg(c: &LineChart, sys: UnitSystem, id: &str) -> String {
    use frame::{BOTTOM, HEIGHT, LEFT, RIGHT, TOP, WIDTH};
    let mut out = String::with_capacity(8192);
    push_title_desc(&mut out, id, &c.title, &c.describe(sys));
    if !c.has_data() {
        // No scale to show: the frame, the axis titles and why, nothing more.
        push_empty(&mut out);
        push_axis_titles(&mut out, &c.x.title(sys), &c.y.title(sys));
        return out;
    }
    push_hatch(&mut out, id);
    let series: Vec<Vec<(f64, f64)>> = c
        .series
        .iter()
        .map(|s| {
            s.points
                .iter()
                .map(|&(x, y)| (c.x.shown(x, sys), c.y.shown(y, sys)))
                .filter(|(x, y)| x.is_finite() && y.is_finite())
                .collect()
        })
        .collect();
    let marker_x = c.markers.iter().map(|m| c.x.shown(m.x, sys));
    let xb = bounds(series.iter().flatten().map(|p| p.0).chain(marker_x));
    let zero = c.y_from_zero.then_some(0.0);
    let yb = bounds(
        series
            .iter()
            .flatten()
            .map(|p| p.1)
            .chain(c.hlines.iter().map(|h| c.y.shown(h.y, sys)))
            .chain(
                c.markers
                    .iter()
                    .filter_map(|m| m.y)
                    .map(|y| c.y.shown(y, sys)),
            )
            .chain(zero),
    );
    let (x0, x1) = xb.unwrap_or((0.0, 1.0));
    let (y0, y1) = yb.unwrap_or((0.0, 1.0));
    let xt = nice_ticks(x0, x1, 6);
    let yt = nice_ticks(y0, y1, 5);
    let px = |x: f64| scale(x, xt.lo, xt.hi, LEFT, WIDTH - RIGHT);
    let py = |y: f64| scale(y, yt.lo, yt.hi, HEIGHT - BOTTOM, TOP);

    push_grid(&mut out, &xt, &yt, true);

    if let Some(sh) = &c.shade {
        if let Some(pts) = series.get(sh.series) {
            let part = clip(pts, c.x.shown(sh.from, sys), c.x.shown(sh.to, sys));
            if let (Some(first), Some(last)) = (part.first(), part.last()) {
                let base = py(0f64.clamp(yt.lo, yt.hi));
                let mut d = format!("M{:.1},{:.1}", px(first.0), base);
                for &(x, y) in &part {
                    let _ = write!(d, " L{:.1},{:.1}", px(x), py(y));
                }
                let _ = write!(d, " L{:.1},{:.1} Z", px(last.0), base);
                let _ = write!(
                    out,
                    r#"<path d="{d}" class="shade-tint"/><path d="{d}" fill="url(#{id}-hatch)" class="shade-hatch"/>"#
                );
            }
        }
    }
    for h in &c.hlines {
        let y = py(c.y.shown(h.y, sys));
        push_line(&mut out, LEFT, y, WIDTH - RIGHT, y, "limit-line");
        push_text(
            &mut out,
            WIDTH - RIGHT - 4.0,
            y - 6.0,
            "end",
            "label",
            &h.label,
        );
    }
    for (i, pts) in series.iter().enumerate() {
        if pts.is_empty() {
            continue;
        }
        out.push_str(r#"<path d=""#);
        for (k, &(x, y)) in pts.iter().enumerate() {
            let _ = write!(
                out,
                "{}{:.1},{:.1}",
                if k == 0 { "M" } else { " L" },
                px(x),
                py(y)
            );
        }
        let _ = write!(out, r#"" class="series s{}"/>"#, i % 4);
    }
    let marks: Vec<(f64, Option<f64>, &str)> = c
        .markers
        .iter()
        .map(|m| {
            (
                px(c.x.shown(m.x, sys)),
                m.y.map(|y| py(c.y.shown(y, sys))),
                m.label.as_str(),
            )
        })
        .collect();
    push_markers(&mut out, &marks);
    push_axis_titles(&mut out, &c.x.title(sys), &c.y.title(sys));
    out
}
