//! Springs combined in parallel and in series, and [`SpringModel`], the enum
//! over every model that the scenario layer holds.
//!
//! Parallel: a shared deflection, forces add: F = Σ F_i(q), W = Σ W_i.
//!
//! Series: a shared force, deflections add: q = Σ q_i(F). Each member's force
//! law is inverted by bracketed bisection (`solve::boundary`, bounded at 60
//! halvings), and the shared force by a second bisection on Σ q_i(F) = q. The
//! inverse is the generalised one, q_i(F) = sup{x : F_i(x) ≤ F} within the
//! member's range, so a member that reaches its limit (solid) stays there
//! while the others deflect further, and a member with a force step (initial
//! tension, a gas spring's F₁) does not move until the step is overcome. The
//! energy of a series stack is the sum of each member's energy at its own
//! deflection, exact up to the bisection resolution (2⁻⁶⁰ of the brackets).
//! Series members must have a rising characteristic (checked by sampling).
//!
//! Bounded work: a series stack's force costs two nested bisections per
//! evaluation (60 × 60 member evaluations for each member), and the release
//! integrator asks for it thousands of times. Combinations are therefore
//! flattened (a series inside a series, or a parallel group inside a
//! parallel group, is the same law with its members listed in place), hold
//! at most [`MAX_COMBINED_SPRINGS`] springs in all, and a series stack may
//! not contain another series stack inside a parallel group (the bisections
//! would nest four deep). A larger or deeper arrangement is refused with an
//! input error saying so, never left to run for minutes.
//!
//! Design choice: combinations hold members as [`SpringModel`] values (an
//! enum), not `Box<dyn Spring>`: the enum is `Clone`, `Send + Sync`,
//! serialisable and comparable, so a combined spring can be copied into a
//! tolerance study and written into a report like any other.

use super::solve::boundary;
use super::{
    Axis, DiscSpec, DiscStack, ExtensionSpec, ExtensionSpring, ForceLaw, GasSpec, GasSpring,
    HelicalSpec, HelicalSpring, LinearSpec, LinearSpring, Spring, StressAt, TableSpec, TableSpring,
    TorsionSpec, TorsionSpring, Travel,
};
use crate::error::InputError;
use crate::figure::SourceStatus;
use serde::{Deserialize, Serialize};

/// Inputs of any spring model, tagged by `model` in JSON.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
#[serde(tag = "model", rename_all = "snake_case")]
pub enum SpringSpec {
    /// Linear spring.
    Linear(LinearSpec),
    /// Helical compression spring (EN 13906-1).
    Helical(HelicalSpec),
    /// Extension spring with initial tension.
    Extension(ExtensionSpec),
    /// Torsion spring (EN 13906-2).
    Torsion(TorsionSpec),
    /// Gas spring.
    Gas(GasSpec),
    /// Disc-spring stack (EN 16984).
    Disc(DiscSpec),
    /// Measured table.
    Table(TableSpec),
    /// Members in series, listed from the fixed end to the moving end.
    Series {
        /// The members.
        members: Vec<SpringSpec>,
    },
    /// Members in parallel.
    Parallel {
        /// The members.
        members: Vec<SpringSpec>,
    },
}

impl SpringSpec {
    /// Validate and build the model. Errors of a member are prefixed with
    /// `members.i`.
    ///
    /// # Errors
    /// The first invalid input found.
    pub fn build(&self) -> Result<SpringModel, InputError> {
        let members = |m: &[SpringSpec]| -> Result<Vec<SpringModel>, InputError> {
            m.iter()
                .enumerate()
                .map(|(i, s)| s.build().map_err(|e| e.within(&format!("members.{i}"))))
                .collect()
        };
        let model = match self {
            SpringSpec::Linear(s) => SpringModel::Linear(LinearSpring::new(s.clone())?),
            SpringSpec::Helical(s) => SpringModel::Helical(HelicalSpring::new(s.clone())?),
            SpringSpec::Extension(s) => SpringModel::Extension(ExtensionSpring::new(s.clone())?),
            SpringSpec::Torsion(s) => SpringModel::Torsion(TorsionSpring::new(s.clone())?),
            SpringSpec::Gas(s) => SpringModel::Gas(GasSpring::new(s.clone())?),
            SpringSpec::Disc(s) => SpringModel::Disc(DiscStack::new(s.clone())?),
            SpringSpec::Table(s) => SpringModel::Table(TableSpring::new(s.clone())?),
            SpringSpec::Series { members: m } => SpringModel::Series(Series::new(members(m)?)?),
            SpringSpec::Parallel { members: m } => {
                SpringModel::Parallel(Parallel::new(members(m)?)?)
            }
        };
        check_finite_over_range(&model)?;
        Ok(model)
    }
}

/// Refuse a model whose force or energy over its admissible range is not a
/// finite number: inputs that each pass their own check can still be of a
/// size whose products overflow (a stroke of 1e308 m, a rate of 1e300 N/m
/// over a long travel). The error names the input most likely at fault.
fn check_finite_over_range(model: &SpringModel) -> Result<(), InputError> {
    let (lo, hi) = model.deflection_range();
    let mid = lo + 0.5 * (hi - lo);
    let finite = [lo, mid, hi].into_iter().all(|q| {
        [Travel::Loading, Travel::Unloading].into_iter().all(|t| {
            q.is_finite()
                && model.force(q, t).is_finite()
                && model.work(lo, q, t).is_finite()
                && model.rate(q).is_finite()
        })
    }) && model.effective_mass().is_finite();
    if finite {
        return Ok(());
    }
    let field = match model {
        SpringModel::Linear(_) | SpringModel::Extension(_) | SpringModel::Torsion(_) => "rate",
        SpringModel::Helical(_) => "wire_diameter",
        SpringModel::Gas(_) => "stroke",
        SpringModel::Disc(_) => "thickness",
        SpringModel::Table(_) => "loading",
        SpringModel::Series(_) | SpringModel::Parallel(_) => "members",
    };
    Err(InputError::invalid(
        field,
        "the force or stored energy over the spring's range is not a finite number: \
         check the sizes and units of its inputs",
    ))
}

/// Any validated spring; implements [`Spring`] by delegation.
#[derive(Debug, Clone, PartialEq, Serialize)]
#[serde(tag = "model", rename_all = "snake_case")]
pub enum SpringModel {
    /// Linear spring.
    Linear(LinearSpring),
    /// Helical compression spring.
    Helical(HelicalSpring),
    /// Extension spring.
    Extension(ExtensionSpring),
    /// Torsion spring.
    Torsion(TorsionSpring),
    /// Gas spring.
    Gas(GasSpring),
    /// Disc-spring stack.
    Disc(DiscStack),
    /// Measured table.
    Table(TableSpring),
    /// Series combination.
    Series(Series),
    /// Parallel combination.
    Parallel(Parallel),
}

macro_rules! each {
    ($self:expr, $s:ident => $e:expr) => {
        match $self {
            SpringModel::Linear($s) => $e,
            SpringModel::Helical($s) => $e,
            SpringModel::Extension($s) => $e,
            SpringModel::Torsion($s) => $e,
            SpringModel::Gas($s) => $e,
            SpringModel::Disc($s) => $e,
            SpringModel::Table($s) => $e,
            SpringModel::Series($s) => $e,
            SpringModel::Parallel($s) => $e,
        }
    };
}

impl SpringModel {
    /// Free length (m) where the model knows it (linear with a free length,
    /// helical, extension with a free length).
    pub fn free_length(&self) -> Option<f64> {
        match self {
            SpringModel::Linear(s) => s.free_length(),
            SpringModel::Helical(s) => Some(s.free_length()),
            SpringModel::Extension(s) => s.spec().free_length,
            _ => None,
        }
    }

    /// Deflection (m) at an installed length (m): L₀ − L for compression
    /// springs (linear, helical), L − L₀ for an extension spring.
    ///
    /// # Errors
    /// The model has no free length, or the length is not finite.
    pub fn deflection_at_length(&self, length: f64) -> Result<f64, InputError> {
        crate::error::check::finite("length", length)?;
        let l0 = self.free_length().ok_or_else(|| {
            InputError::invalid(
                "length",
                "this spring has no free length: give the state as a deflection",
            )
        })?;
        Ok(match self {
            SpringModel::Extension(_) => length - l0,
            _ => l0 - length,
        })
    }
}

impl Spring for SpringModel {
    fn axis(&self) -> Axis {
        each!(self, s => s.axis())
    }
    fn force(&self, q: f64, travel: Travel) -> f64 {
        each!(self, s => s.force(q, travel))
    }
    fn work(&self, q1: f64, q2: f64, travel: Travel) -> f64 {
        each!(self, s => s.work(q1, q2, travel))
    }
    fn deflection_range(&self) -> (f64, f64) {
        each!(self, s => s.deflection_range())
    }
    fn effective_mass(&self) -> f64 {
        each!(self, s => s.effective_mass())
    }
    fn rate(&self, q: f64) -> f64 {
        each!(self, s => s.rate(q))
    }
    fn force_law(&self) -> ForceLaw {
        each!(self, s => s.force_law())
    }
    fn stress(&self, q: f64) -> Option<StressAt> {
        each!(self, s => s.stress(q))
    }
    fn notes(&self) -> Vec<String> {
        each!(self, s => s.notes())
    }
}

/// Most springs in one combination, counting the members of nested
/// combinations: enough for any real stack or group (disc-spring stacks are
/// one model, [`super::DiscStack`]); a series stack of this many members
/// still evaluates in well under a second for a whole release.
pub const MAX_COMBINED_SPRINGS: usize = 16;

/// Springs in a model, counting the members of combinations.
fn leaves(m: &SpringModel) -> usize {
    match m {
        SpringModel::Series(s) => s.members.iter().map(leaves).sum(),
        SpringModel::Parallel(p) => p.members.iter().map(leaves).sum(),
        _ => 1,
    }
}

/// Whether a series stack sits anywhere in the model.
fn holds_series(m: &SpringModel) -> bool {
    match m {
        SpringModel::Series(_) => true,
        SpringModel::Parallel(p) => p.members.iter().any(holds_series),
        _ => false,
    }
}

/// Refuse a combination with more than [`MAX_COMBINED_SPRINGS`] springs.
fn check_count(members: &[SpringModel]) -> Result<(), InputError> {
    let n: usize = members.iter().map(leaves).sum();
    if n > MAX_COMBINED_SPRINGS {
        return Err(InputError::invalid(
            "members",
            format!(
                "at most {MAX_COMBINED_SPRINGS} springs in one combination (this one has {n}); \
                 for a longer stack give its measured force–deflection table"
            ),
        ));
    }
    Ok(())
}

fn common_axis(members: &[SpringModel]) -> Result<Axis, InputError> {
    let Some(first) = members.first() else {
        return Err(InputError::invalid(
            "members",
            "at least one spring is needed",
        ));
    };
    let axis = first.axis();
    if let Some(i) = members.iter().position(|m| m.axis() != axis) {
        return Err(InputError::invalid(
            format!("members.{i}"),
            "all members must act along the same kind of coordinate (all linear or all rotary)",
        ));
    }
    Ok(axis)
}

fn member_notes(members: &[SpringModel]) -> Vec<String> {
    members
        .iter()
        .enumerate()
        .flat_map(|(i, m)| {
            m.notes()
                .into_iter()
                .map(move |n| format!("member {}: {n}", i + 1))
        })
        .collect()
}

/// The member stress with the highest ratio (or the highest stress when no
/// ratio is known), labelled with the member.
fn worst_stress(items: impl Iterator<Item = (usize, Option<StressAt>)>) -> Option<StressAt> {
    let mut best: Option<StressAt> = None;
    for (i, st) in items {
        let Some(mut st) = st else { continue };
        st.method = format!("member {}: {}", i + 1, st.method);
        let better = match &best {
            None => true,
            Some(b) => match (st.ratio, b.ratio) {
                (Some(x), Some(y)) => x > y,
                (Some(_), None) => true,
                (None, Some(_)) => false,
                (None, None) => st.stress > b.stress,
            },
        };
        if better {
            best = Some(st);
        }
    }
    best
}

/// Springs sharing one deflection; forces add.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Parallel {
    members: Vec<SpringModel>,
    axis: Axis,
    range: (f64, f64),
}

impl Parallel {
    /// Combine members; their admissible ranges must overlap.
    ///
    /// # Errors
    /// No members; mixed axes; ranges that do not overlap; more than
    /// [`MAX_COMBINED_SPRINGS`] springs in all.
    pub fn new(members: Vec<SpringModel>) -> Result<Self, InputError> {
        // A parallel group inside a parallel group is the same law.
        let members: Vec<SpringModel> = members
            .into_iter()
            .flat_map(|m| match m {
                SpringModel::Parallel(p) => p.members,
                other => vec![other],
            })
            .collect();
        check_count(&members)?;
        let axis = common_axis(&members)?;
        let range = members
            .iter()
            .fold((f64::NEG_INFINITY, f64::INFINITY), |r, m| {
                let (lo, hi) = m.deflection_range();
                (r.0.max(lo), r.1.min(hi))
            });
        if range.0 >= range.1 {
            return Err(InputError::invalid(
                "members",
                "the members' admissible deflections do not overlap",
            ));
        }
        Ok(Self {
            members,
            axis,
            range,
        })
    }

    /// The members.
    pub fn members(&self) -> &[SpringModel] {
        &self.members
    }
}

impl Spring for Parallel {
    fn axis(&self) -> Axis {
        self.axis
    }
    /// F = Σ F_i(q).
    fn force(&self, q: f64, travel: Travel) -> f64 {
        self.members.iter().map(|m| m.force(q, travel)).sum()
    }
    /// W = Σ W_i.
    fn work(&self, q1: f64, q2: f64, travel: Travel) -> f64 {
        self.members.iter().map(|m| m.work(q1, q2, travel)).sum()
    }
    fn deflection_range(&self) -> (f64, f64) {
        self.range
    }
    fn effective_mass(&self) -> f64 {
        self.members.iter().map(Spring::effective_mass).sum()
    }
    fn rate(&self, q: f64) -> f64 {
        self.members.iter().map(|m| m.rate(q)).sum()
    }
    fn force_law(&self) -> ForceLaw {
        ForceLaw {
            model: format!("{} springs in parallel", self.members.len()),
            formula: "F = Σ F_i(q); W = Σ W_i".into(),
            source: "statics of springs in parallel".into(),
            status: SourceStatus::CommonPractice,
        }
    }
    fn stress(&self, q: f64) -> Option<StressAt> {
        worst_stress(
            self.members
                .iter()
                .enumerate()
                .map(|(i, m)| (i, m.stress(q))),
        )
    }
    fn notes(&self) -> Vec<String> {
        member_notes(&self.members)
    }
}

/// How a series stack shares a deflection.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct SeriesSplit {
    /// Shared force (N or N·m).
    pub force: f64,
    /// Each member's deflection, in member order.
    pub deflections: Vec<f64>,
}

/// Springs carrying one force; deflections add.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Series {
    members: Vec<SpringModel>,
    axis: Axis,
    range: (f64, f64),
}

/// Points per member used to verify a rising characteristic.
const MONOTONE_SAMPLES: u32 = 128;

impl Series {
    /// Combine members, listed from the fixed end to the moving end.
    ///
    /// # Errors
    /// No members; mixed axes; a member whose force falls with deflection on
    /// either branch (the split would not be unique); more than
    /// [`MAX_COMBINED_SPRINGS`] springs in all; a member that holds a series
    /// stack inside a parallel group.
    pub fn new(members: Vec<SpringModel>) -> Result<Self, InputError> {
        // A series stack inside a series stack is the same law, its members
        // listed in place (the order from the fixed end is kept).
        let members: Vec<SpringModel> = members
            .into_iter()
            .flat_map(|m| match m {
                SpringModel::Series(s) => s.members,
                other => vec![other],
            })
            .collect();
        check_count(&members)?;
        if let Some(i) = members.iter().position(holds_series) {
            return Err(InputError::invalid(
                format!("members.{i}"),
                "a series stack cannot hold another series stack inside a parallel group \
                 (solving it would take minutes); give that group's measured \
                 force–deflection table instead",
            ));
        }
        let axis = common_axis(&members)?;
        for (i, m) in members.iter().enumerate() {
            let (lo, hi) = m.deflection_range();
            for travel in [Travel::Loading, Travel::Unloading] {
                let scale = m.force(lo, travel).abs().max(m.force(hi, travel).abs());
                let mut last = m.force(lo, travel);
                for j in 1..=MONOTONE_SAMPLES {
                    let q = lo + (hi - lo) * f64::from(j) / f64::from(MONOTONE_SAMPLES);
                    let f = m.force(q, travel);
                    if f < last - 1e-9 * scale {
                        return Err(InputError::invalid(
                            format!("members.{i}"),
                            format!(
                                "springs in series need a force that rises with deflection; this \
                                 member's force falls near {q:.6} (a snap-through disc or a falling \
                                 table), so the split between members is not unique"
                            ),
                        ));
                    }
                    last = f;
                }
            }
        }
        let range = members.iter().fold((0.0, 0.0), |r, m| {
            let (lo, hi) = m.deflection_range();
            (r.0 + lo, r.1 + hi)
        });
        Ok(Self {
            members,
            axis,
            range,
        })
    }

    /// The members.
    pub fn members(&self) -> &[SpringModel] {
        &self.members
    }

    fn member_deflection(m: &SpringModel, f: f64, travel: Travel) -> f64 {
        let (lo, hi) = m.deflection_range();
        boundary(|x| m.force(x, travel) - f, lo, hi)
    }

    fn total(&self, f: f64, travel: Travel) -> f64 {
        self.members
            .iter()
            .map(|m| Self::member_deflection(m, f, travel))
            .sum()
    }

    /// Shared force and each member's deflection at total deflection `q`,
    /// clamped to the admissible range.
    pub fn split(&self, q: f64, travel: Travel) -> SeriesSplit {
        let q = q.clamp(self.range.0, self.range.1);
        let f_lo = self
            .members
            .iter()
            .map(|m| m.force(m.deflection_range().0, travel))
            .fold(f64::INFINITY, f64::min);
        let f_hi = self
            .members
            .iter()
            .map(|m| m.force(m.deflection_range().1, travel))
            .fold(f64::NEG_INFINITY, f64::max);
        if q <= self.range.0 {
            return SeriesSplit {
                force: f_lo,
                deflections: self
                    .members
                    .iter()
                    .map(|m| m.deflection_range().0)
                    .collect(),
            };
        }
        if q >= self.range.1 {
            return SeriesSplit {
                force: f_hi,
                deflections: self
                    .members
                    .iter()
                    .map(|m| m.deflection_range().1)
                    .collect(),
            };
        }
        let f = boundary(|f| self.total(f, travel) - q, f_lo, f_hi);
        let mut qs: Vec<f64> = self
            .members
            .iter()
            .map(|m| Self::member_deflection(m, f, travel))
            .collect();
        // A member with a flat stretch at exactly this force takes the rest of
        // the travel; give the residual to members with room, in order.
        let mut residual = q - qs.iter().sum::<f64>();
        for (qi, m) in qs.iter_mut().zip(&self.members) {
            if residual.abs() <= 0.0 {
                break;
            }
            let (lo, hi) = m.deflection_range();
            let moved = (*qi + residual).clamp(lo, hi) - *qi;
            *qi += moved;
            residual -= moved;
        }
        SeriesSplit {
            force: f,
            deflections: qs,
        }
    }

    fn energy(&self, q: f64, travel: Travel) -> f64 {
        let (lo, hi) = self.range;
        let inside = |q: f64| -> f64 {
            let s = self.split(q, travel);
            self.members
                .iter()
                .zip(&s.deflections)
                .map(|(m, &qi)| m.work(m.deflection_range().0, qi, travel))
                .sum()
        };
        if q < lo {
            let u = q - lo;
            inside(lo) + self.force(lo, travel) * u + 0.5 * self.end_rate(lo, travel) * u * u
        } else if q > hi {
            let u = q - hi;
            inside(hi) + self.force(hi, travel) * u + 0.5 * self.end_rate(hi, travel) * u * u
        } else {
            inside(q)
        }
    }

    /// 1/Σ(1/k_i) at the members' deflections for total `q` (0 if a member
    /// has no stiffness there).
    fn end_rate(&self, q: f64, travel: Travel) -> f64 {
        let s = self.split(q, travel);
        let compliance: f64 = self
            .members
            .iter()
            .zip(&s.deflections)
            .map(|(m, &qi)| 1.0 / m.rate(qi))
            .sum();
        if compliance.is_finite() && compliance > 0.0 {
            1.0 / compliance
        } else {
            0.0
        }
    }
}

impl Spring for Series {
    fn axis(&self) -> Axis {
        self.axis
    }

    /// Shared force F with Σ q_i(F) = q (bisection); straight-line extension
    /// with the stack's end rate outside the range.
    fn force(&self, q: f64, travel: Travel) -> f64 {
        let (lo, hi) = self.range;
        if q < lo {
            self.split(lo, travel).force + self.end_rate(lo, travel) * (q - lo)
        } else if q > hi {
            self.split(hi, travel).force + self.end_rate(hi, travel) * (q - hi)
        } else {
            self.split(q, travel).force
        }
    }

    /// W = Σ_i W_i(lo_i → q_i(q₂)) − Σ_i W_i(lo_i → q_i(q₁)).
    fn work(&self, q1: f64, q2: f64, travel: Travel) -> f64 {
        self.energy(q2, travel) - self.energy(q1, travel)
    }

    fn deflection_range(&self) -> (f64, f64) {
        self.range
    }

    /// Σ m_i/3·(c_a² + c_a·c_b + c_b²), with c_a, c_b the fractions of the
    /// total travel at the member's fixed-side and moving-side ends, from the
    /// members' compliances at mid-range (Rayleigh's linear velocity profile
    /// applied per member; members listed from the fixed end).
    fn effective_mass(&self) -> f64 {
        let comp: Vec<f64> = self
            .members
            .iter()
            .map(|m| {
                let (lo, hi) = m.deflection_range();
                1.0 / m.rate(0.5 * (lo + hi))
            })
            .collect();
        let total: f64 = comp.iter().sum();
        let n = self.members.len() as f64;
        let usable =
            total.is_finite() && total > 0.0 && comp.iter().all(|c| c.is_finite() && *c >= 0.0);
        let mut c_a = 0.0;
        let mut sum = 0.0;
        for (m, c) in self.members.iter().zip(&comp) {
            let share = if usable { c / total } else { 1.0 / n };
            let c_b = c_a + share;
            sum += m.effective_mass() * (c_a * c_a + c_a * c_b + c_b * c_b);
            c_a = c_b;
        }
        sum
    }

    fn rate(&self, q: f64) -> f64 {
        self.end_rate(q, Travel::Loading)
    }

    fn force_law(&self) -> ForceLaw {
        ForceLaw {
            model: format!("{} springs in series", self.members.len()),
            formula: "shared force F with Σ q_i(F) = q (bracketed bisection); W = Σ W_i(q_i)"
                .into(),
            source: "statics of springs in series".into(),
            status: SourceStatus::CommonPractice,
        }
    }

    fn stress(&self, q: f64) -> Option<StressAt> {
        let s = self.split(q, Travel::Loading);
        worst_stress(
            self.members
                .iter()
                .zip(&s.deflections)
                .enumerate()
                .map(|(i, (m, &qi))| (i, m.stress(qi))),
        )
    }

    fn notes(&self) -> Vec<String> {
        member_notes(&self.members)
    }
}

#[cfg(test)]
mod tests {
    use super::super::extension::ExtensionRate;
    use super::super::gas::ForceReference;
    use super::super::testkit;
    use super::*;
    use proptest::prelude::*;

    /// Series results carry the bisection resolution, 2⁻⁶⁰ of the bracket,
    /// amplified by a few operations.
    const REL_SERIES: f64 = 1e-12;

    fn linear(k: f64, max: f64) -> SpringSpec {
        SpringSpec::Linear(LinearSpec {
            rate: k,
            free_length: None,
            max_deflection: Some(max),
            solid_length: None,
        })
    }

    #[test]
    fn two_identical_springs_in_series_halve_the_rate() {
        let s = SpringSpec::Series {
            members: vec![linear(1000.0, 0.05), linear(1000.0, 0.05)],
        }
        .build()
        .unwrap();
        assert!((s.force(0.04, Travel::Loading) - 20.0).abs() < REL_SERIES * 20.0);
        assert!((s.rate(0.04) - 500.0).abs() < REL_SERIES * 500.0);
        // W = ½·500·0.04² = 0.4 J.
        assert!((s.work(0.0, 0.04, Travel::Loading) - 0.4).abs() < REL_SERIES * 0.4);
        let p = SpringSpec::Parallel {
            members: vec![linear(1000.0, 0.05), linear(1000.0, 0.03)],
        }
        .build()
        .unwrap();
        assert!((p.force(0.02, Travel::Loading) - 40.0).abs() < REL_SERIES * 40.0);
        assert_eq!(p.deflection_range(), (0.0, 0.03));
    }

    #[test]
    fn a_member_at_solid_stays_there() {
        // Soft spring (100 N/m, 10 mm travel) in series with stiff (1000 N/m, 50 mm):
        // beyond 10 mm + F/1000 the soft one is solid and only the stiff one moves.
        let s = SpringSpec::Series {
            members: vec![linear(100.0, 0.01), linear(1000.0, 0.05)],
        }
        .build()
        .unwrap();
        let SpringModel::Series(ser) = &s else {
            panic!()
        };
        let split = ser.split(0.04, Travel::Loading);
        assert!((split.deflections[0] - 0.01).abs() < testkit::ABS_ROUNDING_M);
        assert!((split.force - 30.0).abs() < REL_SERIES * 30.0);
    }

    #[test]
    fn series_with_initial_tension_and_gas_step() {
        let ext = SpringSpec::Extension(ExtensionSpec {
            initial_tension: 50.0,
            rate: ExtensionRate::Given { rate: 2000.0 },
            max_deflection: 0.05,
            free_length: None,
        });
        let s = SpringSpec::Series {
            members: vec![ext, linear(1000.0, 0.1)],
        }
        .build()
        .unwrap();
        // Below 50 N only the linear spring moves: at 0.03 m, F = 30 N.
        assert!((s.force(0.03, Travel::Loading) - 30.0).abs() < REL_SERIES * 30.0);
        // At 0.06 m: 0.05 + x/… F = 1000·q2 and q1 = (F − 50)/2000 → F = 1000·(0.06 − q1)
        // → F = 60 − (F − 50)/2 → F = 56.667 N.
        assert!((s.force(0.06, Travel::Loading) - 170.0 / 3.0).abs() < REL_SERIES * 60.0);
        let gas = SpringSpec::Gas(GasSpec {
            nominal_force: 200.0,
            progression: 1.3,
            stroke: 0.05,
            friction_band: 20.0,
            force_reference: ForceReference::Extension,
            polytropic_index: None,
            moving_mass: None,
        });
        let g = SpringSpec::Series {
            members: vec![gas, linear(10_000.0, 0.1)],
        }
        .build()
        .unwrap();
        testkit::check_work_is_integral(&g, 0.0, 0.1, Travel::Loading);
        testkit::check_work_is_integral(&g, 0.0, 0.1, Travel::Unloading);
    }

    #[test]
    fn refusals() {
        let torsion = SpringSpec::Torsion(TorsionSpec {
            rate: super::super::torsion::TorsionRate::Given { rate: 1.0 },
            max_angle: 1.0,
        });
        let e = SpringSpec::Parallel {
            members: vec![linear(1.0, 0.1), torsion],
        }
        .build()
        .unwrap_err();
        assert_eq!(e.field, "members.1");
        let e = SpringSpec::Series { members: vec![] }.build().unwrap_err();
        assert_eq!(e.field, "members");
        let bad = SpringSpec::Series {
            members: vec![linear(-1.0, 0.1)],
        }
        .build()
        .unwrap_err();
        assert_eq!(bad.field, "members.0.rate");
        // A snap-through disc (h₀/t = 1.5) in series is refused.
        let disc = SpringSpec::Disc(DiscSpec {
            outer_diameter: 154.818e-3,
            inner_diameter: 88.47e-3,
            thickness: 2.65298e-3,
            cone_height: 3.97947e-3,
            youngs_modulus: 207e9,
            poisson_ratio: 0.3,
            in_series: 1,
            in_parallel: 1,
            constant: Default::default(),
            friction: None,
            density: None,
        });
        let e = SpringSpec::Series {
            members: vec![disc, linear(1e6, 0.1)],
        }
        .build()
        .unwrap_err();
        assert_eq!(e.field, "members.0");
    }

    /// From the structure-aware fuzz target, which wraps springs in
    /// combinations: a series pair already costs 60 × 60 member evaluations
    /// per force, and series inside parallel inside series nests the
    /// bisections four deep (tens of millions of evaluations per force,
    /// minutes per release). Nesting of one kind is flattened (the same
    /// law), the total is bounded, and series-in-parallel-in-series is
    /// refused.
    #[test]
    fn nested_combinations_are_flattened_bounded_or_refused() {
        let pair = || SpringSpec::Series {
            members: vec![linear(1000.0, 0.05), linear(1000.0, 0.05)],
        };
        let nested = SpringSpec::Series {
            members: vec![
                pair(),
                SpringSpec::Series {
                    members: vec![pair()],
                },
            ],
        }
        .build()
        .unwrap();
        let SpringModel::Series(flat) = &nested else {
            panic!("a series stays a series")
        };
        assert_eq!(flat.members().len(), 4);
        // Four 1000 N/m springs in series: 250 N/m.
        assert!((nested.rate(0.04) - 250.0).abs() < REL_SERIES * 250.0);
        let groups = SpringSpec::Parallel {
            members: vec![
                SpringSpec::Parallel {
                    members: vec![linear(1.0, 0.1), linear(2.0, 0.1)],
                },
                linear(3.0, 0.1),
            ],
        }
        .build()
        .unwrap();
        let SpringModel::Parallel(flat) = &groups else {
            panic!("a parallel group stays one")
        };
        assert_eq!(flat.members().len(), 3);
        let deep = SpringSpec::Series {
            members: vec![
                SpringSpec::Parallel {
                    members: vec![pair(), linear(1000.0, 0.1)],
                },
                linear(1000.0, 0.1),
            ],
        }
        .build()
        .unwrap_err();
        assert_eq!(deep.field, "members.0");
        let many = SpringSpec::Parallel {
            members: vec![linear(1.0, 0.1); MAX_COMBINED_SPRINGS + 1],
        }
        .build()
        .unwrap_err();
        assert_eq!(many.field, "members");
        assert!(many.message().contains("at most 16"), "{many}");
    }

    #[test]
    fn spec_round_trips_through_json() {
        let spec = SpringSpec::Series {
            members: vec![linear(1000.0, 0.05), linear(2000.0, 0.05)],
        };
        let text = serde_json::to_string(&spec).unwrap();
        let back: SpringSpec = serde_json::from_str(&text).unwrap();
        assert_eq!(spec, back);
        assert!(text.contains("\"model\":\"series\""));
    }

    #[test]
    fn deflection_from_installed_length() {
        let s = SpringSpec::Linear(LinearSpec {
            rate: 1000.0,
            free_length: Some(0.1),
            max_deflection: Some(0.05),
            solid_length: None,
        })
        .build()
        .unwrap();
        assert!((s.deflection_at_length(0.07).unwrap() - 0.03).abs() < testkit::ABS_ROUNDING_M);
        let t = SpringSpec::Torsion(TorsionSpec {
            rate: super::super::torsion::TorsionRate::Given { rate: 1.0 },
            max_angle: 1.0,
        })
        .build()
        .unwrap();
        assert!(t.deflection_at_length(0.1).is_err());
    }

    #[test]
    fn effective_mass_of_a_series_chain() {
        // Two equal springs, each with m/3 = 1 kg: the base member moves from
        // 0 to ½ (share (0 + 0 + ¼) = ¼), the outer from ½ to 1 (share ¼ + ½ + 1 = 7/4):
        // m_eff = 1·¼ + 1·7/4 = 2 kg (Rayleigh profile per member).
        let t = |m: f64| {
            SpringSpec::Table(TableSpec {
                axis: Axis::Linear,
                loading: vec![
                    super::super::table::TablePoint {
                        deflection: 0.0,
                        force: 0.0,
                    },
                    super::super::table::TablePoint {
                        deflection: 0.1,
                        force: 100.0,
                    },
                ],
                unloading: None,
                effective_mass: Some(m),
            })
        };
        let s = SpringSpec::Series {
            members: vec![t(1.0), t(1.0)],
        }
        .build()
        .unwrap();
        assert!((s.effective_mass() - 2.0).abs() < testkit::REL_FEW_OPS * 2.0);
    }

    proptest! {
        // Each case runs nested bisections inside an adaptive quadrature:
        // 64 cases keep the test under a few seconds.
        #![proptest_config(ProptestConfig::with_cases(64))]
        #[test]
        fn series_and_parallel_work_is_the_integral(k1 in 100.0..1e5f64, k2 in 100.0..1e5f64, f0 in 0.0..50.0f64, a in 0.0..1.0f64, b in 0.0..1.0f64) {
            let ext = SpringSpec::Extension(ExtensionSpec { initial_tension: f0, rate: ExtensionRate::Given { rate: k2 }, max_deflection: 0.05, free_length: None });
            let ser = SpringSpec::Series { members: vec![linear(k1, 0.05), ext.clone()] }.build().unwrap();
            let par = SpringSpec::Parallel { members: vec![linear(k1, 0.05), ext] }.build().unwrap();
            for s in [&ser, &par] {
                let (lo, hi) = s.deflection_range();
                let (qa, qb) = (lo + a * (hi - lo), lo + b * (hi - lo));
                testkit::check_work_is_integral(s, qa, qb, Travel::Loading);
                testkit::check_work_algebra(s, qa, qb, 0.5 * hi, Travel::Loading);
                testkit::check_energy_monotone(s, Travel::Loading);
            }
            // Linear members in series: k = k1·k2/(k1 + k2).
            let two = SpringSpec::Series { members: vec![linear(k1, 1.0), linear(k2, 1.0)] }.build().unwrap();
            let k = k1 * k2 / (k1 + k2);
            prop_assert!((two.force(0.3, Travel::Loading) - 0.3 * k).abs() <= REL_SERIES * 0.3 * k * 10.0);
        }
    }
}
