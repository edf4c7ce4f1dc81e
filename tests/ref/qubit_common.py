"""qubit_common.py — shared pieces of the qubit-layer reference checks.

Everything here is written independently of cairn's C code: the FCIDUMP
parser, the encoding matrices (Bravyi-Kitaev by the recursive construction
of Seeley, Richard and Love 2012) and the Hamiltonian from ladder matrices
(all three in tests/ref/ref_common.py), the Jordan-Wigner second
quantization and the Pauli-word matrices.  cairn's side comes only through
the check driver (tests/ref/qubit_driver), which prints its Pauli sums as
JSON.
"""
import json
import os
import subprocess
import sys

import numpy as np
import scipy.sparse as sp

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
# the FCIDUMP reader, the encodings' GF(2) matrices and psi4 (tests/ref/ref_common.py)
import ref_common  # noqa: E402
from ref_common import encoding_matrix, psi4_fcidump, read_fcidump  # noqa: E402,F401

ENCODINGS = ["jordan-wigner", "bravyi-kitaev", "parity"]


def fail(msg):
    print("FAIL:", msg)
    sys.exit(1)


def builddir():
    return os.environ.get("CAIRN_BUILDDIR", os.getcwd())


def driver(fcidump, encoding, taper=False):
    """Run the check driver; returns the parsed JSON."""
    exe = os.path.join(builddir(), "tests", "ref", "qubit_driver")
    cmd = [exe, fcidump, encoding] + (["--taper"] if taper else [])
    out = subprocess.run(cmd, stdout=subprocess.PIPE, stderr=subprocess.PIPE, universal_newlines=True)
    if out.returncode != 0:
        fail("%s exited %d: %s" % (" ".join(cmd), out.returncode, out.stderr))
    return json.loads(out.stdout)


def psi4_run(geometry, basis, tmpdir, name, fci=True, frozen_docc=None, frozen_uocc=None):
    """SCF (and FCI) with psi4, live; writes NAME.fcidump.  Returns
    (path, e_scf, e_fci or None).  Options as REFERENCES.md prescribes
    (ref_common.psi4_fcidump)."""
    os.chdir(tmpdir)  # psi4 leaves scratch files (timer.dat) in the working directory
    path = os.path.join(tmpdir, name + ".fcidump")
    e_scf, e_fci = psi4_fcidump(geometry, path, basis, frozen_docc, frozen_uocc, fci)
    return path, e_scf, e_fci


def write_fcidump(path, h1, h2, e0, nelec, ms2=0):
    """Write integrals as an FCIDUMP file (unique index quadruples)."""
    n = h1.shape[0]
    with open(path, "w") as f:
        f.write("&FCI NORB=%d,NELEC=%d,MS2=%d,\n ORBSYM=%s\n ISYM=1,\n&END\n"
                % (n, nelec, ms2, "1," * n))
        for i in range(n):
            for j in range(i + 1):
                for k in range(n):
                    for l in range(k + 1):
                        if i * (i + 1) // 2 + j < k * (k + 1) // 2 + l:
                            continue
                        f.write("%.17e %d %d %d %d\n" % (h2[i, j, k, l], i + 1, j + 1, k + 1, l + 1))
        for i in range(n):
            for j in range(i + 1):
                f.write("%.17e %d %d 0 0\n" % (h1[i, j], i + 1, j + 1))
        f.write("%.17e 0 0 0 0\n" % e0)


def random_integrals(norb, seed):
    """Real integrals with the 8-fold permutational symmetry (invented data)."""
    rng = np.random.RandomState(seed)
    a = rng.uniform(-0.5, 0.5, (norb, norb))
    h1 = (a + a.T) / 2 - 2.0 * np.eye(norb)
    h2 = rng.uniform(-0.15, 0.15, (norb,) * 4)
    h2 = (h2 + h2.transpose(1, 0, 2, 3)) / 2
    h2 = (h2 + h2.transpose(0, 1, 3, 2)) / 2
    h2 = (h2 + h2.transpose(2, 3, 0, 1)) / 2
    for p in range(norb):
        for r in range(norb):
            h2[p, p, r, r] += 0.4
    return h1, h2


# ---- encodings (independent implementations) ----

def encode_states(name, n, occ):
    """Encoded basis-state indices of occupation indices occ (numpy int array)."""
    A = encoding_matrix(name, n)
    bits = (occ[:, None] >> np.arange(n)[None, :]) & 1
    enc = (bits @ A.T) % 2
    return (enc << np.arange(n)[None, :]).sum(axis=1)


def sector_states(norb, nalpha, nbeta):
    """Occupation indices (mode 2p alpha, 2p+1 beta) with the given electron counts."""
    n = 2 * norb
    occ = np.arange(1 << n, dtype=np.int64)
    bits = (occ[:, None] >> np.arange(n)[None, :]) & 1
    na = bits[:, 0::2].sum(axis=1)
    nb = bits[:, 1::2].sum(axis=1)
    return occ[(na == nalpha) & (nb == nbeta)]


# ---- Pauli sums as matrices ----

def parse_sum(j):
    """JSON Pauli sum -> (n, constant, [(xmask, zmask, coeff)])."""
    def num(v):
        return complex(v[0], v[1]) if isinstance(v, list) else complex(v)
    terms = []
    for t in j["terms"]:
        x = z = 0
        for tok in t["pauli"].split():
            q = int(tok[1:])
            if tok[0] in "XY":
                x |= 1 << q
            if tok[0] in "YZ":
                z |= 1 << q
        terms.append((x, z, num(t["coeff"])))
    return j["qubits"], num(j["constant"]), terms


def popcount(a):
    a = np.asarray(a, dtype=np.int64)
    c = np.zeros(a.shape, dtype=np.int64)
    while np.any(a):
        c += a & 1
        a = a >> 1
    return c


def sum_matrix(j, states=None):
    """Sparse matrix of a JSON Pauli sum on the basis states `states` (all when
    None).  Single words may lead out of the subspace; their sum must not (the
    subspace is a symmetry sector of the operator): raises if it does."""
    n, const, terms = parse_sum(j)
    if states is None:
        states = np.arange(1 << n, dtype=np.int64)
    states = np.asarray(states, dtype=np.int64)
    dim = len(states)
    where = -np.ones(1 << n, dtype=np.int64)
    where[states] = np.arange(dim)
    rows, cols, vals = [np.arange(dim)], [np.arange(dim)], [np.full(dim, const, dtype=complex)]
    orows, ocols, ovals = [], [], []
    ipow = np.array([1, 1j, -1, -1j])
    cidx = np.arange(dim)
    for x, z, c in terms:
        y = bin(x & z).count("1")
        img = states ^ x
        tgt = where[img]
        ph = c * ipow[(y + 2 * popcount(states & z)) % 4]
        inside = tgt >= 0
        rows.append(tgt[inside])
        cols.append(cidx[inside])
        vals.append(ph[inside])
        if not np.all(inside):
            orows.append(img[~inside])
            ocols.append(cidx[~inside])
            ovals.append(ph[~inside])
    if orows:
        out = sp.csr_matrix((np.concatenate(ovals), (np.concatenate(orows), np.concatenate(ocols))),
                            shape=(1 << n, dim))
        leak = np.abs(out.data).max() if out.nnz else 0.0
        if leak > 1e-10:
            raise ValueError("the operator leads out of the subspace (amplitude %.3g)" % leak)
    m = sp.csr_matrix((np.concatenate(vals), (np.concatenate(rows), np.concatenate(cols))), shape=(dim, dim))
    return m


def lowest(m):
    """Lowest eigenvalue of a sparse Hermitian matrix (dense when small)."""
    if m.shape[0] <= 600:
        return float(np.linalg.eigvalsh(m.toarray())[0])
    import scipy.sparse.linalg as sla
    v0 = np.ones(m.shape[0]) / np.sqrt(m.shape[0])
    w = sla.eigsh(m, k=1, which="SA", tol=1e-13, v0=v0, maxiter=20000)[0]
    return float(w[0])


# ---- Jordan-Wigner second quantization with numpy (independent) ----

def jw_annihilators(n):
    """a_p (sparse, 2^n) with qubit q = bit q of the index, occupied = 1:
    a_p = Z_0 ... Z_{p-1} |0><1|_p."""
    I2 = sp.identity(2, format="csr")
    Z = sp.csr_matrix(np.diag([1.0, -1.0]))
    lower = sp.csr_matrix(np.array([[0.0, 1.0], [0.0, 0.0]]))  # |0><1|
    ops = []
    for p in range(n):
        m = sp.identity(1, format="csr")
        for q in range(n - 1, -1, -1):  # kron: the first factor is the top qubit
            f = Z if q < p else (lower if q == p else I2)
            m = sp.kron(m, f, format="csr")
        ops.append(m)
    return ops


def jw_hamiltonian(h1, h2, e0):
    """H = e0 + sum h_pq a+_P a_Q + 1/2 sum (pq|rs) a+_P a+_R a_S a_Q over spin orbitals."""
    n = 2 * h1.shape[0]
    a = jw_annihilators(n)
    ad = [x.T.tocsr() for x in a]
    return ref_common.ladder_hamiltonian(h1, h2, e0, a, ad, sp.identity(1 << n, format="csr"))


def jw_spin_squared(norb):
    n = 2 * norb
    a = jw_annihilators(n)
    ad = [x.T.tocsr() for x in a]
    dim = 1 << n
    Sp = sp.csr_matrix((dim, dim))
    Sz = sp.csr_matrix((dim, dim))
    for p in range(norb):
        Sp = Sp + ad[2 * p] @ a[2 * p + 1]
        Sz = Sz + 0.5 * (ad[2 * p] @ a[2 * p] - ad[2 * p + 1] @ a[2 * p + 1])
    Sm = Sp.T.tocsr()
    return Sm @ Sp + Sz @ Sz + Sz


def tmpdir():
    """A scratch directory removed when the process exits (ref_common.tmpdir)."""
    return ref_common.tmpdir("cairn-qubit-")
