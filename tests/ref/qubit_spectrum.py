"""qubit_spectrum.py — the qubit Hamiltonian against numpy's own second
quantization from the same integrals (up to 10 qubits).

Sources: psi4 1.3 (Debian package, run live) writes the FCIDUMP files of H2
(STO-3G and 6-31G) and LiH (STO-3G, frozen 1s core); numpy/scipy build the
Jordan-Wigner matrix from the ladder-operator definition (qubit_common.py,
independent of cairn's C code).  Checks:
  - Jordan-Wigner: cairn's matrix equals numpy's entry by entry (1e-10) and the
    spectra agree to 1e-10;
  - Bravyi-Kitaev and parity: cairn's matrix equals numpy's Jordan-Wigner
    matrix with rows and columns relabelled by b = A n, A built independently
    (Seeley-Richard-Love recursion; lower-triangular ones), so spectra agree;
  - S^2 equals numpy's S_- S_+ + S_z^2 + S_z, its eigenvalues are s(s+1)
    (common practice), N and S_z are diagonal with the electron counts.
"""
import sys
import os

import numpy as np

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
import qubit_common as qc  # noqa: E402


def check_system(name, path):
    norb, nelec, ms2, h1, h2, e0 = qc.read_fcidump(path)
    n = 2 * norb
    ref = qc.jw_hamiltonian(h1, h2, e0).toarray()
    ref_s2 = qc.jw_spin_squared(norb).toarray()
    w_ref = np.linalg.eigvalsh(ref)
    occ = np.arange(1 << n, dtype=np.int64)
    for enc in qc.ENCODINGS:
        j = qc.driver(path, enc)
        H = qc.sum_matrix(j["hamiltonian"]).toarray()
        b = qc.encode_states(enc, n, occ)  # occupation index -> encoded index
        Hback = H[np.ix_(b, b)]            # in the occupation (Jordan-Wigner) basis
        d = np.abs(Hback - ref).max()
        if d > 1e-10:
            qc.fail("%s %s: matrix differs from numpy's by %.3g" % (name, enc, d))
        w = np.linalg.eigvalsh(H)
        dw = np.abs(w - w_ref).max()
        if dw > 1e-10:
            qc.fail("%s %s: spectrum differs from numpy's by %.3g" % (name, enc, dw))
        S2 = qc.sum_matrix(j["spin_squared"]).toarray()[np.ix_(b, b)]
        if np.abs(S2 - ref_s2).max() > 1e-10:
            qc.fail("%s %s: S^2 differs from numpy's" % (name, enc))
        ws = np.linalg.eigvalsh(S2)
        s = (-1 + np.sqrt(1 + 4 * np.clip(ws, 0, None))) / 2  # s from s(s+1)
        if np.abs(2 * s - np.round(2 * s)).max() > 1e-8:
            qc.fail("%s %s: S^2 eigenvalue that is not s(s+1)" % (name, enc))
        bits = (occ[:, None] >> np.arange(n)[None, :]) & 1
        na, nb = bits[:, 0::2].sum(1), bits[:, 1::2].sum(1)
        N = qc.sum_matrix(j["number"]).toarray()[np.ix_(b, b)]
        Sz = qc.sum_matrix(j["spin_z"]).toarray()[np.ix_(b, b)]
        if np.abs(N - np.diag(na + nb)).max() > 1e-12 or np.abs(Sz - np.diag((na - nb) / 2)).max() > 1e-12:
            qc.fail("%s %s: N or S_z is not the electron count" % (name, enc))
        print("ok %-10s %-13s %2d qubits %4d terms, spectrum max diff %.1e" %
              (name, enc, n, len(j["hamiltonian"]["terms"]), dw))


def main():
    tmp = qc.tmpdir()
    h2 = "0 1\nH 0 0 0\nH 0 0 0.74\nunits angstrom"
    lih = "0 1\nLi 0 0 0\nH 0 0 1.6\nunits angstrom"
    systems = []
    p, _, _ = qc.psi4_run(h2, "sto-3g", tmp, "h2", fci=False)
    systems.append(("H2/STO-3G", p))
    p, _, _ = qc.psi4_run(h2, "6-31g", tmp, "h2b", fci=False)
    systems.append(("H2/6-31G", p))
    p, _, _ = qc.psi4_run(lih, "sto-3g", tmp, "lih", fci=False, frozen_docc=1)
    systems.append(("LiH/fc", p))
    # random integrals of the right symmetry, odd electron count, MS2 = 1 (invented data)
    h1, g = qc.random_integrals(4, 7)
    p = os.path.join(tmp, "random.fcidump")
    qc.write_fcidump(p, h1, g, 0.31, nelec=3, ms2=1)
    systems.append(("random", p))
    for name, path in systems:
        check_system(name, path)
    print("PASS")


if __name__ == "__main__":
    main()
