"""chem_scf.py: restricted Hartree-Fock energies of H2, LiH and H2O at three
geometries each in STO-3G, 6-31G and cc-pVDZ, against psi4 run live
(27 comparisons, tolerance 1e-8 hartree), and the nuclear repulsion energy.
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
c.finish()
