//! Crushing gaps at the closing point: the smallest gap the moving part
//! leaves, compared with the minimum gap each body part needs so that it is
//! not crushed.
//!
//! The gap comes from the geometry: a closing point that shuts completely
//! (gap 0), a fixed clearance, the clearance left when an end-of-travel
//! buffer stops the part (clearance at first buffer contact − buffer stroke
//! used), or the edge of a hinged lid held open at an angle `θ` above its
//! closed position (edge at radius `r`: chord `2r·sin(θ/2)`, arc `r·θ`, or
//! height above the closed plane `r·sin θ`; plane geometry).
//!
//! A body part is protected against crushing at that point when the gap is at
//! least its minimum gap `a`: `gap ≥ a`. The minimum gaps come from the limits
//! layer (ISO 13854:2017 Table 1, status R2: e.g. finger 25 mm, hand 100 mm,
//! body 500 mm) and are inputs here. A gap smaller than `a` may still be safe
//! if the body part cannot reach into it at all (opening sizes of
//! ISO 13857); that is not judged here.

use crate::error::{check, InputError};
use crate::figure::{ids, Figure, Provenance, Verdict};
use crate::units::Dim;
use serde::{Deserialize, Serialize};

/// How the gap at the edge of a hinged lid is measured.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum EdgeGapMeasure {
    /// Straight distance from the edge to its closed position, `2r·sin(θ/2)`.
    Chord,
    /// Path length of the edge to its closed position, `r·θ`.
    Arc,
    /// Height of the edge above the closed plane, `r·sin θ`: the thickness
    /// of a body part lying on the frame at the edge that the lid just
    /// touches (the smallest of the three for `θ ≤ π/2`).
    Normal,
}

impl EdgeGapMeasure {
    fn formula(self) -> &'static str {
        match self {
            EdgeGapMeasure::Chord => "gap = 2·r·sin(θ/2) (chord at the edge)",
            EdgeGapMeasure::Arc => "gap = r·θ (arc at the edge)",
            EdgeGapMeasure::Normal => "gap = r·sin θ (edge height above the closed plane)",
        }
    }
}

/// The gap at the edge of a hinged lid at radius `radius` (m) held open at
/// `angle` (rad) above its closed position (plane geometry).
///
/// # Formula
/// Chord `2r·sin(θ/2)`, arc `r·θ`, normal `r·sin θ`.
///
/// # Errors
/// `radius` not finite and positive; `angle` outside `[0, π]`.
pub fn hinged_edge_gap(
    radius: f64,
    angle: f64,
    measure: EdgeGapMeasure,
) -> Result<f64, InputError> {
    let r = check::positive("radius", radius)?;
    let th = check::in_range("angle", angle, 0.0, std::f64::consts::PI)?;
    Ok(match measure {
        EdgeGapMeasure::Chord => 2.0 * r * (th / 2.0).sin(),
        EdgeGapMeasure::Arc => r * th,
        EdgeGapMeasure::Normal => r * th.sin(),
    })
}

/// The smallest opening angle (rad) at which the edge of a hinged lid at
/// `radius` leaves at least `gap`: below it the gap is smaller. `None` when
/// no angle in `[0, π]` (for `Normal`, `[0, π/2]`) gives that gap.
///
/// # Formula
/// Chord `θ = 2·asin(g/(2r))`; arc `θ = g/r`; normal `θ = asin(g/r)`.
///
/// # Errors
/// `radius` not finite and positive; `gap` negative or not finite.
pub fn hinged_angle_for_gap(
    radius: f64,
    gap: f64,
    measure: EdgeGapMeasure,
) -> Result<Option<f64>, InputError> {
    let r = check::positive("radius", radius)?;
    let g = check::non_negative("gap", gap)?;
    Ok(match measure {
        EdgeGapMeasure::Chord => (g <= 2.0 * r).then(|| 2.0 * (g / (2.0 * r)).asin()),
        EdgeGapMeasure::Arc => (g <= r * std::f64::consts::PI).then_some(g / r),
        EdgeGapMeasure::Normal => (g <= r).then(|| (g / r).asin()),
    })
}

/// Where the gap at the closing point comes from.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum ClosingGeometry {
    /// The parts meet: no gap is left.
    Closed,
    /// A designed clearance that stays at the closing point, m.
    FixedClearance {
        /// Gap, m.
        gap: f64,
    },
    /// A buffer stops the part: the gap is the clearance when the part first
    /// touches the buffer less the buffer stroke it uses.
    BufferStop {
        /// Gap at the closing point when the part first touches the buffer, m.
        gap_at_buffer_contact: f64,
        /// Buffer stroke used to stop the part, m (from the impact figures).
        stroke_used: f64,
    },
    /// The edge of a hinged lid stops at `angle` above its closed position.
    HingedEdge {
        /// Radius of the edge from the hinge axis, m.
        radius: f64,
        /// Angle at which the lid stops, rad.
        angle: f64,
        /// How the edge gap is measured.
        measure: EdgeGapMeasure,
    },
}

/// The gap left at the closing point.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ClosingGap {
    /// Smallest gap left, m (zero or more).
    pub gap: f64,
    /// For a buffer stop: the closing point shuts before the buffer has
    /// stopped the part (stroke used ≥ clearance), so the gap is zero.
    pub closes_before_stop: bool,
    /// The geometry it came from.
    pub geometry: ClosingGeometry,
}

/// The gap left at the closing point, from the geometry.
///
/// # Formula
/// Closed: 0; fixed: the clearance; buffer stop:
/// `max(0, gap_at_buffer_contact − stroke_used)`; hinged edge: see
/// [`hinged_edge_gap`].
///
/// # Errors
/// A negative or non-finite length; a non-positive radius; an angle outside
/// `[0, π]`.
pub fn closing_gap(geometry: &ClosingGeometry) -> Result<ClosingGap, InputError> {
    let (gap, closes_before_stop) = match *geometry {
        ClosingGeometry::Closed => (0.0, false),
        ClosingGeometry::FixedClearance { gap } => (check::non_negative("gap", gap)?, false),
        ClosingGeometry::BufferStop {
            gap_at_buffer_contact,
            stroke_used,
        } => {
            let g0 = check::non_negative("gap_at_buffer_contact", gap_at_buffer_contact)?;
            let s = check::non_negative("stroke_used", stroke_used)?;
            let g = g0 - s;
            (g.max(0.0), g < 0.0)
        }
        ClosingGeometry::HingedEdge {
            radius,
            angle,
            measure,
        } => (hinged_edge_gap(radius, angle, measure)?, false),
    };
    Ok(ClosingGap {
        gap,
        closes_before_stop,
        geometry: *geometry,
    })
}

impl ClosingGap {
    /// The value of figure `id` as [`ClosingGap::figure`] reports it (m):
    /// `None` for a non-finite result or another id. The one place that
    /// maps the id to the number: [`ClosingGap::figure`] takes its value
    /// from here, and the tolerance study reads it without building the
    /// figure.
    pub fn figure_value(&self, id: &str) -> Option<f64> {
        match id {
            ids::GAP_CLOSING_GAP => Some(self.gap),
            _ => None,
        }
        .filter(|v| v.is_finite())
    }

    /// The figure `gap.closing_gap`.
    pub fn figure(&self) -> Figure {
        let (method, source) = match self.geometry {
            ClosingGeometry::Closed => ("parts meet: gap = 0", "geometry"),
            ClosingGeometry::FixedClearance { .. } => ("designed clearance", "geometry"),
            ClosingGeometry::BufferStop { .. } => (
                "gap = clearance at first buffer contact − buffer stroke used",
                "geometry",
            ),
            ClosingGeometry::HingedEdge { measure, .. } => (measure.formula(), "plane geometry"),
        };
        let mut f = Figure::new(
            ids::GAP_CLOSING_GAP,
            "Smallest gap at the closing point",
            Dim::Length,
            self.figure_value(ids::GAP_CLOSING_GAP).unwrap_or(f64::NAN),
        )
        .method(method)
        .source(source)
        .assume("rigid parts; the smallest gap during the closing movement");
        if self.closes_before_stop {
            f = f
                .assume("the closing point shuts before the buffer stops the part: no gap is left");
        }
        f
    }
}

/// The minimum gap a body part needs at a closing point (from the limits
/// layer, e.g. ISO 13854:2017 Table 1).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct GapRequirement {
    /// Body part, e.g. `Finger`.
    pub body_part: String,
    /// Minimum gap `a`, m.
    pub min_gap: f64,
    /// Where the value comes from.
    pub source: Option<Provenance>,
}

/// One body part compared with the gap.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct GapEntry {
    /// Body part.
    pub body_part: String,
    /// Its minimum gap `a`, m.
    pub min_gap: f64,
    /// Whether the gap protects it against crushing (`gap ≥ a`).
    pub protected: bool,
    /// `Pass` when protected, `Fail` otherwise.
    pub verdict: Verdict,
    /// Margin as a difference, `gap − a`, m (negative when short).
    pub difference: f64,
    /// Margin as a ratio, `gap / a` (≥ 1 when protected).
    pub ratio: f64,
    /// Where the minimum gap comes from.
    pub source: Option<Provenance>,
}

/// The gap compared with each body part's minimum gap.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct GapComparison {
    /// The gap compared, m.
    pub gap: f64,
    /// One entry per requirement, in the order given.
    pub entries: Vec<GapEntry>,
}

impl GapComparison {
    /// Body parts the gap protects against crushing.
    pub fn protected(&self) -> Vec<&str> {
        self.entries
            .iter()
            .filter(|e| e.protected)
            .map(|e| e.body_part.as_str())
            .collect()
    }

    /// Body parts the gap does not protect against crushing.
    pub fn not_protected(&self) -> Vec<&str> {
        self.entries
            .iter()
            .filter(|e| !e.protected)
            .map(|e| e.body_part.as_str())
            .collect()
    }
}

/// Compare a gap with the minimum gaps of several body parts: protected when
/// `gap ≥ a` (ISO 13854:2017 Table 1, R2: the gap must be at least the
/// minimum gap for the body part).
///
/// # Errors
/// `gap` or a minimum gap negative or not finite (minimum gaps must be
/// positive); the requirement's index is named.
pub fn compare_gap(gap: f64, requirements: &[GapRequirement]) -> Result<GapComparison, InputError> {
    let g = check::non_negative("gap", gap)?;
    let mut entries = Vec::with_capacity(requirements.len());
    for (i, req) in requirements.iter().enumerate() {
        let a = check::positive("min_gap", req.min_gap)
            .map_err(|e| e.within(&format!("requirements.{i}")))?;
        let protected = g >= a;
        entries.push(GapEntry {
            body_part: req.body_part.clone(),
            min_gap: a,
            protected,
            verdict: if protected {
                Verdict::Pass
            } else {
                Verdict::Fail
            },
            difference: g - a,
            ratio: g / a,
            source: req.source.clone(),
        });
    }
    Ok(GapComparison { gap: g, entries })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::figure::SourceStatus;
    use crate::test_tol::REL_EXACT;
    use approx::assert_relative_eq;
    use proptest::prelude::*;

    const MM: f64 = 1e-3;
    /// Gap → angle → gap through sin/asin: a few ulps of the radius.
    const REL_GAP_ROUND_TRIP: f64 = 1e-12;

    fn iso13854() -> Provenance {
        Provenance::new("ISO 13854:2017", "Table 1", SourceStatus::Secondary)
    }

    fn req(part: &str, mm: f64) -> GapRequirement {
        GapRequirement {
            body_part: part.into(),
            min_gap: mm * MM,
            source: Some(iso13854()),
        }
    }

    #[test]
    fn t19_iso_13854_comparisons() {
        // T19: ISO 13854:2017 Table 1 (R2): finger 25 mm, toes 50 mm, body
        // 500 mm; gap ≥ a protects (exact comparison). The gaps are built in
        // integer millimetres so that "equal" is exactly equal.
        for (part, a, gap, protected) in [
            ("finger", 25.0, 24.0, false),
            ("finger", 25.0, 25.0, true),
            ("toes", 50.0, 49.0, false),
            ("toes", 50.0, 50.0, true),
            ("body", 500.0, 500.0, true),
            ("body", 500.0, 650.0, true),
        ] {
            let c = compare_gap(gap * MM, &[req(part, a)]).unwrap();
            assert_eq!(c.entries[0].protected, protected, "{part} {gap} mm");
        }
    }

    #[test]
    fn several_body_parts_are_sorted_into_protected_and_not() {
        // ISO 13854:2017 Table 1 (R2) values, passed in as the limits layer
        // would.
        let reqs = [
            req("body", 500.0),
            req("head", 300.0),
            req("leg", 180.0),
            req("foot", 120.0),
            req("arm", 120.0),
            req("hand, wrist, fist", 100.0),
            req("toes", 50.0),
            req("finger", 25.0),
        ];
        let c = compare_gap(120.0 * MM, &reqs).unwrap();
        assert_eq!(
            c.protected(),
            vec!["foot", "arm", "hand, wrist, fist", "toes", "finger"]
        );
        assert_eq!(c.not_protected(), vec!["body", "head", "leg"]);
        let leg = &c.entries[2];
        assert_relative_eq!(leg.difference, -60.0 * MM, max_relative = REL_EXACT);
        assert_relative_eq!(leg.ratio, 120.0 / 180.0, max_relative = REL_EXACT);
        assert_eq!(leg.verdict, Verdict::Fail);
    }

    #[test]
    fn buffer_stop_gap() {
        let g = closing_gap(&ClosingGeometry::BufferStop {
            gap_at_buffer_contact: 0.040,
            stroke_used: 0.012,
        })
        .unwrap();
        assert_relative_eq!(g.gap, 0.028, max_relative = REL_EXACT);
        assert!(!g.closes_before_stop);
        let g = closing_gap(&ClosingGeometry::BufferStop {
            gap_at_buffer_contact: 0.010,
            stroke_used: 0.012,
        })
        .unwrap();
        assert_eq!(g.gap, 0.0);
        assert!(g.closes_before_stop);
        assert_eq!(g.figure().value, Some(0.0));
        assert_eq!(closing_gap(&ClosingGeometry::Closed).unwrap().gap, 0.0);
    }

    #[test]
    fn hinged_edge_measures() {
        // Plane geometry: at θ = 60° the chord equals r, the normal r·√3/2.
        let th = std::f64::consts::FRAC_PI_3;
        let r = 0.6;
        assert_relative_eq!(
            hinged_edge_gap(r, th, EdgeGapMeasure::Chord).unwrap(),
            r,
            max_relative = REL_EXACT
        );
        assert_relative_eq!(
            hinged_edge_gap(r, th, EdgeGapMeasure::Normal).unwrap(),
            r * 3.0_f64.sqrt() / 2.0,
            max_relative = REL_EXACT
        );
        assert_relative_eq!(
            hinged_edge_gap(r, th, EdgeGapMeasure::Arc).unwrap(),
            r * th,
            max_relative = REL_EXACT
        );
        assert!(hinged_edge_gap(r, 4.0, EdgeGapMeasure::Arc).is_err());
        // The normal gap for a finger (25 mm) at 0.6 m needs asin(25/600).
        let a = hinged_angle_for_gap(r, 0.025, EdgeGapMeasure::Normal)
            .unwrap()
            .unwrap();
        assert_relative_eq!(a, (0.025_f64 / 0.6).asin(), max_relative = REL_EXACT);
        assert_eq!(
            hinged_angle_for_gap(r, 0.7, EdgeGapMeasure::Normal).unwrap(),
            None
        );
    }

    proptest! {
        #[test]
        fn angle_for_gap_inverts_gap(r in 0.01f64..3.0, frac in 0.0f64..1.0, which in 0usize..3) {
            let m = [EdgeGapMeasure::Chord, EdgeGapMeasure::Arc, EdgeGapMeasure::Normal][which];
            let max_angle = if m == EdgeGapMeasure::Normal { std::f64::consts::FRAC_PI_2 } else { std::f64::consts::PI };
            let th = frac * max_angle;
            let g = hinged_edge_gap(r, th, m).unwrap();
            let back = hinged_angle_for_gap(r, g, m).unwrap().unwrap();
            // asin near its end point (θ → π, or π/2 for Normal) loses
            // precision as √ε: compare the gaps, which are well conditioned.
            let g2 = hinged_edge_gap(r, back, m).unwrap();
            prop_assert!((g2 - g).abs() <= r * REL_GAP_ROUND_TRIP);
        }
    }
}
