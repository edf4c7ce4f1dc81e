"""sim_optimize.py — every optimizer reaches the ground energy of small
problems whose exact minimum numpy computes (numpy.linalg.eigvalsh of the
dense Hamiltonian, run live), and a run is bit-identical when repeated with
the same seed.

Problems: a one-qubit Hamiltonian a X + b Y + c Z + d with the ansatz
Rz Ry |0> (reaches every state up to phase), and a real two-qubit Hamiltonian
(only words with an even number of Y letters, so the matrix is real) with a
real ansatz of Y-type rotations that generates SO(4) (the antisymmetric real
4x4 matrices are spanned by the words with an odd number of Y; common
practice).  Tolerances: 1e-8 hartree for the gradient methods, 1e-6 for the
derivative-free ones.
"""
import json
import os
import subprocess
import sys
import tempfile

import numpy as np

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from ref_common import dense, text  # noqa: E402  (tests/ref/ref_common.py)


def letters(word):
    """{qubit: letter} of a dense word (character q = qubit q)."""
    return {q: l for q, l in enumerate(word) if l != "I"}



def job(n, terms, rotations, method, seed):
    ham = {"qubits": n, "constant": 0.0, "terms": []}
    mat = np.zeros((2**n, 2**n), dtype=complex)
    for w, c in terms:
        mat += c * dense(n, letters(w))
        if set(w) == {"I"}:
            ham["constant"] += c
        else:
            ham["terms"].append({"pauli": text(letters(w)), "coeff": c})
    circ = {
        "qubits": n,
        "init": "0" * n,
        "params": [0] * len(rotations),
        "generators": [{"kind": "word", "text": "test", "rule": -1, "line": 0}],
        "rotations": [{"word": text(letters(w)), "param": k, "mult": 1.0, "gen": 0} for k, w in enumerate(rotations)],
    }
    opt = {"method": method, "tolerance": 1e-12, "max_evals": 3000, "random": 4, "seed": seed}
    return {"hamiltonian": ham, "circuit": circ, "optimize": opt}, np.linalg.eigvalsh(mat)[0]


def run(driver, tmp, j):
    path = os.path.join(tmp, "job.json")
    with open(path, "w") as f:
        json.dump(j, f)
    out = subprocess.run([driver, "optimize", path], capture_output=True, text=True)
    if out.returncode != 0:
        raise RuntimeError(out.stderr)
    return out.stdout


def main():
    driver = os.path.join(os.environ.get("CAIRN_BUILDDIR", "."), "tests", "ref", "sim_driver")
    rng = np.random.default_rng(4242)
    one = [("X", 0.3), ("Y", -0.45), ("Z", 0.8), ("I", -0.2)]
    real_words = ["XI", "ZI", "IX", "IZ", "XX", "XZ", "ZX", "ZZ", "YY"]
    two = [("II", -0.5)] + [(w, float(rng.uniform(-1, 1))) for w in real_words]
    problems = [
        ("one qubit", 1, one, ["Y", "Z"]),
        ("two qubits", 2, two, ["YI", "IY", "XY", "YX", "YI", "IY"]),
    ]
    failures = 0
    with tempfile.TemporaryDirectory() as tmp:
        for name, n, terms, rots in problems:
            for method in ["lbfgs", "slsqp", "bobyqa", "cobyla", "nelder-mead"]:
                j, exact = job(n, terms, rots, method, seed=3)
                text1 = run(driver, tmp, j)
                text2 = run(driver, tmp, j)
                res = json.loads(text1)
                err = res["min"] - exact
                tol = 1e-8 if method in ("lbfgs", "slsqp") else 1e-6
                same = text1 == text2
                ok = abs(err) < tol and same and res["min"] <= res["median"] <= res["max"]
                evals = [s["evals"] for s in res["starts"]]
                print(f"{name:10s} {method:12s} exact {exact:.12f} best {res['min']:.12f} "
                      f"error {err:+.1e} evals {evals} {'repeatable' if same else 'NOT repeatable'} "
                      f"{'ok' if ok else 'FAIL'}")
                failures += not ok
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
