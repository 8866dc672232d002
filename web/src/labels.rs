//! Labels of the scenario's inputs by their dotted path, in plain words of
//! the trade. One table serves the field labels on the sheet and the
//! reasons a figure is missing (`part.mass: a value is required` reads
//! `Moving mass: a value is required`, with a link to the field), so both
//! always say the same thing.

/// Element id of the control for input `path` (`part.mass` → `f-part-mass`).
pub fn field_dom_id(path: &str) -> String {
    let mut id = String::with_capacity(path.len() + 2);
    id.push_str("f-");
    for c in path.chars() {
        id.push(if c == '.' { '-' } else { c });
    }
    id
}

/// Label of the input at `path`; the path itself when it is not known.
pub fn label_of(path: &str) -> String {
    if let Some(base) = path.strip_suffix(".tol") {
        return format!("{} (tolerance)", label_of(base));
    }
    let segs: Vec<&str> = path.split('.').collect();
    // Members of a combination and the buffer's spring say whose field it is.
    let mut prefix = String::new();
    if path.starts_with("contact.law.model") {
        prefix.push_str("Buffer spring, ");
    }
    for w in segs.windows(2) {
        if w[0] == "members" {
            if let Ok(i) = w[1].parse::<usize>() {
                prefix.push_str(&format!("member {}, ", i + 1));
            }
        }
    }
    let row = |kind: &str, i: &str, what: &str| match i.parse::<usize>() {
        Ok(i) => format!("{kind} point {}, {what}", i + 1),
        Err(_) => path.to_string(),
    };
    let n = segs.len();
    let last = segs.last().copied().unwrap_or("");
    let parent = if n >= 2 { segs[n - 2] } else { "" };
    let grand = if n >= 3 { segs[n - 3] } else { "" };
    let text: String = match (segs.first().copied().unwrap_or(""), parent, last) {
        // Table rows.
        (_, i, "deflection") if grand == "loading" => row("Loading", i, "deflection"),
        (_, i, "force") if grand == "loading" => row("Loading", i, "force"),
        (_, i, "deflection") if grand == "unloading" => row("Unloading", i, "deflection"),
        (_, i, "force") if grand == "unloading" => row("Unloading", i, "force"),
        ("states", i, "deflection") => match i.parse::<usize>() {
            Ok(i) => format!("Spring deflection in further state {}", i + 1),
            Err(_) => path.into(),
        },
        ("limits", i, "threshold") => match i.parse::<usize>() {
            Ok(i) => format!("Own limit {}, value", i + 1),
            Err(_) => path.into(),
        },
        ("limits", i, "figure") => match i.parse::<usize>() {
            Ok(i) => format!("Own limit {}, figure", i + 1),
            Err(_) => path.into(),
        },
        ("part", "inertia", f) => match f {
            "inertia" => "Moment of inertia about the hinge",
            "mass" => "Mass of the part",
            "cg_radius" | "distance" => "Centre of mass, distance from the hinge",
            "width" => "Width from the hinge to the far edge",
            "length" => "Length from the pivot",
            "radius" => "Radius",
            "inertia_about_cg" => "Moment of inertia about its centre of mass",
            _ => return path.into(),
        }
        .into(),
        ("part", "friction", "mu") => "Friction coefficient μ".into(),
        ("part", "friction", "force") => "Friction force".into(),
        ("part", _, f) => match f {
            "mass" => "Moving mass",
            "travel" => "Travel from the latched position to contact",
            "incline" => "Incline of the travel (uphill +, blank: level)",
            "damping" => "Viscous damping (blank: none)",
            "drive_force" => "Drive force towards contact (blank: none)",
            "hinge_tilt" => "Tilt of the hinge axis from vertical (blank: 90°, horizontal hinge)",
            "cg_angle_at_latch" => "Centre of mass above the horizontal when latched (blank: 0°)",
            "friction_torque" => "Friction torque at the hinge (blank: none)",
            "drive_torque" => "Drive torque towards contact (blank: none)",
            "hazard_radius" => "Radius of the closing edge from the hinge",
            _ => return path.into(),
        }
        .into(),
        ("spring", "mount", f) => match f {
            "deflection_at_latch" => "Spring deflection when latched",
            "frame_x" => "Frame pin, across from the hinge (x)",
            "frame_y" => "Frame pin, up from the hinge (y)",
            "part_radius" => "Part pin, distance from the hinge",
            "part_angle" => "Part pin angle when latched",
            "free_length" => "Pin-to-pin length with the spring free",
            "kind" => "Mounting",
            _ => return path.into(),
        }
        .into(),
        ("contact", "area", f) => match f {
            "length" => "Edge length in contact",
            "width" => "Contact width",
            "diameter" => "Diameter of the contact face",
            "area" => "Contact area",
            _ => return path.into(),
        }
        .into(),
        ("contact", "padding", "stiffness") => "Padding stiffness over the contact area".into(),
        ("contact", "padding", "thickness") => "Padding thickness (blank: never flat)".into(),
        ("contact", "law", f) => match f {
            "rate" => "Buffer rate",
            "stroke" => "Usable buffer stroke",
            "force_at_stroke" => "Buffer force at full stroke",
            "exponent" => "Exponent n (1 linear, above 1 progressive)",
            "force" => "Absorber force",
            "efficiency" => "Efficiency η (blank: 0.9)",
            "coefficient" => "Orifice coefficient c",
            "preload_deflection" => "Buffer spring deflection before contact (blank: 0)",
            _ => return path.into(),
        }
        .into(),
        ("contact", _, f) => match f {
            "restitution" => "Coefficient of restitution (blank: from the buffer's own unloading)",
            "radius" => "Radius at which the buffer acts (blank: the closing edge's)",
            "count" => "Identical buffers acting together",
            "specific_area" => "Specific area of the region",
            _ => match model_label(f) {
                Some(l) => l,
                None => return path.into(),
            },
        }
        .into(),
        ("gap", _, "gap") => "Gap that stays at the closing point".into(),
        ("gap", _, "gap_at_buffer_contact") => "Gap when the part first touches the buffer".into(),
        ("gap", _, "body_parts") => "Body parts that can reach the gap".into(),
        ("limits", "lift_en81", "rated_speed") => "Rated speed of the car".into(),
        ("limits", "lift_us", "rated_speed") => "Rated speed".into(),
        ("limits", "crane", "rated_speed") => "Rated load speed".into(),
        ("limits", "gate", "gap_width") => "Gap width at the measuring point".into(),
        ("sizing", _, f) => match f {
            "peak_force" => "Highest peak force (blank: no limit)",
            "peak_deceleration" => "Highest peak deceleration (blank: no limit)",
            "mean_deceleration" => "Highest mean deceleration (blank: no limit)",
            "stroke" => "Stroke available (blank: no limit)",
            _ => return path.into(),
        }
        .into(),
        ("cycles_per_hour", _, _) => "Releases per hour (blank: none; for the heat load)".into(),
        (_, _, f) => match model_label(f) {
            Some(l) => l.into(),
            None => return path.into(),
        },
    };
    if prefix.is_empty() {
        text
    } else {
        let mut c = text.chars();
        match c.next() {
            Some(first) => format!("{prefix}{}{}", first.to_lowercase(), c.as_str()),
            None => prefix,
        }
    }
}

/// Labels of the inputs of a spring model and of field identification.
fn model_label(field: &str) -> Option<&'static str> {
    Some(match field {
        "rate" => "Spring rate",
        "max_deflection" => "Largest admissible deflection",
        "initial_tension" => "Initial tension F₀",
        "max_angle" => "Largest admissible wind-up angle",
        "wire_diameter" => "Wire diameter d",
        "coil_diameter" => "Coil diameter",
        "active_coils" => "Active coils n",
        "total_coils" => "Total coils (blank: from the ends)",
        "free_length" => "Free length L₀",
        "nominal_force" => "Nominal force F₁",
        "progression" => "Progression F₂/F₁ over the stroke",
        "stroke" => "Stroke",
        "friction_band" => "Friction band, compression minus extension force (blank: 0)",
        "polytropic_index" => "Polytropic index κ (blank: 1, isothermal)",
        "outer_diameter" => "Outside diameter Dₑ",
        "inner_diameter" => "Inside diameter Dᵢ",
        "thickness" => "Disc thickness t",
        "cone_height" => "Free cone height h₀",
        "youngs_modulus" => "Young's modulus (blank: 206 000 N/mm²)",
        "poisson_ratio" => "Poisson's ratio (blank: 0.3)",
        "in_series" => "Discs stacked in series",
        "in_parallel" => "Discs nested in parallel per group",
        "mass" => "Known mass",
        "sag" => "Measured sag under the mass",
        "resolution" => "Reading resolution of the sag (±)",
        "oscillations" => "Full oscillations counted",
        "time" => "Time for those oscillations",
        "timing_uncertainty" => "Timing uncertainty (blank: 0.1 s, hand stopwatch)",
        "spring_mass" => "Mass of the spring (blank: ignored)",
        "length_1" => "First length",
        "force_1" => "Force at the first length",
        "length_2" => "Second length",
        "force_2" => "Force at the second length",
        "force_uncertainty" => "Uncertainty of a force reading (±)",
        "length_uncertainty" => "Uncertainty of a length reading (±)",
        _ => return None,
    })
}

/// A figure id in words when the report has no label for it
/// (`impact.peak_force` → `impact: peak force`).
pub fn humanise_id(id: &str) -> String {
    id.replacen('.', ": ", 1).replace('_', " ")
}
