"""chem_common.py: shared helpers of the chemistry reference checks.

The checks run cairn's chemistry chain through tests/ref/chem_driver and psi4
(Debian's psi4 1.3.2 Python module, run live) side by side.  psi4 settings, as
the project's reference conventions require: scf_type pk, e_convergence 1e-10,
d_convergence 1e-10, symmetry c1, no_reorient, no_com; geometries in bohr.
"""
import atexit
import json
import os
import shutil
import subprocess
import sys
import tempfile

BUILD = os.environ.get("CAIRN_BUILDDIR", os.path.join(os.path.dirname(__file__), "..", ".."))
SRC = os.environ.get("CAIRN_SRCDIR", os.path.join(os.path.dirname(__file__), "..", ".."))
DRIVER = os.path.join(BUILD, "tests", "ref", "chem_driver")

_psi4 = None
_scratch = None


def tmpdir(prefix="cairn-chem-"):
    """A temporary directory removed when the test exits."""
    d = tempfile.mkdtemp(prefix=prefix)
    atexit.register(shutil.rmtree, d, True)
    return d


def psi4():
    """The psi4 module, set up quietly with its scratch files in a temporary
    directory; exits 77 (skip) only when psi4 is not installed."""
    global _psi4, _scratch
    if _psi4 is None:
        # made before the import so that its removal (atexit, last in first
        # out) runs after psi4's own clean-up of the files in it
        _scratch = tmpdir("cairn-psi4-")
        sys.path.insert(0, "/usr/lib/x86_64-linux-gnu")
        try:
            import psi4 as p
        except ImportError:
            print("psi4 is not installed (Debian package psi4): skipped")
            sys.exit(77)
        p.set_output_file(os.path.join(_scratch, "psi4.out"), False)
        p.core.be_quiet()
        p.core.IOManager.shared_object().set_default_path(_scratch)
        p.set_memory("2 GB")
        p.set_num_threads(1)
        _psi4 = p
    return _psi4


def psi4_setup(geom, basis, charge=0, mult=1, reference="rhf", **extra):
    """Build the molecule and set the reference options; returns psi4."""
    p = psi4()
    p.core.clean()
    p.core.clean_options()
    p.geometry("%d %d\n%s\nunits bohr\nsymmetry c1\nno_reorient\nno_com\n"
               % (charge, mult, geom.replace(";", "\n")))
    opts = {"basis": basis, "scf_type": "pk", "e_convergence": 1e-10, "d_convergence": 1e-10,
            "reference": reference, "mp2_type": "conv", "r_convergence": 1e-10,
            "maxiter": 200}
    opts.update(extra)
    p.set_options(opts)
    return p


def driver(*args, expect_fail=False, cwd=None):
    """Run chem_driver; returns (exit status, parsed JSON or None, stderr)."""
    r = subprocess.run([DRIVER] + [str(a) for a in args], capture_output=True, text=True, cwd=cwd)
    out = None
    if r.returncode == 0:
        out = json.loads(r.stdout)
    elif not expect_fail:
        sys.stderr.write(r.stderr)
    return r.returncode, out, r.stderr


class Checker:
    """Counts comparisons and failures; prints one line per comparison."""

    def __init__(self):
        self.n = 0
        self.bad = 0

    def close(self, what, ours, ref, tol):
        self.n += 1
        ok = ours is not None and ref is not None and abs(ours - ref) <= tol
        if not ok:
            self.bad += 1
        print("%s %-60s ours %-22s ref %-22s diff %s" % (
            "ok  " if ok else "FAIL", what, repr(ours), repr(ref),
            "%.1e" % abs(ours - ref) if ours is not None and ref is not None else "-"))
        return ok

    def true(self, what, cond):
        self.n += 1
        if not cond:
            self.bad += 1
        print("%s %s" % ("ok  " if cond else "FAIL", what))
        return cond

    def finish(self):
        print("%d checks, %d failed" % (self.n, self.bad))
        if self.n == 0:
            print("no checks ran")
            sys.exit(1)
        sys.exit(1 if self.bad else 0)


# Test geometries in bohr (our own choices; three per molecule).
def h2(r):
    return "H 0 0 0; H 0 0 %r" % r


def lih(r):
    return "Li 0 0 0; H 0 0 %r" % r


def h2o(r, angle_deg=104.5):
    import math
    a = math.radians(angle_deg) / 2
    return "O 0 0 0; H 0 %r %r; H 0 %r %r" % (r * math.sin(a), r * math.cos(a), -r * math.sin(a), r * math.cos(a))


GEOMETRIES = {
    "H2": [("R=1.4", h2(1.4)), ("R=2.0", h2(2.0)), ("R=3.0", h2(3.0))],
    "LiH": [("R=3.015", lih(3.015)), ("R=4.0", lih(4.0)), ("R=5.5", lih(5.5))],
    "H2O": [("R=1.81", h2o(1.81)), ("R=2.2", h2o(2.2)), ("R=2.8", h2o(2.8))],
}
