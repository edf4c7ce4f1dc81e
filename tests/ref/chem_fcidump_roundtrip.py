"""chem_fcidump_roundtrip.py: FCIDUMP round trips.
  1. cairn's integrals (H2O 6-31G, frozen core, 7 active orbitals) written
     with cairn's writer, read back: the same HF, MP2, CCSD and exact energies
     (1e-10 hartree); writing the read space again gives the same bytes
     (deterministic output).
  2. A file written by psi4.fcidump() (psi4 run live) read by cairn, written
     by cairn, read again: the same energies, and the reference energy of the
     file equals psi4's SCF energy (1e-8)."""
import os
import sys

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from chem_common import tmpdir, Checker, driver, h2o, lih, psi4_setup

c = Checker()
tmp = tmpdir("cairn-rt-")
a, b, b2 = (os.path.join(tmp, n) for n in ("a.fcidump", "b.fcidump", "b2.fcidump"))
g = h2o(2.0)
rc, first, _ = driver("--atoms", g, "--basis", "6-31g", "--frozen-core", "--active", 7, "--write-fcidump", a)
rc2, back, _ = driver("--fcidump", a, "--write-fcidump", b)
rc3, again, _ = driver("--fcidump", b, "--write-fcidump", b2, "--no-ccsd", "--no-exact")
if c.true("write, read, write runs", rc == 0 and rc2 == 0 and rc3 == 0):
    for k in ("hf", "mp2", "ccsd", "exact"):
        c.close("%s: own integrals vs their FCIDUMP read back" % k, back.get(k), first.get(k), 1e-10)
    c.close("hf: reference energy of the file = SCF energy", back["reference"], first["hf"], 1e-10)
    c.true("the second write has the same bytes as the first", open(b, "rb").read() == open(a, "rb").read())
    c.true("and the third", open(b2, "rb").read() == open(a, "rb").read())

# a psi4-written file through cairn's reader and writer
g = lih(3.2)
p = psi4_setup(g, "6-31g")
escf, wfn = p.energy("scf", return_wfn=True)  # psi4 live
pfile = os.path.join(tmp, "psi4.fcidump")
p.fcidump(wfn, fname=pfile, oe_ints=["EIGENVALUES"])
ours_file = os.path.join(tmp, "ours.fcidump")
rc, r1, _ = driver("--fcidump", pfile, "--write-fcidump", ours_file)
rc2, r2, _ = driver("--fcidump", ours_file)
if c.true("psi4 file read, written, read again", rc == 0 and rc2 == 0):
    c.close("reference energy of psi4's file = psi4 SCF", r1["hf"], escf, 1e-8)
    for k in ("hf", "mp2", "ccsd", "exact"):
        c.close("%s: psi4 file vs cairn's copy of it" % k, r2.get(k), r1.get(k), 1e-10)
c.finish()
