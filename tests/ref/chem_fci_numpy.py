"""chem_fci_numpy.py: the exact solver against an independent construction
with numpy: the full CI matrix of an FCIDUMP file built here from the
Slater-Condon rules over spin-orbital determinants (second-quantized signs),
with S^2 = S_z^2 + S_z + N_beta - sum_pq a+_qa a_pa a+_pb a_qb, diagonalized by
numpy.linalg.eigh.  Cases cover cairn's dense path (<= 400 determinants) and
its Davidson path, the lowest state of an S_z sector, and spin targeting by
multiplicity (linear and quadratic spin penalty).  Tolerance 1e-9 hartree."""
import itertools
import os
import sys

import numpy as np

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from chem_common import tmpdir, Checker, driver, h2o

c = Checker()
tmp = tmpdir("cairn-fcinp-")


def read_fcidump(path):
    """A minimal reader of the layout cairn writes (for this test only)."""
    txt = open(path).read()
    head, body = txt.split("&END", 1)
    kv = dict(f.split("=") for f in head.replace("\n", " ").replace(",", " ").split() if "=" in f)
    n = int(kv["NORB"])
    h1 = np.zeros((n, n))
    h2 = np.zeros((n, n, n, n))
    core = 0.0
    for line in body.strip().splitlines():
        v, i, j, k, l = line.split()
        v, i, j, k, l = float(v), int(i), int(j), int(k), int(l)
        if i and j and k and l:
            for a, b, cc, d in ((i, j, k, l), (j, i, k, l), (i, j, l, k), (j, i, l, k),
                                (k, l, i, j), (l, k, i, j), (k, l, j, i), (l, k, j, i)):
                h2[a - 1, b - 1, cc - 1, d - 1] = v
        elif i and j:
            h1[i - 1, j - 1] = h1[j - 1, i - 1] = v
        elif not i:
            core = v
    return n, h1, h2, core


def apply(ops, det):
    """ops = [(spin orbital, dagger)], applied right to left; (sign, det) or None."""
    sign = 1
    for so, dag in reversed(ops):
        occ = (det >> so) & 1
        if dag == occ:
            return None
        if bin(det & ((1 << so) - 1)).count("1") & 1:
            sign = -sign
        det ^= 1 << so
    return sign, det


def fci_matrices(n, h1, h2, na, nb):
    nso = 2 * n
    hs = np.zeros((nso, nso))
    g = np.zeros((nso, nso, nso, nso))  # <pq|rs>
    for p in range(nso):
        for q in range(nso):
            if p % 2 == q % 2:
                hs[p, q] = h1[p // 2, q // 2]
    for p, q, r, s in itertools.product(range(nso), repeat=4):
        if p % 2 == r % 2 and q % 2 == s % 2:
            g[p, q, r, s] = h2[p // 2, r // 2, q // 2, s // 2]
    ga = g - g.transpose(0, 1, 3, 2)  # <pq||rs>
    dets = []
    for A in itertools.combinations(range(n), na):
        for B in itertools.combinations(range(n), nb):
            d = 0
            for p in A:
                d |= 1 << (2 * p)
            for p in B:
                d |= 1 << (2 * p + 1)
            dets.append(d)
    index = {d: k for k, d in enumerate(dets)}
    N = len(dets)
    H = np.zeros((N, N))
    for x, d1 in enumerate(dets):
        occ = [p for p in range(nso) if d1 >> p & 1]
        H[x, x] = sum(hs[i, i] for i in occ) + 0.5 * sum(ga[i, j, i, j] for i in occ for j in occ)
        vir = [p for p in range(nso) if not d1 >> p & 1]
        for m in occ:
            for p in vir:
                if m % 2 != p % 2:
                    continue
                r = apply([(p, 1), (m, 0)], d1)
                val = hs[p, m] + sum(ga[p, k, m, k] for k in occ)
                H[index[r[1]], x] += r[0] * val
        for m, nn in itertools.combinations(occ, 2):
            for p, q in itertools.combinations(vir, 2):
                if (m % 2) + (nn % 2) != (p % 2) + (q % 2):
                    continue
                r = apply([(p, 1), (q, 1), (nn, 0), (m, 0)], d1)
                v = ga[p, q, m, nn]
                if v != 0:
                    H[index[r[1]], x] += r[0] * v
    S2 = np.zeros((N, N))
    sz = 0.5 * (na - nb)
    for x, d1 in enumerate(dets):
        S2[x, x] += sz * sz + sz + nb
        for p in range(n):
            for q in range(n):
                # - a+_{q alpha} a_{p alpha} a+_{p beta} a_{q beta}
                r = apply([(2 * q, 1), (2 * p, 0), (2 * p + 1, 1), (2 * q + 1, 0)], d1)
                if r:
                    S2[index[r[1]], x] -= r[0]
    return H, S2


def check(label, path, na, nb, mults):
    n, h1, h2, core = read_fcidump(path)
    H, S2 = fci_matrices(n, h1, h2, na, nb)
    c.true("%s: H is symmetric" % label, np.abs(H - H.T).max() < 1e-12)
    w, v = np.linalg.eigh(H)  # numpy
    s2 = np.einsum("ik,ij,jk->k", v, S2, v)
    for mult in mults:
        rc, ours, _ = driver("--fcidump", path, "--no-mp2", "--no-ccsd", "--exact-mult", mult)
        if mult == 0:
            ref, refs2 = w[0] + core, s2[0]
        else:
            S = 0.5 * (mult - 1)
            k = next(k for k in range(len(w)) if abs(s2[k] - S * (S + 1)) < 1e-6)
            ref, refs2 = w[k] + core, s2[k]
        what = "%s (%d determinants), multiplicity %s" % (label, len(w), mult or "any")
        c.close("exact energy " + what, ours and ours.get("exact"), ref, 1e-9)
        c.close("<S^2> " + what, ours and ours.get("exact_s2"), refs2, 1e-7)


# 1. water, 4 alpha + 4 beta in 6 orbitals (225 determinants: dense path)
#    and in 7 orbitals (1225: Davidson)
for act in (6, 7):
    f = os.path.join(tmp, "h2o-%d.fcidump" % act)
    driver("--atoms", h2o(2.4), "--basis", "6-31g", "--frozen-core", "--active", act, "--write-fcidump", f,
           "--no-mp2", "--no-ccsd", "--no-exact")
    check("H2O 6-31G fc, %d active" % act, f, 4, 4, (0, 1, 3))

# 2. O2 (ROHF triplet orbitals), 12 electrons in 8 orbitals:
#    S_z = 1 sector (448 determinants) and S_z = 0 sector (784), where the
#    lowest state is the triplet and the lowest singlet needs the quadratic penalty
f = os.path.join(tmp, "o2.fcidump")
driver("--atoms", "O 0 0 0; O 0 0 2.28", "--basis", "sto-3g", "--mult", 3, "--core", 2, "--write-fcidump", f,
       "--no-mp2", "--no-ccsd", "--no-exact")
check("O2 STO-3G, S_z = 1", f, 7, 5, (0, 3, 5))
f0 = os.path.join(tmp, "o2-ms0.fcidump")
open(f0, "w").write(open(f).read().replace("MS2=2", "MS2=0"))
check("O2 STO-3G, S_z = 0", f0, 6, 6, (0, 1, 3, 5))
c.finish()
