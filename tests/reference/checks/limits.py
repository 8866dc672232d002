"""Limit sets against an independent transcription of the published values.

Every entry of every limit set in the core's catalogue must have a
transcription here: the value as published, in the unit it is published in
(converted to SI by pint), with the status of the project's reference table
(R confirmed, R2 secondary, D derived, M from memory); or, for an entry that
is a rule rather than a number, the rule's wording and, where it is a
formula, the formula evaluated against the core's rule function. An entry
without a transcription fails, so a limit added to the core must be added
here with its source.

`py.limits.us_rules` evaluates the rules written in US units — the gravity
stopping distance S = V²/19 320 (S in inches, V in ft/min), the oil-buffer
stroke at 115 % of rated speed, the crane check speeds and decelerations —
in their published units and converts with pint.
"""

import pint

from common import guarded

ureg = pint.UnitRegistry()
Q = ureg.Quantity

R, R2, D, M = "confirmed", "secondary", "derived", "from_memory"


def si(value, unit):
    return Q(value, unit).to_base_units().magnitude


# ── Transcriptions: key → (value as published, unit, status) ───────────

GUARDS = {
    # ISO 14120:2015 (formerly EN 953), clause not confirmed: reference table §2, M.
    "force_no_device": (75, "N", M),
    "energy_no_device": (4, "J", M),
    "force_with_device": (150, "N", M),
    "energy_with_device": (10, "J", M),
    # 16 CFR 1211.12(a)(1): 15 lbf, R.
    "edge_actuation_force_us": (15, "force_pound", R),
}

# ISO/TS 15066:2016 Table A.2 (quasi-static force, N; pressures N/cm²) and
# Table A.3 (k N/mm, m_H kg), reference table §1b, R2.
REGIONS = {
    "skull_forehead": (130, 150, 4.4, {"middle_of_forehead": 130, "temple": 110}),
    "face": (65, 75, 4.4, {"masticatory_muscle": 110}),
    "neck": (150, 50, 1.2, {"neck_muscle": 140, "seventh_neck_muscle": 210}),
    "back_shoulders": (210, 35, 40, {"shoulder_joint": 160, "fifth_lumbar_vertebra": 210}),
    "chest": (140, 25, 40, {"sternum": 120, "pectoral_muscle": 170}),
    "abdomen": (110, 10, 40, {"abdominal_muscle": 140}),
    "pelvis": (180, 25, 40, {"pelvic_bone": 210}),
    "upper_arm_elbow": (150, 30, 3, {"deltoid_muscle": 190, "humerus": 220}),
    "lower_arm_wrist": (160, 40, 2, {"radial_bone": 190, "forearm_muscle": 180, "arm_nerve": 180}),
    "hand_fingers": (140, 75, 0.6, {
        "forefinger_pad_dominant": 300, "forefinger_pad_non_dominant": 270,
        "forefinger_end_joint_dominant": 280, "forefinger_end_joint_non_dominant": 220,
        "thenar_eminence": 200, "palm": 260, "back_of_hand_dominant": 200, "back_of_hand_non_dominant": 190}),
    "thigh_knee": (220, 50, 75, {"thigh_muscle": 250, "kneecap": 220}),
    "lower_leg": (130, 60, 75, {"middle_of_shin": 220, "calf_muscle": 210}),
}
# Table A.2 footnote c: transient = 2 × quasi-static; none for the head (A.3.2).
HEAD = {"skull_forehead", "face"}


def body_regions():
    out = {}
    for region, (force, k, mass, pressures) in REGIONS.items():
        out[f"{region}.quasi_static_force"] = (force, "N", R2)
        out[f"{region}.spring_constant"] = (k, "N/mm", R2)
        out[f"{region}.mass"] = (mass, "kg", R2)
        for area, p in pressures.items():
            out[f"{region}.pressure.{area}"] = (p, "N/cm**2", R2)
        if region in HEAD:
            out[f"{region}.transient_contact"] = ("not_permitted", None, R2)
        else:
            out[f"{region}.transient_force"] = (2 * force, "N", R2)
            # Derived (reference table §1c): E = (2F)²/(2k).
            out[f"{region}.transfer_energy"] = ((2 * force) ** 2 / (2 * k * 1000.0), "J", D)
    return out


GAPS = {
    # ISO 13854:2017 Table 1, reference table §3, R2.
    "body": (500, "mm", R2), "head": (300, "mm", R2), "leg": (180, "mm", R2), "foot": (120, "mm", R2),
    "toes": (50, "mm", R2), "arm": (120, "mm", R2), "hand_wrist_fist": (100, "mm", R2), "finger": (25, "mm", R2),
}

EN81 = {
    # EN 81-20:2014/2020, reference table §4, R2.
    "accumulation_max_speed": (1.0, "m/s", R2),          # 5.8.1.5
    "linear_stroke_min": (65, "mm", R2),                 # 5.8.2.1.1
    "nonlinear_mean": (1, "standard_gravity", R2),       # 5.8.2.1.2
    "nonlinear_time_above": (0.04, "s", R2),
    "nonlinear_peak": (6, "standard_gravity", R2),
    "nonlinear_return_speed": (1, "m/s", R2),
    "reduced_stroke_min": (0.42, "m", R2),               # 5.8.2.2.2
    "dissipation_mean": (1, "standard_gravity", R2),     # 5.8.2.2.3
    "dissipation_time_above": (0.04, "s", R2),
}
EN81_RULES = {
    "dissipation_any_speed": ("any rated speed", R2),
    "linear_stroke": ("s ≥ 0.135·v² (v in m/s, s in m)", R2),
    "linear_static_load": ("2.5 to 4 × (P + Q)·g_n", R2),
    "dissipation_stroke": ("s ≥ 0.0674·v²", R2),
}

US = {
    # Cal. Code Regs. Title 8, reference table §4, R.
    "oil_mean": (32.2, "ft/s**2", R),                    # §3108(b)
    "oil_peak_time": (1 / 25, "s", R),                   # §3108(b)
    "elevator_spring_max_speed": (200, "ft/min", R),     # §3031(a)(3)
    "hoist_spring_stroke_100": (1.5, "inch", R),         # §1604.14(a)(1), (b)(1)
    "hoist_spring_stroke_150": (2.5, "inch", R),
    "hoist_spring_stroke_200": (4, "inch", R),
    "hoist_spring_stroke_250": (6, "inch", R),
    "hoist_spring_stroke_300": (9, "inch", R),
    "hoist_spring_limiter": (12, "inch", R),
}
US_RULES = {
    "gravity_stopping_distance": ("S = V²/19 320 (S in in, V in ft/min)", R),
    "oil_stroke": ("S at 115 % of rated speed", R),
    "hoist_spring_solid": ("not solid under 2 × (car + rated load); solid under 3 ×", R),
}

CRANE = {
    # 29 CFR 1910.179, reference table §5, R.
    "bridge_deceleration": (3, "ft/s**2", R),            # (e)(2)(i)
    "trolley_deceleration": (4.7, "ft/s**2", R),         # (e)(3)(i)
}
CRANE_RULES = {
    "bridge_energy": ("E ≥ ½·m·(0.4·v)², m excluding the lifted load", R),
    "trolley_energy": ("E ≥ ½·m·(v/3)², m excluding the lifted load", D),
}

GATES = {
    # EN 12453, reference table §8: the 400/1 400 N limits (R2) hang on the
    # opening-width split (M), so the entries are M; 0.75 s and 150 N R2;
    # end force 25 N M; the instrument's 500 N/mm R2.
    "dynamic_small_gap": (400, "N", M),
    "dynamic_wide_gap": (1400, "N", M),
    "dynamic_time": (0.75, "s", R2),
    "residual_force": (150, "N", R2),
    "end_force": (25, "N", M),
    "instrument": (500, "N/mm", R2),
}

TRANSCRIPTION = {
    "guards": (GUARDS, {}),
    "body_regions": (body_regions(), {}),
    "crushing_gaps": (GAPS, {}),
    "lift_buffers_en81": (EN81, EN81_RULES),
    "lift_buffers_us": (US, US_RULES),
    "crane_bumpers": (CRANE, CRANE_RULES),
    "powered_gates": (GATES, {}),
}

CHECK = "py.limits.transcription"
SPEEDS = [0.3, 0.63, 1.0, 1.6, 2.5, 4.0]


def transcription(h, rec, out):
    for limit_set in out["catalogue"]:
        values, rules = TRANSCRIPTION.get(limit_set["id"], (None, None))
        if values is None:
            rec.error(CHECK, f"limit set {limit_set['id']}", "no transcription in the reference suite")
            continue
        seen = set()
        for e in limit_set["entries"]:
            key = f"{limit_set['id']}.{e['key']}"
            status = e["provenance"]["status"]
            seen.add(e["key"])
            if e["key"] in values:
                value, unit, want_status = values[e["key"]]
                if unit is None:
                    rec.decide(CHECK, f"{key}: comparison", e["comparison"], value)
                else:
                    rec.compare(CHECK, f"{key} = {value} {unit}", e["value"], si(value, unit))
                rec.decide(CHECK, f"{key}: status", status, want_status)
            elif e["key"] in rules:
                text, want_status = rules[e["key"]]
                rec.decide(CHECK, f"{key}: rule as published", e["rule"], text)
                rec.decide(CHECK, f"{key}: status", status, want_status)
            else:
                rec.error(CHECK, key, "no published value or rule transcribed for this entry")
        for missing in sorted((set(values) | set(rules)) - seen):
            rec.error(CHECK, f"{limit_set['id']}.{missing}", "transcribed but not in the core's limit set")

    # Formula rules of EN 81-20 (5.8.2.1.1, 5.8.2.2.1, 5.8.2.2.2).
    for v, lin, dis, red in zip(SPEEDS, out["en81_linear_stroke"], out["en81_dissipation_stroke"],
                                out["en81_reduced_stroke"]):
        rec.compare(CHECK, f"EN 81-20 linear stroke max(0.135·v², 65 mm) at {v} m/s", lin, max(0.135 * v * v, 0.065))
        rec.compare(CHECK, f"EN 81-20 dissipation stroke 0.0674·v² at {v} m/s", dis, 0.0674 * v * v)
        rec.compare(CHECK, f"EN 81-20 reduced stroke max(0.0674·v², 0.42 m) at {v} m/s", red, max(0.0674 * v * v, 0.42))
    # ISO/TS 15066 Table A.2 footnote c and the derived energies of §1c.
    for r in out["body_regions"]:
        key = next(k for k, v in REGIONS.items() if v[0] == r["quasi_static_force"] and v[1] * 1000 == r["spring_constant"])
        force, k, _m, _p = REGIONS[key]
        if key in HEAD:
            rec.decide(CHECK, f"{key}: no transient force (A.3.2)", r["transient_force"], None)
        else:
            rec.compare(CHECK, f"{key}: transient force 2 × {force} N", r["transient_force"], 2.0 * force)
            rec.compare(CHECK, f"{key}: transient energy (2F)²/(2k)", r["transient_energy"], (2.0 * force) ** 2 / (2e3 * k))
        rec.compare(CHECK, f"{key}: quasi-static energy F²/(2k)", r["quasi_static_energy"], force**2 / (2e3 * k))
    # Guard limits as the check functions apply them.
    rec.compare(CHECK, "guard force without a device", out["guard_limits"][0][0], 75.0)
    rec.compare(CHECK, "guard energy without a device", out["guard_limits"][0][1], 4.0)
    rec.compare(CHECK, "guard force with a device", out["guard_limits"][1][0], 150.0)
    rec.compare(CHECK, "guard energy with a device", out["guard_limits"][1][1], 10.0)
    # EN 12453 dynamic force by gap width (split from memory).
    for gap, want in zip([0.03, 0.05, 0.3, 0.5, 0.6], [None, 400.0, 400.0, 400.0, 1400.0]):
        rec.decide(CHECK, f"EN 12453 dynamic force limit at a {gap * 1000:g} mm gap", out["gate_dynamic_limit"][
            [0.03, 0.05, 0.3, 0.5, 0.6].index(gap)], want)


def us_rules(h, rec, out):
    chk = "py.limits.us_rules"
    for i, v in enumerate(SPEEDS):
        speed = Q(v, "m/s")
        # Cal. T8 §3108(a)(3): S = V²/19 320, S in inches, V in ft/min.
        fpm = speed.to("ft/min").magnitude
        s = Q(fpm**2 / 19320.0, "inch").to("m").magnitude
        rec.compare(chk, f"gravity stopping distance at {v} m/s ({fpm:.1f} ft/min)", out["us_gravity_stopping_distance"][i], s)
        # §3108(a)(1): oil buffer stroke = that distance at 115 % of rated speed.
        fpm115 = (1.15 * speed).to("ft/min").magnitude
        rec.compare(chk, f"oil-buffer stroke at {v} m/s", out["us_oil_buffer_minimum_stroke"][i],
                    Q(fpm115**2 / 19320.0, "inch").to("m").magnitude)
        # 29 CFR 1910.179(e)(2)(i): bridge 3 ft/s² at 20 % speed, energy at 40 %;
        # (e)(3)(i): trolley 4.7 ft/s² at ⅓ speed.
        for travel, frac, acc, efrac in [("bridge", 0.2, 3.0, 0.4), ("trolley", 1.0 / 3.0, 4.7, 1.0 / 3.0)]:
            u = frac * speed
            stroke = (u**2 / (2 * Q(acc, "ft/s**2"))).to("m").magnitude
            rec.compare(chk, f"{travel} constant-deceleration stroke at {v} m/s rated", out[f"crane_{travel}_stroke"][i], stroke)
            rec.compare(chk, f"{travel} energy check speed at {v} m/s rated", out[f"crane_{travel}_energy_speed"][i], efrac * v)


def run(h, rec):
    out = h.call("limits", speeds=SPEEDS, gap_widths=[0.03, 0.05, 0.3, 0.5, 0.6])
    guarded(rec, CHECK, "transcription", lambda: transcription(h, rec, out))
    guarded(rec, "py.limits.us_rules", "US rules", lambda: us_rules(h, rec, out))
