#!/usr/bin/python3
"""Write h4.fcidump: linear H4, 1.0 angstrom spacing, STO-3G, RHF, by psi4.
Usage: /usr/bin/python3 make-h4.py h4.fcidump"""
import sys

sys.path.insert(0, "/usr/lib/x86_64-linux-gnu")
import psi4  # noqa: E402

psi4.core.set_output_file(sys.argv[1] + ".out", False)
psi4.geometry("0 1\nH 0 0 0\nH 0 0 1.0\nH 0 0 2.0\nH 0 0 3.0\nunits angstrom\nsymmetry c1\nno_reorient\nno_com\n")
psi4.set_options({"basis": "sto-3g", "scf_type": "pk", "e_convergence": 1e-10, "d_convergence": 1e-10})
e, wfn = psi4.energy("scf", return_wfn=True)
psi4.fcidump(wfn, sys.argv[1])
print("E(SCF) = %.10f" % e)
