# make-h4-chain.py: writes h4-chain.fcidump (see README).  Run with Debian's /usr/bin/python3.
import sys
sys.path.insert(0, "/usr/lib/x86_64-linux-gnu")
import psi4
psi4.set_output_file("/dev/null", False)
psi4.set_memory("500 MB")
mol = psi4.geometry("""
0 1
H 0.0 0.0 0.0
H 0.0 0.0 1.5
H 0.0 0.0 3.0
H 0.0 0.0 4.5
units angstrom
symmetry c1
no_reorient
no_com
""")
psi4.set_options({"basis": "sto-3g", "scf_type": "pk", "e_convergence": 1e-10, "d_convergence": 1e-10, "reference": "rhf"})
e, wfn = psi4.energy("scf", return_wfn=True)
psi4.fcidump(wfn, fname=sys.argv[1], oe_ints=["EIGENVALUES"])
print("E(SCF) = %.10f" % e)
