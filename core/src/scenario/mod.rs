//! The scenario: the whole description of one assessment, exactly as the user
//! entered it, in a versioned format (JSON through serde).
//!
//! Every numeric input is a [`Value`]: the text as typed (`"12,5 mm"`), its SI
//! value, and an optional tolerance. Choices are enums. The scenario is read
//! into SI models by [`resolve`] (collecting every input error with its field
//! path, so one bad field hides only the figures that depend on it), and
//! assessed by [`crate::assess::assess`].
//!
//! Format history and migration: see [`migrate`]. The current version is
//! [`SCHEMA_VERSION`]; a file of an older version is upgraded on load by
//! [`Scenario::from_json`], a newer one is refused with a message.

// The input types are plain data, built once per assessment and kept whole
// in files; boxing the larger enum variants would only make them harder to
// write by hand.
#![allow(clippy::large_enum_variant)]

pub mod demos;
pub mod fields;
pub mod migrate;
pub mod reader;
pub mod resolve;
pub mod value;

pub use value::{Spread, Value};

use crate::limits::body::BodyRegion as RegionId;
use crate::limits::crane::CraneTravel;
use crate::limits::gaps::BodyPart;
use crate::limits::guards::GuardKind;
use crate::limits::lift::{En81BufferType, UsBufferType, UsInstallation};
use crate::limits::Comparison;
use crate::spring::disc::DiscConstant;
use crate::spring::gas::ForceReference;
use crate::spring::helical::{EndType, Seating};
use crate::spring::material::Grade;
use crate::spring::Axis;
use crate::units::UnitSystem;
use serde::{Deserialize, Serialize};

/// Version of the scenario format written by this program.
pub const SCHEMA_VERSION: u32 = 1;

macro_rules! schema_attr {
    ($($item:item)*) => {
        $(
            #[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
            #[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
            // A misspelt field in a hand-edited file is refused, never
            // silently ignored.
            #[serde(deny_unknown_fields)]
            $item
        )*
    };
}

schema_attr! {
    /// One assessment.
    pub struct Scenario {
        /// Format version ([`SCHEMA_VERSION`]).
        pub schema_version: u32,
        /// Who, what, where, when.
        #[serde(default)]
        pub identity: Identity,
        /// Units the figures are shown in (never changes what was typed).
        #[serde(default)]
        pub display_units: UnitSystem,
        /// What moves.
        pub part: PartInput,
        /// The spring that stores the energy, and how it is mounted; `None`
        /// for a part moved by a drive or gravity alone.
        #[serde(default)]
        pub spring: Option<SpringInput>,
        /// Further named spring states (e.g. a maintenance position), by
        /// spring deflection.
        #[serde(default)]
        pub states: Vec<StateInput>,
        /// What the part meets at the end of its travel.
        #[serde(default)]
        pub contact: ContactInput,
        /// The gap left at the closing point, checked against body parts.
        #[serde(default)]
        pub gap: Option<GapInput>,
        /// The limit sets that apply.
        #[serde(default)]
        pub limits: LimitsInput,
        /// Buffer sizing from limits, for the same impact.
        #[serde(default)]
        pub sizing: Option<SizingSpec>,
        /// Tolerance study settings.
        #[serde(default)]
        pub study: StudyInput,
        /// Release cycles per hour (heat load of the buffer), blank for none.
        #[serde(default)]
        pub cycles_per_hour: Option<Value>,
    }

    /// The assessment's identity, printed in the report's title block.
    #[derive(Default)]
    pub struct Identity {
        /// Title, e.g. "Hopper lid, line 2".
        #[serde(default)]
        pub title: String,
        /// Machine tag or asset number.
        #[serde(default)]
        pub machine_tag: String,
        /// Location (plant, line, cell).
        #[serde(default)]
        pub location: String,
        /// Person making the assessment.
        #[serde(default)]
        pub assessor: String,
        /// Date of the assessment as entered (ISO 8601 preferred).
        #[serde(default)]
        pub date: String,
        /// Revision.
        #[serde(default)]
        pub revision: String,
        /// Free notes.
        #[serde(default)]
        pub notes: String,
    }

    /// What moves.
    #[serde(tag = "kind", rename_all = "snake_case")]
    pub enum PartInput {
        /// A part sliding along a straight path.
        Translating(TranslatingInput),
        /// A part turning about a hinge.
        Rotating(RotatingInput),
    }

    /// A sliding part.
    pub struct TranslatingInput {
        /// Moving mass without the spring (kg).
        pub mass: Value,
        /// Travel from the latched position to the contact point (mm).
        pub travel: Value,
        /// Incline of the direction of travel above the horizontal (deg):
        /// 90° moves straight up, −90° falls straight down. Blank: 0.
        #[serde(default)]
        pub incline: Option<Value>,
        /// Friction opposing the motion.
        #[serde(default)]
        pub friction: FrictionInput,
        /// Viscous damping coefficient (N·s/m). Blank: none.
        #[serde(default)]
        pub damping: Option<Value>,
        /// Constant drive force along the travel, towards contact (N).
        /// Blank: none.
        #[serde(default)]
        pub drive_force: Option<Value>,
        /// Add the spring's effective mass share (one third of a helical
        /// spring's mass) to the moving mass.
        #[serde(default = "yes")]
        pub include_spring_mass: bool,
    }

    /// Friction of a sliding part.
    #[derive(Default)]
    #[serde(tag = "kind", rename_all = "snake_case")]
    pub enum FrictionInput {
        /// None.
        #[default]
        None,
        /// Coefficient times the normal force from the incline.
        Coefficient {
            /// Coulomb coefficient μ.
            mu: Value,
        },
        /// A fixed friction force (N), e.g. measured with a force gauge.
        Force {
            /// Force (N).
            force: Value,
        },
    }

    /// A hinged part.
    pub struct RotatingInput {
        /// Moment of inertia about the hinge, directly or from a shape.
        pub inertia: InertiaInput,
        /// Angle between the hinge axis and the vertical (deg): 90° for a
        /// horizontal hinge (full gravity torque), 0° for a vertical hinge
        /// (none). Blank: 90°.
        #[serde(default)]
        pub hinge_tilt: Option<Value>,
        /// Angle of the hinge-to-centre-of-mass line above the horizontal in
        /// the latched position (deg), in the plane of rotation with travel
        /// towards contact turning upwards from +x. Blank: 0.
        #[serde(default)]
        pub cg_angle_at_latch: Option<Value>,
        /// Angle turned from the latched position to contact (deg).
        pub travel: Value,
        /// Friction torque at the hinge (N·m). Blank: none.
        #[serde(default)]
        pub friction_torque: Option<Value>,
        /// Constant drive torque towards contact (N·m). Blank: none.
        #[serde(default)]
        pub drive_torque: Option<Value>,
        /// Radius of the hazard point (closing edge) from the hinge axis (mm).
        pub hazard_radius: Value,
    }

    /// Moment of inertia of a hinged part.
    #[serde(tag = "shape", rename_all = "snake_case")]
    pub enum InertiaInput {
        /// Given directly.
        Given {
            /// Moment of inertia about the hinge (kg·m²).
            inertia: Value,
            /// Mass (kg).
            mass: Value,
            /// Distance of the centre of mass from the hinge (mm).
            cg_radius: Value,
        },
        /// Uniform plate hinged along one edge: I = m·w²/3.
        Plate {
            /// Mass (kg).
            mass: Value,
            /// Width from the hinge to the far edge (mm).
            width: Value,
        },
        /// Slender rod pivoted at one end: I = m·L²/3.
        Rod {
            /// Mass (kg).
            mass: Value,
            /// Length (mm).
            length: Value,
        },
        /// Disc about its centre: I = m·R²/2.
        Disc {
            /// Mass (kg).
            mass: Value,
            /// Radius (mm).
            radius: Value,
        },
        /// Point mass at a radius: I = m·r².
        Point {
            /// Mass (kg).
            mass: Value,
            /// Radius (mm).
            radius: Value,
        },
        /// Known inertia about the centre of mass, offset from the hinge.
        Offset {
            /// Mass (kg).
            mass: Value,
            /// Moment of inertia about the centre of mass (kg·m²).
            inertia_about_cg: Value,
            /// Distance of the centre of mass from the hinge (mm).
            distance: Value,
        },
    }

    /// The spring and how it is mounted.
    pub struct SpringInput {
        /// The spring's force law.
        pub model: SpringModelInput,
        /// How its deflection follows the part.
        pub mount: MountInput,
    }

    /// A spring model, with inputs as typed.
    #[serde(tag = "model", rename_all = "snake_case")]
    pub enum SpringModelInput {
        /// Linear spring from its rate.
        Linear {
            /// Rate (N/mm).
            rate: Value,
            /// Largest admissible deflection (mm).
            max_deflection: Value,
        },
        /// Helical compression spring from its geometry (EN 13906-1).
        Helical(HelicalInput),
        /// Extension spring with initial tension.
        Extension {
            /// Initial tension F₀ (N).
            initial_tension: Value,
            /// Rate (N/mm).
            rate: Value,
            /// Largest admissible extension (mm).
            max_deflection: Value,
        },
        /// Torsion spring from its rate per radian or degree.
        Torsion {
            /// Rate (N·mm/deg or N·m/rad).
            rate: Value,
            /// Largest admissible wind-up angle (deg).
            max_angle: Value,
        },
        /// Gas spring (gas strut).
        Gas {
            /// Nominal (extended) force F₁ (N).
            nominal_force: Value,
            /// Progression F₂/F₁ over the stroke.
            progression: Value,
            /// Stroke (mm).
            stroke: Value,
            /// Friction band: compression minus extension force (N). Blank: 0.
            #[serde(default)]
            friction_band: Option<Value>,
            /// Which curve the nominal force is read on.
            #[serde(default = "extension_curve")]
            force_reference: ForceReference,
            /// Polytropic index κ (1 isothermal … 1.4 adiabatic). Blank: 1.
            #[serde(default)]
            polytropic_index: Option<Value>,
        },
        /// Disc-spring stack (EN 16984, Almen–László).
        Disc(DiscInput),
        /// Measured force–deflection table.
        Table(TableInput),
        /// A linear spring whose rate was measured in the field.
        Measured(MeasuredInput),
        /// Springs in series (shared force, deflections add).
        Series {
            /// The members.
            members: Vec<SpringModelInput>,
        },
        /// Springs in parallel (forces add).
        Parallel {
            /// The members.
            members: Vec<SpringModelInput>,
        },
    }

    /// Helical compression spring geometry.
    pub struct HelicalInput {
        /// Wire diameter d (mm).
        pub wire_diameter: Value,
        /// Coil diameter (mm), mean unless `diameter_kind` says otherwise.
        pub coil_diameter: Value,
        /// Whether the coil diameter is the mean, outside or inside one.
        #[serde(default)]
        pub diameter_kind: DiameterKind,
        /// Active coils n.
        pub active_coils: Value,
        /// Total coils n_t. Blank: from the end type.
        #[serde(default)]
        pub total_coils: Option<Value>,
        /// End type.
        pub ends: EndType,
        /// Free length L₀ (mm).
        pub free_length: Value,
        /// Material.
        pub material: Grade,
        /// Seating of the ends (buckling).
        #[serde(default = "default_seating")]
        pub seating: Seating,
    }

    /// Disc-spring stack.
    pub struct DiscInput {
        /// Outside diameter D_e (mm).
        pub outer_diameter: Value,
        /// Inside diameter D_i (mm).
        pub inner_diameter: Value,
        /// Thickness t (mm).
        pub thickness: Value,
        /// Free cone height h₀ (mm).
        pub cone_height: Value,
        /// Discs stacked in series (alternating).
        pub in_series: u32,
        /// Discs nested in parallel per group.
        pub in_parallel: u32,
        /// Young's modulus (N/mm²). Blank: 206 000.
        #[serde(default)]
        pub youngs_modulus: Option<Value>,
        /// Poisson's ratio. Blank: 0.3.
        #[serde(default)]
        pub poisson_ratio: Option<Value>,
    }

    /// Measured force–deflection table.
    pub struct TableInput {
        /// Linear (N, mm) or rotary (N·m, deg).
        pub axis: Axis,
        /// Loading curve, deflections increasing.
        pub loading: Vec<PointInput>,
        /// Unloading curve (optional, for hysteresis).
        #[serde(default)]
        pub unloading: Vec<PointInput>,
    }

    /// One measured point.
    pub struct PointInput {
        /// Deflection (mm or deg).
        pub deflection: Value,
        /// Force (N) or torque (N·m).
        pub force: Value,
    }

    /// A linear spring identified in the field.
    pub struct MeasuredInput {
        /// How the rate was measured.
        pub method: IdentifyInput,
        /// A second measurement of the same spring by another method, to
        /// compare with (disagreement beyond 2 combined standard
        /// uncertainties is flagged with its likely causes).
        #[serde(default)]
        pub cross_check: Option<IdentifyInput>,
        /// Largest admissible deflection (mm).
        pub max_deflection: Value,
    }

    /// Field identification methods.
    #[serde(tag = "method", rename_all = "snake_case")]
    pub enum IdentifyInput {
        /// Known mass hung on the spring, sag measured: k = m·g/δ.
        Static {
            /// Mass (kg), with its tolerance as the uncertainty.
            mass: Value,
            /// Measured sag (mm).
            sag: Value,
            /// Reading resolution of the sag (mm), ± half-width.
            resolution: Value,
        },
        /// Known mass bouncing on the spring: k = 4π²(m + m_s/3)/T².
        Dynamic {
            /// Mass (kg).
            mass: Value,
            /// Number of full oscillations timed.
            oscillations: Value,
            /// Time for those oscillations (s).
            time: Value,
            /// Timing uncertainty (s). Blank: 0.1 s (hand stopwatch).
            #[serde(default)]
            timing_uncertainty: Option<Value>,
            /// Spring mass (kg). Blank: ignored.
            #[serde(default)]
            spring_mass: Option<Value>,
        },
        /// Forces read with a gauge at two lengths.
        TwoPoint {
            /// First length (mm).
            length_1: Value,
            /// Force at the first length (N).
            force_1: Value,
            /// Second length (mm).
            length_2: Value,
            /// Force at the second length (N).
            force_2: Value,
            /// Uncertainty of a force reading (N).
            force_uncertainty: Value,
            /// Uncertainty of a length reading (mm).
            length_uncertainty: Value,
        },
    }

    /// How the spring is mounted.
    #[serde(tag = "kind", rename_all = "snake_case")]
    pub enum MountInput {
        /// Along the sliding part's path, or a torsion spring at the hinge:
        /// the deflection changes one-for-one with the travel.
        Direct {
            /// Spring deflection in the latched position (mm or deg).
            deflection_at_latch: Value,
            /// Whether the spring drives the part (unloads) or resists it.
            #[serde(default)]
            sense: SenseInput,
            /// The part only bears on the spring and leaves it at its free
            /// length (an ejector); otherwise the spring is attached.
            #[serde(default)]
            detaches: bool,
        },
        /// A linear or gas spring pinned between the frame and a hinged part.
        Strut {
            /// Frame pin, horizontal coordinate from the hinge (mm).
            frame_x: Value,
            /// Frame pin, vertical coordinate from the hinge (mm).
            frame_y: Value,
            /// Distance of the part pin from the hinge (mm).
            part_radius: Value,
            /// Angle of the part pin in the latched position (deg).
            part_angle: Value,
            /// Pin-to-pin length at which the spring is free or fully
            /// extended (mm).
            free_length: Value,
            /// Compression (gas strut) or extension spring.
            #[serde(default)]
            mode: StrutModeInput,
        },
    }

    /// A further named state of the spring.
    pub struct StateInput {
        /// Name, e.g. "Maintenance position".
        pub name: String,
        /// Spring deflection in that state (mm or deg).
        pub deflection: Value,
    }

    /// What the part meets at the end of its travel.
    #[derive(Default)]
    #[serde(tag = "kind", rename_all = "snake_case")]
    pub enum ContactInput {
        /// Nothing modelled: release figures only.
        #[default]
        None,
        /// An end-of-travel buffer.
        Buffer(BufferInput),
        /// A human body region (two-body contact).
        Body(BodyInput),
    }

    /// End-of-travel buffer.
    pub struct BufferInput {
        /// The buffer's force law.
        pub law: BufferLawInput,
        /// Identical buffers acting together. Blank: 1.
        #[serde(default = "one")]
        pub count: u32,
        /// Coefficient of restitution for the rebound; blank: the buffer's
        /// own unloading law.
        #[serde(default)]
        pub restitution: Option<Value>,
        /// Hinged part only: radius at which the buffer acts (mm). Blank:
        /// the hazard radius.
        #[serde(default)]
        pub radius: Option<Value>,
    }

    /// Buffer force laws.
    #[serde(tag = "type", rename_all = "snake_case")]
    pub enum BufferLawInput {
        /// Linear spring buffer F = k·x.
        Linear {
            /// Rate (N/mm).
            rate: Value,
            /// Usable stroke (mm).
            stroke: Value,
        },
        /// Progressive elastomer F = a·xⁿ, given by its force at full stroke.
        PowerLaw {
            /// Force at full stroke (N).
            force_at_stroke: Value,
            /// Exponent n (1 linear, > 1 progressive).
            exponent: Value,
            /// Usable stroke (mm).
            stroke: Value,
        },
        /// A spring model as the buffer (measured table with unloading, gas
        /// spring…).
        Spring {
            /// The buffer's spring.
            model: SpringModelInput,
            /// Its deflection before contact (mm). Blank: 0.
            #[serde(default)]
            preload_deflection: Option<Value>,
        },
        /// Constant force (set hydraulic absorber, friction brake).
        ConstantForce {
            /// Force (N).
            force: Value,
            /// Usable stroke (mm).
            stroke: Value,
        },
        /// Self-adjusting hydraulic absorber.
        Absorber {
            /// Stroke (mm).
            stroke: Value,
            /// Efficiency η = E/(F_max·s). Blank: 0.9.
            #[serde(default)]
            efficiency: Option<Value>,
        },
        /// Orifice damper F = c·v².
        Orifice {
            /// Coefficient c (N·s²/m²).
            coefficient: Value,
            /// Usable stroke (mm).
            stroke: Value,
        },
    }

    /// Contact with a body region.
    pub struct BodyInput {
        /// The body region (ISO/TS 15066 Table A.2/A.3 list).
        pub region: RegionId,
        /// Specific area key within the region for the pressure limit.
        #[serde(default)]
        pub specific_area: Option<String>,
        /// Shape of the contact area.
        pub area: AreaInput,
        /// Padding on the part's edge, if any.
        #[serde(default)]
        pub padding: Option<PaddingInput>,
    }

    /// Contact area shapes.
    #[serde(tag = "shape", rename_all = "snake_case")]
    pub enum AreaInput {
        /// An edge of a length pressing with a width.
        Edge {
            /// Edge length in contact (mm).
            length: Value,
            /// Contact width (mm).
            width: Value,
        },
        /// A circular face.
        Circle {
            /// Diameter (mm).
            diameter: Value,
        },
        /// An area given directly (mm² or cm²).
        Given {
            /// Area.
            area: Value,
        },
    }

    /// Padding in series with the body.
    pub struct PaddingInput {
        /// Compressive stiffness over the contact area (N/mm).
        pub stiffness: Value,
        /// Thickness it can yield before it is flat (mm). Blank: never flat.
        #[serde(default)]
        pub thickness: Option<Value>,
    }

    /// Gap at the closing point.
    pub struct GapInput {
        /// How the gap arises.
        pub geometry: GapGeometryInput,
        /// Body parts that can reach the closing point.
        pub body_parts: Vec<BodyPart>,
    }

    /// Geometry of the closing point.
    #[serde(tag = "kind", rename_all = "snake_case")]
    pub enum GapGeometryInput {
        /// The parts meet: no gap.
        Closed,
        /// A clearance that stays (mm).
        Clearance {
            /// Gap (mm).
            gap: Value,
        },
        /// A buffer stops the part: gap at first buffer contact less the
        /// buffer stroke used.
        BufferStop {
            /// Gap when the part first touches the buffer (mm).
            gap_at_buffer_contact: Value,
        },
    }

    /// The limit sets that apply, with their options.
    pub struct LimitsInput {
        /// Guard force and energy limits.
        #[serde(default)]
        pub guard: Option<GuardChoice>,
        /// Body-region limits for the body contact (on by default when the
        /// contact is a body region).
        #[serde(default = "yes")]
        pub body_region: bool,
        /// Lift buffer rules, EN 81-20.
        #[serde(default)]
        pub lift_en81: Option<En81Choice>,
        /// Lift and hoist buffer rules, US (Cal. Code Regs. Title 8).
        #[serde(default)]
        pub lift_us: Option<UsLiftChoice>,
        /// Crane bumper rules (29 CFR 1910.179).
        #[serde(default)]
        pub crane: Option<CraneChoice>,
        /// Power-operated door and gate force limits (EN 12453).
        #[serde(default)]
        pub gate: Option<GateChoice>,
        /// The user's own limits.
        #[serde(default)]
        pub user: Vec<UserLimitInput>,
    }

    /// Guard limit options.
    pub struct GuardChoice {
        /// Power-operated or self-closing.
        pub kind: GuardKind,
        /// A protective device (pressure-sensitive edge…) stops or reverses
        /// the guard on contact.
        #[serde(default)]
        pub protective_device: bool,
    }

    /// EN 81-20 lift buffer options.
    pub struct En81Choice {
        /// Buffer type.
        pub buffer_type: En81BufferType,
        /// Rated speed of the car (m/s).
        pub rated_speed: Value,
    }

    /// US lift or hoist buffer options.
    pub struct UsLiftChoice {
        /// Elevator or construction hoist.
        pub installation: UsInstallation,
        /// Spring or oil buffer.
        pub buffer_type: UsBufferType,
        /// Rated speed (ft/min or m/s).
        pub rated_speed: Value,
        /// A terminal speed limiting device is fitted (hoists).
        #[serde(default)]
        pub terminal_speed_limiter: bool,
    }

    /// Crane bumper options.
    pub struct CraneChoice {
        /// Bridge or trolley.
        pub travel: CraneTravel,
        /// Rated load speed (ft/min or m/s).
        pub rated_speed: Value,
    }

    /// Door or gate options.
    pub struct GateChoice {
        /// Width of the gap at the measuring point (mm).
        pub gap_width: Value,
    }

    /// A limit of the user's own.
    pub struct UserLimitInput {
        /// Name shown beside the check.
        pub name: String,
        /// Figure id it applies to (e.g. `impact.peak_force`).
        pub figure: String,
        /// Threshold, in the figure's kind of quantity.
        pub threshold: Value,
        /// At most or at least.
        pub comparison: Comparison,
        /// Where the limit comes from.
        #[serde(default)]
        pub source: String,
    }

    /// Buffer sizing request.
    pub struct SizingSpec {
        /// Highest peak force (N). Blank: no limit.
        #[serde(default)]
        pub peak_force: Option<Value>,
        /// Highest peak deceleration (m/s² or g). Blank: no limit.
        #[serde(default)]
        pub peak_deceleration: Option<Value>,
        /// Highest mean deceleration (m/s² or g). Blank: no limit.
        #[serde(default)]
        pub mean_deceleration: Option<Value>,
        /// Stroke available (mm). Blank: no limit.
        #[serde(default)]
        pub stroke: Option<Value>,
    }

    /// Tolerance study settings.
    pub struct StudyInput {
        /// Run the Monte Carlo study.
        #[serde(default)]
        pub monte_carlo: bool,
        /// Number of samples.
        #[serde(default = "default_samples")]
        pub samples: u32,
        /// Seed of the generator (same seed, same report).
        #[serde(default = "default_seed")]
        pub seed: u64,
    }
}

/// How a coil diameter was measured.
#[derive(Debug, Clone, Copy, Default, PartialEq, Eq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
#[serde(rename_all = "snake_case")]
pub enum DiameterKind {
    /// Mean coil diameter D.
    #[default]
    Mean,
    /// Outside diameter D_e = D + d.
    Outside,
    /// Inside diameter D_i = D − d.
    Inside,
}

/// Whether a directly mounted spring drives or resists the part.
#[derive(Debug, Clone, Copy, Default, PartialEq, Eq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
#[serde(rename_all = "snake_case")]
pub enum SenseInput {
    /// Deflection falls as the part travels: the spring drives it.
    #[default]
    Unloads,
    /// Deflection grows as the part travels: the spring resists it.
    Loads,
}

/// A strut spring's working sense.
#[derive(Debug, Clone, Copy, Default, PartialEq, Eq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
#[serde(rename_all = "snake_case")]
pub enum StrutModeInput {
    /// Compression or gas spring.
    #[default]
    Compression,
    /// Extension spring.
    Extension,
}

impl Default for LimitsInput {
    fn default() -> Self {
        Self {
            guard: None,
            body_region: true,
            lift_en81: None,
            lift_us: None,
            crane: None,
            gate: None,
            user: Vec::new(),
        }
    }
}

impl Default for StudyInput {
    fn default() -> Self {
        Self {
            monte_carlo: false,
            samples: default_samples(),
            seed: default_seed(),
        }
    }
}

fn yes() -> bool {
    true
}
fn one() -> u32 {
    1
}
fn extension_curve() -> ForceReference {
    ForceReference::Extension
}
fn default_seating() -> Seating {
    Seating::BothFixed
}
/// Most Monte Carlo samples a scenario may ask for: every sample of every
/// figure the study follows is kept for exact percentiles, and 500 000 ×
/// the followed figures stays within the study's memory bound (checked at
/// compile time in `assess`). More samples would be silently skipped.
pub const MAX_STUDY_SAMPLES: u32 = 500_000;

fn default_samples() -> u32 {
    10_000
}
fn default_seed() -> u64 {
    20_261_202
}

/// Why a scenario file could not be read.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct FileError {
    /// Dotted path of the offending field (`part.mass`), or empty for the
    /// file as a whole.
    pub path: String,
    /// What is wrong, in words.
    pub message: String,
}

impl std::fmt::Display for FileError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        if self.path.is_empty() {
            write!(f, "{}", self.message)
        } else {
            write!(f, "{}: {}", self.path, self.message)
        }
    }
}

/// Largest scenario file read, in bytes (4 MiB). A scenario with every
/// section filled and long measured tables is a few tens of kilobytes; a
/// larger file is not a scenario (or carries a pasted document), and
/// refusing it before parsing keeps an import quick on a tablet.
pub const MAX_FILE_BYTES: usize = 4 * 1024 * 1024;

fn file_error(message: impl Into<String>) -> FileError {
    FileError {
        path: String::new(),
        message: message.into(),
    }
}

fn too_large(len: usize) -> FileError {
    // Sizes in MiB for people; the exact limit in the constant's doc.
    let mib = |n: usize| n as f64 / (1024.0 * 1024.0);
    file_error(format!(
        "the file is {:.1} MB; a scenario file is at most {:.0} MB, so this is not a Joulewise scenario",
        mib(len),
        mib(MAX_FILE_BYTES)
    ))
}

impl Scenario {
    /// Read a scenario from the bytes of a file: checks the size, refuses
    /// UTF-16 and UTF-32 text and bytes that are not UTF-8 (naming the
    /// first bad byte and its line), skips a UTF-8 byte-order mark, then
    /// reads the text with [`Scenario::from_json`].
    ///
    /// # Errors
    /// An empty or oversized file, text in another encoding, and everything
    /// [`Scenario::from_json`] refuses.
    pub fn from_bytes(bytes: &[u8]) -> Result<Scenario, FileError> {
        if bytes.len() > MAX_FILE_BYTES {
            return Err(too_large(bytes.len()));
        }
        let bytes = bytes.strip_prefix(b"\xEF\xBB\xBF").unwrap_or(bytes);
        if let Some(name) = utf16_or_32(bytes) {
            return Err(file_error(format!(
                "the file is {name} text; a scenario file is UTF-8: save it again as UTF-8"
            )));
        }
        match std::str::from_utf8(bytes) {
            Ok(text) => Self::from_json(text),
            Err(e) => {
                let at = e.valid_up_to();
                let line = 1 + bytes
                    .get(..at)
                    .map_or(0, |b| b.iter().filter(|&&c| c == b'\n').count());
                let byte = bytes.get(at).copied().unwrap_or(0);
                Err(file_error(format!(
                    "not UTF-8 text: byte 0x{byte:02X} at offset {at} (line {line}) cannot be read; \
                     a scenario file is UTF-8 JSON (a file saved as Latin-1 or Windows-1252 must \
                     be saved again as UTF-8, and a binary file is not a scenario)"
                )))
            }
        }
    }

    /// Read a scenario from JSON text, migrating an older format version.
    ///
    /// # Errors
    /// Empty or oversized text, malformed JSON (truncated files and nesting
    /// deeper than the parser's limit of 128 levels are named as such), a
    /// field of the wrong type or shape (named by its path), an unknown or
    /// newer format version.
    pub fn from_json(text: &str) -> Result<Scenario, FileError> {
        if text.len() > MAX_FILE_BYTES {
            return Err(too_large(text.len()));
        }
        let text = text.strip_prefix('\u{feff}').unwrap_or(text);
        if text.trim().is_empty() {
            return Err(file_error(
                "the file is empty; a scenario file is a JSON object with a \"schema_version\" field",
            ));
        }
        let value: serde_json::Value = serde_json::from_str(text).map_err(|e| {
            let what = if e.is_eof() {
                "the file ends before the JSON does (cut short?)".to_string()
            } else if e.to_string().starts_with("recursion limit exceeded") {
                "brackets nested deeper than any scenario (more than 128 levels)".to_string()
            } else {
                format!("JSON error: {e}")
            };
            file_error(format!(
                "not a readable scenario file at line {}, column {}: {what}",
                e.line(),
                e.column(),
            ))
        })?;
        let value = migrate::to_current(value)?;
        Self::from_value(value)
    }

    /// Read a scenario from an already parsed JSON value of the current
    /// version (no migration).
    ///
    /// # Errors
    /// A field of the wrong type or shape, named by its path; a format
    /// version other than [`SCHEMA_VERSION`] (such a value must go through
    /// [`Scenario::from_json`], which migrates older versions).
    pub fn from_value(value: serde_json::Value) -> Result<Scenario, FileError> {
        let copy = value.clone();
        let s: Scenario = serde_path_to_error::deserialize(value).map_err(|e| {
            // Dotted like the input errors' paths (`states.0.deflection`),
            // not serde's `states[0].deflection`.
            let path = e
                .path()
                .iter()
                .map(|seg| match seg {
                    serde_path_to_error::Segment::Seq { index } => index.to_string(),
                    serde_path_to_error::Segment::Map { key } => key.clone(),
                    serde_path_to_error::Segment::Enum { variant } => variant.clone(),
                    serde_path_to_error::Segment::Unknown => "?".to_string(),
                })
                .collect::<Vec<_>>()
                .join(".");
            let message = e.into_inner().to_string();
            // Inside an internally tagged enum (`"kind": ...`) serde buffers
            // the content and the path stops at the enum; find the offending
            // key or value below it.
            let path = refine_path(&copy, &path, &message).unwrap_or(path);
            FileError { path, message }
        })?;
        if s.schema_version != SCHEMA_VERSION {
            return Err(FileError {
                path: "schema_version".into(),
                message: format!(
                    "format version {} where version {SCHEMA_VERSION} was expected; \
                     read files with Scenario::from_json, which upgrades older versions",
                    s.schema_version
                ),
            });
        }
        Ok(s)
    }

    /// The scenario as pretty JSON with the SI value of every input filled
    /// in beside its text (informative for readers of the file).
    pub fn to_json(&self) -> String {
        let mut s = self.clone();
        resolve::fill_si(&mut s);
        // Serialising plain data structures cannot fail.
        serde_json::to_string_pretty(&s).unwrap_or_default()
    }
}

/// The name of a UTF-16 or UTF-32 encoding, recognised by its byte-order
/// mark or, without one, by the zero bytes ASCII text has in those
/// encodings (`{` as `7B 00` or `00 7B`).
fn utf16_or_32(bytes: &[u8]) -> Option<&'static str> {
    if bytes.starts_with(&[0xFF, 0xFE, 0, 0]) || bytes.starts_with(&[0, 0, 0xFE, 0xFF]) {
        return Some("UTF-32");
    }
    if bytes.starts_with(&[0xFF, 0xFE]) || bytes.starts_with(&[0xFE, 0xFF]) {
        return Some("UTF-16");
    }
    match bytes.get(..2) {
        Some([0, b]) | Some([b, 0]) if b.is_ascii_graphic() || b.is_ascii_whitespace() => {
            Some("UTF-16 (without a byte-order mark)")
        }
        _ => None,
    }
}

/// What an error message from serde names, to be found in the file.
#[derive(Debug, PartialEq)]
enum Quoted {
    /// An unknown field's key.
    Key(String),
    /// A value: a string, a whole number, a number with a fraction, a flag.
    Str(String),
    Int(f64),
    Float(f64),
    Bool(bool),
    Null,
    /// A list where something else was expected.
    Seq,
    /// An object where something else was expected.
    Map,
}

impl Quoted {
    /// The thing a serde message quotes: `unknown field `zz``, `unknown
    /// variant `elbow``, `invalid type: string "12 mm"`, `invalid value:
    /// integer `-1``, `floating point `1.5``, `boolean `true``, `null`.
    fn from_message(message: &str) -> Option<Quoted> {
        let backticked = |rest: &str| rest.split('`').nth(1).map(str::to_string);
        if let Some(rest) = message.strip_prefix("unknown field ") {
            return backticked(rest).map(Quoted::Key);
        }
        if let Some(rest) = message.strip_prefix("unknown variant ") {
            return backticked(rest).map(Quoted::Str);
        }
        let found = message
            .strip_prefix("invalid type: ")
            .or_else(|| message.strip_prefix("invalid value: "))?;
        let found = found.rsplit_once(", expected").map_or(found, |(f, _)| f);
        if let Some(rest) = found.strip_prefix("string ") {
            // serde quotes strings with Rust's escapes; plain text reads as JSON.
            return serde_json::from_str::<String>(rest).ok().map(Quoted::Str);
        }
        let number = |rest: &str| backticked(rest).and_then(|n| n.parse::<f64>().ok());
        if let Some(rest) = found.strip_prefix("integer ") {
            return number(rest).map(Quoted::Int);
        }
        if let Some(rest) = found.strip_prefix("floating point ") {
            return number(rest).map(Quoted::Float);
        }
        if let Some(rest) = found.strip_prefix("boolean ") {
            return backticked(rest).map(|b| Quoted::Bool(b == "true"));
        }
        match found {
            "null" => Some(Quoted::Null),
            "sequence" => Some(Quoted::Seq),
            "map" => Some(Quoted::Map),
            _ => None,
        }
    }

    fn is_value(&self, v: &serde_json::Value) -> bool {
        use serde_json::Value as J;
        match (self, v) {
            (Quoted::Str(a), J::String(b)) => a == b,
            (Quoted::Int(a), J::Number(n)) if !n.is_f64() => n.as_f64() == Some(*a),
            (Quoted::Float(a), J::Number(n)) if n.is_f64() => n.as_f64() == Some(*a),
            (Quoted::Bool(a), J::Bool(b)) => a == b,
            (Quoted::Null, J::Null) | (Quoted::Seq, J::Array(_)) | (Quoted::Map, J::Object(_)) => {
                true
            }
            _ => false,
        }
    }
}

/// Below `path`, the exact field a serde message points at. Inside an
/// internally tagged enum (`"kind": ...`) serde buffers the content and the
/// path it reports stops at the enum (`part`); the message still quotes the
/// offending key or value (`unknown field `zz``, `invalid type: integer
/// `5``), so the subtree is searched for it. Only a single match refines the
/// path, so the refined path is never a guess.
fn refine_path(root: &serde_json::Value, path: &str, message: &str) -> Option<String> {
    let wanted = Quoted::from_message(message)?;
    let mut node = root;
    for seg in path.split('.').filter(|s| !s.is_empty()) {
        node = match node {
            serde_json::Value::Object(m) => m.get(seg)?,
            serde_json::Value::Array(a) => a.get(seg.parse::<usize>().ok()?)?,
            _ => return None,
        };
    }
    fn join(prefix: &str, seg: &str) -> String {
        if prefix.is_empty() {
            seg.to_string()
        } else {
            format!("{prefix}.{seg}")
        }
    }
    fn search(node: &serde_json::Value, wanted: &Quoted, prefix: &str, hits: &mut Vec<String>) {
        // Two hits already make the answer ambiguous: stop looking.
        if hits.len() > 1 {
            return;
        }
        let children: Vec<(String, &serde_json::Value)> = match node {
            serde_json::Value::Object(m) => m.iter().map(|(k, v)| (join(prefix, k), v)).collect(),
            serde_json::Value::Array(a) => a
                .iter()
                .enumerate()
                .map(|(i, v)| (join(prefix, &i.to_string()), v))
                .collect(),
            _ => return,
        };
        for (p, v) in children {
            let key = p.rsplit('.').next().unwrap_or("");
            let hit = match wanted {
                Quoted::Key(k) => node.is_object() && key == k,
                other => other.is_value(v),
            };
            if hit {
                hits.push(p.clone());
            }
            search(v, wanted, &p, hits);
        }
    }
    let mut hits = Vec::new();
    search(node, &wanted, path, &mut hits);
    (hits.len() == 1).then(|| hits.remove(0))
}

#[cfg(test)]
mod tests;
