"""Units: every entry of the core's unit table against pint.

For each unit the core lists a pint expression (`Unit::pint`). pint converts
one such unit to the SI unit of its kind; that must equal the core's factor
(`py.units.pint_factors`) and what the core's parser makes of `1 <spelling>`
for every accepted spelling (`py.units.parser`). pint's definitions (inch
0.0254 m, pound 0.453 592 37 kg, g_0 9.806 65 m/s², hp 550 ft·lbf/s ...) are
the exact ones of NIST SP 811, so only rounding separates the two.
"""

import pint

from common import guarded

# The SI unit the core holds each kind in, as a pint expression.
SI = {
    "ratio": "dimensionless",
    "length": "meter",
    "area": "meter**2",
    "force": "newton",
    "mass": "kilogram",
    "energy": "joule",
    "linear_rate": "newton / meter",
    "torsional_rate": "newton * meter / radian",
    "speed": "meter / second",
    "angular_speed": "radian / second",
    "acceleration": "meter / second**2",
    "pressure": "pascal",
    "angle": "radian",
    "torque": "newton * meter",
    "inertia": "kilogram * meter**2",
    "time": "second",
    "frequency": "hertz",
    "power": "watt",
    "linear_damping": "newton * second / meter",
    "quadratic_damping": "newton * second**2 / meter**2",
    "density": "kilogram / meter**3",
    "probability": "dimensionless",
}


def run(h, rec):
    ureg = pint.UnitRegistry()
    units = h.call("units")
    for u in units:
        label = f"{u['symbol'] or '(plain number)'} [{u['dim']}] = {u['pint']}"

        def one(u=u, label=label):
            si = ureg.parse_expression(SI[u["dim"]])
            value = (ureg.parse_expression(u["pint"]) / si).to("dimensionless").magnitude
            rec.compare("py.units.pint_factors", label, u["factor"], float(value))
            for p in u["parsed"]:
                if "error" in p:
                    rec.error("py.units.parser", f"{p['text']!r} as {u['dim']}", p["error"])
                else:
                    rec.compare("py.units.parser", f"{p['text']!r} as {u['dim']}", p["value"], float(value))

        guarded(rec, "py.units.pint_factors", label, one)
