//! Contact between the moving part and a human body region: the two-body
//! model of ISO/TS 15066:2016 Annex A (transient contact) and the static
//! force balance of quasi-static clamping.
//!
//! Transient contact: the body region is a linear spring of stiffness `k`
//! carrying the region's effective mass `m_H`; the moving part presents its
//! effective mass `m_R` at the hazard point (from the mechanism: `m`, or
//! `I/r²` for a rotating part). During the contact the two masses exchange
//! momentum through the spring, so the relative motion is that of the reduced
//! mass `μ = (1/m_H + 1/m_R)⁻¹` on the spring `k`:
//! peak force `F = v·√(μ·k)`, energy transferred `E = ½·μ·v² = F²/(2k)`, and
//! the highest relative speed a force limit allows `v = F_max/√(μ·k)` (or a
//! pressure limit `v = p_max·A/√(μ·k)`, the lower of the two governing).
//! Source: ISO/TS 15066:2016 Annex A, as transcribed by secondary sources
//! (status R2 in the project's reference table; the standard's content now
//! sits in ISO 10218-2:2025). Padding between part and body is a second
//! spring in series, `k_eff = 1/(1/k_body + 1/k_pad)`; a pad of given
//! thickness that is squeezed flat is followed by the body alone.
//!
//! Quasi-static clamping: a driven part that comes to rest pressing on a body
//! part presses with the static balance of the forces along its motion
//! (spring + drive + gravity − holding friction), reduced, if the caller gives
//! the mechanism spring's rate, by the spring's relaxation while the body
//! yields (Newton's first law; common practice).
//!
//! Contact pressure is the force over a contact area from a shape. For a
//! rigid edge this is an estimate: the real area grows as tissue conforms, and
//! the standard's pressure limits were measured with a 1.4 cm × 1.4 cm flat
//! probe (ISO/TS 15066 Table A.2 footnote a, R2).
//!
//! Not modelled here: the limit tables themselves (see `crate::limits`; this
//! module takes a region's stiffness, mass and limits as inputs) and the
//! standard's robot effective mass `M/2 + m_L` (the caller passes `m_R`).

use crate::error::{check, InputError};
use crate::figure::{ids, Figure, Provenance, SourceStatus};
use crate::units::tag;
use crate::units::Dim;
use serde::{Deserialize, Serialize};

/// Provenance of the two-body transient model.
fn iso_ts_15066() -> Provenance {
    Provenance::new(
        "ISO/TS 15066:2016",
        "Annex A, transient contact (two-body model)",
        SourceStatus::Secondary,
    )
}

/// Provenance of the static force balance.
fn static_balance() -> Provenance {
    Provenance::new(
        "Static force balance (Newton's first law)",
        "",
        SourceStatus::CommonPractice,
    )
}

/// A body region as the two-body model sees it.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct BodyRegion {
    /// Name for people, e.g. `Hands and fingers`.
    pub label: String,
    /// Effective mass of the region `m_H`, kg (ISO/TS 15066 Table A.3).
    pub mass: f64,
    /// Effective spring constant of the region `k`, N/m (ISO/TS 15066
    /// Table A.3 lists it in N/mm: multiply by 1000).
    pub stiffness: f64,
}

impl BodyRegion {
    /// A validated region: `mass` and `stiffness` finite and positive.
    ///
    /// # Errors
    /// `mass` or `stiffness` not finite and positive.
    pub fn new(label: &str, mass: f64, stiffness: f64) -> Result<Self, InputError> {
        let r = Self {
            label: label.into(),
            mass,
            stiffness,
        };
        r.validate()?;
        Ok(r)
    }

    /// Check the fields (for a region built from its public fields).
    ///
    /// # Errors
    /// `mass` or `stiffness` not finite and positive.
    pub fn validate(&self) -> Result<(), InputError> {
        check::positive("mass", self.mass)?;
        check::positive("stiffness", self.stiffness)?;
        Ok(())
    }
}

/// The contact area between the part and the body, from the shape of the
/// part where it touches. ISO/TS 15066 Annex A uses the smaller of the part's
/// and the body's contact areas: pass that one.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[serde(tag = "shape", rename_all = "snake_case")]
pub enum ContactArea {
    /// An edge of `length` (m) touching over an effective `width` (m):
    /// `A = length × width`. A sharp edge still has a width (its flat land or
    /// twice its radius); the pressure it gives is an estimate.
    Edge {
        /// Length of edge in contact, m.
        length: f64,
        /// Effective width of the contact strip, m.
        width: f64,
    },
    /// A round face of `diameter` (m): `A = π·d²/4`.
    Circle {
        /// Diameter of the contact face, m.
        diameter: f64,
    },
    /// An area given directly, m².
    Given {
        /// Contact area, m².
        area: f64,
    },
}

impl ContactArea {
    /// The area in m², validated (every dimension finite and positive).
    ///
    /// # Errors
    /// A dimension not finite and positive, named by its field.
    pub fn area(&self) -> Result<f64, InputError> {
        match *self {
            // Dimensions of extreme size can overflow or underflow the
            // product even when each is positive: the area must be usable.
            ContactArea::Edge { length, width } => {
                let a = check::positive("length", length)? * check::positive("width", width)?;
                check::derived("width", a, "a contact area length × width")
            }
            ContactArea::Circle { diameter } => {
                let d = check::positive("diameter", diameter)?;
                check::derived(
                    "diameter",
                    std::f64::consts::PI * d * d / 4.0,
                    "a contact area π·d²/4",
                )
            }
            ContactArea::Given { area } => check::positive("area", area),
        }
    }

    /// The formula in words, for a figure's method.
    pub fn formula(&self) -> &'static str {
        match self {
            ContactArea::Edge { .. } => "A = edge length × contact width",
            ContactArea::Circle { .. } => "A = π·d²/4",
            ContactArea::Given { .. } => "A given",
        }
    }

    /// Whether the pressure over this area is a rigid-edge estimate.
    fn is_edge(&self) -> bool {
        matches!(self, ContactArea::Edge { .. })
    }
}

/// Padding between the part and the body: a spring in series with the body.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct Padding {
    /// Compressive stiffness of the pad over the contact area, N/m.
    pub stiffness: f64,
    /// Thickness the pad can yield before it is squeezed flat, m; `None`
    /// when the pad is taken never to bottom.
    pub thickness: Option<f64>,
}

impl Padding {
    fn validate(&self) -> Result<(), InputError> {
        check::positive("stiffness", self.stiffness)?;
        if let Some(t) = self.thickness {
            check::positive("thickness", t)?;
        }
        Ok(())
    }
}

/// The series spring formed by the body region and an optional pad, with the
/// pad's bottoming. Force–compression law: `F = k_eff·δ` while the pad is
/// not flat (`F ≤ k_pad·t`), then the body alone adds `ΔF = k_body·Δδ`.
#[derive(Debug, Clone, Copy, PartialEq)]
struct SeriesSpring {
    body: f64,
    pad: Option<f64>,
    /// Force at which the pad is squeezed flat, N (`k_pad·t`); `None` if the
    /// pad never bottoms or there is no pad.
    pad_flat_force: Option<f64>,
}

impl SeriesSpring {
    fn new(body: f64, padding: Option<&Padding>) -> Self {
        Self {
            body,
            pad: padding.map(|p| p.stiffness),
            pad_flat_force: padding.and_then(|p| p.thickness.map(|t| p.stiffness * t)),
        }
    }

    /// `k_eff = 1/(1/k_body + 1/k_pad)` (springs in series).
    fn effective(&self) -> f64 {
        match self.pad {
            // 1/(1/k_b + 1/k_p): the same value as k_b·k_p/(k_b + k_p)
            // without ∞/∞ for stiffnesses of extreme size.
            Some(kp) => 1.0 / (1.0 / self.body + 1.0 / kp),
            None => self.body,
        }
    }

    /// Energy stored when the force reaches `f`, J.
    fn energy_at_force(&self, f: f64) -> f64 {
        let ke = self.effective();
        match self.pad_flat_force {
            Some(fb) if f > fb => fb * fb / (2.0 * ke) + (f * f - fb * fb) / (2.0 * self.body),
            _ => 0.5 * f * (f / ke),
        }
    }

    /// Force when the stored energy is `e` (inverse of `energy_at_force`).
    fn force_at_energy(&self, e: f64) -> f64 {
        let ke = self.effective();
        match self.pad_flat_force {
            Some(fb) if e > fb * fb / (2.0 * ke) => {
                (fb * fb + self.body * (2.0 * e - fb * fb / ke)).sqrt()
            }
            // √(2·e)·√k rather than √(2·k·e): no ∞·0 for a stiffness of
            // extreme size meeting an energy that underflowed.
            _ => (2.0 * e).sqrt() * ke.sqrt(),
        }
    }

    /// Compression of the pad (m) under force `f`.
    fn pad_compression(&self, f: f64) -> f64 {
        match (self.pad, self.pad_flat_force) {
            (Some(kp), Some(fb)) => f.min(fb) / kp,
            (Some(kp), None) => f / kp,
            _ => 0.0,
        }
    }

    /// Whether the pad is flat under force `f`.
    fn pad_flat(&self, f: f64) -> bool {
        matches!(self.pad_flat_force, Some(fb) if f > fb)
    }
}

/// What the limits layer says about transient contact with a region.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum TransientLimits {
    /// Transient contact is permissible up to these values (the transient
    /// values, i.e. twice the quasi-static ones of Table A.2 per its
    /// footnote c). Either may be absent.
    Permissible {
        /// Highest transient force, N.
        max_force: Option<f64>,
        /// Highest transient pressure, Pa.
        max_pressure: Option<f64>,
    },
    /// Transient contact with this region is not permissible at any speed
    /// (skull, forehead and face: ISO/TS 15066 A.3.2).
    NotPermissible {
        /// The clause that says so, for the report.
        clause: String,
    },
}

impl TransientLimits {
    fn validate(&self) -> Result<(), InputError> {
        if let TransientLimits::Permissible {
            max_force,
            max_pressure,
        } = self
        {
            if let Some(f) = max_force {
                check::positive("max_force", *f)?;
            }
            if let Some(p) = max_pressure {
                check::positive("max_pressure", *p)?;
            }
        }
        Ok(())
    }
}

/// Inputs of a transient (free, unconstrained) contact between the moving
/// part and a body region.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct TransientContact {
    /// Effective mass of the moving part at the hazard point `m_R`, kg
    /// (`m` for a translating part, `I/r²` for a rotating one).
    pub part_mass: f64,
    /// Relative speed at the start of contact, m/s (zero or more).
    pub relative_speed: f64,
    /// The body region.
    pub region: BodyRegion,
    /// Contact area shape.
    pub contact_area: ContactArea,
    /// Optional padding in series with the body.
    pub padding: Option<Padding>,
    /// Transient limits of the region, from the limits layer; `None` when no
    /// permissible speed is wanted.
    pub limits: Option<TransientLimits>,
}

/// Which limit sets the permissible speed.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum SpeedRoute {
    /// The force limit: `v = F_max/√(μ·k)`.
    Force,
    /// The pressure limit: `v = p_max·A/√(μ·k)`.
    Pressure,
}

/// The highest relative speed the region's transient limits permit.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum PermissibleSpeed {
    /// Limited by the force and/or pressure limit; the lower governs.
    Limited {
        /// The governing (lower) speed, m/s.
        speed: f64,
        /// Speed allowed by the force limit, m/s.
        by_force: Option<f64>,
        /// Speed allowed by the pressure limit over the contact area, m/s.
        by_pressure: Option<f64>,
        /// The route that governs.
        governing: SpeedRoute,
    },
    /// No transient contact is permissible: the permissible speed is zero.
    NotPermissible {
        /// The clause that says so.
        clause: String,
    },
    /// Neither a force nor a pressure limit was given.
    NoLimitGiven,
}

impl PermissibleSpeed {
    /// The permissible speed in m/s: zero when contact is not permissible,
    /// `None` when no limit was given.
    pub fn speed(&self) -> Option<f64> {
        match self {
            PermissibleSpeed::Limited { speed, .. } => Some(*speed),
            PermissibleSpeed::NotPermissible { .. } => Some(0.0),
            PermissibleSpeed::NoLimitGiven => None,
        }
    }
}

/// Figures of a transient contact.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct TransientOutcome {
    /// Region label, echoed for figures.
    pub region_label: String,
    /// Reduced mass `μ = (1/m_H + 1/m_R)⁻¹`, kg.
    pub reduced_mass: f64,
    /// Stiffness seen by the contact, N/m: the body's, or body and pad in
    /// series while the pad is not flat.
    pub effective_stiffness: f64,
    /// Peak transient force `F = v·√(μ·k_eff)` (with the pad's bottoming
    /// where it bottoms), N.
    pub peak_force: f64,
    /// Peak force with no padding, `v·√(μ·k_body)`, N (equal to
    /// `peak_force` without a pad).
    pub unpadded_peak_force: f64,
    /// Energy of the relative motion `½·μ·v²`, J: all of it is stored in the
    /// contact springs at the peak.
    pub contact_energy: f64,
    /// Energy transferred to the body region at the peak, `F²/(2·k_body)`, J;
    /// equals `contact_energy` without padding (ISO/TS 15066 Annex A).
    pub transfer_energy: f64,
    /// Energy taken by the pad, `contact_energy − transfer_energy`, J.
    pub pad_energy: f64,
    /// Contact area, m².
    pub contact_area: f64,
    /// Peak pressure `F/A`, Pa.
    pub pressure: f64,
    /// Compression of the body region at the peak, `F/k_body`, m.
    pub body_compression: f64,
    /// Compression of the pad at the peak, m.
    pub pad_compression: f64,
    /// Whether the pad was squeezed flat before the peak.
    pub pad_flat: bool,
    /// Whether the pressure comes from a rigid-edge area (an estimate).
    pub edge_estimate: bool,
    /// Whether padding was given.
    pub padded: bool,
    /// Relative speed of the contact, m/s (echoed).
    pub relative_speed: f64,
    /// The highest relative speed the region's limits permit.
    pub permissible_speed: PermissibleSpeed,
}

/// Peak force, energy, pressure and permissible speed of a transient contact
/// with a body region (ISO/TS 15066:2016 Annex A, R2).
///
/// # Formula
/// `μ = m_H·m_R/(m_H + m_R)`; `k_eff = 1/(1/k_body + 1/k_pad)`;
/// `F = v·√(μ·k_eff)` while the pad is not flat, otherwise from the energy
/// balance `½·μ·v² = F_b²/(2·k_eff) + (F² − F_b²)/(2·k_body)` with
/// `F_b = k_pad·t`; transferred energy `F²/(2·k_body)`; pressure `F/A`;
/// permissible speed `min(F_max, p_max·A)` inverted through the same law
/// (`v = F_max/√(μ·k)` without a pad).
///
/// # Errors
/// Any mass, stiffness, dimension or limit not finite and positive; a
/// negative or non-finite speed. The field is named.
pub fn transient_contact(input: &TransientContact) -> Result<TransientOutcome, InputError> {
    let m_r = check::positive("part_mass", input.part_mass)?;
    let v = check::non_negative("relative_speed", input.relative_speed)?;
    input.region.validate().map_err(|e| e.within("region"))?;
    let area = input
        .contact_area
        .area()
        .map_err(|e| e.within("contact_area"))?;
    if let Some(p) = &input.padding {
        p.validate().map_err(|e| e.within("padding"))?;
    }
    if let Some(l) = &input.limits {
        l.validate().map_err(|e| e.within("limits"))?;
    }

    let m_h = input.region.mass;
    let k_body = input.region.stiffness;
    // μ = m_H·m_R/(m_H + m_R), written as small/(1 + small/large): no 1/m
    // overflow for tiny masses and no ∞/∞ for masses of extreme size.
    let (small, large) = if m_h < m_r { (m_h, m_r) } else { (m_r, m_h) };
    let mu = small / (1.0 + small / large);
    let spring = SeriesSpring::new(k_body, input.padding.as_ref());
    let contact_energy = 0.5 * mu * v * v;
    let peak_force = spring.force_at_energy(contact_energy);
    // F²/(2k) written as ½·F·(F/k): the same value, without F² and 2k
    // both overflowing to ∞ (∞/∞ = NaN) for a region of extreme stiffness.
    let transfer_energy = 0.5 * peak_force * (peak_force / k_body);

    let permissible_speed = match &input.limits {
        None => PermissibleSpeed::NoLimitGiven,
        Some(TransientLimits::NotPermissible { clause }) => PermissibleSpeed::NotPermissible {
            clause: clause.clone(),
        },
        Some(TransientLimits::Permissible {
            max_force,
            max_pressure,
        }) => {
            // Invert the force law: the speed whose contact energy ½·μ·v²
            // brings the force to the allowed value.
            let speed_for = |f: f64| (2.0 * spring.energy_at_force(f) / mu).sqrt();
            let by_force = max_force.map(speed_for);
            let by_pressure = max_pressure.map(|p| speed_for(p * area));
            match (by_force, by_pressure) {
                (None, None) => PermissibleSpeed::NoLimitGiven,
                (Some(f), None) => PermissibleSpeed::Limited {
                    speed: f,
                    by_force,
                    by_pressure,
                    governing: SpeedRoute::Force,
                },
                (None, Some(p)) => PermissibleSpeed::Limited {
                    speed: p,
                    by_force,
                    by_pressure,
                    governing: SpeedRoute::Pressure,
                },
                (Some(f), Some(p)) => PermissibleSpeed::Limited {
                    speed: f.min(p),
                    by_force,
                    by_pressure,
                    governing: if p < f {
                        SpeedRoute::Pressure
                    } else {
                        SpeedRoute::Force
                    },
                },
            }
        }
    };

    Ok(TransientOutcome {
        region_label: input.region.label.clone(),
        reduced_mass: mu,
        effective_stiffness: spring.effective(),
        peak_force,
        unpadded_peak_force: SeriesSpring::new(k_body, None).force_at_energy(contact_energy),
        contact_energy,
        transfer_energy,
        pad_energy: (contact_energy - transfer_energy).max(0.0),
        contact_area: area,
        pressure: peak_force / area,
        body_compression: peak_force / k_body,
        pad_compression: spring.pad_compression(peak_force),
        pad_flat: spring.pad_flat(peak_force),
        edge_estimate: input.contact_area.is_edge(),
        padded: input.padding.is_some(),
        relative_speed: v,
        permissible_speed,
    })
}

impl TransientOutcome {
    /// The value of figure `id` as [`TransientOutcome::figures`] reports it,
    /// in SI: `None` when that figure is missing (no limit given for the
    /// permissible speed, a non-finite result) or is not one of these
    /// figures. The one place that maps the figure ids to numbers:
    /// [`TransientOutcome::figures`] takes its values from here, and the
    /// tolerance study reads them without building the figures. A region
    /// where transient contact is not permissible has permissible speed 0.
    pub fn figure_value(&self, id: &str) -> Option<f64> {
        match id {
            ids::BODY_REDUCED_MASS => Some(self.reduced_mass),
            ids::BODY_TRANSIENT_FORCE => Some(self.peak_force),
            ids::BODY_TRANSFER_ENERGY => Some(self.transfer_energy),
            ids::BODY_TRANSIENT_PRESSURE => Some(self.pressure),
            ids::BODY_PERMISSIBLE_SPEED => match &self.permissible_speed {
                PermissibleSpeed::Limited { speed, .. } => Some(*speed),
                PermissibleSpeed::NotPermissible { .. } => Some(0.0),
                PermissibleSpeed::NoLimitGiven => None,
            },
            _ => None,
        }
        .filter(|v| v.is_finite())
    }

    /// [`TransientOutcome::figure_value`], NaN when missing (which
    /// [`Figure::new`] records as missing).
    fn value_or_nan(&self, id: &str) -> f64 {
        self.figure_value(id).unwrap_or(f64::NAN)
    }

    /// The figures of the contact: reduced mass, peak force, transferred
    /// energy, pressure and permissible speed.
    pub fn figures(&self) -> Vec<Figure> {
        let src = iso_ts_15066().cite();
        let region = format!("body region: {}", self.region_label);
        let two_body =
            "two-body model: the region is a linear spring carrying its effective mass; \
                        the part is free (not clamped) during the contact";
        let mut pad_note = Vec::new();
        if self.padded {
            pad_note.push(format!(
                "padding in series with the body (k_eff = {}); without it the peak force \
                 would be {}",
                tag(self.effective_stiffness, Dim::LinearRate),
                tag(self.unpadded_peak_force, Dim::Force)
            ));
            if self.pad_flat {
                pad_note.push(
                    "the pad is squeezed flat before the peak; the body alone takes the rest"
                        .into(),
                );
            }
        }
        let with_notes = |mut f: Figure| {
            for n in &pad_note {
                f = f.assume(n);
            }
            f
        };

        let mu = Figure::new(
            ids::BODY_REDUCED_MASS,
            "Reduced mass of the contact",
            Dim::Mass,
            self.value_or_nan(ids::BODY_REDUCED_MASS),
        )
        .method("μ = (1/m_H + 1/m_R)⁻¹")
        .source(&src)
        .assume(&region)
        .assume("m_R is the effective mass of the moving part at the hazard point (m, or I/r²)");

        let force = with_notes(
            Figure::new(
                ids::BODY_TRANSIENT_FORCE,
                "Peak transient contact force",
                Dim::Force,
                self.value_or_nan(ids::BODY_TRANSIENT_FORCE),
            )
            .method(if self.padded {
                "F from ½·μ·v² = energy stored in body and pad in series (F = v·√(μ·k_eff) while the pad is not flat)"
            } else {
                "F = v·√(μ·k)"
            })
            .source(&src)
            .assume(&region)
            .assume(two_body),
        );

        let energy = with_notes(
            Figure::new(
                ids::BODY_TRANSFER_ENERGY,
                "Energy transferred to the body region",
                Dim::Energy,
                self.value_or_nan(ids::BODY_TRANSFER_ENERGY),
            )
            .method(if self.padded {
                "E = F²/(2·k_body) (the pad takes the rest of ½·μ·v²)"
            } else {
                "E = ½·μ·v² = F²/(2·k)"
            })
            .source(&src)
            .assume(&region)
            .assume(two_body),
        );

        let mut pressure = Figure::new(
            ids::BODY_TRANSIENT_PRESSURE,
            "Peak transient contact pressure",
            Dim::Pressure,
            self.value_or_nan(ids::BODY_TRANSIENT_PRESSURE),
        )
        .method("p = F/A")
        .source(&src)
        .assume(&region)
        .assume("uniform pressure over the contact area; use the smaller of the part's and the body's contact areas");
        if self.edge_estimate {
            pressure = pressure.assume(
                "area from a rigid-edge model: an estimate (tissue conforms and the real area grows)",
            );
        }

        let speed_label = "Highest permissible relative speed";
        let speed = match &self.permissible_speed {
            PermissibleSpeed::Limited {
                by_force,
                by_pressure,
                governing,
                ..
            } => {
                let mut f = with_notes(
                    Figure::new(
                        ids::BODY_PERMISSIBLE_SPEED,
                        speed_label,
                        Dim::Speed,
                        self.value_or_nan(ids::BODY_PERMISSIBLE_SPEED),
                    )
                    .method("v = F_max/√(μ·k) or v = p_max·A/√(μ·k), the lower governing")
                    .source(&src)
                    .assume(&region)
                    .assume(two_body),
                );
                f = f.assume(match governing {
                    SpeedRoute::Force => "the force limit governs",
                    SpeedRoute::Pressure => "the pressure limit governs",
                });
                if let (Some(a), Some(b)) = (by_force, by_pressure) {
                    f = f.assume(&format!(
                        "force route {}, pressure route {}",
                        tag(*a, Dim::Speed),
                        tag(*b, Dim::Speed)
                    ));
                }
                f
            }
            PermissibleSpeed::NotPermissible { clause } => Figure::new(
                ids::BODY_PERMISSIBLE_SPEED,
                speed_label,
                Dim::Speed,
                self.value_or_nan(ids::BODY_PERMISSIBLE_SPEED),
            )
            .method("transient contact not permissible for this region")
            .source(&format!(
                "ISO/TS 15066:2016, {clause} (from a secondary source quoting the standard)"
            ))
            .assume(&region)
            .assume(
                "any contact speed exceeds the limit: design so that this region cannot be reached",
            ),
            PermissibleSpeed::NoLimitGiven => Figure::missing(
                ids::BODY_PERMISSIBLE_SPEED,
                speed_label,
                Dim::Speed,
                vec!["no force or pressure limit was given for this region".into()],
            ),
        };

        vec![mu, force, energy, pressure, speed]
    }
}

/// Inputs of quasi-static clamping: the part has come to rest pressing on a
/// body part that cannot move away. Forces are along the part's motion,
/// positive when they push towards the body.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Clamping {
    /// Spring force on the part where it first touches the body, N (signed).
    pub spring_force: f64,
    /// Drive force that keeps pushing, N (signed).
    pub drive_force: f64,
    /// Gravity component along the motion, N (signed).
    pub gravity_force: f64,
    /// Friction that holds the part back at rest, N (zero or more); it is
    /// subtracted. Give zero for the conservative value.
    pub friction_force: f64,
    /// Rate of the mechanism's spring along the motion, N/m: as the body
    /// yields the spring relaxes by `rate × compression`. `None` ignores the
    /// relaxation (conservative).
    pub spring_rate: Option<f64>,
    /// The body region (its stiffness sets how far it yields).
    pub region: BodyRegion,
    /// Optional padding in series with the body.
    pub padding: Option<Padding>,
    /// Contact area shape.
    pub contact_area: ContactArea,
}

/// Figures of quasi-static clamping.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ClampingOutcome {
    /// Region label, echoed for figures.
    pub region_label: String,
    /// Net force pushing towards the body at first touch,
    /// `spring + drive + gravity − friction`, N (may be negative).
    pub pushing_force: f64,
    /// Clamping force at rest, N: the pushing force less the spring's
    /// relaxation, and zero when nothing pushes.
    pub clamping_force: f64,
    /// Contact area, m².
    pub contact_area: f64,
    /// Clamping pressure `F/A`, Pa.
    pub pressure: f64,
    /// Compression of body plus pad at rest, m.
    pub compression: f64,
    /// Whether the pressure comes from a rigid-edge area (an estimate).
    pub edge_estimate: bool,
    /// Whether the spring's relaxation was taken into account.
    pub relaxation_included: bool,
}

/// Quasi-static clamping force and pressure when a driven part comes to rest
/// on a body part (static force balance; common practice).
///
/// # Formula
/// `F₀ = F_spring + F_drive + F_gravity − F_friction`; without a spring rate
/// `F = max(0, F₀)`; with the mechanism spring's rate `k_s`, the part
/// advances by the compression `δ(F)` of body and pad, so
/// `F = F₀ − k_s·δ(F)`, i.e. `F = F₀/(1 + k_s/k_eff)` while the pad is not
/// flat, `F = (F₀ − k_s·t)/(1 + k_s/k_body)` once it is; pressure `F/A`.
///
/// # Errors
/// A non-finite force, a negative friction or rate, a non-positive region
/// mass/stiffness or area dimension. The field is named.
pub fn clamping(input: &Clamping) -> Result<ClampingOutcome, InputError> {
    let fs = check::finite("spring_force", input.spring_force)?;
    let fd = check::finite("drive_force", input.drive_force)?;
    let fg = check::finite("gravity_force", input.gravity_force)?;
    let ff = check::non_negative("friction_force", input.friction_force)?;
    if let Some(k) = input.spring_rate {
        check::non_negative("spring_rate", k)?;
    }
    input.region.validate().map_err(|e| e.within("region"))?;
    if let Some(p) = &input.padding {
        p.validate().map_err(|e| e.within("padding"))?;
    }
    let area = input
        .contact_area
        .area()
        .map_err(|e| e.within("contact_area"))?;

    let pushing = fs + fd + fg - ff;
    let spring = SeriesSpring::new(input.region.stiffness, input.padding.as_ref());
    let k_body = input.region.stiffness;
    let force = if pushing <= 0.0 {
        0.0
    } else {
        match input.spring_rate {
            None => pushing,
            Some(ks) => {
                let f = pushing / (1.0 + ks / spring.effective());
                match (
                    input.padding.as_ref().and_then(|p| p.thickness),
                    spring.pad_flat_force,
                ) {
                    (Some(t), Some(fb)) if f > fb => {
                        ((pushing - ks * t) / (1.0 + ks / k_body)).max(fb)
                    }
                    _ => f,
                }
            }
        }
    };
    let compression = force / k_body + spring.pad_compression(force);
    Ok(ClampingOutcome {
        region_label: input.region.label.clone(),
        pushing_force: pushing,
        clamping_force: force,
        contact_area: area,
        pressure: force / area,
        compression,
        edge_estimate: input.contact_area.is_edge(),
        relaxation_included: input.spring_rate.is_some(),
    })
}

impl ClampingOutcome {
    /// The value of figure `id` as [`ClampingOutcome::figures`] reports it,
    /// in SI: `None` for a non-finite result or an id that is not one of
    /// these figures. The one place that maps the figure ids to numbers:
    /// [`ClampingOutcome::figures`] takes its values from here, and the
    /// tolerance study reads them without building the figures.
    pub fn figure_value(&self, id: &str) -> Option<f64> {
        match id {
            ids::BODY_CLAMPING_FORCE => Some(self.clamping_force),
            ids::BODY_CLAMPING_PRESSURE => Some(self.pressure),
            _ => None,
        }
        .filter(|v| v.is_finite())
    }

    /// [`ClampingOutcome::figure_value`], NaN when missing (which
    /// [`Figure::new`] records as missing).
    fn value_or_nan(&self, id: &str) -> f64 {
        self.figure_value(id).unwrap_or(f64::NAN)
    }

    /// The figures: clamping force and clamping pressure.
    pub fn figures(&self) -> Vec<Figure> {
        let src = static_balance().cite();
        let region = format!("body region: {}", self.region_label);
        let relax = if self.relaxation_included {
            "the mechanism spring relaxes while the body yields (F = F₀ − k_s·δ)"
        } else {
            "spring relaxation while the body yields ignored (conservative)"
        };
        let mut force = Figure::new(
            ids::BODY_CLAMPING_FORCE,
            "Quasi-static clamping force",
            Dim::Force,
            self.value_or_nan(ids::BODY_CLAMPING_FORCE),
        )
        .method("F = F_spring + F_drive + F_gravity − F_friction at rest on the body")
        .source(&src)
        .assume(&region)
        .assume("the body part cannot move away (clamped against a fixed part)")
        .assume(relax);
        if self.pushing_force <= 0.0 {
            force =
                force.assume("nothing pushes the part towards the body at rest: no clamping force");
        }
        let mut pressure = Figure::new(
            ids::BODY_CLAMPING_PRESSURE,
            "Quasi-static clamping pressure",
            Dim::Pressure,
            self.value_or_nan(ids::BODY_CLAMPING_PRESSURE),
        )
        .method("p = F/A")
        .source(&src)
        .assume(&region)
        .assume("uniform pressure over the contact area");
        if self.edge_estimate {
            pressure = pressure.assume(
                "area from a rigid-edge model: an estimate (tissue conforms and the real area grows)",
            );
        }
        vec![force, pressure]
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::test_tol::REL_EXACT;
    use approx::assert_relative_eq;
    use proptest::prelude::*;

    /// Reference-table values printed to 4 significant figures (e.g.
    /// 0.5227 J, 1.359 m/s): half a unit in the 4th digit is at most 5e-4
    /// relative; for 3 decimals on values near 1 (1.364 m/s) it is 5e-4/1.0.
    const REL_PRINTED_4SF: f64 = crate::test_tol::REL_PRINTED_4SF;

    /// A value pushed through a square root and squared back, or a short
    /// chain of such closed forms: a few units of rounding.
    const REL_ROUND_TRIP: f64 = 1e-11;
    /// A speed found from a force limit and fed back: `sqrt` then square
    /// through the piecewise pad law; rounding grows with the spread of
    /// stiffnesses in the random cases (up to 1e5), so allow 1e-9.
    const REL_INVERSE: f64 = 1e-9;

    /// N/mm → N/m.
    const PER_MM: f64 = 1000.0;
    /// N/cm² → Pa.
    const PER_CM2: f64 = 1.0e4;

    fn region(label: &str, k_n_per_mm: f64, m_h: f64) -> BodyRegion {
        BodyRegion::new(label, m_h, k_n_per_mm * PER_MM).unwrap()
    }

    fn contact(
        m_r: f64,
        v: f64,
        region: BodyRegion,
        limits: Option<TransientLimits>,
    ) -> TransientContact {
        TransientContact {
            part_mass: m_r,
            relative_speed: v,
            region,
            contact_area: ContactArea::Given { area: 1.0e-4 },
            padding: None,
            limits,
        }
    }

    fn force_limit(f: f64) -> Option<TransientLimits> {
        Some(TransientLimits::Permissible {
            max_force: Some(f),
            max_pressure: None,
        })
    }

    fn speed(o: &TransientOutcome) -> f64 {
        o.permissible_speed.speed().unwrap()
    }

    // ISO/TS 15066:2016 Table A.2 (F quasi-static) and Table A.3 (k, m_H),
    // status R2; transient force = 2 × quasi-static per Table A.2 footnote c
    // (R2); derived energies and speeds are reference-values.md table 1c (D).
    #[test]
    fn t15_transfer_energy_hand_chest_abdomen() {
        // T15 (R2 formula, D arithmetic): E = F_T²/(2k).
        // (region, k N/mm, m_H kg, F_T N, E_T J)
        for (name, k, m_h, f_t, e_ref) in [
            ("hand", 75.0, 0.6, 280.0, 0.5227),
            ("chest", 25.0, 40.0, 280.0, 1.568),
            ("abdomen", 10.0, 40.0, 220.0, 2.420),
        ] {
            // At the permissible speed the transferred energy is F_max²/(2k).
            let o = transient_contact(&contact(10.0, 0.0, region(name, k, m_h), force_limit(f_t)))
                .unwrap();
            let v = speed(&o);
            let at_v = transient_contact(&contact(10.0, v, region(name, k, m_h), None)).unwrap();
            assert_relative_eq!(at_v.transfer_energy, e_ref, max_relative = REL_PRINTED_4SF);
            assert_relative_eq!(at_v.peak_force, f_t, max_relative = REL_ROUND_TRIP);
        }
        // Quasi-static energy at the same k is a quarter: hand 0.1307 J (D).
        let o = transient_contact(&contact(
            10.0,
            0.0,
            region("hand", 75.0, 0.6),
            force_limit(140.0),
        ))
        .unwrap();
        let e = 0.5 * o.reduced_mass * speed(&o).powi(2);
        assert_relative_eq!(e, 0.1307, max_relative = REL_PRINTED_4SF);
    }

    #[test]
    fn t16_permissible_speed_hand() {
        // T16 (ISO/TS 15066 Annex A, R2): hand m_H = 0.6 kg, k = 75 N/mm,
        // F_T = 280 N; m_R = 10 kg → μ = 0.5660 kg, v = 1.359 m/s;
        // m_R = 5 kg → μ = 0.5357 kg, v = 1.397 m/s.
        let o = transient_contact(&contact(
            10.0,
            1.0,
            region("hand", 75.0, 0.6),
            force_limit(280.0),
        ))
        .unwrap();
        assert_relative_eq!(o.reduced_mass, 0.5660, max_relative = REL_PRINTED_4SF);
        assert_relative_eq!(speed(&o), 1.359, max_relative = REL_PRINTED_4SF);
        let o = transient_contact(&contact(
            5.0,
            1.0,
            region("hand", 75.0, 0.6),
            force_limit(280.0),
        ))
        .unwrap();
        assert_relative_eq!(o.reduced_mass, 0.5357, max_relative = REL_PRINTED_4SF);
        assert_relative_eq!(speed(&o), 1.397, max_relative = REL_PRINTED_4SF);
    }

    #[test]
    fn t17_pressure_route_and_lower_governs() {
        // T17 (R2): back of hand ND p = 190 N/cm², transient ×2 = 380 N/cm²,
        // A = 1 cm², m_R = 10 kg → 1.844 m/s by pressure; force route 1.359
        // governs.
        let mut c = contact(
            10.0,
            1.0,
            region("hand", 75.0, 0.6),
            Some(TransientLimits::Permissible {
                max_force: Some(280.0),
                max_pressure: Some(2.0 * 190.0 * PER_CM2),
            }),
        );
        c.contact_area = ContactArea::Given { area: 1.0e-4 };
        let o = transient_contact(&c).unwrap();
        match o.permissible_speed {
            PermissibleSpeed::Limited {
                speed,
                by_force,
                by_pressure,
                governing,
            } => {
                assert_relative_eq!(by_pressure.unwrap(), 1.844, max_relative = REL_PRINTED_4SF);
                assert_relative_eq!(by_force.unwrap(), 1.359, max_relative = REL_PRINTED_4SF);
                assert_eq!(governing, SpeedRoute::Force);
                assert_eq!(speed, by_force.unwrap());
            }
            other => panic!("expected a limited speed, got {other:?}"),
        }
        // A smaller area (edge 10 mm × 1 mm = 0.1 cm²) makes pressure govern.
        c.contact_area = ContactArea::Edge {
            length: 0.010,
            width: 0.001,
        };
        let o = transient_contact(&c).unwrap();
        assert!(matches!(
            o.permissible_speed,
            PermissibleSpeed::Limited {
                governing: SpeedRoute::Pressure,
                ..
            }
        ));
        assert!(o.edge_estimate);
    }

    #[test]
    fn table_1c_permissible_speeds() {
        // reference-values.md table 1c (D from ISO/TS 15066 Tables A.2/A.3,
        // R2): (k N/mm, m_H kg, F_T N, v at m_R = 5 kg, v at m_R = 10 kg).
        let rows = [
            ("neck", 50.0, 1.2, 300.0, 1.364, 1.296),
            ("back/shoulders", 35.0, 40.0, 420.0, 1.065, 0.794),
            ("chest", 25.0, 40.0, 280.0, 0.840, 0.626),
            ("abdomen", 10.0, 40.0, 220.0, 1.044, 0.778),
            ("pelvis", 25.0, 40.0, 360.0, 1.080, 0.805),
            ("upper arm", 30.0, 3.0, 300.0, 1.265, 1.140),
            ("lower arm", 40.0, 2.0, 320.0, 1.339, 1.239),
            ("hand/fingers", 75.0, 0.6, 280.0, 1.397, 1.359),
            ("thigh/knee", 50.0, 75.0, 440.0, 0.909, 0.662),
            ("lower leg", 60.0, 75.0, 260.0, 0.490, 0.357),
        ];
        // Values printed to 3 decimals: half a unit is 5e-4 absolute, i.e.
        // up to 1.4e-3 relative at 0.357 m/s.
        const ABS_PRINTED_3DP: f64 = 5e-4;
        for (name, k, m_h, f_t, v5, v10) in rows {
            for (m_r, v_ref) in [(5.0, v5), (10.0, v10)] {
                let o =
                    transient_contact(&contact(m_r, 0.0, region(name, k, m_h), force_limit(f_t)))
                        .unwrap();
                let v = speed(&o);
                assert!(
                    (v - v_ref).abs() <= ABS_PRINTED_3DP,
                    "{name} m_R={m_r}: {v} vs {v_ref}"
                );
            }
        }
    }

    #[test]
    fn t18_head_and_face_not_permissible() {
        // T18: ISO/TS 15066 A.3.2 and Table A.2 footnote c (R2): no transient
        // contact with skull, forehead or face.
        let c = contact(
            2.0,
            0.1,
            region("face", 75.0, 4.4),
            Some(TransientLimits::NotPermissible {
                clause: "A.3.2".into(),
            }),
        );
        let o = transient_contact(&c).unwrap();
        assert!(matches!(
            o.permissible_speed,
            PermissibleSpeed::NotPermissible { .. }
        ));
        assert_eq!(o.permissible_speed.speed(), Some(0.0));
        let fig = o
            .figures()
            .into_iter()
            .find(|f| f.id == ids::BODY_PERMISSIBLE_SPEED)
            .unwrap();
        assert_eq!(fig.value, Some(0.0));
        assert!(fig.source.contains("A.3.2"));
    }

    #[test]
    fn force_and_energy_identities() {
        // F = v·√(μk) and E = ½μv² = F²/(2k): the same formula two ways.
        let o = transient_contact(&contact(3.0, 0.8, region("arm", 30.0, 3.0), None)).unwrap();
        let mu = 1.5;
        assert_relative_eq!(o.reduced_mass, mu, max_relative = REL_EXACT);
        assert_relative_eq!(
            o.peak_force,
            0.8 * (mu * 30_000.0_f64).sqrt(),
            max_relative = REL_EXACT
        );
        assert_relative_eq!(o.transfer_energy, 0.5 * mu * 0.64, max_relative = REL_EXACT);
        assert_relative_eq!(
            o.contact_energy,
            o.transfer_energy,
            max_relative = REL_EXACT
        );
        assert_relative_eq!(o.pressure, o.peak_force / 1.0e-4, max_relative = REL_EXACT);
        assert_eq!(o.figures().len(), 5);
    }

    #[test]
    fn padding_in_series_lowers_force_and_bottoming_raises_it() {
        let base = contact(10.0, 1.0, region("hand", 75.0, 0.6), force_limit(280.0));
        let bare = transient_contact(&base).unwrap();
        let mut padded = base.clone();
        // A pad as stiff as the body halves k: force falls by √2.
        padded.padding = Some(Padding {
            stiffness: 75_000.0,
            thickness: None,
        });
        let p = transient_contact(&padded).unwrap();
        assert_relative_eq!(p.effective_stiffness, 37_500.0, max_relative = REL_EXACT);
        assert_relative_eq!(
            p.peak_force * 2.0_f64.sqrt(),
            bare.peak_force,
            max_relative = REL_EXACT
        );
        // Body and pad share the energy equally (equal stiffness).
        assert_relative_eq!(p.transfer_energy, p.pad_energy, max_relative = REL_EXACT);
        assert_relative_eq!(
            p.transfer_energy + p.pad_energy,
            p.contact_energy,
            max_relative = REL_EXACT
        );
        // Permissible speed rises by √2.
        assert_relative_eq!(
            speed(&p),
            speed(&bare) * 2.0_f64.sqrt(),
            max_relative = REL_EXACT
        );
        assert_eq!(p.unpadded_peak_force, bare.peak_force);

        // A thin pad bottoms: force lies between padded and bare values and
        // the energy balance holds piecewise.
        padded.padding = Some(Padding {
            stiffness: 75_000.0,
            thickness: Some(0.001),
        });
        let t = transient_contact(&padded).unwrap();
        assert!(t.pad_flat);
        assert!(t.peak_force > p.peak_force && t.peak_force < bare.peak_force);
        let fb = 75.0;
        let e = fb * fb / (2.0 * 37_500.0) + (t.peak_force.powi(2) - fb * fb) / (2.0 * 75_000.0);
        assert_relative_eq!(e, t.contact_energy, max_relative = REL_ROUND_TRIP);
        assert_relative_eq!(t.pad_compression, 0.001, max_relative = REL_EXACT);
        // The permissible speed inverts the same law: at that speed F = F_max.
        let mut at = padded.clone();
        at.relative_speed = speed(&t);
        let back = transient_contact(&at).unwrap();
        assert_relative_eq!(back.peak_force, 280.0, max_relative = REL_ROUND_TRIP);
    }

    #[test]
    fn contact_area_shapes() {
        assert_relative_eq!(
            ContactArea::Circle { diameter: 0.02 }.area().unwrap(),
            std::f64::consts::PI * 1.0e-4,
            max_relative = REL_EXACT
        );
        assert_relative_eq!(
            ContactArea::Edge {
                length: 0.1,
                width: 0.002
            }
            .area()
            .unwrap(),
            2.0e-4,
            max_relative = REL_EXACT
        );
        let e = ContactArea::Edge {
            length: 0.1,
            width: 0.0,
        }
        .area()
        .unwrap_err();
        assert_eq!(e.field, "width");
    }

    #[test]
    fn clamping_static_balance() {
        let reg = region("hand", 75.0, 0.6);
        let mut c = Clamping {
            spring_force: 120.0,
            drive_force: 50.0,
            gravity_force: 10.0,
            friction_force: 30.0,
            spring_rate: None,
            region: reg,
            padding: None,
            contact_area: ContactArea::Given { area: 2.0e-4 },
        };
        let o = clamping(&c).unwrap();
        assert_relative_eq!(o.clamping_force, 150.0, max_relative = REL_EXACT);
        assert_relative_eq!(o.pressure, 150.0 / 2.0e-4, max_relative = REL_EXACT);
        assert_relative_eq!(o.compression, 150.0 / 75_000.0, max_relative = REL_EXACT);
        // With the spring's relaxation: F = F₀/(1 + k_s/k) and the balance
        // F = F₀ − k_s·δ holds at rest.
        c.spring_rate = Some(25_000.0);
        let r = clamping(&c).unwrap();
        assert_relative_eq!(
            r.clamping_force,
            150.0 / (1.0 + 25.0 / 75.0),
            max_relative = REL_EXACT
        );
        assert_relative_eq!(
            r.clamping_force,
            150.0 - 25_000.0 * r.compression,
            max_relative = REL_EXACT
        );
        // With a pad that bottoms, the balance still holds.
        c.padding = Some(Padding {
            stiffness: 75_000.0,
            thickness: Some(0.0005),
        });
        let b = clamping(&c).unwrap();
        assert_relative_eq!(
            b.clamping_force,
            150.0 - 25_000.0 * b.compression,
            max_relative = REL_EXACT
        );
        // Nothing pushes: zero force, not negative.
        c.spring_force = -200.0;
        let z = clamping(&c).unwrap();
        assert_eq!(z.clamping_force, 0.0);
        assert_eq!(z.figures().len(), 2);
    }

    #[test]
    fn invalid_inputs_name_their_field() {
        let mut c = contact(0.0, 1.0, region("hand", 75.0, 0.6), None);
        assert_eq!(transient_contact(&c).unwrap_err().field, "part_mass");
        c.part_mass = 1.0;
        c.region.stiffness = f64::NAN;
        assert_eq!(transient_contact(&c).unwrap_err().field, "region.stiffness");
        c.region.stiffness = 1.0;
        c.limits = force_limit(-1.0);
        assert_eq!(transient_contact(&c).unwrap_err().field, "limits.max_force");
    }

    proptest! {
        #[test]
        fn finite_inputs_give_finite_figures(
            m_r in 1e-3f64..1e4, m_h in 1e-2f64..100.0, k in 1e2f64..1e7,
            v in 0.0f64..50.0, kp in prop::option::of(1e2f64..1e7),
            t in prop::option::of(1e-5f64..0.05), fmax in 1.0f64..1e4,
        ) {
            let c = TransientContact {
                part_mass: m_r,
                relative_speed: v,
                region: BodyRegion::new("r", m_h, k).unwrap(),
                contact_area: ContactArea::Circle { diameter: 0.01 },
                padding: kp.map(|s| Padding { stiffness: s, thickness: t }),
                limits: force_limit(fmax),
            };
            let o = transient_contact(&c).unwrap();
            for f in o.figures() {
                prop_assert!(f.value.is_some(), "{} missing", f.id);
            }
            // Force monotone in speed; padding never raises the force.
            prop_assert!(o.peak_force <= o.unpadded_peak_force * (1.0 + REL_EXACT));
            // At the permissible speed, the force equals the limit.
            let mut at = c.clone();
            at.relative_speed = o.permissible_speed.speed().unwrap();
            let back = transient_contact(&at).unwrap();
            prop_assert!((back.peak_force - fmax).abs() <= fmax * REL_INVERSE);
        }
    }
}

/// Inputs each valid but of extreme size (found by the property tests in
/// `tests/properties.rs`).
#[cfg(test)]
mod extreme_inputs {
    use super::*;

    fn contact(m_h: f64, k: f64, v: f64, area: ContactArea) -> TransientContact {
        TransientContact {
            part_mass: 1.0,
            relative_speed: v,
            region: BodyRegion {
                label: "test".into(),
                mass: m_h,
                stiffness: k,
            },
            contact_area: area,
            padding: None,
            limits: None,
        }
    }

    const EDGE: ContactArea = ContactArea::Edge {
        length: 0.1,
        width: 0.1,
    };

    /// A circle of 2.2e-308 m gave an area of 0 and a pressure 0/0 = NaN;
    /// a region of stiffness 1.8e308 N/m gave F²/(2k) = ∞/∞; a region of
    /// mass 1.8e308 kg hit at 0 m/s gave ½·∞·0. The area must be a finite
    /// positive number, and the reduced mass, peak force and energy are
    /// written so that extreme sizes cannot make NaN.
    #[test]
    fn no_nan_for_extreme_areas_stiffnesses_and_masses() {
        let tiny = ContactArea::Circle { diameter: 2.2e-308 };
        let e = transient_contact(&contact(1.0, 1e3, 1e-3, tiny)).unwrap_err();
        assert_eq!(e.field, "contact_area.diameter", "{e}");
        for (m_h, k, v) in [
            (5e-324, f64::MAX, 1.0),
            (1.0, f64::MAX, 1.0),
            (f64::MAX, 1e3, 0.0),
        ] {
            let o = transient_contact(&contact(m_h, k, v, EDGE)).unwrap();
            for x in [
                o.peak_force,
                o.transfer_energy,
                o.contact_energy,
                o.pressure,
            ] {
                assert!(!x.is_nan(), "m_H {m_h}, k {k}, v {v}: {o:?}");
            }
        }
    }
}
