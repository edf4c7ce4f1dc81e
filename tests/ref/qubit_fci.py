"""qubit_fci.py — ground energies of the qubit Hamiltonian against psi4's full
CI, and tapering against the untapered sector.

Source: psi4 1.3 (Debian package, run live): SCF and FCI of H2, LiH and H2O in
STO-3G (scf_type pk, e_convergence 1e-10, d_convergence 1e-10, symmetry c1),
and the FCIDUMP file cairn reads.  For every encoding:
  - the lowest eigenvalue of H restricted to the reference's N / S_z sector
    (scipy.sparse) equals psi4's FCI energy to 1e-8;
  - <HF|H|HF> on cairn's encoded reference equals psi4's SCF energy to 1e-8
    (the Hartree-Fock determinant energy in its own orbitals);
  - with tapering: the tapered Hamiltonian's lowest eigenvalue equals the lowest
    eigenvalue of the untapered H restricted to the chosen Z2 sector, and psi4's
    FCI energy (the ground state shares the reference's symmetry); the tapered
    reference keeps the SCF energy; the parity encoding removes at least two
    qubits, among them particle-number parity.
"""
import os
import sys

import numpy as np

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
import qubit_common as qc  # noqa: E402

TOL = 1e-8


def bits_index(s):
    return sum(1 << q for q, c in enumerate(s) if c == "1")


def check(name, path, e_scf, e_fci):
    for enc in qc.ENCODINGS:
        j = qc.driver(path, enc, taper=True)
        norb, na, nb = j["norb"], j["nalpha"], j["nbeta"]
        n = 2 * norb
        occ = qc.sector_states(norb, na, nb)
        states = qc.encode_states(enc, n, occ)
        H = qc.sum_matrix(j["hamiltonian"], states)  # raises if H leaves the sector
        e0 = qc.lowest(H)
        if abs(e0 - e_fci) > TOL:
            qc.fail("%s %s: sector ground energy %.12f, psi4 FCI %.12f" % (name, enc, e0, e_fci))
        ref = bits_index(j["reference"])
        pos = int(np.where(states == ref)[0][0])
        e_ref = H[pos, pos].real
        if abs(e_ref - e_scf) > TOL:
            qc.fail("%s %s: <HF|H|HF> %.12f, psi4 SCF %.12f" % (name, enc, e_ref, e_scf))

        t = j["taper"]
        k = t["removed"]
        allst = np.arange(1 << n, dtype=np.int64)
        keep = np.ones(1 << n, dtype=bool)
        for tau, s in zip(t["tau"], t["sector"]):
            par = qc.popcount(allst & bits_index(tau)) % 2
            keep &= (1 - 2 * par) == s
        sector = allst[keep]
        if len(sector) != 1 << (n - k):
            qc.fail("%s %s: Z2 sector has %d states, expected %d" % (name, enc, len(sector), 1 << (n - k)))
        e_sec = qc.lowest(qc.sum_matrix(j["hamiltonian"], sector))
        Ht = qc.sum_matrix(t["hamiltonian"])
        e_tap = qc.lowest(Ht)
        if abs(e_tap - e_sec) > TOL:
            qc.fail("%s %s: tapered ground %.12f, untapered Z2 sector %.12f" % (name, enc, e_tap, e_sec))
        if abs(e_tap - e_fci) > TOL:
            qc.fail("%s %s: tapered ground %.12f, psi4 FCI %.12f" % (name, enc, e_tap, e_fci))
        tref = bits_index(t["reference"])
        e_tref = Ht[tref, tref].real
        if abs(e_tref - e_scf) > TOL:
            qc.fail("%s %s: tapered <HF|H|HF> %.12f, psi4 SCF %.12f" % (name, enc, e_tref, e_scf))
        if enc == "parity":
            if k < 2 or "particle-number parity" not in t["why"]:
                qc.fail("%s parity taper removed %d qubits (%s)" % (name, k, ", ".join(t["why"])))
        print("ok %-4s %-13s %2d qubits, FCI %.10f (diff %.1e), tapered to %2d qubits (%s), diff %.1e"
              % (name, enc, n, e0, e0 - e_fci, n - k, ", ".join(t["why"]), e_tap - e_fci))


def main():
    tmp = qc.tmpdir()
    mols = [
        ("H2", "0 1\nH 0 0 0\nH 0 0 0.74\nunits angstrom"),
        ("LiH", "0 1\nLi 0 0 0\nH 0 0 1.6\nunits angstrom"),
        ("H2O", "0 1\nO 0 0 0\nH 0 0.7586 0.5872\nH 0 -0.7586 0.5872\nunits angstrom"),
    ]
    for name, geom in mols:
        path, e_scf, e_fci = qc.psi4_run(geom, "sto-3g", tmp, name.lower())
        check(name, path, e_scf, e_fci)
    print("PASS")


if __name__ == "__main__":
    main()
