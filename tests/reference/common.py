"""Shared pieces of the reference suite: the harness client and the recorder.

The harness (`refharness`, a binary of the joulewise-tests crate) answers one
JSON request per line with one JSON line. The recorder prints one line per
comparison, keeps the largest relative deviation per check and per source,
and closes with a summary and the line `tally: N passed, M failed`, which
`cargo xtask test` counts.

Tolerances are never written here: each comparison names its check id, and
the tolerance comes from the verification catalogue of the core
(`joulewise_core::verification`), read through the harness.
"""

import json
import math
import subprocess
import sys
from collections import defaultdict


class HarnessError(RuntimeError):
    """The harness refused a request (the message says why)."""


class Harness:
    """A running `refharness` process: one request per line."""

    def __init__(self, path):
        self.proc = subprocess.Popen(
            [path],
            stdin=subprocess.PIPE,
            stdout=subprocess.PIPE,
            text=True,
            bufsize=1,
        )

    def call(self, op, **fields):
        req = dict(fields)
        req["op"] = op
        self.proc.stdin.write(json.dumps(req) + "\n")
        self.proc.stdin.flush()
        line = self.proc.stdout.readline()
        if not line:
            raise HarnessError(f"harness closed while answering {op}")
        answer = json.loads(line)
        if "error" in answer:
            raise HarnessError(f"{op}: {answer['error']}")
        return answer["ok"]

    def close(self):
        try:
            self.proc.stdin.close()
            self.proc.wait(timeout=30)
        except Exception:  # the process is ours; end it if it hangs
            self.proc.kill()


def rel_dev(got, want):
    """|got − want| / |want|; for want = 0, |got| (an absolute deviation)."""
    if got is None or want is None:
        return math.inf
    if not (math.isfinite(got) and math.isfinite(want)):
        return 0.0 if got == want else math.inf
    if want == 0.0:
        return abs(got)
    return abs(got - want) / abs(want)


class Recorder:
    """Prints comparisons and tallies them against the catalogue."""

    def __init__(self, catalogue, versions):
        self.checks = {c["id"]: c for c in catalogue["checks"]}
        self.python_ids = {
            c["id"] for c in catalogue["checks"] if c["runner"]["kind"] == "python_suite"
        }
        self.catalogue = catalogue
        self.versions = versions
        self.seen = set()
        self.passed = 0
        self.failed = 0
        self.per_source = defaultdict(int)
        self.per_basis = defaultdict(int)
        self.max_dev = {}  # check id -> (dev, label)
        self.max_dev_source = {}  # source -> (dev, check id, label)

    def tolerance(self, check_id):
        return self.checks[check_id]["tolerance"]["relative"]

    def _line(self, ok, check_id, text):
        status = "PASS" if ok else "FAIL"
        print(f"{status} {check_id} {text}", flush=True)
        if ok:
            self.passed += 1
        else:
            self.failed += 1

    def _known(self, check_id):
        if check_id not in self.checks:
            self._line(False, check_id, "is not in the verification catalogue")
            return False
        if check_id not in self.python_ids:
            self._line(False, check_id, "is in the catalogue but not marked for the Python suite")
            return False
        self.seen.add(check_id)
        return True

    def _count(self, check_id, dev, label):
        ref = self.checks[check_id]["reference"]
        self.per_source[ref["name"]] += 1
        self.per_basis[ref["basis"]] += 1
        if dev is not None and math.isfinite(dev):
            if dev >= self.max_dev.get(check_id, (-1.0, ""))[0]:
                self.max_dev[check_id] = (dev, label)
            if dev >= self.max_dev_source.get(ref["name"], (-1.0, "", ""))[0]:
                self.max_dev_source[ref["name"]] = (dev, check_id, label)

    def compare(self, check_id, label, got, want):
        """Relative comparison within the check's catalogue tolerance."""
        if not self._known(check_id):
            return False
        tol = self.tolerance(check_id)
        got = None if got is None else float(got)
        want = None if want is None else float(want)
        dev = rel_dev(got, want)
        ok = dev <= tol
        self._count(check_id, dev, label)
        self._line(ok, check_id, f"{label}: got {got!r}, reference {want!r}, rel. dev. {dev:.2e} (tol {tol:.0e})")
        return ok

    def decide(self, check_id, label, got, want):
        """An exact comparison (a verdict, a kind of ending, a count)."""
        if not self._known(check_id):
            return False
        ok = got == want
        self._count(check_id, 0.0 if ok else math.inf, label)
        self._line(ok, check_id, f"{label}: got {got!r}, reference {want!r}")
        return ok

    def error(self, check_id, label, exc):
        """A comparison that could not be made."""
        if check_id in self.checks:
            self.seen.add(check_id)
        self._line(False, check_id, f"{label}: {exc}")

    def finish(self):
        """Coverage against the catalogue, summary, tally. Returns the exit code."""
        for cid in sorted(self.python_ids - self.seen):
            self._line(False, cid, "is listed in the catalogue for the Python suite but was not run")
        print()
        print("summary: library versions: " + ", ".join(f"{k} {v}" for k, v in sorted(self.versions.items())))
        print("summary: comparisons per source (this run)")
        for src, n in sorted(self.per_source.items(), key=lambda kv: (-kv[1], kv[0])):
            dev = self.max_dev_source.get(src, (0.0, "", ""))
            print(f"summary:   {n:5d}  {src}  (largest rel. dev. {dev[0]:.2e} in {dev[1]}: {dev[2]})")
        print("summary: comparisons per basis (this run)")
        for basis, n in sorted(self.per_basis.items()):
            print(f"summary:   {n:5d}  {basis}")
        cat_src = defaultdict(int)
        cat_runner = defaultdict(int)
        for c in self.catalogue["checks"]:
            cat_src[c["reference"]["name"]] += 1
            cat_runner[c["runner"]["kind"]] += 1
        print(f"summary: catalogue: {len(self.catalogue['checks'])} checks over "
              f"{len(self.catalogue['subjects'])} models and limit sets; by runner: "
              + ", ".join(f"{k} {v}" for k, v in sorted(cat_runner.items())))
        print("summary: catalogue checks per source")
        for src, n in sorted(cat_src.items(), key=lambda kv: (-kv[1], kv[0])):
            print(f"summary:   {n:5d}  {src}")
        print("summary: largest relative deviation per check (tolerance)")
        worst = (0.0, "", "")
        for cid in sorted(self.max_dev):
            dev, label = self.max_dev[cid]
            print(f"summary:   {dev:.2e} ({self.tolerance(cid):.0e})  {cid}  {label}")
            if self.tolerance(cid) > 0 and dev > worst[0]:
                worst = (dev, cid, label)
        print("summary: largest relative deviation per kind of tolerance")
        by_kind = {}
        for cid, (dev, label) in self.max_dev.items():
            kind = self.checks[cid]["tolerance"]["kind"]
            if dev > by_kind.get(kind, (-1.0, "", ""))[0]:
                by_kind[kind] = (dev, cid, label)
        for kind, (dev, cid, label) in sorted(by_kind.items()):
            print(f"summary:   {kind:20s} {dev:.2e} in {cid} ({label})")
        print(f"summary: largest relative deviation overall: {worst[0]:.2e} in {worst[1]} ({worst[2]})")
        print(f"tally: {self.passed} passed, {self.failed} failed")
        return 0 if self.failed == 0 else 1


def guarded(rec, check_id, label, fn):
    """Run one case; a harness refusal or a Python error becomes a failure."""
    try:
        fn()
    except Exception as exc:  # reported as a failed comparison, never hidden
        rec.error(check_id, label, f"{type(exc).__name__}: {exc}")
        if "--traceback" in sys.argv:
            raise
