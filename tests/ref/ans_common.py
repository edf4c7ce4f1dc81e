"""ans_common.py — shared helpers of the ansatz reference checks.

Independent of cairn's C code: molecules come from psi4 run live (FCIDUMP
files written by psi4 itself), and everything else is rebuilt here with numpy
in the occupation basis (second quantization by explicit matrices), then
carried into an encoding by its GF(2) matrix (Jordan-Wigner: identity; parity:
b_i = n_0 + ... + n_i; Bravyi-Kitaev: the recursive matrix of Seeley, Richard
and Love, J. Chem. Phys. 137, 224109 (2012)).  Only the generator *labels*
(excitation indices, Pauli words, reference angles) are read from cairn's
output; the operators are built here.
"""
import json
import os
import subprocess
import sys

import numpy as np

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
# psi4, the FCIDUMP reader, the encodings' GF(2) matrices, the basis
# permutation they make, Pauli words and the Hamiltonian from ladder
# matrices (tests/ref/ref_common.py)
import ref_common  # noqa: E402
from ref_common import dense, encoding_matrix, parse_word, permutation, read_fcidump  # noqa: E402,F401


def psi4_fcidump(geometry, path, basis="sto-3g", charge=0, mult=1):
    """RHF with psi4 (scf_type pk, tight convergence, c1, no reorientation) and
    its own FCIDUMP writer (ref_common.psi4_fcidump).  Returns the SCF energy."""
    return ref_common.psi4_fcidump("%d %d\n%s" % (charge, mult, geometry), path, basis)[0]


def set_electrons(src, dst, nelec, ms2):
    """Copy an FCIDUMP file with other NELEC and MS2 (same integrals)."""
    text = open(src).read()
    import re

    text = re.sub(r"NELEC=\s*\d+", "NELEC=%d" % nelec, text)
    text = re.sub(r"MS2=\s*-?\d+", "MS2=%d" % ms2, text)
    open(dst, "w").write(text)


# ---- second quantization in the occupation basis (qubit q = bit q, 1 = occupied)

def annihilators(nmodes):
    dim = 1 << nmodes
    ops = []
    for j in range(nmodes):
        a = np.zeros((dim, dim))
        for n in range(dim):
            if (n >> j) & 1:
                sign = -1.0 if bin(n & ((1 << j) - 1)).count("1") % 2 else 1.0
                a[n ^ (1 << j), n] = sign
        ops.append(a)
    return ops


def hamiltonian(norb, h1, h2, const, a):
    """H = c + sum h_pq a+_p a_q + 1/2 sum (pq|rs) a+_p a+_r a_s a_q over spin orbitals."""
    return ref_common.ladder_hamiltonian(h1, h2, const, a, [x.T for x in a], np.eye(1 << len(a)))


def spin_operators(nmodes, a):
    ad = [x.T for x in a]
    N = sum(ad[p] @ a[p] for p in range(nmodes))
    Sz = 0.5 * sum(ad[p] @ a[p] * (1 if p % 2 == 0 else -1) for p in range(nmodes))
    Sp = sum(ad[2 * p] @ a[2 * p + 1] for p in range(nmodes // 2))
    S2 = Sp.T @ Sp + Sz + Sz @ Sz
    return N, Sz, S2


def excitation(a, frm, to):
    """T = a+_{t0} ... a+_{t(k-1)} a_{f(k-1)} ... a_{f0} (cairn's stated convention)."""
    dim = a[0].shape[0]
    T = np.eye(dim)
    for t in to:
        T = T @ a[t].T
    for f in reversed(frm):
        T = T @ a[f]
    return T


def qubit_excitation(nmodes, frm, to):
    """Q = prod Q+_t prod Q_f with Q+ = |1><0| on each mode, no parity strings."""
    dim = 1 << nmodes
    Q = np.zeros((dim, dim))
    for n in range(dim):
        if all((n >> f) & 1 for f in frm) and not any((n >> t) & 1 for t in to):
            m = n
            for f in frm:
                m &= ~(1 << f)
            for t in to:
                m |= 1 << t
            Q[m, n] = 1.0
    return Q


def pauli_matrix(text, n):
    """Dense matrix of a sparse Pauli word ("X0 Y1 Z5"), qubit q = bit q."""
    return dense(n, parse_word(text))


def product_state(theta, phi):
    psi = np.ones(1, dtype=complex)
    for q in reversed(range(len(theta))):
        psi = np.kron(psi, np.array([np.cos(theta[q] / 2), np.exp(1j * phi[q]) * np.sin(theta[q] / 2)]))
    return psi


def basis_state(bits):
    n = len(bits)
    psi = np.zeros(1 << n, dtype=complex)
    psi[sum(1 << q for q in range(n) if bits[q] == "1")] = 1
    return psi


def driver(args):
    """Run cairn's check driver; returns the parsed JSON (stderr passed through)."""
    exe = os.path.join(os.environ.get("CAIRN_BUILDDIR", "."), "tests", "ref", "ans_driver")
    out = subprocess.run([exe] + args, stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True)
    if out.returncode != 0:
        sys.stderr.write(out.stderr)
        raise RuntimeError("ans_driver %s failed with status %d" % (" ".join(args), out.returncode))
    return json.loads(out.stdout)


def generator_unitary_family(g, nmodes, a, P):
    """(A Hermitian, sign) with U(theta) = exp(i theta A) for generator g, built
    here from its label: excitations and qubit excitations from their indices
    (theta (K - K+) = i theta A), words from their Pauli text (exp(-i theta P/2))."""
    kind = g["kind"]
    if "from" in g:
        frm, to = g["from"], g["to"]
        if kind in ("qubit-single", "qubit-double"):
            T = qubit_excitation(nmodes, frm, to)
        else:
            T = excitation(a, frm, to)
            if g.get("spin_adapted"):
                T = T + excitation(a, [f + 1 for f in frm], [t + 1 for t in to])
        K = P @ (T - T.T) @ P.T
        return -1j * K
    return -0.5 * pauli_matrix(g["text"], nmodes)


def fd_gradient(A, H, psi, h=1e-3, eig=None):
    """Five-point central difference of E(theta) = <psi|U+ H U|psi>, U = exp(i theta A).
    eig: (w, V) of A when already known."""
    w, V = eig if eig is not None else np.linalg.eigh(A)
    c = V.conj().T @ psi

    def E(t):
        phi = V @ (np.exp(1j * t * w) * c)
        return float(np.real(np.vdot(phi, H @ phi)))

    return (-E(2 * h) + 8 * E(h) - 8 * E(-h) + E(-2 * h)) / (12 * h)
