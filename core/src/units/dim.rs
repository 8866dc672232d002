//! Dimensions (quantity kinds) the core computes with, each with its SI unit.

use serde::{Deserialize, Serialize};

/// The kind of a physical quantity. Every value inside the core is in the
/// SI unit named by [`Dim::si_symbol`].
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
#[serde(rename_all = "snake_case")]
pub enum Dim {
    /// Pure number (ratio, coefficient, count).
    Ratio,
    /// Length, m.
    Length,
    /// Area, m².
    Area,
    /// Force, N.
    Force,
    /// Mass, kg.
    Mass,
    /// Energy, J.
    Energy,
    /// Linear spring rate, N/m.
    LinearRate,
    /// Torsional spring rate, N·m/rad.
    TorsionalRate,
    /// Speed, m/s.
    Speed,
    /// Angular speed, rad/s.
    AngularSpeed,
    /// Acceleration, m/s².
    Acceleration,
    /// Pressure or stress, Pa.
    Pressure,
    /// Plane angle, rad.
    Angle,
    /// Torque or moment, N·m.
    Torque,
    /// Moment of inertia, kg·m².
    Inertia,
    /// Time, s.
    Time,
    /// Frequency or rate of events, Hz (1/s).
    Frequency,
    /// Power, W (also heat per hour).
    Power,
    /// Viscous damping coefficient, N·s/m.
    LinearDamping,
    /// Orifice (quadratic) damping coefficient, N·s²/m².
    QuadraticDamping,
    /// Density, kg/m³.
    Density,
    /// Probability, 0..1 (shown as %).
    Probability,
}

impl Dim {
    /// Every dimension, for tables and tests.
    pub const ALL: [Dim; 22] = [
        Dim::Ratio,
        Dim::Length,
        Dim::Area,
        Dim::Force,
        Dim::Mass,
        Dim::Energy,
        Dim::LinearRate,
        Dim::TorsionalRate,
        Dim::Speed,
        Dim::AngularSpeed,
        Dim::Acceleration,
        Dim::Pressure,
        Dim::Angle,
        Dim::Torque,
        Dim::Inertia,
        Dim::Time,
        Dim::Frequency,
        Dim::Power,
        Dim::LinearDamping,
        Dim::QuadraticDamping,
        Dim::Density,
        Dim::Probability,
    ];

    /// The SI unit symbol in which the core holds this kind.
    pub fn si_symbol(self) -> &'static str {
        match self {
            Dim::Ratio => "",
            Dim::Length => "m",
            Dim::Area => "m²",
            Dim::Force => "N",
            Dim::Mass => "kg",
            Dim::Energy => "J",
            Dim::LinearRate => "N/m",
            Dim::TorsionalRate => "N·m/rad",
            Dim::Speed => "m/s",
            Dim::AngularSpeed => "rad/s",
            Dim::Acceleration => "m/s²",
            Dim::Pressure => "Pa",
            Dim::Angle => "rad",
            Dim::Torque => "N·m",
            Dim::Inertia => "kg·m²",
            Dim::Time => "s",
            Dim::Frequency => "Hz",
            Dim::Power => "W",
            Dim::LinearDamping => "N·s/m",
            Dim::QuadraticDamping => "N·s²/m²",
            Dim::Density => "kg/m³",
            Dim::Probability => "",
        }
    }

    /// Stable key, the serde name (`linear_rate`).
    pub fn key(self) -> &'static str {
        match self {
            Dim::Ratio => "ratio",
            Dim::Length => "length",
            Dim::Area => "area",
            Dim::Force => "force",
            Dim::Mass => "mass",
            Dim::Energy => "energy",
            Dim::LinearRate => "linear_rate",
            Dim::TorsionalRate => "torsional_rate",
            Dim::Speed => "speed",
            Dim::AngularSpeed => "angular_speed",
            Dim::Acceleration => "acceleration",
            Dim::Pressure => "pressure",
            Dim::Angle => "angle",
            Dim::Torque => "torque",
            Dim::Inertia => "inertia",
            Dim::Time => "time",
            Dim::Frequency => "frequency",
            Dim::Power => "power",
            Dim::LinearDamping => "linear_damping",
            Dim::QuadraticDamping => "quadratic_damping",
            Dim::Density => "density",
            Dim::Probability => "probability",
        }
    }

    /// The kind with this key.
    pub fn from_key(key: &str) -> Option<Dim> {
        Dim::ALL.into_iter().find(|d| d.key() == key)
    }

    /// The kind in words with an article, for messages: `a force`.
    pub fn noun(self) -> &'static str {
        match self {
            Dim::Ratio => "a plain number",
            Dim::Length => "a length",
            Dim::Area => "an area",
            Dim::Force => "a force",
            Dim::Mass => "a mass",
            Dim::Energy => "an energy",
            Dim::LinearRate => "a spring rate",
            Dim::TorsionalRate => "a torsional spring rate",
            Dim::Speed => "a speed",
            Dim::AngularSpeed => "an angular speed",
            Dim::Acceleration => "an acceleration",
            Dim::Pressure => "a pressure or stress",
            Dim::Angle => "an angle",
            Dim::Torque => "a torque",
            Dim::Inertia => "a moment of inertia",
            Dim::Time => "a time",
            Dim::Frequency => "a frequency",
            Dim::Power => "a power",
            Dim::LinearDamping => "a damping coefficient",
            Dim::QuadraticDamping => "an orifice damping coefficient",
            Dim::Density => "a density",
            Dim::Probability => "a probability",
        }
    }
}

#[cfg(test)]
mod tests {
    use super::Dim;

    #[test]
    fn keys_are_the_serde_names() {
        for d in Dim::ALL {
            let json = serde_json::to_string(&d).unwrap();
            assert_eq!(json, format!("\"{}\"", d.key()));
        }
    }
}
