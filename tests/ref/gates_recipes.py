"""gates_recipes.py — circuits of real recipes act as the optimized ansatz.

For small recipes (H2 and LiH in STO-3G, psi4-checked chemistry upstream)
under each encoding (Jordan-Wigner, Bravyi-Kitaev, parity), with and without
tapering, with UCCSD-type, qubit-excitation and QCC (entanglers on a qubit
mean-field reference) pools:
  1. `cairn run --json` optimizes the ansatz and reports its energy and its
     final parameters;
  2. `cairn build --bind REPORT` writes OpenQASM 2.0, OpenQASM 3.0 and the
     listing with those parameters, for the plain, optimized, tree and short
     lowerings;
  3. the readers and the gate simulator of tests/ref/gates_sim.py (numpy,
     independent of the C code) run each circuit from |0...0>; its state
     must equal, to 1e-10 up to a global phase, the state of the rotation
     program (`cairn build --save-program`) computed here as the product of
     scipy.linalg.expm(-i a P / 2) on the init state with the report's
     parameters;
  4. the energy <psi|H|psi> of the circuit with the Hamiltonian of `cairn
     show --hamiltonian --json` (dense matrix built here from its terms) must
     equal the report's ansatz energy to 1e-9 hartree (the simulation engine
     and the circuit agree).
Also: plain cx counts equal sum of 2(w - 1) as `cairn build --json` reports
(common practice), and optimized circuits never have more gates than plain.
"""
import json
import os
import subprocess
import sys
import tempfile

import numpy as np

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
import gates_sim as gs  # noqa: E402
from ref_common import dense, parse_word, word_masks  # noqa: E402

CAIRN = os.environ.get("CAIRN", "./cairn")
FAILS = gs.FAILS  # failures are collected by gates_sim.check
check = gs.check

MOLECULES = {
    "h2": ("atoms angstrom {\n  H 0 0 0\n  H 0 0 0.74\n}\n", ""),
    "lih": ("atoms angstrom {\n  Li 0 0 0\n  H 0 0 1.6\n}\n", "orbitals {\n  freeze core\n  active 2 electrons in 3 orbitals\n}\n"),
}
POOLS = {
    "uccsd": ("reference hartree-fock\n", "pool {\n  singles\n  doubles\n}\nchoose all\norder as written\n"),
    "qubit": ("reference hartree-fock\n", "pool {\n  qubit singles\n  qubit doubles\n}\nchoose all\norder as written\n"),
    "qcc": ("reference mean-field\n", "pool {\n  entanglers\n}\nchoose 4 by gradient\norder by gradient\n"),
}


def recipe(mol, enc, taper, pool):
    atoms, orb = MOLECULES[mol]
    ref, body = POOLS[pool]
    return ("cairn 1\n" + atoms + "charge 0\nmultiplicity 1\nbasis sto-3g\n" + orb +
            f"encoding {enc}{' taper' if taper else ''}\n" + ref + body +
            "trotter 1\noptimize lbfgs tolerance 1e-10 iterations 500\n")


def cairn(*args):
    r = subprocess.run([CAIRN, *args], capture_output=True, text=True)
    if r.returncode != 0:
        raise RuntimeError(f"cairn {' '.join(args)}: exit {r.returncode}: {r.stderr}")
    return r.stdout


def program_state(prog, theta):
    """prod_k exp(-i a_k P_k / 2) |init> of a rotation program (json.h form),
    expm checked against the closed form (common practice, P^2 = I)."""
    n = prog["qubits"]
    p = gs.Program(n, sum(1 << q for q, b in enumerate(prog["init"]) if b == "1"))
    for r in prog["rotations"]:
        p.rots.append((parse_word(r["word"]), r["param"], r["mult"], r["gen"]))
    return gs.reference_state(p, theta, use_expm=n <= 8)


class PauliSumOp:
    """A Pauli sum acting on state vectors (H @ psi), term by term by bit
    masks, so registers too large for a dense matrix can still be checked:
    (P psi)[i] = phase(i) psi[i ^ x] with X on the x bits, Y = i X Z, Z
    giving (-1)^(bit) (the Pauli matrices, common practice)."""

    def __init__(self, n, constant, terms):
        self.n, self.constant = n, constant
        idx = np.arange(1 << n)
        self.terms = []
        for c, word in terms:
            x, z, ny = word_masks(word)
            # <i|P|j> with j = i ^ x: the Z part acts on |j>, then X flips it
            j = idx ^ x
            sign = 1 - 2 * (np.array([bin(v).count("1") for v in (j & z)]) & 1)
            self.terms.append((c * (1j ** ny), j, sign))

    def __matmul__(self, psi):
        out = self.constant * psi
        for c, j, sign in self.terms:
            out = out + c * sign * psi[j]
        return out


def hamiltonian(path):
    h = json.loads(cairn("show", "--hamiltonian", "--json", path))
    if "points" in h:  # a scan: its first point, the one `build --bind` binds
        h = h["points"][0]
    n = h["qubits"]
    c = h["constant"]
    terms = [(complex(*t["coeff"]) if isinstance(t["coeff"], list) else t["coeff"], parse_word(t["pauli"]))
             for t in h["terms"]]
    H = PauliSumOp(n, complex(*c) if isinstance(c, list) else c, terms)
    if n <= 6:  # the vector form against the dense matrices of ref_common, once per small recipe
        D = H.constant * np.eye(1 << n, dtype=complex)
        for k, w in terms:
            D += k * dense(n, w)
        v = np.random.default_rng(5).standard_normal(1 << n) + 0j
        check(np.allclose(D @ v, H @ v, atol=1e-12), f"{path}: Pauli-sum action differs from its dense matrix")
    return n, H


VARIANTS = {"plain": ["--no-passes"], "passes": [], "tree": ["--tree"], "short": ["--short"]}


def read_circuit(fmt, src, theta):
    if fmt == "qasm2":
        n, gates = gs.read_qasm2(src)
        return n, gates, gs.QELIB1
    if fmt == "qasm3":
        n, gates = gs.read_qasm3(src, [])
        return n, gates, gs.STDGATES
    n, gates, _ = gs.read_listing(src, theta)
    return n, gates, gs.LISTING


def check_recipe(name, path, tmp):
    rep = os.path.join(tmp, name + ".report.json")
    cairn("run", "--json", rep, path)
    with open(rep) as f:
        pt = json.load(f)["points"][0]
    e_ans = pt["energies"]["ansatz"]
    prog_path = os.path.join(tmp, name + ".program.json")
    out = os.path.join(tmp, name + ".out")
    # one build per lowering: counts (--json on stdout), the bound OpenQASM 2.0
    # circuit, and (first) the rotation program; OpenQASM 3.0 and the listing
    # for the default lowering
    jobs = [(v, "qasm2", o) for v, o in VARIANTS.items()] + [("passes", "qasm3", []), ("passes", "listing", [])]
    k, prog, ref, nh, H, worst, werr = {}, None, None, None, None, 0.0, 0.0
    for v, fmt, opts in jobs:
        extra = ["--save-program", prog_path] if prog is None else []
        counts = json.loads(cairn("build", "--json", path, "--bind", rep, "--format", fmt, "-o", out, *extra, *opts))
        k.setdefault(v, counts)
        if prog is None:
            with open(prog_path) as f:
                prog = json.load(f)
            n = prog["qubits"]
            check(n == pt["qubits"], f"{name}: program on {n} qubits, report says {pt['qubits']}")
            ref = program_state(prog, np.array(pt["parameters"]))
            nh, H = hamiltonian(path)
            check(nh == n, f"{name}: Hamiltonian on {nh} qubits, program on {n}")
            e_ref = float(np.real(np.vdot(ref, H @ ref)))
            check(abs(e_ref - e_ans) < 1e-9, f"{name}: program state energy {e_ref!r} != report's {e_ans!r}")
        with open(out) as f:
            src = f.read()
        nq, gates, table = read_circuit(fmt, src, pt["parameters"])
        check(nq == n, f"{name}/{v}/{fmt}: register {nq} != {n}")
        zero = np.zeros((1 << nq, 1), dtype=complex)
        zero[0, 0] = 1
        psi = gs.simulate(nq, gates, table, zero)[:, 0]
        check(gs.same_up_to_phase(psi, ref), f"{name}/{v}/{fmt}: circuit state differs from the program's")
        k0 = np.argmax(np.abs(ref))
        worst = max(worst, float(np.max(np.abs(psi - psi[k0] / ref[k0] * ref))))
        cx = sum(1 for g in gates if g[0] == "cx")
        check(cx == counts["gates"]["cnot"] and len(gates) == counts["gates"]["total"],
              f"{name}/{v}/{fmt}: gates read ({cx} cx, {len(gates)} total) differ from the counts printed")
        e = float(np.real(np.vdot(psi, H @ psi)))
        werr = max(werr, abs(e - e_ans))
        check(abs(e - e_ans) < 1e-9, f"{name}/{v}/{fmt}: circuit energy {e!r} != report's {e_ans!r}")
    check(k["plain"]["gates"]["cnot"] == k["plain"]["plain_cnot"],
          f"{name}: plain cx {k['plain']['gates']['cnot']} != sum 2(w-1) {k['plain']['plain_cnot']}")
    for v in ("passes", "tree", "short"):
        check(k[v]["gates"]["total"] <= k["plain"]["gates"]["total"], f"{name}/{v}: more gates than plain")
    print(f"{name}: {n} qubits, {len(pt['generators'])} generators, E(ansatz) {e_ans:.10f}; "
          f"worst amplitude error {worst:.1e}, energy error {werr:.1e}; "
          f"cx plain {k['plain']['gates']['cnot']}, passes {k['passes']['gates']['cnot']}, short {k['short']['gates']['cnot']}")


def main():
    with tempfile.TemporaryDirectory() as tmp:
        cases = []
        for enc in ("jordan-wigner", "bravyi-kitaev", "parity"):
            for taper in (False, True):
                cases.append(("lih", enc, taper, "uccsd"))
        cases += [("h2", "jordan-wigner", False, "uccsd"), ("h2", "parity", True, "qcc"),
                  ("lih", "jordan-wigner", False, "qcc"), ("lih", "bravyi-kitaev", True, "qcc"),
                  ("lih", "jordan-wigner", False, "qubit"), ("lih", "parity", False, "qubit")]
        for mol, enc, taper, pool in cases:
            name = f"{mol}-{pool}-{enc}{'-taper' if taper else ''}"
            path = os.path.join(tmp, name + ".cairn")
            with open(path, "w") as f:
                f.write(recipe(mol, enc, taper, pool))
            check_recipe(name, path, tmp)
    if FAILS:
        print(f"{len(FAILS)} check(s) failed")
        return 1
    print("all recipe circuit checks passed")
    return 0


if __name__ == "__main__":
    sys.exit(main())
