"""chem_scf.py: restricted Hartree-Fock energies of H2, LiH and H2O at three
geometries each in STO-3G, 6-31G and cc-pVDZ, against psi4 run live
(27 comparisons, tolerance 1e-8 hartree), and the nuclear repulsion energy;
and f shells (spherical and cartesian) through a cc-pVTZ basis file.
Source of every reference value: psi4 1.3.2 (Debian), scf_type pk."""
import os
import sys

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from chem_common import Checker, GEOMETRIES, driver, psi4_setup

c = Checker()
for mol, geoms in GEOMETRIES.items():
    for basis in ("sto-3g", "6-31g", "cc-pvdz"):
        for tag, g in geoms:
            rc, ours, _ = driver("--atoms", g, "--basis", basis, "--no-mp2", "--no-ccsd", "--no-exact")
            p = psi4_setup(g, basis)
            e = p.energy("scf")  # psi4 live
            enuc = p.core.get_active_molecule().nuclear_repulsion_energy()
            label = "%s %s %s" % (mol, basis, tag)
            c.close("E(RHF) " + label, ours and ours["hf"], e, 1e-8)
            c.close("E(nuc) " + label, ours and ours["nuclear"], enuc, 1e-10)

# f functions, spherical and cartesian: psi4's own cc-pVTZ file (Debian psi4
# package, Gaussian-94) read by cairn as a user basis file, and the same text
# with `cartesian` (psi4 given the same text as a basis block).
import os
from chem_common import h2o, tmpdir

src = "/usr/share/psi4/basis/cc-pvtz.gbs"  # part of Debian's psi4 package, which the checks above ran
if c.true("psi4's basis file %s is there" % src, os.path.exists(src)):
    txt = open(src).read()
    keep, out, take = ("H", "O"), [], False
    for ln in txt.splitlines():  # only H and O, so that psi4's basis block stays small
        f = ln.split()
        if f and f[0] in ("spherical", "cartesian"):
            out.append(f[0])
        elif ln.startswith("****"):
            out.append(ln)
            take = False
        elif len(f) == 2 and f[1] == "0" and not f[0][0].isdigit():
            take = f[0] in keep
            if take:
                out.append(ln)
        elif take:
            out.append(ln)
    sph = "\n".join(out) + "\n"
    d = tmpdir()
    g = h2o(1.81)
    for kind in ("spherical", "cartesian"):
        text = sph.replace("spherical", kind)
        path = os.path.join(d, "tz-%s.gbs" % kind)
        open(path, "w").write(text)
        rc, ours, _ = driver("--atoms", g, "--basis-file", path, "--no-mp2", "--no-ccsd", "--no-exact")
        p = psi4_setup(g, "sto-3g")
        p.basis_helper("assign tz\n[tz]\n" + text, name="tz")
        e = p.energy("scf")  # psi4 live
        c.close("E(RHF) H2O R=1.81 cc-pVTZ (f shells, %s) as a basis file" % kind, ours and ours["hf"], e, 1e-8)
c.finish()
