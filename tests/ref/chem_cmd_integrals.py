"""chem_cmd_integrals.py: `cairn integrals -o X.fcidump FILE` on a recipe
(tests/ref/chem_water.cairn: water, STO-3G, frozen core, 4 electrons in 4
orbitals).  The file's reference energy is psi4's SCF energy and its exact
energy psi4's CASCI (energy('fci') with frozen_docc [3], the folded core),
psi4 run live, 1e-8 hartree.  Writing twice gives the same bytes; a recipe
with an unknown basis set fails with exit status 1 and a located message."""
import os
import subprocess
import sys

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from chem_common import SRC, Checker, driver, psi4_setup, tmpdir

CAIRN = os.environ.get("CAIRN", os.path.join(os.path.dirname(__file__), "..", "..", "cairn"))
c = Checker()
tmp = tmpdir()
recipe = os.path.join(SRC, "tests", "ref", "chem_water.cairn")
a, b = os.path.join(tmp, "a.fcidump"), os.path.join(tmp, "b.fcidump")
r1 = subprocess.run([CAIRN, "integrals", "-o", a, recipe], capture_output=True, text=True)
r2 = subprocess.run([CAIRN, "integrals", "-o", b, recipe], capture_output=True, text=True)
sys.stderr.write(r1.stderr)
if c.true("cairn integrals exits 0", r1.returncode == 0 and r2.returncode == 0):
    c.true("it says what it wrote", r1.stdout.startswith("wrote %s: 4 orbitals, 2 alpha + 2 beta electrons" % a))
    c.true("the same bytes twice", open(a, "rb").read() == open(b, "rb").read())
    rc, ours, _ = driver("--fcidump", a)
    g = "O 0 0 0; H 0 1.43 1.1; H 0 -1.43 1.1"
    p = psi4_setup(g, "sto-3g")
    escf = p.energy("scf")  # psi4 live
    p.set_options({"frozen_docc": [3]})
    ecas = p.energy("fci")  # psi4 live: CASCI of the 4 orbitals above the 3 lowest
    c.close("reference energy of the written file vs psi4 SCF", ours and ours["hf"], escf, 1e-8)
    c.close("exact energy of the written file vs psi4 CASCI", ours and ours["exact"], ecas, 1e-8)

bad = os.path.join(tmp, "bad.cairn")
open(bad, "w").write(open(recipe).read().replace("basis sto-3g", "basis sto-4g"))
r = subprocess.run([CAIRN, "integrals", "-o", os.path.join(tmp, "c.fcidump"), bad], capture_output=True, text=True)
c.true("unknown basis: exit status 1", r.returncode == 1)
c.true("unknown basis: located message", "bad.cairn:9:" in r.stderr and "unknown basis set `sto-4g`" in r.stderr)
c.true("unknown basis: nothing written", not os.path.exists(os.path.join(tmp, "c.fcidump")))
c.finish()
