//! Plots as SVG: crisp at any zoom, printable, and small (no plotting
//! crate). One Leptos component, [`PlotFrame`], holds every plot; the
//! drawing inside is SVG markup written as text (see [`crate::html`] for
//! why), with every label escaped. Data come in SI from the core; every axis is
//! drawn in the display unit system ([`crate::system::DisplaySystem`]) with
//! 1-2-5 ticks. Each plot is `role="img"` with a `<title>` and a `<desc>`
//! that summarises the data in words for screen readers and the printout.
//!
//! - [`line`](mod@line): line plot with several series, legend, an optional shaded
//!   area under one series, markers and limit lines (force–deflection with
//!   the stored energy shaded; position, speed and force against time);
//! - [`histogram`]: distribution of a figure from the tolerance study;
//! - [`margins`]: the checks' utilisations side by side.

pub mod histogram;
pub mod line;
pub mod margins;

use crate::html::push_esc;
use joulewise_core::units::{display_unit, format_sig, Dim, UnitSystem};
use leptos::prelude::*;
use std::fmt::Write;

pub use histogram::{HistChart, HistogramPlot};
pub use line::{HLine, LineChart, LinePlot, Marker, Series, Shade};
pub use margins::MarginOverview;

/// An axis: what it shows and its quantity kind (values arrive in SI).
#[derive(Debug, Clone, PartialEq)]
pub struct Axis {
    /// Name of the quantity, e.g. `Spring force`.
    pub label: String,
    /// Quantity kind.
    pub dim: Dim,
}

impl Axis {
    /// An axis.
    pub fn new(label: &str, dim: Dim) -> Self {
        Self {
            label: label.into(),
            dim,
        }
    }

    /// Title with the unit of `system`: `Spring force (lbf)`.
    pub fn title(&self, system: UnitSystem) -> String {
        let unit = display_unit(self.dim, system).symbol;
        if unit.is_empty() {
            self.label.clone()
        } else {
            format!("{} ({unit})", self.label)
        }
    }

    /// An SI value in the display unit of `system`.
    pub fn shown(&self, si: f64, system: UnitSystem) -> f64 {
        display_unit(self.dim, system).from_si(si)
    }
}

/// Tick marks of an axis: a 1-2-5 step and the values on it.
#[derive(Debug, Clone, PartialEq)]
pub struct Ticks {
    /// First tick (≤ the data minimum): the axis starts here.
    pub lo: f64,
    /// Last tick (≥ the data maximum): the axis ends here.
    pub hi: f64,
    /// Distance between ticks: 1, 2 or 5 × 10ᵏ.
    pub step: f64,
    /// The tick values, `lo`, `lo + step`, … `hi`.
    pub values: Vec<f64>,
    /// Decimals that show every tick exactly.
    pub decimals: usize,
}

/// Fraction of a step within which a data end counts as on the tick.
const SNAP: f64 = 1e-6;

/// Most ticks ever drawn (a guard against a degenerate range).
const MAX_TICKS: usize = 40;

/// Ticks covering `[min, max]` with about `target` intervals, each a 1, 2 or
/// 5 × 10ᵏ step; the axis is widened to the ticks around the data. A
/// non-finite or empty range gives 0..1; a single value is widened by ±10 %
/// (±1 at zero).
pub fn nice_ticks(min: f64, max: f64, target: usize) -> Ticks {
    let (mut a, mut b) = if min.is_finite() && max.is_finite() {
        (min.min(max), min.max(max))
    } else {
        (0.0, 1.0)
    };
    if a == b {
        let d = if a == 0.0 { 1.0 } else { 0.1 * a.abs() };
        a -= d;
        b += d;
    }
    let raw = (b - a) / target.max(1) as f64;
    let mag = 10f64.powf(raw.log10().floor());
    let norm = raw / mag;
    let nice = if norm <= 1.0 {
        1.0
    } else if norm <= 2.0 {
        2.0
    } else if norm <= 5.0 {
        5.0
    } else {
        10.0
    };
    let step = nice * mag;
    // Rounding dust (a minimum of −1e-12 N) must not add a whole step.
    let lo = (a / step + SNAP).floor() * step;
    let hi = (b / step - SNAP).ceil() * step;
    let n = (((hi - lo) / step).round() as usize).clamp(1, MAX_TICKS);
    let values = (0..=n)
        .map(|i| {
            let v = lo + i as f64 * step;
            // Snap rounding dust (e.g. 3e-17 for 0) to the exact tick.
            if v.abs() < step * 1e-9 {
                0.0
            } else {
                v
            }
        })
        .collect::<Vec<_>>();
    let decimals = (-step.log10().floor()).max(0.0) as usize;
    Ticks {
        lo,
        hi: lo + n as f64 * step,
        step,
        values,
        decimals,
    }
}

/// A tick label: fixed decimals for ordinary steps, significant figures
/// for very small or very large ones.
pub fn tick_label(v: f64, t: &Ticks) -> String {
    let big = t.hi.abs().max(t.lo.abs()) >= 1e7;
    if t.decimals > 6 || big {
        return format_sig(v, 3);
    }
    let s = format!("{:.*}", t.decimals, v);
    if s.trim_start_matches('-')
        .chars()
        .all(|c| c == '0' || c == '.')
    {
        // No "-0" or "-0.0".
        s.trim_start_matches('-').to_string()
    } else {
        s.replace('-', "−")
    }
}

/// Map `v` from `[d0, d1]` to `[r0, r1]`; a zero-width domain maps to the
/// middle.
pub fn scale(v: f64, d0: f64, d1: f64, r0: f64, r1: f64) -> f64 {
    if d1 == d0 {
        0.5 * (r0 + r1)
    } else {
        r0 + (v - d0) / (d1 - d0) * (r1 - r0)
    }
}

/// Plot box geometry in SVG user units (the viewBox is `0 0 WIDTH HEIGHT`).
pub mod frame {
    /// Width of the drawing: at 760 px on a portrait tablet, 15-unit text
    /// renders at about 18 px; at 640 px, at 15 px.
    pub const WIDTH: f64 = 640.0;
    /// Height of the drawing.
    pub const HEIGHT: f64 = 330.0;
    /// Left margin (tick labels and the rotated axis title).
    pub const LEFT: f64 = 78.0;
    /// Right margin.
    pub const RIGHT: f64 = 34.0;
    /// Top margin (marker labels).
    pub const TOP: f64 = 20.0;
    /// Bottom margin (tick labels and the axis title).
    pub const BOTTOM: f64 = 60.0;
}

/// The frame every plot is shown in: a `<figure>` holding the SVG (with
/// `role="img"`, its `<title>` and `<desc>` inside the markup) and a
/// caption with the legend.
#[component]
pub fn PlotFrame(
    /// Unique element id; the markup names its title `{id}-title` and its
    /// description `{id}-desc`.
    #[prop(into)]
    id: String,
    /// Extra class of the figure.
    #[prop(default = "")]
    class: &'static str,
    /// The SVG viewBox.
    #[prop(into)]
    view_box: Signal<String>,
    /// The SVG's content.
    #[prop(into)]
    svg: Signal<String>,
    /// The caption's content.
    #[prop(into)]
    caption: Signal<String>,
) -> impl IntoView {
    let labelled = format!("{id}-title {id}-desc");
    view! {
        <figure class=format!("plot {class}") id=id>
            <svg viewBox=view_box role="img" aria-labelledby=labelled inner_html=svg></svg>
            <figcaption inner_html=caption></figcaption>
        </figure>
    }
}

/// Append the `<title>` and `<desc>` of plot `id`.
pub(crate) fn push_title_desc(out: &mut String, id: &str, title: &str, desc: &str) {
    let _ = write!(out, r#"<title id="{id}-title">"#);
    push_esc(out, title);
    let _ = write!(out, r#"</title><desc id="{id}-desc">"#);
    push_esc(out, desc);
    out.push_str("</desc>");
}

/// Append the diagonal hatch pattern `{id}-hatch`.
pub(crate) fn push_hatch(out: &mut String, id: &str) {
    let _ = write!(
        out,
        r#"<defs><pattern id="{id}-hatch" width="8" height="8" patternUnits="userSpaceOnUse" patternTransform="rotate(45)"><line x1="0" y1="0" x2="0" y2="8" class="hatch-line"/></pattern></defs>"#
    );
}

/// Append a line.
pub(crate) fn push_line(out: &mut String, x1: f64, y1: f64, x2: f64, y2: f64, class: &str) {
    let _ = write!(
        out,
        r#"<line x1="{x1:.1}" y1="{y1:.1}" x2="{x2:.1}" y2="{y2:.1}" class="{class}"/>"#
    );
}

/// Append a text at `(x, y)` with the given anchor (`start`, `middle`, `end`).
pub(crate) fn push_text(out: &mut String, x: f64, y: f64, anchor: &str, class: &str, text: &str) {
    let _ = write!(
        out,
        r#"<text x="{x:.1}" y="{y:.1}" text-anchor="{anchor}" class="{class}">"#
    );
    push_esc(out, text);
    out.push_str("</text>");
}

/// Append the horizontal axis title and the rotated vertical one.
pub(crate) fn push_axis_titles(out: &mut String, x_title: &str, y_title: &str) {
    use frame::{BOTTOM, HEIGHT, LEFT, RIGHT, TOP, WIDTH};
    push_text(
        out,
        0.5 * (LEFT + WIDTH - RIGHT),
        HEIGHT - 10.0,
        "middle",
        "axis-title",
        x_title,
    );
    let mid = 0.5 * (TOP + HEIGHT - BOTTOM);
    let _ = write!(
        out,
        r#"<text x="18" y="{mid:.1}" text-anchor="middle" class="axis-title" transform="rotate(-90 18 {mid:.1})">"#
    );
    push_esc(out, y_title);
    out.push_str("</text>");
}

/// Append the frame's grid lines and tick labels for both axes (`grid_x`:
/// draw vertical grid lines, else only tick marks).
pub(crate) fn push_grid(out: &mut String, xt: &Ticks, yt: &Ticks, grid_x: bool) {
    use frame::{BOTTOM, HEIGHT, LEFT, RIGHT, TOP, WIDTH};
    let bottom = HEIGHT - BOTTOM;
    for &v in &yt.values {
        let y = scale(v, yt.lo, yt.hi, bottom, TOP);
        push_line(out, LEFT, y, WIDTH - RIGHT, y, "grid");
        push_text(out, LEFT - 8.0, y + 5.0, "end", "tick", &tick_label(v, yt));
    }
    for &v in &xt.values {
        let x = scale(v, xt.lo, xt.hi, LEFT, WIDTH - RIGHT);
        if grid_x {
            push_line(out, x, TOP, x, bottom, "grid");
        } else {
            push_line(out, x, bottom, x, bottom + 6.0, "axis");
        }
        push_text(out, x, bottom + 22.0, "middle", "tick", &tick_label(v, xt));
    }
    push_line(out, LEFT, bottom, WIDTH - RIGHT, bottom, "axis");
    push_line(out, LEFT, TOP, LEFT, bottom, "axis");
}

/// Append vertical markers with their labels (staggered in three rows so
/// labels of nearby markers do not overlap) and dots where a height is given.
pub(crate) fn push_markers(out: &mut String, marks: &[(f64, Option<f64>, &str)]) {
    use frame::{BOTTOM, HEIGHT, LEFT, RIGHT, TOP, WIDTH};
    let bottom = HEIGHT - BOTTOM;
    for (i, &(x, y, label)) in marks.iter().enumerate() {
        push_line(out, x, TOP, x, bottom, "marker-line");
        if let Some(y) = y {
            let _ = write!(
                out,
                r#"<circle cx="{x:.1}" cy="{y:.1}" r="5" class="marker-dot"/>"#
            );
        }
        let right_side = x > LEFT + 0.6 * (WIDTH - LEFT - RIGHT);
        let (tx, anchor) = if right_side {
            (x - 5.0, "end")
        } else {
            (x + 5.0, "start")
        };
        let ty = TOP + 16.0 + 19.0 * (i % 3) as f64;
        push_text(out, tx, ty, anchor, "label", label);
    }
}

/// Append the bare frame of a plot with no data and the words "Not
/// computed" (the reasons are in the caption, where they can wrap).
pub(crate) fn push_empty(out: &mut String) {
    use frame::{BOTTOM, HEIGHT, LEFT, RIGHT, TOP, WIDTH};
    let bottom = HEIGHT - BOTTOM;
    push_line(out, LEFT, bottom, WIDTH - RIGHT, bottom, "axis");
    push_line(out, LEFT, TOP, LEFT, bottom, "axis");
    push_text(
        out,
        0.5 * (LEFT + WIDTH - RIGHT),
        0.5 * (TOP + bottom),
        "middle",
        "label empty",
        "Not computed: the reason is given below",
    );
}

/// The standard viewBox of the line plots and histograms.
pub(crate) fn view_box() -> String {
    format!("0 0 {} {}", frame::WIDTH, frame::HEIGHT)
}

/// `v` (display units) with 3 significant figures and the unit.
pub(crate) fn with_unit(v: f64, unit: &str) -> String {
    if unit.is_empty() {
        format_sig(v, 3)
    } else {
        format!("{} {unit}", format_sig(v, 3))
    }
}
