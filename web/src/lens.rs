//! Access to one numeric input of the scenario by its dotted path, the same
//! path the core names in its input errors (`spring.model.rate`,
//! `contact.law.model.members.1.stroke`, `limits.user.0.threshold`), so a
//! field, its error and the figures that depend on it all meet on one name.
//!
//! One walker, [`value_mut`], serves reading and writing: reading passes
//! `create = false` and changes nothing; writing passes `create = true`,
//! which fills an optional input that was left out (`None`) with an empty
//! one before the text goes in. [`model_mut`] finds a spring model (the
//! spring's own, a member of a combination, a buffer's spring) by its path.

use joulewise_core::scenario::{
    AreaInput, BufferLawInput, ContactInput, FrictionInput, GapGeometryInput, IdentifyInput,
    InertiaInput, MountInput, PartInput, Scenario, SpringModelInput, Value,
};

type Segs<'p> = std::str::Split<'p, char>;

/// The numeric input at `path`, if the scenario has it in its current
/// shape. With `create`, an optional input left out is made empty first.
pub fn value_mut<'a>(s: &'a mut Scenario, path: &str, create: bool) -> Option<&'a mut Value> {
    let mut p = path.split('.');
    let c = create;
    match p.next()? {
        "part" => part(&mut s.part, &mut p, c),
        "spring" => {
            let sp = s.spring.as_mut()?;
            match p.next()? {
                "model" => model(&mut sp.model, &mut p, c),
                "mount" => mount(&mut sp.mount, &mut p),
                _ => None,
            }
        }
        "states" => {
            let st = s.states.get_mut(index(&mut p)?)?;
            (p.next()? == "deflection").then_some(&mut st.deflection)
        }
        "contact" => contact(&mut s.contact, &mut p, c),
        "gap" => match (&mut s.gap.as_mut()?.geometry, p.next()?, p.next()?) {
            (GapGeometryInput::Clearance { gap }, "geometry", "gap") => Some(gap),
            (
                GapGeometryInput::BufferStop {
                    gap_at_buffer_contact,
                },
                "geometry",
                "gap_at_buffer_contact",
            ) => Some(gap_at_buffer_contact),
            _ => None,
        },
        "limits" => {
            let l = &mut s.limits;
            match (p.next()?, p.next()?) {
                ("lift_en81", "rated_speed") => Some(&mut l.lift_en81.as_mut()?.rated_speed),
                ("lift_us", "rated_speed") => Some(&mut l.lift_us.as_mut()?.rated_speed),
                ("crane", "rated_speed") => Some(&mut l.crane.as_mut()?.rated_speed),
                ("gate", "gap_width") => Some(&mut l.gate.as_mut()?.gap_width),
                ("user", i) => {
                    let u = l.user.get_mut(i.parse::<usize>().ok()?)?;
                    (p.next()? == "threshold").then_some(&mut u.threshold)
                }
                _ => None,
            }
        }
        "sizing" => {
            let z = s.sizing.as_mut()?;
            opt(
                match p.next()? {
                    "peak_force" => &mut z.peak_force,
                    "peak_deceleration" => &mut z.peak_deceleration,
                    "mean_deceleration" => &mut z.mean_deceleration,
                    "stroke" => &mut z.stroke,
                    _ => return None,
                },
                c,
            )
        }
        "cycles_per_hour" => opt(&mut s.cycles_per_hour, c),
        _ => None,
    }
}

/// The spring model at `path` (`spring.model`, `spring.model.members.0`,
/// `contact.law.model`…).
pub fn model_mut<'a>(s: &'a mut Scenario, path: &str) -> Option<&'a mut SpringModelInput> {
    let mut p = path.split('.');
    let mut m = match (p.next()?, p.next()?) {
        ("spring", "model") => &mut s.spring.as_mut()?.model,
        ("contact", "law") => match &mut s.contact {
            ContactInput::Buffer(b) => match (&mut b.law, p.next()?) {
                (BufferLawInput::Spring { model, .. }, "model") => model,
                _ => return None,
            },
            _ => return None,
        },
        _ => return None,
    };
    while let Some(seg) = p.next() {
        m = match (m, seg) {
            (
                SpringModelInput::Series { members } | SpringModelInput::Parallel { members },
                "members",
            ) => members.get_mut(index(&mut p)?)?,
            _ => return None,
        };
    }
    Some(m)
}

fn index(p: &mut Segs<'_>) -> Option<usize> {
    p.next()?.parse().ok()
}

fn opt(v: &mut Option<Value>, create: bool) -> Option<&mut Value> {
    if create && v.is_none() {
        *v = Some(Value::default());
    }
    v.as_mut()
}

fn part<'a>(part: &'a mut PartInput, p: &mut Segs<'_>, c: bool) -> Option<&'a mut Value> {
    match part {
        PartInput::Translating(t) => match p.next()? {
            "mass" => Some(&mut t.mass),
            "travel" => Some(&mut t.travel),
            "incline" => opt(&mut t.incline, c),
            "damping" => opt(&mut t.damping, c),
            "drive_force" => opt(&mut t.drive_force, c),
            "friction" => match (&mut t.friction, p.next()?) {
                (FrictionInput::Coefficient { mu }, "mu") => Some(mu),
                (FrictionInput::Force { force }, "force") => Some(force),
                _ => None,
            },
            _ => None,
        },
        PartInput::Rotating(t) => match p.next()? {
            "hinge_tilt" => opt(&mut t.hinge_tilt, c),
            "cg_angle_at_latch" => opt(&mut t.cg_angle_at_latch, c),
            "travel" => Some(&mut t.travel),
            "friction_torque" => opt(&mut t.friction_torque, c),
            "drive_torque" => opt(&mut t.drive_torque, c),
            "hazard_radius" => Some(&mut t.hazard_radius),
            "inertia" => inertia(&mut t.inertia, p.next()?),
            _ => None,
        },
    }
}

fn inertia<'a>(i: &'a mut InertiaInput, field: &str) -> Option<&'a mut Value> {
    use InertiaInput as I;
    Some(match (i, field) {
        (I::Given { inertia, .. }, "inertia") => inertia,
        (I::Given { cg_radius, .. }, "cg_radius") => cg_radius,
        (
            I::Given { mass, .. }
            | I::Plate { mass, .. }
            | I::Rod { mass, .. }
            | I::Disc { mass, .. }
            | I::Point { mass, .. }
            | I::Offset { mass, .. },
            "mass",
        ) => mass,
        (I::Plate { width, .. }, "width") => width,
        (I::Rod { length, .. }, "length") => length,
        (I::Disc { radius, .. } | I::Point { radius, .. }, "radius") => radius,
        (
            I::Offset {
                inertia_about_cg, ..
            },
            "inertia_about_cg",
        ) => inertia_about_cg,
        (I::Offset { distance, .. }, "distance") => distance,
        _ => return None,
    })
}

fn model<'a>(m: &'a mut SpringModelInput, p: &mut Segs<'_>, c: bool) -> Option<&'a mut Value> {
    use SpringModelInput as M;
    let field = p.next()?;
    Some(match (m, field) {
        (M::Series { members } | M::Parallel { members }, "members") => {
            return model(members.get_mut(index(p)?)?, p, c)
        }
        (M::Linear { rate, .. } | M::Extension { rate, .. } | M::Torsion { rate, .. }, "rate") => {
            rate
        }
        (
            M::Linear { max_deflection, .. }
            | M::Extension { max_deflection, .. }
            | M::Measured(joulewise_core::scenario::MeasuredInput { max_deflection, .. }),
            "max_deflection",
        ) => max_deflection,
        (
            M::Extension {
                initial_tension, ..
            },
            "initial_tension",
        ) => initial_tension,
        (M::Torsion { max_angle, .. }, "max_angle") => max_angle,
        (M::Helical(h), f) => match f {
            "wire_diameter" => &mut h.wire_diameter,
            "coil_diameter" => &mut h.coil_diameter,
            "active_coils" => &mut h.active_coils,
            "total_coils" => return opt(&mut h.total_coils, c),
            "free_length" => &mut h.free_length,
            _ => return None,
        },
        (
            M::Gas {
                nominal_force,
                progression,
                stroke,
                friction_band,
                polytropic_index,
                ..
            },
            f,
        ) => match f {
            "nominal_force" => nominal_force,
            "progression" => progression,
            "stroke" => stroke,
            "friction_band" => return opt(friction_band, c),
            "polytropic_index" => return opt(polytropic_index, c),
            _ => return None,
        },
        (M::Disc(d), f) => match f {
            "outer_diameter" => &mut d.outer_diameter,
            "inner_diameter" => &mut d.inner_diameter,
            "thickness" => &mut d.thickness,
            "cone_height" => &mut d.cone_height,
            "youngs_modulus" => return opt(&mut d.youngs_modulus, c),
            "poisson_ratio" => return opt(&mut d.poisson_ratio, c),
            _ => return None,
        },
        (M::Table(t), "loading" | "unloading") => {
            let rows = if field == "loading" {
                &mut t.loading
            } else {
                &mut t.unloading
            };
            let row = rows.get_mut(index(p)?)?;
            match p.next()? {
                "deflection" => &mut row.deflection,
                "force" => &mut row.force,
                _ => return None,
            }
        }
        (M::Measured(mi), "method") => return identify(&mut mi.method, p.next()?, c),
        (M::Measured(mi), "cross_check") => {
            return identify(mi.cross_check.as_mut()?, p.next()?, c)
        }
        _ => return None,
    })
}

fn identify<'a>(m: &'a mut IdentifyInput, field: &str, c: bool) -> Option<&'a mut Value> {
    use IdentifyInput as I;
    Some(match (m, field) {
        (I::Static { mass, .. } | I::Dynamic { mass, .. }, "mass") => mass,
        (I::Static { sag, .. }, "sag") => sag,
        (I::Static { resolution, .. }, "resolution") => resolution,
        (I::Dynamic { oscillations, .. }, "oscillations") => oscillations,
        (I::Dynamic { time, .. }, "time") => time,
        (
            I::Dynamic {
                timing_uncertainty, ..
            },
            "timing_uncertainty",
        ) => return opt(timing_uncertainty, c),
        (I::Dynamic { spring_mass, .. }, "spring_mass") => return opt(spring_mass, c),
        (I::TwoPoint { length_1, .. }, "length_1") => length_1,
        (I::TwoPoint { force_1, .. }, "force_1") => force_1,
        (I::TwoPoint { length_2, .. }, "length_2") => length_2,
        (I::TwoPoint { force_2, .. }, "force_2") => force_2,
        (
            I::TwoPoint {
                force_uncertainty, ..
            },
            "force_uncertainty",
        ) => force_uncertainty,
        (
            I::TwoPoint {
                length_uncertainty, ..
            },
            "length_uncertainty",
        ) => length_uncertainty,
        _ => return None,
    })
}

fn mount<'a>(m: &'a mut MountInput, p: &mut Segs<'_>) -> Option<&'a mut Value> {
    Some(match (m, p.next()?) {
        (
            MountInput::Direct {
                deflection_at_latch,
                ..
            },
            "deflection_at_latch",
        ) => deflection_at_latch,
        (MountInput::Strut { frame_x, .. }, "frame_x") => frame_x,
        (MountInput::Strut { frame_y, .. }, "frame_y") => frame_y,
        (MountInput::Strut { part_radius, .. }, "part_radius") => part_radius,
        (MountInput::Strut { part_angle, .. }, "part_angle") => part_angle,
        (MountInput::Strut { free_length, .. }, "free_length") => free_length,
        _ => return None,
    })
}

fn contact<'a>(ct: &'a mut ContactInput, p: &mut Segs<'_>, c: bool) -> Option<&'a mut Value> {
    match ct {
        ContactInput::None => None,
        ContactInput::Buffer(b) => match p.next()? {
            "restitution" => opt(&mut b.restitution, c),
            "radius" => opt(&mut b.radius, c),
            "law" => law(&mut b.law, p, c),
            _ => None,
        },
        ContactInput::Body(b) => match p.next()? {
            "area" => match (&mut b.area, p.next()?) {
                (AreaInput::Edge { length, .. }, "length") => Some(length),
                (AreaInput::Edge { width, .. }, "width") => Some(width),
                (AreaInput::Circle { diameter }, "diameter") => Some(diameter),
                (AreaInput::Given { area }, "area") => Some(area),
                _ => None,
            },
            "padding" => {
                let pad = b.padding.as_mut()?;
                match p.next()? {
                    "stiffness" => Some(&mut pad.stiffness),
                    "thickness" => opt(&mut pad.thickness, c),
                    _ => None,
                }
            }
            _ => None,
        },
    }
}

fn law<'a>(l: &'a mut BufferLawInput, p: &mut Segs<'_>, c: bool) -> Option<&'a mut Value> {
    use BufferLawInput as L;
    Some(match (l, p.next()?) {
        (L::Spring { model: m, .. }, "model") => return model(m, p, c),
        (
            L::Spring {
                preload_deflection, ..
            },
            "preload_deflection",
        ) => return opt(preload_deflection, c),
        (L::Linear { rate, .. }, "rate") => rate,
        (
            L::Linear { stroke, .. }
            | L::PowerLaw { stroke, .. }
            | L::ConstantForce { stroke, .. }
            | L::Absorber { stroke, .. }
            | L::Orifice { stroke, .. },
            "stroke",
        ) => stroke,
        (
            L::PowerLaw {
                force_at_stroke, ..
            },
            "force_at_stroke",
        ) => force_at_stroke,
        (L::PowerLaw { exponent, .. }, "exponent") => exponent,
        (L::ConstantForce { force, .. }, "force") => force,
        (L::Absorber { efficiency, .. }, "efficiency") => return opt(efficiency, c),
        (L::Orifice { coefficient, .. }, "coefficient") => coefficient,
        _ => return None,
    })
}
