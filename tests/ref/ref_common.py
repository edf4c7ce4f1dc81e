"""ref_common.py — helpers shared by the reference checks in tests/ref.

Written independently of cairn's C code, with numpy: Pauli words and their
dense matrices, the Jordan-Wigner algebra of ladder operators on words
(Jordan & Wigner 1928; a_p = Z_0 ... Z_{p-1} (X_p + i Y_p) / 2, common
practice), the GF(2) matrices of the encodings (Bravyi-Kitaev by the
recursive construction of Seeley, Richard and Love, J. Chem. Phys. 137,
224109, 2012), the second-quantized Hamiltonian from ladder matrices, a
reader of FCIDUMP files (Knowles & Handy, Comput. Phys. Commun. 54, 75,
1989), scratch directories, and psi4 (Debian's, run live) with the
project's reference settings.  Qubit q is bit q of a basis-state index
(DEVELOPERS.md).  Nothing here checks anything: each test keeps its own
checks, tolerances and sources.
"""
import atexit
import os
import shutil
import sys
import tempfile

import numpy as np

# ---- Pauli words as {qubit: letter} -----------------------------------------

PAULI = {
    "I": np.eye(2, dtype=complex),
    "X": np.array([[0, 1], [1, 0]], dtype=complex),
    "Y": np.array([[0, -1j], [1j, 0]], dtype=complex),
    "Z": np.array([[1, 0], [0, -1]], dtype=complex),
}


def dense(n, word):
    """Matrix of a word {qubit: letter} on n qubits; qubit q is bit q of the
    basis index (the Kronecker product runs from the top qubit down)."""
    m = np.eye(1, dtype=complex)
    for q in range(n - 1, -1, -1):
        m = np.kron(m, PAULI[word.get(q, "I")])
    return m


def text(word):
    """Sparse text of a word: "X0 Y1 Z5", qubits increasing; "I" when empty."""
    return " ".join(f"{word[q]}{q}" for q in sorted(word)) or "I"


def parse_word(s):
    """{qubit: letter} of a sparse text ("X0 Y1 Z5", or "I")."""
    if s.strip() == "I":
        return {}
    return {int(tok[1:]): tok[0] for tok in s.split()}


def word_masks(word):
    """(x, z, ny) of a word given as {qubit: letter} or ((qubit, letter), ...):
    X on the x bits, Z on the z bits, Y on both (ny of them), so that the
    word is i^ny X^x Z^z (Y = iXZ, the Pauli matrices)."""
    x = z = ny = 0
    for q, L in (word.items() if isinstance(word, dict) else word):
        if L in "XY":
            x |= 1 << q
        if L in "YZ":
            z |= 1 << q
        ny += L == "Y"
    return x, z, ny


# ---- Jordan-Wigner algebra on words as sorted ((qubit, letter), ...) tuples ----

MUL = {("X", "Y"): (1j, "Z"), ("Y", "Z"): (1j, "X"), ("Z", "X"): (1j, "Y"),
       ("Y", "X"): (-1j, "Z"), ("Z", "Y"): (-1j, "X"), ("X", "Z"): (-1j, "Y")}


def word_mul(a, b):
    """Product of two words: (phase, word) with a b = phase * word."""
    ph, out = 1, dict(a)
    for q, l in b:
        if q not in out:
            out[q] = l
        elif out[q] == l:
            del out[q]
        else:
            f, r = MUL[(out[q], l)]
            ph *= f
            out[q] = r
    return ph, tuple(sorted(out.items()))


def op_mul(s, t):
    """Product of two operators {word: coefficient}."""
    acc = {}
    for wa, ca in s.items():
        for wb, cb in t.items():
            ph, w = word_mul(wa, wb)
            acc[w] = acc.get(w, 0) + ca * cb * ph
    return acc


def ladder(p, dagger):
    """Jordan-Wigner a_p (a_p^+ with dagger) = Z_0..Z_{p-1} (X_p +- i Y_p)/2."""
    z = tuple((q, "Z") for q in range(p))
    return {z + ((p, "X"),): 0.5, z + ((p, "Y"),): (-0.5j if dagger else 0.5j)}


def product(ops):
    """The operator product of ladders [(mode, dagger), ...] as written."""
    out = {(): 1}
    for p, d in ops:
        out = op_mul(out, ladder(p, d))
    return out


def excitation_words(frm, to):
    """G = 2i (T - T^+), T = a_to^+ ... a_from ... (from in reverse order), as
    {word: real multiplier}."""
    t = product([(a, 1) for a in to] + [(i, 0) for i in reversed(frm)])
    td = product([(i, 1) for i in frm] + [(a, 0) for a in reversed(to)])
    g = {}
    for w, c in t.items():
        g[w] = g.get(w, 0) + 2j * c
    for w, c in td.items():
        g[w] = g.get(w, 0) - 2j * c
    return {w: c.real for w, c in g.items() if abs(c) > 1e-12}


# ---- second quantization by matrices --------------------------------------------

def ladder_hamiltonian(h1, h2, const, a, ad, eye):
    """H = const + sum h_pq a+_P a_Q + 1/2 sum (pq|rs) a+_P a+_R a_S a_Q over
    spin orbitals (P = 2p + spin, spin kept along each pair; chemists'
    notation), from the annihilator matrices a, their adjoints ad and the
    identity eye (dense or sparse alike)."""
    n = len(a)
    H = const * eye
    for p in range(n):
        for q in range(n):
            if p % 2 == q % 2 and h1[p // 2, q // 2] != 0:
                H += h1[p // 2, q // 2] * (ad[p] @ a[q])
    for p in range(n):
        for q in range(n):
            if p % 2 != q % 2:
                continue
            for r in range(n):
                for s in range(n):
                    if r % 2 != s % 2:
                        continue
                    v = h2[p // 2, q // 2, r // 2, s // 2]
                    if v != 0:
                        H += 0.5 * v * (ad[p] @ ad[r] @ a[s] @ a[q])
    return H


# ---- encodings as GF(2) matrices: b = A n ------------------------------------

def encoding_matrix(name, n):
    """GF(2) matrix A with b = A n for occupation vector n (qubit 0 first)."""
    if name == "jordan-wigner":
        return np.eye(n, dtype=np.int64)
    if name == "parity":
        return np.tril(np.ones((n, n), dtype=np.int64))
    if name == "bravyi-kitaev":
        # beta_1 = [1], beta_2m = [[beta_m, 0], [A_m, beta_m]] with A_m zero but
        # for its last row of ones (qubit 2m-1 holds the parity of all 2m
        # modes); for other n the leading n x n block.
        b = np.ones((1, 1), dtype=np.int64)
        while b.shape[0] < n:
            m = b.shape[0]
            am = np.zeros((m, m), dtype=np.int64)
            am[m - 1, :] = 1
            b = np.block([[b, np.zeros((m, m), dtype=np.int64)], [am, b]])
        return b[:n, :n].copy()
    raise ValueError(name)


def permutation(A):
    """P with P e_n = e_{A n}: an occupation-basis operator O becomes P O P^T."""
    n = A.shape[0]
    dim = 1 << n
    P = np.zeros((dim, dim))
    for occ in range(dim):
        v = np.array([(occ >> j) & 1 for j in range(n)])
        b = (A @ v) % 2
        P[int(sum(int(b[q]) << q for q in range(n))), occ] = 1.0
    return P


# ---- FCIDUMP files ------------------------------------------------------------

def read_fcidump(path):
    """(norb, nelec, ms2, h1, h2 chemists' (pq|rs) with the 8-fold symmetry,
    constant) of an FCIDUMP file; orbital-energy lines (i 0 0 0) are skipped."""
    text = open(path).read()
    end = text.upper().find("&END")
    if end >= 0:
        head, body = text[:end], text[end + 4:]
    else:
        head, body = text.split("/", 1)
    fields = {}
    for part in head.replace("&FCI", "").replace("&fci", "").replace("\n", " ").split(","):
        if "=" in part:
            k, v = part.split("=", 1)
            fields[k.strip().upper()] = v.strip()
    norb = int(fields["NORB"])
    nelec = int(fields["NELEC"])
    ms2 = int(fields.get("MS2", "0"))
    h1 = np.zeros((norb, norb))
    h2 = np.zeros((norb,) * 4)
    const = 0.0
    for line in body.splitlines():
        f = line.split()
        if len(f) != 5:
            continue
        v = float(f[0].replace("D", "E").replace("d", "e"))
        i, j, k, l = (int(x) for x in f[1:])
        if i == j == k == l == 0:
            const = v
        elif k == 0 and l == 0:
            if j == 0:
                continue  # orbital energy
            h1[i - 1, j - 1] = h1[j - 1, i - 1] = v
        else:
            i, j, k, l = i - 1, j - 1, k - 1, l - 1
            for a, b, c, d in ((i, j, k, l), (j, i, k, l), (i, j, l, k), (j, i, l, k),
                               (k, l, i, j), (l, k, i, j), (k, l, j, i), (l, k, j, i)):
                h2[a, b, c, d] = v
    return norb, nelec, ms2, h1, h2, const


# ---- scratch directories ------------------------------------------------------

def tmpdir(prefix="cairn-check-"):
    """A temporary directory removed when the process exits."""
    d = tempfile.mkdtemp(prefix=prefix)
    atexit.register(shutil.rmtree, d, True)
    return d


# ---- psi4, run live ------------------------------------------------------------

# The reference settings for psi4: SCF options and the molecule's frame.
PSI4_SCF = {"scf_type": "pk", "e_convergence": 1e-10, "d_convergence": 1e-10}
PSI4_FRAME = "symmetry c1\nno_reorient\nno_com\n"


def psi4_module():
    """Debian's psi4, importable from Debian's python3; exits 77 (skip) when
    it is not installed."""
    sys.path.insert(0, "/usr/lib/x86_64-linux-gnu")
    try:
        import psi4
    except ImportError:
        print("psi4 is not installed (Debian package psi4): skipped")
        sys.exit(77)
    return psi4


def psi4_fcidump(molecule, path, basis, frozen_docc=None, frozen_uocc=None, fci=False):
    """RHF with psi4 on `molecule` (psi4 geometry text: charge and
    multiplicity line, atoms, units), its own FCIDUMP writer into `path`, and
    with fci also psi4's full-CI energy (r_convergence 1e-8).  Output goes to
    path + ".out".  Returns (e_scf, e_fci or None)."""
    psi4 = psi4_module()
    psi4.core.clean()
    psi4.core.clean_options()
    psi4.core.set_output_file(path + ".out", False)
    psi4.set_memory("500 MB")
    mol = psi4.geometry(molecule + "\n" + PSI4_FRAME)
    opts = dict(PSI4_SCF, basis=basis, reference="rhf", r_convergence=1e-8)
    if frozen_docc is not None:
        opts["frozen_docc"] = [frozen_docc]
    if frozen_uocc is not None:
        opts["frozen_uocc"] = [frozen_uocc]
    psi4.set_options(opts)
    e_scf, wfn = psi4.energy("scf", return_wfn=True, molecule=mol)
    psi4.fcidump(wfn, path)
    e_fci = psi4.energy("fci", molecule=mol) if fci else None
    psi4.core.clean()
    return e_scf, e_fci
