"""chem_corr.py: MP2, CCSD and exact (full CI) energies against psi4 run live
(tolerance 1e-8 hartree), on
  (a) FCIDUMP files written by psi4.fcidump() and read by cairn, and
  (b) cairn's own integrals and SCF,
for H2, LiH and H2O in STO-3G, 6-31G and cc-pVDZ, with and without a frozen
core, and with an active space for the exact energy where the full space is
too large.  Source of every reference value: psi4 1.3.2 (Debian): energy('mp2')
(mp2_type conv), energy('ccsd') (r_convergence 1e-10), energy('fci').

psi4.fcidump() is given wavefunctions without frozen orbitals: with a frozen
core psi4 1.3.2 writes one-electron integrals and orbital energies for all but
the last active orbital (seen in its files: NORB=23 with h_ij only up to 22), so
the core is folded on cairn's side (chem_space_select) and compared with
psi4's own frozen-core energies."""
import os
import sys

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from chem_common import tmpdir, Checker, driver, h2, h2o, lih, psi4_setup

TOL = 1e-8
tmp = tmpdir("cairn-corr-")
c = Checker()

# (label, geometry, basis, core, active, methods, exact from psi4 with frozen_uocc)
CASES = [
    ("H2 R=1.4", h2(1.4), "sto-3g", 0, None, "mp2 ccsd fci"),
    ("H2 R=1.4", h2(1.4), "6-31g", 0, None, "mp2 ccsd fci"),
    ("H2 R=1.4", h2(1.4), "cc-pvdz", 0, None, "mp2 ccsd fci"),
    ("H2 R=3.0", h2(3.0), "cc-pvdz", 0, None, "mp2 ccsd fci"),
    ("LiH R=3.015", lih(3.015), "sto-3g", 0, None, "mp2 ccsd fci"),
    ("LiH R=3.015", lih(3.015), "6-31g", 0, None, "mp2 ccsd fci"),
    ("LiH R=3.015", lih(3.015), "cc-pvdz", 0, None, "mp2 ccsd fci"),
    ("LiH R=3.015", lih(3.015), "cc-pvdz", 1, None, "mp2 ccsd fci"),
    ("H2O R=1.81", h2o(1.81), "sto-3g", 0, None, "mp2 ccsd fci"),
    ("H2O R=2.2", h2o(2.2), "6-31g", 1, None, "mp2 ccsd fci"),
    ("H2O R=1.81", h2o(1.81), "cc-pvdz", 0, None, "mp2 ccsd"),
    ("H2O R=1.81", h2o(1.81), "cc-pvdz", 1, 8, "fci"),
]

for label, g, basis, core, active, methods in CASES:
    methods = methods.split()
    p = psi4_setup(g, basis)
    escf, wfn = p.energy("scf", return_wfn=True)
    nmo = wfn.nmo()
    dump = os.path.join(tmp, "%s-%s.fcidump" % (label.replace(" ", "_"), basis))
    p.fcidump(wfn, fname=dump, oe_ints=["EIGENVALUES"])
    ref = {}
    opts = {}
    if core:
        opts["freeze_core"] = True
    if active is not None:
        opts = {"frozen_docc": [core], "frozen_uocc": [nmo - core - active]}
    p.set_options(opts)
    for m in methods:
        ref[m] = p.energy(m)  # psi4 live
    name = "%s %s%s%s" % (label, basis, " core %d" % core if core else "",
                           " active %d" % active if active is not None else "")
    sel = []
    if core:
        sel += ["--core", core]
    if active is not None:
        sel += ["--active", active]
    flags = [] if "fci" in methods else ["--no-exact"]
    if "ccsd" not in methods:
        flags.append("--no-ccsd")
    if "mp2" not in methods:
        flags.append("--no-mp2")
    rc1, from_dump, _ = driver("--fcidump", dump, *(sel + flags))
    own_sel = sel
    rc2, own, _ = driver("--atoms", g, "--basis", basis, *(own_sel + flags))
    c.true("driver runs on psi4's FCIDUMP for %s" % name, rc1 == 0)
    c.true("driver runs on its own integrals for %s" % name, rc2 == 0)
    if rc1 or rc2:
        continue
    # the reference determinant of psi4's file is psi4's SCF state
    c.close("E(ref det) from psi4 FCIDUMP, %s" % name, from_dump["hf"], escf, TOL)
    for m in methods:
        key = "exact" if m == "fci" else m
        c.close("%s from psi4 FCIDUMP, %s" % (key, name), from_dump.get(key), ref[m], TOL)
        c.close("%s from own integrals, %s" % (key, name), own.get(key), ref[m], TOL)
    if "ccsd" in methods:
        c.true("CCSD converged, %s" % name, from_dump.get("ccsd_converged") and own.get("ccsd_converged"))
c.finish()
