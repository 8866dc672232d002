//! Stored energy between named mechanism states: what a lockout procedure
//! and a release assessment need.
//!
//! A state is a name and a deflection of the spring (e.g. "latched",
//! "released against stop", "maintenance position"). For each state the
//! report gives the energy stored from free on the loading branch,
//! W_L(0 → q) = ∫₀^q F_load dq, and the energy it can give back relaxing to
//! free on the unloading branch, W_U(0 → q). Between any two states it gives
//! the energy released, ∫_{q_to}^{q_from} F_unload dq when the spring relaxes
//! (positive), or −∫_{q_from}^{q_to} F_load dq when it must be loaded
//! (negative). Springs with hysteresis (gas-spring friction, disc-stack
//! friction, a measured unloading curve) give back less than they took; the
//! release uses the unloading branch because that is the force that drives
//! the part. The residual energy is what the spring still holds when the
//! part rests on its stop: the energy released if the stop were removed and
//! the spring relaxed to free, W_U(0 → q_stop). Source: work–energy theorem
//! (mechanics), with each model's force law.

use super::{Axis, ForceLaw, Spring, StressAt, StressKind, Travel};
use crate::error::{check, InputError};
use crate::figure::{ids, Figure};
use crate::units::{tag, Dim};
use serde::{Deserialize, Serialize};

/// What a state means to the assessment.
#[derive(Debug, Clone, Copy, Default, PartialEq, Eq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
#[serde(rename_all = "snake_case")]
pub enum StateRole {
    /// The loaded, held state before release (at most one).
    Latched,
    /// The part at rest against its stop after release (at most one).
    Released,
    /// Any other state of interest (maintenance position, mid-travel).
    #[default]
    Other,
}

/// A named mechanism state.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
pub struct State {
    /// Name for people, unique within the list.
    pub name: String,
    /// Spring deflection from free in this state (m or rad).
    pub deflection: f64,
    /// Role of the state; default `other`.
    #[serde(default)]
    pub role: StateRole,
}

/// Energy and force of the spring in one state.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct StateEnergy {
    /// State name.
    pub name: String,
    /// Role.
    pub role: StateRole,
    /// Deflection (m or rad).
    pub deflection: f64,
    /// Force on the loading branch (N or N·m).
    pub force_loading: f64,
    /// Force on the unloading branch (N or N·m).
    pub force_unloading: f64,
    /// Energy stored from free on the loading branch (J).
    pub stored: f64,
    /// Energy given back relaxing from this state to free (unloading branch), J.
    pub releasable: f64,
}

/// Energy released going from one state to another.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Transition {
    /// Starting state.
    pub from: String,
    /// End state.
    pub to: String,
    /// Energy the spring gives up (J); negative when it has to be loaded.
    pub released: f64,
}

/// The energy picture of a spring across the mechanism's states.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct StatesReport {
    /// Linear or rotary.
    pub axis: Axis,
    /// One entry per state, in the order given.
    pub states: Vec<StateEnergy>,
    /// Every ordered pair of distinct states.
    pub transitions: Vec<Transition>,
    /// Index of the latched state.
    pub latched: Option<usize>,
    /// Index of the released (on-stop) state.
    pub released: Option<usize>,
    /// Local rate at the latched state (N/m or N·m/rad).
    pub rate_latched: Option<f64>,
    /// Wire stress at the latched state, for models that know it.
    pub stress_latched: Option<StressAt>,
    /// The spring's force law and source.
    pub law: ForceLaw,
    /// The spring's notes (worrying but valid facts).
    pub notes: Vec<String>,
}

/// Energy released from deflection `from` to deflection `to` (J): unloading
/// branch when the spring relaxes, minus the loading work when it is loaded.
pub fn released_between(spring: &dyn Spring, from: f64, to: f64) -> f64 {
    if to <= from {
        spring.work(to, from, Travel::Unloading)
    } else {
        -spring.work(from, to, Travel::Loading)
    }
}

/// Analyse the states of a spring.
///
/// # Errors
/// No states; an empty or repeated name; a deflection outside the spring's
/// range (`states.i.deflection`); more than one latched or released state; a
/// spring whose admissible range does not include the free state (0).
pub fn analyse(spring: &dyn Spring, states: &[State]) -> Result<StatesReport, InputError> {
    if states.is_empty() {
        return Err(InputError::invalid("states", "give at least one state"));
    }
    let (lo, _) = spring.deflection_range();
    if lo > 1e-12 {
        return Err(InputError::invalid(
            "states",
            "the spring's data do not reach the free state (deflection 0), so the stored energy \
             cannot be given: extend the table to zero deflection",
        ));
    }
    let mut latched = None;
    let mut released = None;
    for (i, s) in states.iter().enumerate() {
        if s.name.trim().is_empty() {
            return Err(InputError::invalid(
                format!("states.{i}.name"),
                "give the state a name",
            ));
        }
        if states.iter().take(i).any(|o| o.name == s.name) {
            return Err(InputError::invalid(
                format!("states.{i}.name"),
                "names must be unique: another state has this name",
            ));
        }
        let field = format!("states.{i}.deflection");
        check::finite(&field, s.deflection)?;
        spring.check_deflection(&field, s.deflection)?;
        let slot = match s.role {
            StateRole::Latched => Some(&mut latched),
            StateRole::Released => Some(&mut released),
            StateRole::Other => None,
        };
        if let Some(slot) = slot {
            if slot.is_some() {
                return Err(InputError::invalid(
                    format!("states.{i}.role"),
                    "only one state may be latched and one released",
                ));
            }
            *slot = Some(i);
        }
    }
    let energies: Vec<StateEnergy> = states
        .iter()
        .map(|s| StateEnergy {
            name: s.name.clone(),
            role: s.role,
            deflection: s.deflection,
            force_loading: spring.force(s.deflection, Travel::Loading),
            force_unloading: spring.force(s.deflection, Travel::Unloading),
            stored: spring.work(0.0, s.deflection, Travel::Loading),
            releasable: spring.work(0.0, s.deflection, Travel::Unloading),
        })
        .collect();
    let mut transitions = Vec::new();
    for a in states {
        for b in states {
            if a.name != b.name {
                transitions.push(Transition {
                    from: a.name.clone(),
                    to: b.name.clone(),
                    released: released_between(spring, a.deflection, b.deflection),
                });
            }
        }
    }
    let q_latched = latched.and_then(|i| states.get(i)).map(|s| s.deflection);
    Ok(StatesReport {
        axis: spring.axis(),
        states: energies,
        transitions,
        latched,
        released,
        rate_latched: q_latched.map(|q| spring.rate(q)),
        stress_latched: q_latched.and_then(|q| spring.stress(q)),
        law: spring.force_law(),
        notes: spring.notes(),
    })
}

impl StatesReport {
    /// Energy released from state `from` to state `to` (J), by name.
    pub fn released(&self, from: &str, to: &str) -> Option<f64> {
        self.transitions
            .iter()
            .find(|t| t.from == from && t.to == to)
            .map(|t| t.released)
    }

    fn source(&self) -> String {
        if self.law.source.is_empty() {
            self.law.status.describe().to_string()
        } else {
            format!("{} ({})", self.law.source, self.law.status.describe())
        }
    }

    /// The value of figure `id` as [`StatesReport::figures`] reports it, in
    /// SI: `None` when that figure is missing (a state not marked, a
    /// non-finite result) or is not one of these figures. The one place that
    /// maps the figure ids to numbers: [`StatesReport::figures`] takes its
    /// values from here, and the tolerance study reads them without building
    /// the figures.
    pub fn figure_value(&self, id: &str) -> Option<f64> {
        let latched = self.latched.and_then(|i| self.states.get(i));
        let released = self.released.and_then(|i| self.states.get(i));
        match id {
            ids::ENERGY_STORED_LATCHED => latched.map(|s| s.stored),
            ids::ENERGY_RELEASED => latched
                .zip(released)
                .map(|(l, r)| released_value(l, r, &self.transitions)),
            ids::ENERGY_RESIDUAL => released.map(|r| r.releasable),
            ids::SPRING_FORCE_LATCHED => latched.map(|s| s.force_loading),
            ids::SPRING_FORCE_RELEASED => released.map(|s| s.force_unloading),
            ids::SPRING_RATE => self.rate_latched,
            ids::SPRING_SHEAR_STRESS => self
                .stress_latched
                .as_ref()
                .filter(|st| st.kind == StressKind::Shear)
                .map(|st| st.stress),
            ids::SPRING_STRESS_RATIO => self.stress_latched.as_ref().and_then(|st| st.ratio),
            _ => None,
        }
        .filter(|v| v.is_finite())
    }

    /// [`StatesReport::figure_value`], NaN when missing (which
    /// [`Figure::new`] records as missing).
    fn value_or_nan(&self, id: &str) -> f64 {
        self.figure_value(id).unwrap_or(f64::NAN)
    }

    /// The assessment figures: stored, released and residual energy, forces
    /// in the latched and released states, rate and stress at the latched
    /// state. Figures that need a latched or released state which was not
    /// marked are returned as missing with the reason.
    pub fn figures(&self) -> Vec<Figure> {
        let (force_dim, rate_dim) = match self.axis {
            Axis::Linear => (Dim::Force, Dim::LinearRate),
            Axis::Rotary => (Dim::Torque, Dim::TorsionalRate),
        };
        let source = self.source();
        let need = |role: &str| vec![format!("mark one state as {role}")];
        let latched = self.latched.and_then(|i| self.states.get(i));
        let released = self.released.and_then(|i| self.states.get(i));
        let mut out = Vec::new();
        let law = &self.law.formula;
        let from_free = "energy counted from the free state (deflection 0)";
        out.push(match latched {
            Some(_) => Figure::new(
                ids::ENERGY_STORED_LATCHED,
                "Energy stored when latched",
                Dim::Energy,
                self.value_or_nan(ids::ENERGY_STORED_LATCHED),
            )
            .method(&format!("W = ∫₀^q F_load dq; {law}"))
            .source(&source)
            .assume(from_free)
            .assume("loading branch (the work put in to reach the latch)"),
            None => Figure::missing(
                ids::ENERGY_STORED_LATCHED,
                "Energy stored when latched",
                Dim::Energy,
                need("latched"),
            ),
        });
        out.push(match (latched, released) {
            (Some(_), Some(_)) => Figure::new(
                ids::ENERGY_RELEASED,
                "Energy released from latch to stop",
                Dim::Energy,
                self.value_or_nan(ids::ENERGY_RELEASED),
            )
            .method(&format!("W = ∫_q_stop^q_latch F_unload dq; {law}"))
            .source(&source)
            .assume("unloading branch: friction and hysteresis losses are not passed to the part"),
            _ => Figure::missing(
                ids::ENERGY_RELEASED,
                "Energy released from latch to stop",
                Dim::Energy,
                need("latched and one as released"),
            ),
        });
        out.push(match released {
            Some(r) => Figure::new(ids::ENERGY_RESIDUAL, "Residual energy on the stop", Dim::Energy, self.value_or_nan(ids::ENERGY_RESIDUAL))
                .method(&format!("W = ∫₀^q_stop F_unload dq; {law}"))
                .source(&source)
                .assume("energy given back if the stop were removed and the spring relaxed to free: block or release it before work")
                .assume(&format!(
                    "loading branch to reach the same deflection: {}",
                    tag(r.stored, Dim::Energy)
                )),
            None => Figure::missing(ids::ENERGY_RESIDUAL, "Residual energy on the stop", Dim::Energy, need("released (part on its stop)")),
        });
        out.push(match latched {
            Some(s) => Figure::new(
                ids::SPRING_FORCE_LATCHED,
                "Spring force when latched",
                force_dim,
                self.value_or_nan(ids::SPRING_FORCE_LATCHED),
            )
            .method(law)
            .source(&source)
            .assume("loading branch: the largest force the latch must hold")
            .assume(&format!(
                "unloading branch (force driving the release): {}",
                tag(s.force_unloading, force_dim)
            )),
            None => Figure::missing(
                ids::SPRING_FORCE_LATCHED,
                "Spring force when latched",
                force_dim,
                need("latched"),
            ),
        });
        out.push(match released {
            Some(s) => Figure::new(
                ids::SPRING_FORCE_RELEASED,
                "Spring force on the stop",
                force_dim,
                self.value_or_nan(ids::SPRING_FORCE_RELEASED),
            )
            .method(law)
            .source(&source)
            .assume("unloading branch: the force with which the part arrives and rests on the stop")
            .assume(&format!(
                "loading branch value: {}",
                tag(s.force_loading, force_dim)
            )),
            None => Figure::missing(
                ids::SPRING_FORCE_RELEASED,
                "Spring force on the stop",
                force_dim,
                need("released (part on its stop)"),
            ),
        });
        out.push(match self.rate_latched {
            Some(_) => Figure::new(
                ids::SPRING_RATE,
                "Spring rate at the latch",
                rate_dim,
                self.value_or_nan(ids::SPRING_RATE),
            )
            .method("k = dF/dq on the loading branch")
            .source(&source),
            None => Figure::missing(
                ids::SPRING_RATE,
                "Spring rate at the latch",
                rate_dim,
                need("latched"),
            ),
        });
        if let Some(st) = &self.stress_latched {
            if st.kind == StressKind::Shear {
                let mut f = Figure::new(
                    ids::SPRING_SHEAR_STRESS,
                    "Corrected shear stress when latched",
                    Dim::Pressure,
                    self.value_or_nan(ids::SPRING_SHEAR_STRESS),
                )
                .method(&st.method)
                .source(&st.source);
                for n in &st.notes {
                    f = f.assume(n);
                }
                out.push(f);
            }
            let label = match st.kind {
                StressKind::Shear => "Shear stress / permissible when latched",
                StressKind::Bending => "Bending stress / permissible when latched",
            };
            out.push(match st.ratio {
                Some(_) => Figure::new(
                    ids::SPRING_STRESS_RATIO,
                    label,
                    Dim::Ratio,
                    self.value_or_nan(ids::SPRING_STRESS_RATIO),
                )
                .method(&st.method)
                .source(&st.source),
                None => Figure::missing(
                    ids::SPRING_STRESS_RATIO,
                    label,
                    Dim::Ratio,
                    st.notes.clone(),
                )
                .method(&st.method)
                .source(&st.source),
            });
        }
        out
    }
}

fn released_value(l: &StateEnergy, r: &StateEnergy, transitions: &[Transition]) -> f64 {
    transitions
        .iter()
        .find(|t| t.from == l.name && t.to == r.name)
        .map_or(f64::NAN, |t| t.released)
}

#[cfg(test)]
mod tests {
    use super::super::gas::{ForceReference, GasSpec, GasSpring};
    use super::super::helical::{CoilDiameter, EndType, HelicalSpec, HelicalSpring, Seating};
    use super::super::material::Material;
    use super::super::testkit::REL_FEW_OPS;
    use super::super::torsion::{TorsionRate, TorsionSpec, TorsionSpring};
    use super::super::{LinearSpec, LinearSpring};
    use super::*;
    use crate::test_tol::REL_EXACT;

    fn st(name: &str, q: f64, role: StateRole) -> State {
        State {
            name: name.into(),
            deflection: q,
            role,
        }
    }

    fn linear() -> LinearSpring {
        LinearSpring::new(LinearSpec {
            rate: 41_203.0,
            free_length: None,
            max_deflection: Some(0.04),
            solid_length: None,
        })
        .unwrap()
    }

    fn value(figs: &[Figure], id: &str) -> Option<f64> {
        figs.iter().find(|f| f.id == id).and_then(|f| f.value)
    }

    #[test]
    fn t10_latched_released_residual() {
        // reference-values.md T10 (status D): k = 41.203 N/mm, preload 10 mm →
        // compressed 30 mm: released energy ½·k·(30² − 10²) mm² = 16.481 J.
        const REL_T10: f64 = 1e-3; // T10 tolerance
        let r = analyse(
            &linear(),
            &[
                st("latched", 0.030, StateRole::Latched),
                st("on stop", 0.010, StateRole::Released),
                st("maintenance", 0.020, StateRole::Other),
            ],
        )
        .unwrap();
        let figs = r.figures();
        assert!((value(&figs, ids::ENERGY_RELEASED).unwrap() / 16.481 - 1.0).abs() < REL_T10);
        // Residual on the stop: ½·k·0.01² = 2.06015 J; stored latched ½·k·0.03² = 18.54135 J.
        assert!(
            (value(&figs, ids::ENERGY_RESIDUAL).unwrap() - 0.5 * 41_203.0 * 1e-4).abs()
                < REL_EXACT * 3.0
        );
        assert!(
            (value(&figs, ids::ENERGY_STORED_LATCHED).unwrap() - 0.5 * 41_203.0 * 9e-4).abs()
                < REL_EXACT * 20.0
        );
        assert!(
            (value(&figs, ids::SPRING_FORCE_RELEASED).unwrap() - 412.03).abs() < REL_EXACT * 500.0
        );
        assert_eq!(value(&figs, ids::SPRING_RATE), Some(41_203.0));
        // Loading from the stop into the maintenance position costs energy.
        assert!(r.released("on stop", "maintenance").unwrap() < 0.0);
        assert_eq!(r.transitions.len(), 6);
        assert!(figs
            .iter()
            .all(|f| f.value.is_none() || !f.source.is_empty()));
    }

    #[test]
    fn hysteresis_makes_release_smaller_than_storage() {
        let g = GasSpring::new(GasSpec {
            nominal_force: 300.0,
            progression: 1.3,
            stroke: 0.1,
            friction_band: 40.0,
            force_reference: ForceReference::Extension,
            polytropic_index: None,
            moving_mass: None,
        })
        .unwrap();
        let r = analyse(
            &g,
            &[
                st("latched", 0.1, StateRole::Latched),
                st("stop", 0.0, StateRole::Released),
            ],
        )
        .unwrap();
        let l = &r.states[0];
        assert!(l.releasable < l.stored);
        // Loss over the full stroke = band × stroke = 4 J.
        assert!((l.stored - l.releasable - 4.0).abs() < REL_FEW_OPS * l.stored);
        assert!(
            (r.released("latched", "stop").unwrap() - l.releasable).abs()
                < REL_EXACT * l.releasable
        );
        assert!(r.notes.iter().any(|n| n.contains("charged")));
    }

    #[test]
    fn missing_roles_give_missing_figures_not_errors() {
        let r = analyse(&linear(), &[st("a", 0.01, StateRole::Other)]).unwrap();
        let figs = r.figures();
        let f = figs.iter().find(|f| f.id == ids::ENERGY_RESIDUAL).unwrap();
        assert!(f.value.is_none() && !f.missing.is_empty());
    }

    #[test]
    fn refusals_name_the_state() {
        let e = analyse(&linear(), &[st("a", 0.05, StateRole::Latched)]).unwrap_err();
        assert_eq!(e.field, "states.0.deflection");
        let e = analyse(
            &linear(),
            &[
                st("a", 0.01, StateRole::Latched),
                st("a", 0.02, StateRole::Other),
            ],
        )
        .unwrap_err();
        assert_eq!(e.field, "states.1.name");
        let e = analyse(
            &linear(),
            &[
                st("a", 0.01, StateRole::Latched),
                st("b", 0.02, StateRole::Latched),
            ],
        )
        .unwrap_err();
        assert_eq!(e.field, "states.1.role");
        assert!(analyse(&linear(), &[]).is_err());
    }

    #[test]
    fn helical_latched_state_carries_stress_figures() {
        let h = HelicalSpring::new(HelicalSpec {
            wire_diameter: 2.5e-3,
            coil_diameter: CoilDiameter::Outside(31e-3),
            active_coils: 13.0,
            total_coils: Some(14.0),
            ends: EndType::OpenGround,
            free_length: 0.1,
            material: Material::Grade {
                grade: super::super::material::Grade::MusicWireA228,
            },
            solid_length: None,
            tensile_strength: None,
            permissible_stress_fraction: None,
            seating: Seating::BothFixed,
        })
        .unwrap();
        let r = analyse(&h, &[st("latched", 0.05, StateRole::Latched)]).unwrap();
        let figs = r.figures();
        assert!(value(&figs, ids::SPRING_SHEAR_STRESS).is_some());
        assert!(value(&figs, ids::SPRING_STRESS_RATIO).is_some());
    }

    #[test]
    fn torsion_figures_use_rotary_dimensions() {
        let t = TorsionSpring::new(TorsionSpec {
            rate: TorsionRate::Given { rate: 2.0 },
            max_angle: 3.0,
        })
        .unwrap();
        let r = analyse(
            &t,
            &[
                st("closed", 0.5, StateRole::Released),
                st("open", 2.0, StateRole::Latched),
            ],
        )
        .unwrap();
        let figs = r.figures();
        // reference-values.md T12 (status D): 3.75 J from 2.0 to 0.5 rad at 2 N·m/rad.
        assert!((value(&figs, ids::ENERGY_RELEASED).unwrap() - 3.75).abs() < REL_EXACT * 4.0);
        let f = figs
            .iter()
            .find(|f| f.id == ids::SPRING_FORCE_LATCHED)
            .unwrap();
        assert_eq!(f.dim, Dim::Torque);
    }
}
