//! Names of the scenario's numeric inputs for people: label, kind of
//! quantity, unit of a bare number and a short help text, by field path.
//!
//! The paths are those of the JSON file and of `InputError::field`
//! (`part.mass`, `spring.model.rate`, `contact.law.stroke`), so the web
//! sheet, the printed report's input list and the CLI label a field the same
//! way and can show an error beside the field it names. List indices are
//! written `*` in the table (`states.*.deflection`); members of a spring
//! combination and a buffer's own spring model are described like the main
//! spring's fields.

use super::resolve::default_unit;
use crate::units::Dim;

/// What a field is.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct FieldInfo {
    /// Label, e.g. "Moving mass".
    pub label: &'static str,
    /// Kind of quantity.
    pub dim: Dim,
    /// Unit of a bare number (`12` in a length field means 12 mm).
    pub default_unit: &'static str,
    /// One line of help: what to measure or where to find it.
    pub help: &'static str,
}

/// How a coordinate-like field is measured: lengths for sliding parts and
/// linear springs, angles for hinged parts and torsion springs.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Coordinate {
    /// Lengths (m), forces (N), rates (N/m).
    Linear,
    /// Angles (rad), torques (N·m), rates (N·m/rad).
    Rotary,
}

/// Kinds that depend on the coordinate.
#[derive(Clone, Copy)]
enum K {
    D(Dim),
    /// Length or angle.
    Q,
    /// Force or torque.
    F,
    /// Linear or torsional rate.
    R,
}

const TABLE: &[(&str, &str, K, &str)] = &[
    (
        "part.mass",
        "Moving mass",
        K::D(Dim::Mass),
        "mass of the moving part without the spring",
    ),
    (
        "part.travel",
        "Travel from latch to contact",
        K::Q,
        "distance (or angle) the part moves before it meets the contact",
    ),
    (
        "part.incline",
        "Incline of the travel",
        K::D(Dim::Angle),
        "above the horizontal; −90° falls straight down",
    ),
    (
        "part.friction.mu",
        "Friction coefficient",
        K::D(Dim::Ratio),
        "Coulomb coefficient times the normal force from the incline",
    ),
    (
        "part.friction.force",
        "Friction force",
        K::D(Dim::Force),
        "fixed friction force, e.g. read with a force gauge",
    ),
    (
        "part.damping",
        "Viscous damping",
        K::D(Dim::LinearDamping),
        "force per unit speed opposing the motion",
    ),
    (
        "part.drive_force",
        "Drive force",
        K::D(Dim::Force),
        "constant force towards contact that keeps pushing",
    ),
    (
        "part.inertia.inertia",
        "Moment of inertia about the hinge",
        K::D(Dim::Inertia),
        "from CAD or a swing test",
    ),
    (
        "part.inertia.mass",
        "Mass of the hinged part",
        K::D(Dim::Mass),
        "whole moving part",
    ),
    (
        "part.inertia.cg_radius",
        "Centre of mass from the hinge",
        K::D(Dim::Length),
        "distance perpendicular to the hinge axis",
    ),
    (
        "part.inertia.width",
        "Width from hinge to far edge",
        K::D(Dim::Length),
        "uniform plate hinged along one edge",
    ),
    (
        "part.inertia.length",
        "Length of the rod",
        K::D(Dim::Length),
        "uniform rod pivoted at one end",
    ),
    (
        "part.inertia.radius",
        "Radius",
        K::D(Dim::Length),
        "of the disc, or of the point mass from the hinge",
    ),
    (
        "part.inertia.inertia_about_cg",
        "Inertia about the centre of mass",
        K::D(Dim::Inertia),
        "parallel to the hinge axis",
    ),
    (
        "part.inertia.distance",
        "Centre of mass from the hinge",
        K::D(Dim::Length),
        "offset used with the parallel-axis theorem",
    ),
    (
        "part.hinge_tilt",
        "Hinge axis from vertical",
        K::D(Dim::Angle),
        "90° for a horizontal hinge (full gravity), 0° for a vertical hinge",
    ),
    (
        "part.cg_angle_at_latch",
        "Centre-of-mass angle at the latch",
        K::D(Dim::Angle),
        "above the horizontal, in the plane of rotation",
    ),
    (
        "part.friction_torque",
        "Hinge friction torque",
        K::D(Dim::Torque),
        "torque needed to turn the part slowly",
    ),
    (
        "part.drive_torque",
        "Drive torque",
        K::D(Dim::Torque),
        "constant torque towards contact",
    ),
    (
        "part.hazard_radius",
        "Closing edge from the hinge",
        K::D(Dim::Length),
        "radius of the hazard point",
    ),
    (
        "spring.model.rate",
        "Spring rate",
        K::R,
        "from the data sheet, or measured",
    ),
    (
        "spring.model.max_deflection",
        "Largest admissible deflection",
        K::D(Dim::Length),
        "e.g. to solid or to the rated travel",
    ),
    (
        "spring.model.max_angle",
        "Largest admissible wind-up angle",
        K::D(Dim::Angle),
        "from the data sheet",
    ),
    (
        "spring.model.initial_tension",
        "Initial tension",
        K::D(Dim::Force),
        "force before the coils separate",
    ),
    (
        "spring.model.wire_diameter",
        "Wire diameter",
        K::D(Dim::Length),
        "measure with a micrometer",
    ),
    (
        "spring.model.coil_diameter",
        "Coil diameter",
        K::D(Dim::Length),
        "mean, outside or inside as chosen",
    ),
    (
        "spring.model.active_coils",
        "Active coils",
        K::D(Dim::Ratio),
        "coils free to deflect",
    ),
    (
        "spring.model.total_coils",
        "Total coils",
        K::D(Dim::Ratio),
        "blank: from the end type",
    ),
    (
        "spring.model.free_length",
        "Free length",
        K::D(Dim::Length),
        "unloaded length",
    ),
    (
        "spring.model.nominal_force",
        "Nominal force F₁",
        K::D(Dim::Force),
        "extended force printed on the gas spring",
    ),
    (
        "spring.model.progression",
        "Progression F₂/F₁",
        K::D(Dim::Ratio),
        "end force over start force, typically 1.1–1.6",
    ),
    (
        "spring.model.stroke",
        "Stroke",
        K::D(Dim::Length),
        "of the gas spring",
    ),
    (
        "spring.model.friction_band",
        "Friction band",
        K::D(Dim::Force),
        "compression force minus extension force",
    ),
    (
        "spring.model.polytropic_index",
        "Polytropic index κ",
        K::D(Dim::Ratio),
        "1 slow (isothermal) … 1.4 fast (adiabatic)",
    ),
    (
        "spring.model.outer_diameter",
        "Outside diameter D_e",
        K::D(Dim::Length),
        "of one disc",
    ),
    (
        "spring.model.inner_diameter",
        "Inside diameter D_i",
        K::D(Dim::Length),
        "of one disc",
    ),
    (
        "spring.model.thickness",
        "Disc thickness t",
        K::D(Dim::Length),
        "of one disc",
    ),
    (
        "spring.model.cone_height",
        "Free cone height h₀",
        K::D(Dim::Length),
        "l₀ − t of one disc",
    ),
    (
        "spring.model.youngs_modulus",
        "Young's modulus",
        K::D(Dim::Pressure),
        "blank: 206 000 N/mm²",
    ),
    (
        "spring.model.poisson_ratio",
        "Poisson's ratio",
        K::D(Dim::Ratio),
        "blank: 0.3",
    ),
    (
        "spring.model.loading.*.deflection",
        "Deflection (loading)",
        K::Q,
        "measured point on the loading curve",
    ),
    (
        "spring.model.loading.*.force",
        "Force (loading)",
        K::F,
        "measured point on the loading curve",
    ),
    (
        "spring.model.unloading.*.deflection",
        "Deflection (unloading)",
        K::Q,
        "measured point on the unloading curve",
    ),
    (
        "spring.model.unloading.*.force",
        "Force (unloading)",
        K::F,
        "measured point on the unloading curve",
    ),
    (
        "spring.model.method.mass",
        "Test mass",
        K::D(Dim::Mass),
        "known mass hung on the spring; its ± is its uncertainty",
    ),
    (
        "spring.model.method.sag",
        "Measured sag",
        K::D(Dim::Length),
        "deflection under the test mass",
    ),
    (
        "spring.model.method.resolution",
        "Reading resolution of the sag",
        K::D(Dim::Length),
        "± half-width of the scale reading",
    ),
    (
        "spring.model.method.oscillations",
        "Oscillations timed",
        K::D(Dim::Ratio),
        "whole number of full oscillations",
    ),
    (
        "spring.model.method.time",
        "Time for those oscillations",
        K::D(Dim::Time),
        "stopwatch reading",
    ),
    (
        "spring.model.method.timing_uncertainty",
        "Timing uncertainty",
        K::D(Dim::Time),
        "blank: 0.1 s for a hand stopwatch",
    ),
    (
        "spring.model.method.spring_mass",
        "Spring mass",
        K::D(Dim::Mass),
        "blank: ignored",
    ),
    (
        "spring.model.method.length_1",
        "First length",
        K::D(Dim::Length),
        "installed length at the first reading",
    ),
    (
        "spring.model.method.force_1",
        "Force at the first length",
        K::D(Dim::Force),
        "gauge reading",
    ),
    (
        "spring.model.method.length_2",
        "Second length",
        K::D(Dim::Length),
        "installed length at the second reading",
    ),
    (
        "spring.model.method.force_2",
        "Force at the second length",
        K::D(Dim::Force),
        "gauge reading",
    ),
    (
        "spring.model.method.force_uncertainty",
        "Force reading uncertainty",
        K::D(Dim::Force),
        "standard uncertainty of one reading",
    ),
    (
        "spring.model.method.length_uncertainty",
        "Length reading uncertainty",
        K::D(Dim::Length),
        "standard uncertainty of one reading",
    ),
    (
        "spring.mount.deflection_at_latch",
        "Spring deflection when latched",
        K::Q,
        "how far the spring is compressed, stretched or wound with the part latched",
    ),
    (
        "spring.mount.frame_x",
        "Frame pin, horizontal",
        K::D(Dim::Length),
        "from the hinge axis",
    ),
    (
        "spring.mount.frame_y",
        "Frame pin, vertical",
        K::D(Dim::Length),
        "from the hinge axis",
    ),
    (
        "spring.mount.part_radius",
        "Part pin from the hinge",
        K::D(Dim::Length),
        "distance of the strut's pin on the part",
    ),
    (
        "spring.mount.part_angle",
        "Part pin angle at the latch",
        K::D(Dim::Angle),
        "in the plane of rotation",
    ),
    (
        "spring.mount.free_length",
        "Strut length at zero deflection",
        K::D(Dim::Length),
        "pin to pin, spring free or gas spring fully extended",
    ),
    (
        "states.*.deflection",
        "Spring deflection in this state",
        K::Q,
        "e.g. a maintenance position",
    ),
    (
        "contact.restitution",
        "Coefficient of restitution",
        K::D(Dim::Ratio),
        "rebound speed over impact speed; blank: the buffer's own unloading",
    ),
    (
        "contact.radius",
        "Buffer radius from the hinge",
        K::D(Dim::Length),
        "blank: at the closing edge",
    ),
    (
        "contact.law.rate",
        "Buffer rate",
        K::D(Dim::LinearRate),
        "per buffer",
    ),
    (
        "contact.law.stroke",
        "Buffer stroke",
        K::D(Dim::Length),
        "usable stroke",
    ),
    (
        "contact.law.force_at_stroke",
        "Force at full stroke",
        K::D(Dim::Force),
        "per buffer, from its curve",
    ),
    (
        "contact.law.exponent",
        "Progression exponent n",
        K::D(Dim::Ratio),
        "F = a·xⁿ; 1 linear, above 1 progressive",
    ),
    (
        "contact.law.force",
        "Force level",
        K::D(Dim::Force),
        "set force of the absorber or brake",
    ),
    (
        "contact.law.efficiency",
        "Efficiency η",
        K::D(Dim::Ratio),
        "energy over peak force × stroke; blank: 0.9",
    ),
    (
        "contact.law.coefficient",
        "Orifice coefficient c",
        K::D(Dim::QuadraticDamping),
        "F = c·v²",
    ),
    (
        "contact.law.preload_deflection",
        "Preload deflection",
        K::D(Dim::Length),
        "buffer spring deflection before contact",
    ),
    (
        "contact.area.length",
        "Contact edge length",
        K::D(Dim::Length),
        "length of the edge that meets the body",
    ),
    (
        "contact.area.width",
        "Contact width",
        K::D(Dim::Length),
        "width of the edge in contact",
    ),
    (
        "contact.area.diameter",
        "Contact diameter",
        K::D(Dim::Length),
        "of a round contact face",
    ),
    (
        "contact.area.area",
        "Contact area",
        K::D(Dim::Area),
        "given directly",
    ),
    (
        "contact.padding.stiffness",
        "Padding stiffness",
        K::D(Dim::LinearRate),
        "over the contact area",
    ),
    (
        "contact.padding.thickness",
        "Padding thickness",
        K::D(Dim::Length),
        "before it is squeezed flat",
    ),
    (
        "gap.geometry.gap",
        "Gap left at the closing point",
        K::D(Dim::Length),
        "designed clearance that stays",
    ),
    (
        "gap.geometry.gap_at_buffer_contact",
        "Gap at first buffer contact",
        K::D(Dim::Length),
        "clearance when the part first touches the buffer",
    ),
    (
        "limits.lift_en81.rated_speed",
        "Rated speed of the car",
        K::D(Dim::Speed),
        "EN 81-20",
    ),
    (
        "limits.lift_us.rated_speed",
        "Rated speed",
        K::D(Dim::Speed),
        "ft/min or m/s",
    ),
    (
        "limits.crane.rated_speed",
        "Rated load speed",
        K::D(Dim::Speed),
        "bridge or trolley",
    ),
    (
        "limits.gate.gap_width",
        "Gap width at the measuring point",
        K::D(Dim::Length),
        "EN 12453 opening width",
    ),
    (
        "limits.user.*.threshold",
        "Limit value",
        K::D(Dim::Ratio),
        "in the kind of the chosen figure",
    ),
    (
        "sizing.peak_force",
        "Highest peak force",
        K::D(Dim::Force),
        "blank: no limit",
    ),
    (
        "sizing.peak_deceleration",
        "Highest peak deceleration",
        K::D(Dim::Acceleration),
        "m/s² or g; blank: no limit",
    ),
    (
        "sizing.mean_deceleration",
        "Highest mean deceleration",
        K::D(Dim::Acceleration),
        "m/s² or g; blank: no limit",
    ),
    (
        "sizing.stroke",
        "Stroke available",
        K::D(Dim::Length),
        "blank: no limit",
    ),
    (
        "cycles_per_hour",
        "Releases per hour",
        K::D(Dim::Frequency),
        "for the buffer's heat load",
    ),
];

/// Normalise a path for the table: list indices become `*`, members of a
/// combination and a buffer's own spring read like the main spring.
fn normalise(path: &str) -> String {
    let mut segs: Vec<&str> = path.split('.').collect();
    // `spring.model.members.0.members.1.rate` → `spring.model.rate`.
    let mut i = 0;
    while let (Some(&a), Some(b)) = (segs.get(i), segs.get(i + 1)) {
        if a == "members" && b.parse::<usize>().is_ok() {
            segs.drain(i..i + 2);
        } else {
            i += 1;
        }
    }
    let mut p = segs
        .iter()
        .map(|s| if s.parse::<usize>().is_ok() { "*" } else { s })
        .collect::<Vec<_>>()
        .join(".");
    if let Some(rest) = p.strip_prefix("contact.law.model.") {
        p = format!("spring.model.{rest}");
    }
    if let Some(rest) = p.strip_prefix("spring.model.cross_check.") {
        p = format!("spring.model.method.{rest}");
    }
    p
}

/// What the field at `path` is, with coordinate-dependent kinds resolved for
/// `coordinate`: for the part's fields, rotary for a hinged part; for the
/// spring's fields and the states, rotary for a torsion spring at a hinge
/// (a strut's spring is linear). `None` for a path that is not a numeric
/// input.
pub fn info(path: &str, coordinate: Coordinate) -> Option<FieldInfo> {
    let key = normalise(path);
    let (_, label, kind, help) = TABLE.iter().find(|(p, ..)| *p == key)?;
    let rotary = coordinate == Coordinate::Rotary;
    let dim = match kind {
        K::D(d) => *d,
        K::Q if rotary => Dim::Angle,
        K::Q => Dim::Length,
        K::F if rotary => Dim::Torque,
        K::F => Dim::Force,
        K::R if rotary => Dim::TorsionalRate,
        K::R => Dim::LinearRate,
    };
    // A buffer's spring is always linear; its coordinate-dependent fields
    // follow.
    let dim = if path.starts_with("contact.law.model.") {
        match dim {
            Dim::Angle => Dim::Length,
            Dim::Torque => Dim::Force,
            Dim::TorsionalRate => Dim::LinearRate,
            d => d,
        }
    } else {
        dim
    };
    Some(FieldInfo {
        label,
        dim,
        default_unit: default_unit(dim),
        help,
    })
}

/// Every path pattern in the table (for front ends that list the fields).
pub fn patterns() -> impl Iterator<Item = &'static str> {
    TABLE.iter().map(|(p, ..)| *p)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::scenario::demos;
    use crate::scenario::reader::Reader;
    use crate::scenario::resolve::resolve;

    #[test]
    fn every_input_of_every_demo_has_a_label_and_the_kind_the_core_reads() {
        for d in demos::all() {
            let s = (d.build)();
            let rotating = matches!(s.part, crate::scenario::PartInput::Rotating(_));
            let mut r = Reader::record();
            let _ = resolve(&s, &mut r);
            for rec in r.records.iter().filter(|rec| !rec.text.is_empty()) {
                let coord = if rotating && !rec.path.starts_with("contact.") {
                    Coordinate::Rotary
                } else {
                    Coordinate::Linear
                };
                let fi = info(&rec.path, coord)
                    .unwrap_or_else(|| panic!("{}: no label for {}", d.key, rec.path));
                if !rec.path.starts_with("limits.user") {
                    assert_eq!(fi.dim, rec.dim, "{}: {}", d.key, rec.path);
                }
            }
        }
    }

    #[test]
    fn indices_members_and_buffer_springs_normalise() {
        assert_eq!(
            normalise("spring.model.members.1.loading.3.force"),
            "spring.model.loading.*.force"
        );
        assert_eq!(
            normalise("contact.law.model.nominal_force"),
            "spring.model.nominal_force"
        );
        let f = info("spring.model.rate", Coordinate::Rotary).unwrap();
        assert_eq!(f.dim, Dim::TorsionalRate);
        assert_eq!(info("no.such.field", Coordinate::Linear), None);
    }
}
