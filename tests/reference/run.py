"""Joulewise reference suite: the core's figures against computations by
general-purpose reference libraries (scipy, numpy, pint, uncertainties) and
published values, as listed in the core's verification catalogue.

Usage: python tests/reference/run.py --harness target/debug/refharness

Each check module recomputes figures from the physics description (the
module documentation of the core and the project's reference table), not by
translating the Rust code, sends the same case to the harness, and compares
within the tolerance the catalogue states for that check. The run fails when
a comparison fails, when a check listed for this suite is not run, or when a
check run here is not in the catalogue. The last line is
`tally: N passed, M failed`.
"""

import argparse
import importlib
import os
import sys

HERE = os.path.dirname(os.path.abspath(__file__))
sys.path.insert(0, HERE)

from common import Harness, Recorder  # noqa: E402

MODULES = [
    "checks.units",
    "checks.springs",
    "checks.identify",
    "checks.release",
    "checks.impact",
    "checks.body",
    "checks.sizing",
    "checks.stats",
    "checks.limits",
]


def versions():
    import numpy
    import pint
    import scipy
    import uncertainties

    return {
        "python": sys.version.split()[0],
        "numpy": numpy.__version__,
        "scipy": scipy.__version__,
        "pint": pint.__version__,
        "uncertainties": uncertainties.__version__,
    }


def main():
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--harness", required=True, help="path to the refharness binary")
    parser.add_argument("--only", default="", help="comma-separated module names to run (debugging)")
    parser.add_argument("--traceback", action="store_true", help="raise Python errors instead of recording them")
    args = parser.parse_args()
    harness = Harness(args.harness)
    try:
        rec = Recorder(harness.call("catalogue"), versions())
        only = [m for m in args.only.split(",") if m]
        for name in MODULES:
            if only and name.split(".")[-1] not in only:
                continue
            module = importlib.import_module(name)
            try:
                module.run(harness, rec)
            except Exception as exc:  # a broken module is a failure, never silent
                rec.error(f"module {name}", "did not complete", f"{type(exc).__name__}: {exc}")
                if args.traceback:
                    raise
        if only:
            rec.python_ids &= rec.seen
        code = rec.finish()
    finally:
        harness.close()
    sys.exit(code)


if __name__ == "__main__":
    main()
