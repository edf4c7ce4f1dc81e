"""chem_rohf.py: open shells.  Restricted open-shell Hartree-Fock, ROHF-based
spin-orbital CCSD and the exact energy of the state of the recipe's
multiplicity, against psi4 run live (reference rohf; tolerance 1e-8 hartree):
OH (doublet), CH2 (triplet), NH2 (doublet) and Li (doublet atom).
Also: MP2 is absent for open shells (cairn computes closed-shell RMP2 only;
a value not computed is absent), and the exact state has <S^2> = S(S+1)."""
import os
import sys

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from chem_common import Checker, driver, psi4_setup

c = Checker()
CASES = [
    ("OH", "O 0 0 0; H 0 0 1.83", "6-31g", 2, "ccsd"),
    ("OH stretched", "O 0 0 0; H 0 0 3.2", "sto-3g", 2, "ccsd fci"),
    ("CH2 triplet", "C 0 0 0; H 0 1.6 1.2; H 0 -1.6 1.2", "sto-3g", 3, "ccsd fci"),
    ("CH2 triplet", "C 0 0 0; H 0 1.6 1.2; H 0 -1.6 1.2", "6-31g", 3, "ccsd"),
    ("NH2", "N 0 0 0; H 0 1.5 1.1; H 0 -1.5 1.1", "cc-pvdz", 2, ""),
    ("Li atom", "Li 0 0 0", "cc-pvdz", 2, "ccsd fci"),
]
for label, g, basis, mult, methods in CASES:
    methods = methods.split()
    p = psi4_setup(g, basis, mult=mult, reference="rohf")
    ref = {"scf": p.energy("scf")}  # psi4 live
    for m in methods:
        ref[m] = p.energy(m)
    flags = ["--mult", mult, "--exact-mult", mult]
    if "ccsd" not in methods:
        flags.append("--no-ccsd")
    if "fci" not in methods:
        flags.append("--no-exact")
    rc, ours, _ = driver("--atoms", g, "--basis", basis, *flags)
    name = "%s %s" % (label, basis)
    if not c.true("driver runs for %s" % name, rc == 0):
        continue
    c.close("E(ROHF) " + name, ours["hf"], ref["scf"], 1e-8)
    c.true("MP2 absent for the open shell %s" % name, "mp2" not in ours)
    if "ccsd" in methods:
        c.close("E(ROHF-CCSD) " + name, ours.get("ccsd"), ref["ccsd"], 1e-8)
    if "fci" in methods:
        s = 0.5 * (mult - 1)
        c.close("E(exact, multiplicity %d) %s" % (mult, name), ours.get("exact"), ref["fci"], 1e-8)
        c.close("<S^2> of the exact state, %s (S(S+1), common practice)" % name, ours.get("exact_s2"), s * (s + 1), 1e-8)
c.finish()
