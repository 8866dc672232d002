//! Histogram of one figure from the tolerance study: the core's bins
//! ([`joulewise_core::tolerance::Histogram`]: equal bins from the smallest to
//! the largest value), drawn as bars, with markers for percentiles and a
//! limit.

use super::line::Marker;
use super::{
    frame, nice_ticks, push_axis_titles, push_empty, push_grid, push_markers, push_title_desc,
    scale, view_box, with_unit, Axis, PlotFrame,
};
use crate::html::push_el;
use crate::system::DisplaySystem;
use joulewise_core::units::UnitSystem;
use leptos::prelude::*;
use std::fmt::Write;

/// Everything a histogram shows (SI).
#[derive(Debug, Clone, PartialEq)]
pub struct HistChart {
    /// Title.
    pub title: String,
    /// The figure's axis.
    pub x: Axis,
    /// Left edge of the first bin, SI.
    pub low: f64,
    /// Right edge of the last bin, SI.
    pub high: f64,
    /// Samples per bin.
    pub counts: Vec<usize>,
    /// Percentile and limit markers.
    pub markers: Vec<Marker>,
    /// Said in place of the bars when there are none.
    pub empty: String,
}

impl HistChart {
    /// The data in words, in the display system.
    pub fn describe(&self, sys: UnitSystem) -> String {
        let total: usize = self.counts.iter().sum();
        if total == 0 {
            return format!("{}: no samples. {}", self.title, self.empty);
        }
        let u = joulewise_core::units::display_unit(self.x.dim, sys).symbol;
        let f = |v: f64| with_unit(self.x.shown(v, sys), u);
        let mut out = format!(
            "{}: {total} samples in {} bins from {} to {}. ",
            self.title,
            self.counts.len(),
            f(self.low),
            f(self.high)
        );
        for m in &self.markers {
            out.push_str(&format!("{} at {}. ", m.label, f(m.x)));
        }
        out.trim_end().to_string()
    }
}

/// The histogram plot; `id` must be unique in the page.
#[component]
pub fn HistogramPlot(
    /// Unique element id of the figure.
    #[prop(into)]
    id: String,
    /// What to draw (SI).
    #[prop(into)]
    chart: Signal<HistChart>,
) -> impl IntoView {
    let sys = DisplaySystem::expect();
    let svg = {
        let id = id.clone();
        Signal::derive(move || chart.with(|c| render_svg(c, sys.get(), &id)))
    };
    let caption = Signal::derive(move || {
        chart.with(|c| {
            let mut out = String::new();
            push_el(&mut out, "span", "plot-title", &c.title);
            if c.counts.iter().sum::<usize>() == 0 {
                push_el(&mut out, "p", "plot-empty", &c.empty);
            }
            out
        })
    });
    view! { <PlotFrame id=id view_box=view_box() svg=svg caption=caption /> }
}

/// The SVG content of a histogram in one unit system.
pub fn render_svg(c: &HistChart, sys: UnitSystem, id: &str) -> String {
    use frame::{BOTTOM, HEIGHT, LEFT, RIGHT, TOP, WIDTH};
    let mut out = String::with_capacity(4096);
    push_title_desc(&mut out, id, &c.title, &c.describe(sys));
    if c.counts.iter().all(|&k| k == 0) {
        push_empty(&mut out);
        push_axis_titles(&mut out, &c.x.title(sys), "Samples per bin");
        return out;
    }
    let bottom = HEIGHT - BOTTOM;
    let (lo, hi) = (c.x.shown(c.low, sys), c.x.shown(c.high, sys));
    let marks: Vec<f64> = c.markers.iter().map(|m| c.x.shown(m.x, sys)).collect();
    let xmin = marks.iter().copied().fold(lo.min(hi), f64::min);
    let xmax = marks.iter().copied().fold(lo.max(hi), f64::max);
    let xt = nice_ticks(xmin, xmax, 6);
    let peak = c.counts.iter().copied().max().unwrap_or(0);
    let yt = nice_ticks(0.0, peak.max(1) as f64, 4);
    let px = |x: f64| scale(x, xt.lo, xt.hi, LEFT, WIDTH - RIGHT);
    let py = |y: f64| scale(y, yt.lo, yt.hi, bottom, TOP);
    push_grid(&mut out, &xt, &yt, false);
    let n = c.counts.len().max(1) as f64;
    let width = (hi - lo) / n;
    for (i, &k) in c.counts.iter().enumerate() {
        if k == 0 {
            continue;
        }
        // All values equal: one bar of a nominal width around the value.
        let (a, b) = if width > 0.0 {
            (lo + i as f64 * width, lo + (i + 1) as f64 * width)
        } else {
            (lo - 0.1 * xt.step, lo + 0.1 * xt.step)
        };
        let (xa, xb) = (px(a), px(b));
        let y = py(k as f64);
        let _ = write!(
            out,
            r#"<rect x="{xa:.1}" y="{y:.1}" width="{:.1}" height="{:.1}" class="bar"/>"#,
            (xb - xa - 1.0).max(1.0),
            (bottom - y).max(0.0)
        );
    }
    let marks: Vec<(f64, Option<f64>, &str)> = c
        .markers
        .iter()
        .zip(marks)
        .map(|(m, x)| (px(x), None, m.label.as_str()))
        .collect();
    push_markers(&mut out, &marks);
    push_axis_titles(&mut out, &c.x.title(sys), "Samples per bin");
    out
}
