"""sim_expm.py — energies, states and gradients of fixed-parameter rotation
programs from cairn's statevector engine against an independent numpy/scipy
computation: dense Pauli matrices built by Kronecker products, each rotation
the dense matrix exponential scipy.linalg.expm(-i a P / 2), for random
Hermitian Pauli sums and random programs on 1 to 10 qubits.

Sources: numpy and scipy run live (reference programs of the project); the
Pauli matrices and the qubit order (qubit q is bit q of the basis index) are
common practice / DEVELOPERS.md.  Tolerance 1e-10 on energies and amplitudes;
programs of Jordan-Wigner excitations (written out here, independently) check
the engine's fused steps the same way.  The gradient is checked against the
dense derivative
dE/dtheta_p = 2 Re <psi|H|d psi/d theta_p> to 1e-9.

Measured here: Debian's scipy 1.10.1 scipy.linalg.expm returns wrong
exponentials of some 512x512 and larger Pauli matrices of norm ~1.5 (errors
up to 1.6 against cos(a/2) I - i sin(a/2) P).  So each exponential is taken of
the matrix scaled to norm <= 1/4 and squared back, and every one is checked
against an independent eigendecomposition (numpy.linalg.eigh) to 1e-12: a
wrong reference fails the test instead of passing silently.
"""
import json
import os
import subprocess
import sys
import tempfile

import numpy as np
import scipy.linalg

PAULI = {
    "I": np.eye(2, dtype=complex),
    "X": np.array([[0, 1], [1, 0]], dtype=complex),
    "Y": np.array([[0, -1j], [1j, 0]], dtype=complex),
    "Z": np.array([[1, 0], [0, -1]], dtype=complex),
}


def dense(n, letters):
    """Matrix of a word {qubit: letter}; qubit 0 is the least significant bit."""
    m = np.eye(1, dtype=complex)
    for q in range(n - 1, -1, -1):
        m = np.kron(m, PAULI[letters.get(q, "I")])
    return m


def text(letters):
    return " ".join(f"{letters[q]}{q}" for q in sorted(letters)) or "I"


def random_word(rng, n):
    while True:
        w = {q: "IXYZ"[rng.integers(4)] for q in range(n)}
        w = {q: l for q, l in w.items() if l != "I"}
        if w:
            return w


def problem(rng, n, nterms, nparams, nrot):
    terms, ham = [], np.zeros((2**n, 2**n), dtype=complex)
    const = float(rng.uniform(-1, 1))
    ham += const * np.eye(2**n)
    for _ in range(nterms):
        w = random_word(rng, n)
        c = float(rng.uniform(-1, 1))
        terms.append({"pauli": text(w), "coeff": c})
        ham += c * dense(n, w)
    init = [int(b) for b in rng.integers(0, 2, n)]
    rots, mats = [], []
    for _ in range(nrot):
        w = random_word(rng, n)
        fixed = rng.integers(5) == 0
        p = -1 if fixed else int(rng.integers(nparams))
        m = float(rng.uniform(-1.5, 1.5))
        rots.append({"word": text(w), "param": p, "mult": m, "gen": -1 if fixed else 0})
        mats.append(dense(n, w))
    theta = [float(t) for t in rng.uniform(-2, 2, nparams)]
    # an observable besides the objective, as N, S_z or S^2 are used
    obs_terms, obs = [], np.zeros((2**n, 2**n), dtype=complex)
    for _ in range(n + 2):
        w = random_word(rng, n)
        c = float(rng.uniform(-1, 1))
        obs_terms.append({"pauli": text(w), "coeff": c})
        obs += c * dense(n, w)
    job = {
        "hamiltonian": {"qubits": n, "constant": const, "terms": terms},
        "circuit": {
            "qubits": n,
            "init": "".join(str(b) for b in init),
            "params": [0] * nparams,
            "generators": [{"kind": "word", "text": "random", "rule": -1, "line": 0}],
            "rotations": rots,
        },
        "theta": theta,
        "observables": [{"qubits": n, "constant": 0.5, "terms": obs_terms}],
    }
    return job, ham, init, mats, obs + 0.5 * np.eye(2**n)


def expm_checked(a):
    """exp(a) for anti-Hermitian a: scipy.linalg.expm of a / 2^s, squared s times,
    cross-checked with the eigendecomposition of the Hermitian i a."""
    norm = np.abs(a).sum(axis=1).max()
    s = max(0, int(np.ceil(np.log2(norm / 0.25)))) if norm > 0 else 0
    u = scipy.linalg.expm(a / 2**s)
    for _ in range(s):
        u = u @ u
    w, q = np.linalg.eigh(1j * a)
    v = (q * np.exp(-1j * w)) @ q.conj().T
    if np.abs(u - v).max() > 1e-12:
        raise RuntimeError(f"reference exponentials disagree: {np.abs(u - v).max():.2e}")
    return u


# Jordan-Wigner excitations written out here, independently of cairn: words
# as {qubit: letter} with complex coefficients; a_p = Z_0..Z_{p-1}(X_p + iY_p)/2.
MUL = {("X", "Y"): (1j, "Z"), ("Y", "Z"): (1j, "X"), ("Z", "X"): (1j, "Y"),
       ("Y", "X"): (-1j, "Z"), ("Z", "Y"): (-1j, "X"), ("X", "Z"): (-1j, "Y")}


def word_mul(a, b):
    ph, out = 1, dict(a)
    for q, l in b.items():
        if q not in out:
            out[q] = l
        elif out[q] == l:
            del out[q]
        else:
            f, r = MUL[(out[q], l)]
            ph *= f
            out[q] = r
    return ph, out


def op_mul(s, t):
    acc = {}
    for wa, ca in s.items():
        for wb, cb in t.items():
            ph, w = word_mul(dict(wa), dict(wb))
            key = tuple(sorted(w.items()))
            acc[key] = acc.get(key, 0) + ca * cb * ph
    return acc


def ladder(p, dagger):
    z = [(q, "Z") for q in range(p)]
    return {tuple(z + [(p, "X")]): 0.5, tuple(z + [(p, "Y")]): (-0.5j if dagger else 0.5j)}


def excitation_words(frm, to):
    """G = 2i (T - T^+), T = a_to^+ ... a_from ... as {word: real multiplier}."""
    t = {(): 1}
    for a in to:
        t = op_mul(t, ladder(a, True))
    for i in reversed(frm):
        t = op_mul(t, ladder(i, False))
    g = {}
    for w, c in t.items():
        g[w] = g.get(w, 0) + 2j * c
    adj = {(): 1}
    for i in frm:
        adj = op_mul(adj, ladder(i, True))
    for a in reversed(to):
        adj = op_mul(adj, ladder(a, False))
    for w, c in adj.items():
        g[w] = g.get(w, 0) - 2j * c
    return {w: c.real for w, c in g.items() if abs(c) > 1e-12}


def excitation_problem(rng, n, nelec, nterms):
    """Random Hermitian H and a program of random JW excitations: the words of
    one excitation in a row with one parameter (the runs the engine fuses)."""
    job, ham, init, mats, obs = problem(rng, n, nterms, 1, 0)
    occ, vir = list(range(nelec)), list(range(nelec, n))
    rots, mats, nparams = [], [], 0
    for _ in range(6):
        k = 1 + int(rng.integers(2))
        frm = sorted(int(q) for q in rng.choice(occ, k, replace=False))
        to = sorted(int(q) for q in rng.choice(vir, k, replace=False))
        for w, m in sorted(excitation_words(frm, to).items()):
            letters = dict(w)
            rots.append({"word": text(letters), "param": nparams, "mult": m, "gen": 0})
            mats.append(dense(n, letters))
        nparams += 1
    # terms that connect the states the excitations reach (random words alone
    # rarely act on them): Z_q, and every X/Y word on each excitation's qubits
    flipsets = {tuple(sorted(q for q, l in dict(w).items() if l in "XY"))
                for r in rots for w in [tuple((int(t[1:]), t[0]) for t in r["word"].split())]}
    extra = [{q: "Z"} for q in range(n)]
    for fs in sorted(flipsets):
        for ys in range(2 ** len(fs)):
            extra.append({q: ("Y" if ys >> b & 1 else "X") for b, q in enumerate(fs)})
    for w in extra:
        c = float(rng.uniform(-0.5, 0.5))
        job["hamiltonian"]["terms"].append({"pauli": text(w), "coeff": c})
        ham = ham + c * dense(n, w)
    init = [1] * nelec + [0] * (n - nelec)
    job["circuit"].update(init="1" * nelec + "0" * (n - nelec), params=[0] * nparams, rotations=rots)
    job["theta"] = [float(t) for t in rng.uniform(-1, 1, nparams)]
    return job, ham, init, mats, obs


def reference(n, ham, init, rots, mats, theta):
    """State, energy and gradient by dense matrices and scipy.linalg.expm."""
    idx = sum(b << q for q, b in enumerate(init))
    phi = np.zeros(2**n, dtype=complex)
    phi[idx] = 1
    us, prefix = [], []
    for r, P in zip(rots, mats):
        a = theta[r["param"]] * r["mult"] if r["param"] >= 0 else r["mult"]
        u = expm_checked(-0.5j * a * P)
        phi = u @ phi
        us.append(u)
        prefix.append(phi)
    psi = phi
    energy = np.vdot(psi, ham @ psi).real
    grad = np.zeros(len(theta))
    hpsi = ham @ psi
    for k, (r, P) in enumerate(zip(rots, mats)):
        if r["param"] < 0:
            continue
        v = -0.5j * r["mult"] * (P @ prefix[k])
        for u in us[k + 1:]:
            v = u @ v
        grad[r["param"]] += 2 * np.vdot(hpsi, v).real
    return psi, energy, grad


def main():
    driver = os.path.join(os.environ.get("CAIRN_BUILDDIR", "."), "tests", "ref", "sim_driver")
    rng = np.random.default_rng(20260601)
    failures = 0
    cases = [(n, t) for n in range(1, 9) for t in range(3)] + [(9, 0), (9, 1), (10, 0)]
    cases += [(n, "excitations") for n in (4, 6, 8)]
    with tempfile.TemporaryDirectory() as tmp:
        for n, trial in cases:
            nrot = 30 if n <= 6 else (12 if n <= 8 else 6)
            if trial == "excitations":
                job, ham, init, mats, obs = excitation_problem(rng, n, n // 2, 4 * n + 3)
            else:
                job, ham, init, mats, obs = problem(rng, n, 4 * n + 3, 1 + int(rng.integers(5)), nrot)
            path = os.path.join(tmp, f"job{n}_{trial}.json")
            with open(path, "w") as f:
                json.dump(job, f)
            out = subprocess.run([driver, "eval", path], capture_output=True, text=True)
            if out.returncode != 0:
                print(f"n={n}: driver failed: {out.stderr}")
                failures += 1
                continue
            got = json.loads(out.stdout)
            psi, energy, grad = reference(n, ham, init, job["circuit"]["rotations"], mats, job["theta"])
            state = np.array([complex(a, b) for a, b in got["state"]])
            de = abs(got["energy"] - energy)
            ds = np.max(np.abs(state - psi))
            dg = np.max(np.abs(np.array(got["gradient"]) - grad)) if len(grad) else 0.0
            dgp = abs(got["energy_from_gradient_pass"] - energy)
            do = abs(got["observables"][0] - np.vdot(psi, obs @ psi).real)
            ok = de < 1e-10 and ds < 1e-10 and dg < 1e-9 and dgp < 1e-10 and do < 1e-10
            if trial == "excitations":  # each excitation's words run as one fused step
                ok = ok and got["steps"] == len(job["theta"]) < got["rotations"]
                ok = ok and np.min(np.abs(grad)) > 1e-3  # and the gradient check is not vacuous
            print(f"n={n:2d} {trial if isinstance(trial, str) else 'trial ' + str(trial)}: |dE|={de:.1e} |dpsi|={ds:.1e} |dgrad|={dg:.1e} |dobs|={do:.1e} {'ok' if ok else 'FAIL'}")
            failures += not ok
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
