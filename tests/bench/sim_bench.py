"""sim_bench.py — benchmarks of the statevector engine (make bench).

1. One Pauli rotation over 24 qubits in GB/s beside a STREAM-like copy of the
   same register measured in the same run (medians).  Goal: >= 60 % of the
   copy bandwidth.
2. One energy + gradient evaluation on 14 qubits (the size of water in
   STO-3G) with 16 entanglers and with UCCSD, by cairn's engine and by the
   same adjoint computation written with numpy/scipy (scipy.sparse CSR
   Hamiltonian, dense numpy vectors) in the same run.  Goal: >= 20x faster.

Inputs: the Jordan-Wigner Hamiltonian of water in STO-3G (all 7 orbitals,
10 electrons, 14 qubits, r = 0.96 angstrom, 104.5 degrees) as exported by
`cairn show --hamiltonian --json`; when that command cannot produce it (the
front end or the chemistry is not built), a synthetic Hamiltonian of the same
shape: the Jordan-Wigner form of random real integrals with the 8-fold
symmetry of real orbitals over 7 spatial orbitals, 10 electrons (the run says
which one it used).  The UCCSD program is the Jordan-Wigner form of every
spin-conserving single and double excitation of the Hartree-Fock state; the
16 entanglers are weight-4 words (one Y) on flip sets of the Hamiltonian.
These figures are for speed only, not chemistry.

3. Scaling (no goal; the issue asks for 20 qubits interactive): one energy +
   gradient on molecule-shaped registers of 16, 18 and 20 qubits (Jordan-
   Wigner Hamiltonian of random integrals built by cairn's qubit module), with
   16 entanglers and with every double excitation.

Environment: SIM_BENCH (path of the bench binary), SIM_BENCH_QUBITS (default
24), SIM_BENCH_REPEATS (default 7), SIM_BENCH_SCALE (orbital counts, default
"8 9 10").
"""
import json
import os
import statistics
import subprocess
import sys
import tempfile
import time

import numpy as np
import scipy.sparse

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "ref"))
from ref_common import excitation_words, product, word_masks  # noqa: E402


# ---- Pauli words: the Jordan-Wigner algebra of tests/ref/ref_common.py on
# ((qubit, letter), ...) words, turned into (x, z) integer masks for the
# numpy engine; word = i^|x&z| X^x Z^z --------------------------------------

def popcount(v):
    return bin(v).count("1")


def masks(word):
    """(x, z) masks of a ((qubit, letter), ...) word."""
    return word_masks(word)[:2]


def add_into(acc, s, c):
    for w, v in s.items():
        acc[w] = acc.get(w, 0) + c * v


def hamiltonian(norb, rng):
    """JW Hamiltonian of random real integrals with 8-fold symmetry."""
    h1 = rng.normal(size=(norb, norb))
    h1 = 0.5 * (h1 + h1.T)
    h2 = rng.normal(size=(norb,) * 4) * 0.1
    h2 = (h2 + h2.transpose(1, 0, 2, 3) + h2.transpose(0, 1, 3, 2) + h2.transpose(1, 0, 3, 2)) / 4
    h2 = 0.5 * (h2 + h2.transpose(2, 3, 0, 1))
    acc = {}
    nso = 2 * norb
    for p in range(nso):
        for q in range(nso):
            if p % 2 == q % 2:
                add_into(acc, product([(p, 1), (q, 0)]), h1[p // 2, q // 2])
    for p in range(nso):
        for q in range(nso):
            if p % 2 != q % 2:
                continue
            for r in range(nso):
                for s in range(nso):
                    if r % 2 != s % 2 or p == r or q == s:
                        continue
                    v = h2[p // 2, q // 2, r // 2, s // 2]
                    add_into(acc, product([(p, 1), (r, 1), (s, 0), (q, 0)]), 0.5 * v)
    terms = {}
    for w, c in acc.items():
        if abs(c) > 1e-12:
            terms[masks(w)] = c.real  # Hermitian: real coefficients
    return terms


def word_text(w):
    x, z = w
    out = []
    for q in range(64):
        b = 1 << q
        if x & b or z & b:
            out.append(("Y" if (x & b and z & b) else "X" if x & b else "Z") + str(q))
    return " ".join(out) or "I"


def generator_words(exc):
    """G = 2i (T - T^+) of an excitation as {(x, z): real mult}."""
    frm, to = exc
    return {masks(w): m for w, m in excitation_words(frm, to).items()}


def uccsd(nso, nelec):
    occ, vir = list(range(nelec)), list(range(nelec, nso))
    gens = []
    for i in occ:
        for a in vir:
            if i % 2 == a % 2:
                gens.append(((i,), (a,)))
    for x, i in enumerate(occ):
        for j in occ[x + 1:]:
            for y, a in enumerate(vir):
                for b in vir[y + 1:]:
                    if (i % 2 + j % 2) == (a % 2 + b % 2) and sorted([i % 2, j % 2]) == sorted([a % 2, b % 2]):
                        gens.append(((i, j), (a, b)))
    return gens


# ---- jobs in the sim_driver format -------------------------------------------

def job_json(n, ham, init_bits, program, nparams, theta):
    const = ham.get((0, 0), 0.0)
    terms = [{"pauli": word_text(w), "coeff": c} for w, c in sorted(ham.items()) if w != (0, 0)]
    return {
        "hamiltonian": {"qubits": n, "constant": const, "terms": terms},
        "circuit": {
            "qubits": n,
            "init": "".join("1" if init_bits >> q & 1 else "0" for q in range(n)),
            "params": list(range(nparams)),
            "generators": [{"kind": "word", "text": f"g{k}", "rule": -1, "line": 0} for k in range(nparams)],
            "rotations": [{"word": word_text(w), "param": p, "mult": m, "gen": p} for w, p, m in program],
        },
        "theta": list(theta),
    }


# ---- the numpy/scipy version of the same computation -------------------------

def parity(v):
    v = v.copy()
    for s in (32, 16, 8, 4, 2, 1):
        v ^= v >> np.uint64(s)
    return v & np.uint64(1)


class NumpyEngine:
    """Adjoint energy + gradient with numpy vectors and a scipy.sparse CSR
    Hamiltonian; words as (index permutation, phase vector), precomputed."""

    def __init__(self, n, ham, init_bits, program):
        dim = 1 << n
        idx = np.arange(dim, dtype=np.uint64)
        rows, cols, vals = [], [], []
        for (x, z), c in ham.items():
            j = idx ^ np.uint64(x)
            sign = 1.0 - 2.0 * parity(j & np.uint64(z))
            ph = (1j ** (popcount(x & z) % 4)) * c
            rows.append(idx)
            cols.append(j)
            vals.append(ph * sign)
        self.H = scipy.sparse.csr_matrix(
            (np.concatenate(vals), (np.concatenate(rows).astype(np.int64), np.concatenate(cols).astype(np.int64))),
            shape=(dim, dim))
        self.H.sum_duplicates()
        self.H.eliminate_zeros()
        self.init = init_bits
        self.dim = dim
        self.rots = []
        for (x, z), p, m in program:
            j = (idx ^ np.uint64(x)).astype(np.int64)
            ph = (1j ** (popcount(x & z) % 4)) * (1.0 - 2.0 * parity((idx ^ np.uint64(x)) & np.uint64(z)))
            self.rots.append((j, ph, p, m))

    def energy_grad(self, theta, nparams):
        psi = np.zeros(self.dim, dtype=complex)
        psi[self.init] = 1
        for j, ph, p, m in self.rots:
            a = theta[p] * m
            psi = np.cos(a / 2) * psi - 1j * np.sin(a / 2) * (ph * psi[j])
        lam = self.H @ psi
        energy = np.vdot(psi, lam).real
        grad = np.zeros(nparams)
        for j, ph, p, m in reversed(self.rots):
            a = theta[p] * m
            pphi = ph * psi[j]
            grad[p] += m * np.vdot(lam, pphi).imag
            c, s = np.cos(a / 2), np.sin(a / 2)
            psi = c * psi + 1j * s * pphi
            lam = c * lam + 1j * s * (ph * lam[j])
        return energy, grad


def timed(f, reps):
    ts = []
    out = None
    for _ in range(reps):
        t0 = time.perf_counter()
        out = f()
        ts.append(time.perf_counter() - t0)
    return statistics.median(ts), out


WATER = """cairn 1
# water, STO-3G, all orbitals active (14 qubits): benchmark input
atoms angstrom {
  O  0   0                       0
  H  0   0.96*sin(52.25 deg)   0.96*cos(52.25 deg)
  H  0  -0.96*sin(52.25 deg)   0.96*cos(52.25 deg)
}
basis sto-3g
encoding jordan-wigner
reference hartree-fock
pool {
  doubles
}
choose all
"""


def parse_word(text):
    x = z = 0
    for tok in text.split():
        if tok == "I":
            continue
        q = 1 << int(tok[1:])
        if tok[0] in "XY":
            x |= q
        if tok[0] in "YZ":
            z |= q
    return x, z


def water_hamiltonian(tmp):
    """The qubit Hamiltonian of water from cairn, or None (with the reason)."""
    cairn = os.environ.get("CAIRN", os.path.join(os.environ.get("CAIRN_BUILDDIR", "."), "cairn"))
    path = os.path.join(tmp, "water.cairn")
    with open(path, "w") as f:
        f.write(WATER)
    try:
        out = subprocess.run([cairn, "show", "--hamiltonian", "--json", path], capture_output=True, text=True,
                             timeout=300)
    except (OSError, subprocess.TimeoutExpired) as e:
        return None, str(e)
    if out.returncode != 0:
        return None, (out.stderr.strip().splitlines() or ["exit status %d" % out.returncode])[0]
    j = json.loads(out.stdout)
    if j.get("qubits") != 14:
        return None, f"cairn gave {j.get('qubits')} qubits, not 14"
    c = j.get("constant", 0.0)
    ham = {(0, 0): c[0] if isinstance(c, list) else c}
    for t in j["terms"]:
        c = t["coeff"]
        ham[parse_word(t["pauli"])] = c[0] if isinstance(c, list) else c
    return ham, None


def run(cmd, env=None):
    out = subprocess.run(cmd, capture_output=True, text=True, env=env)
    if out.returncode != 0:
        sys.stderr.write(out.stderr)
        raise SystemExit(f"{cmd[0]} failed")
    return json.loads(out.stdout)


def main():
    bench = os.environ.get("SIM_BENCH", os.path.join(os.environ.get("CAIRN_BUILDDIR", "."), "tests", "bench",
                                                     "sim_bench"))
    nq = int(os.environ.get("SIM_BENCH_QUBITS", "24"))
    reps = int(os.environ.get("SIM_BENCH_REPEATS", "7"))
    threads = os.environ.get("OMP_NUM_THREADS", "")
    print(f"cairn statevector benchmarks (medians of {reps} repeats; OMP_NUM_THREADS={threads or 'unset'})")

    r = run([bench, "rotation", str(nq), str(reps)])
    print(f"\n1. Pauli rotation over {r['qubits']} qubits ({r['vector_bytes'] / 2**20:.0f} MiB vector), "
          f"{r['threads']} thread(s)")
    print(f"   copy (STREAM-like, read+write):  {r['copy']['gbps']:7.2f} GB/s")
    for w in r["rotations"]:
        print(f"   rotation {w['word']:16s}        {w['gbps']:7.2f} GB/s  = {100 * w['of_copy']:5.1f} % of copy"
              f"  (goal >= 60 %)")

    rng = np.random.default_rng(7)
    norb, nelec = 7, 10
    n = 2 * norb
    t0 = time.perf_counter()
    with tempfile.TemporaryDirectory() as tmp:
        ham, why = water_hamiltonian(tmp)
    if ham is None:
        source = f"synthetic molecule-shaped Hamiltonian (cairn show --hamiltonian: {why})"
        ham = hamiltonian(norb, rng)
    else:
        source = "water STO-3G Hamiltonian from cairn show --hamiltonian --json"
    init = (1 << nelec) - 1
    # 16 entanglers: weight-4 flip sets of the Hamiltonian, one Y (odd Y count)
    flips = sorted({x for (x, z) in ham if popcount(x) == 4})
    pick = [flips[k] for k in rng.choice(len(flips), 16, replace=False)]
    ent = []
    for k, x in enumerate(pick):
        low = x & -x
        ent.append(((x, low), k, 1.0))
    gens = uccsd(n, nelec)
    ucc = []
    for k, g in enumerate(gens):
        for w, m in sorted(generator_words(g).items()):
            ucc.append((w, k, m))
    build_s = time.perf_counter() - t0
    print(f"\n2. energy + gradient, {n} qubits, {source}: {len(ham)} terms, "
          f"{len({x for x, z in ham})} X masks (built in {build_s:.1f} s)")
    results = []
    with tempfile.TemporaryDirectory() as tmp:
        for name, prog, npar in [("16 entanglers", ent, 16), (f"UCCSD ({len(gens)} generators)", ucc, len(gens))]:
            theta = rng.uniform(-0.1, 0.1, npar)
            path = os.path.join(tmp, "job.json")
            with open(path, "w") as f:
                json.dump(job_json(n, ham, init, prog, npar, theta), f)
            env1 = dict(os.environ, OMP_NUM_THREADS="1")
            c1 = run([bench, "evalgrad", path, str(reps)], env1)
            c2 = run([bench, "evalgrad", path, str(reps)])
            ne = NumpyEngine(n, ham, init, prog)
            tn, (en, gn) = timed(lambda: ne.energy_grad(theta, npar), reps)
            probe = np.ones(ne.dim, dtype=complex) / np.sqrt(ne.dim)
            tmv, _ = timed(lambda: ne.H @ probe, reps)
            de = abs(en - c1["energy"])
            dg = float(np.max(np.abs(gn - np.array(c1["gradient"]))))
            print(f"   {name}: {len(prog)} rotations, CSR nnz {ne.H.nnz}")
            print(f"     numpy/scipy           {1e3 * tn:9.3f} ms   [scipy H @ psi alone {1e3 * tmv:.3f} ms]")
            for c in (c1, c2):
                print(f"     cairn, {c['threads']} thread(s)     {1e3 * c['evalgrad_seconds']:9.3f} ms"
                      f"  ({tn / c['evalgrad_seconds']:6.1f}x faster; goal >= 20x)"
                      f"   [H|psi> alone {1e3 * c['apply_seconds']:.3f} ms ({tmv / c['apply_seconds']:.1f}x scipy's), energy alone "
                      f"{1e3 * c['energy_seconds']:.3f} ms]")
            print(f"     agreement: |dE| = {de:.1e}, max |d grad| = {dg:.1e}")
            results.append(de < 1e-9 and dg < 1e-8)

    print("\n3. scaling: energy + gradient on molecule-shaped registers (random integrals, speed only)")
    for norb in [int(v) for v in os.environ.get("SIM_BENCH_SCALE", "8 9 10").split()]:
        m = run([bench, "molecule", str(norb), str(norb), "3"])
        if "refused" in m:
            print(f"   {m['qubits']} qubits: refused: {m['refused']}")
            continue
        print(f"   {m['qubits']} qubits, {m['terms']} terms, engine memory {m['engine_bytes']}, {m['threads']} thread(s): "
              f"16 entanglers {m['entanglers']['evalgrad_seconds']:.3f} s; "
              f"{m['doubles']['generators']} doubles ({m['doubles']['rotations']} rotations in "
              f"{m['doubles']['steps']} fused steps) {m['doubles']['evalgrad_seconds']:.3f} s")
    return 0 if all(results) else 1


if __name__ == "__main__":
    sys.exit(main())
