#!/usr/bin/python3
"""Screening gradients against central finite differences of the exact energy.

For every pool kind, in Jordan-Wigner, Bravyi-Kitaev and parity, at the
Hartree-Fock reference, the qubit mean-field reference and a random product
state: cairn's closed-form dE/dtheta at theta = 0 must equal a five-point
central difference of E(theta) = <ref|U(theta)+ H U(theta)|ref>, computed here
on a dense statevector by independent numpy code, to 1e-7.

Sources: the molecules' integrals come from psi4 run live (RHF, STO-3G,
FCIDUMP written by psi4); the Hamiltonian, the generators (from their
excitation indices or Pauli text) and the states are built here with numpy.
"""
import os
import sys
import tempfile

import numpy as np

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
import ans_common as C  # noqa: E402

# explicit generators first: rule-made copies of them are then dropped as duplicates
RULES = ["excite 0 3 -> 4 7", "excite 1 -> 5", "word X0 Y1 Z2 X3", "word Y1 X6", "singles", "doubles",
         "singles spin-adapted", "doubles paired", "singles generalized", "doubles generalized",
         "doubles paired generalized", "qubit singles", "qubit doubles", "qubit doubles generalized",
         "entanglers"]
ENCODINGS = ["jordan-wigner", "bravyi-kitaev", "parity"]
TOL = 1e-7


def check(path, label, failures):
    norb, nelec, ms2, h1, h2, const = C.read_fcidump(path)
    n = 2 * norb
    a = C.annihilators(n)
    H_occ = C.hamiltonian(norb, h1, h2, const, a)
    nalpha, nbeta = (nelec + ms2) // 2, (nelec - ms2) // 2
    hf_occ = [1 if (m % 2 == 0 and m // 2 < nalpha) or (m % 2 == 1 and m // 2 < nbeta) else 0 for m in range(n)]
    kinds = set()
    for enc in ENCODINGS:
        A = C.encoding_matrix(enc, n)
        P = C.permutation(A)
        H = P @ H_occ @ P.T
        for ref in ("hartree-fock", "mean-field"):
            j = C.driver(["--encoding", enc, "--reference", ref, "--product", "5", path] + RULES)
            r = j["reference"]
            if ref == "hartree-fock":
                bits = "".join(str(int(v)) for v in (A @ np.array(hf_occ)) % 2)
                if r["bits"] != bits:
                    failures.append("%s %s: HF bits %s, expected %s" % (label, enc, r["bits"], bits))
                psi = C.basis_state(r["bits"])
            else:
                psi = C.product_state(r["theta"], r["phi"])
                e_hf = float(np.real(np.vdot(C.basis_state(r["bits"]), H @ C.basis_state(r["bits"]))))
                e_mf = float(np.real(np.vdot(psi, H @ psi)))
                # the product state is no higher than HF and stationary in its angles
                if e_mf > e_hf + 1e-10 or abs(e_mf - r["energy"]) > 1e-9:
                    failures.append("%s %s: mean-field energy %r (numpy %r, HF %r)" % (label, enc, r["energy"], e_mf, e_hf))
                th, ph = np.array(r["theta"]), np.array(r["phi"])
                for q in range(n):
                    for vec in (th, ph):
                        v0 = vec[q]
                        vec[q] = v0 + 1e-5
                        ep = C.product_state(th, ph)
                        vec[q] = v0 - 1e-5
                        em = C.product_state(th, ph)
                        vec[q] = v0
                        d = (np.vdot(ep, H @ ep) - np.vdot(em, H @ em)).real / 2e-5
                        if abs(d) > 1e-5:
                            failures.append("%s %s: mean field not stationary (dE = %g at qubit %d)" % (label, enc, d, q))
            prod = j["product"]
            psi_p = C.product_state(prod["theta"], prod["phi"])
            if abs(np.vdot(psi_p, H @ psi_p).real - prod["energy"]) > 1e-9:
                failures.append("%s %s: product-state energy" % (label, enc))
            worst = 0.0
            for g, gp in zip(j["generators"], prod["gradients"]):
                kinds.add(g["kind"])
                Aop = C.generator_unitary_family(g, n, a, P)
                eig = np.linalg.eigh(Aop)
                for state, value in ((psi, g["gradient"]), (psi_p, gp)):
                    fd = C.fd_gradient(Aop, H, state, eig=eig)
                    worst = max(worst, abs(fd - value))
                    if abs(fd - value) > TOL:
                        failures.append("%s %s %s %s %s: gradient %r, finite difference %r"
                                        % (label, enc, ref, g["kind"], g["text"], value, fd))
            print("%-14s %-13s %-12s %3d generators, worst |closed form - FD| = %.2e"
                  % (label, enc, ref, len(j["generators"]), worst))
    return kinds


def main():
    failures = []
    with tempfile.TemporaryDirectory() as tmp:
        h4 = os.path.join(tmp, "h4.fcidump")
        h4s = os.path.join(tmp, "h4s.fcidump")
        C.psi4_fcidump("H 0 0 0\nH 0 0 0.9\nH 0 0 1.8\nH 0 0 2.7", h4)
        C.psi4_fcidump("H 0 0 0\nH 0 0 2.0\nH 0 0 4.0\nH 0 0 6.0", h4s)
        # an open shell in the same orbitals: 3 electrons, S_z = 1/2 (psi4's
        # integrals, our electron count)
        h4c = os.path.join(tmp, "h4c.fcidump")
        C.set_electrons(h4, h4c, 3, 1)
        kinds = set()
        for path, label in ((h4, "H4 0.9 A"), (h4s, "H4 2.0 A"), (h4c, "H4+ 0.9 A")):
            kinds |= check(path, label, failures)
    expected = {"single", "double", "qubit-single", "qubit-double", "entangler", "word", "excite"}
    if kinds != expected:
        failures.append("kinds checked %s, expected %s" % (sorted(kinds), sorted(expected)))
    for f in failures[:40]:
        print("FAIL:", f)
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
