"""gates_sparse.py — circuits of examples too wide for dense vectors act as
their rotation program.

gates_examples.py simulates every example of at most 12 qubits densely.  The
wider ones (n2-compile: 29 qubits, 8 GiB as a dense complex vector) are
checked here on sparse states: a state is the sorted array of basis indices
that carry amplitude, with their amplitudes.  A Hartree-Fock reference and
number-conserving generators reach few of the 2^n basis states, so the
support stays small (it is printed).

For each such example, with random parameters (the recipe is compile-only:
no run report to bind):
  1. `cairn build --save-program` gives the rotation program; its state
     prod_k exp(-i a_k P_k / 2) |init> is computed here on the sparse state
     as cos(a/2) psi - i sin(a/2) P psi (P^2 = I, common practice), with
     P|j> = i^ny (-1)^|j & z| |j ^ x> (Y = iXZ, the Pauli matrices);
  2. `cairn build` writes OpenQASM 2.0 (plain, passes, tree and short
     lowerings), OpenQASM 3.0 and the listing; the readers and gate tables
     of gates_sim.py (checked there against the published grammars and
     gate definitions) turn each into gates;
  3. each OpenQASM 2.0 circuit, run here on the sparse state from |0...0>,
     must give the program's state to 1e-10 up to a global phase; the
     OpenQASM 3.0 and listing circuits (the passes lowering) must hold the
     same gates as its OpenQASM 2.0 form; the gates read must equal the
     counts `cairn build --json` prints.
The sparse simulator is first checked against gates_sim's dense one on a
small example (h2-bravyi-kitaev), so a fault in it cannot pass silently.
"""
import glob
import json
import os
import subprocess
import sys
import tempfile

import numpy as np

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
import gates_recipes as gr  # noqa: E402
import gates_sim as gs  # noqa: E402
from ref_common import parse_word, word_masks  # noqa: E402

SRC = os.environ.get("CAIRN_SRCDIR", ".")
DENSE_MAX = 12  # gates_examples.py covers these
DROP = 1e-14    # amplitudes below this after a merge are dropped (far below the 1e-10 check)
check = gs.check


def parity(v):
    """Parity of each int64 in v (bit folding)."""
    v = v.copy()
    for s in (32, 16, 8, 4, 2, 1):
        v ^= v >> s
    return v & 1


class Sparse:
    """sum_k amp[k] |idx[k]>, idx sorted and distinct."""

    def __init__(self, idx, amp):
        self.idx, self.amp = idx, amp

    @staticmethod
    def basis(bits):
        return Sparse(np.array([bits], dtype=np.int64), np.array([1.0 + 0j]))

    @staticmethod
    def merged(idx, amp):
        """Sum the amplitudes of equal indices.  The callers pass a few
        sorted runs, which the stable sort (timsort) merges in linear time."""
        o = np.argsort(idx, kind="stable")
        idx, amp = idx[o], amp[o]
        first = np.ones(len(idx), dtype=bool)
        first[1:] = idx[1:] != idx[:-1]
        g = np.cumsum(first) - 1
        a = np.bincount(g, amp.real) + 1j * np.bincount(g, amp.imag)
        u = idx[first]
        keep = np.abs(a) > DROP
        return Sparse(u[keep], a[keep])

    def word(self, x, z, ny):
        """P psi for P = i^ny X^x Z^z (letters: X on x, Z on z, Y on both)."""
        sign = 1 - 2 * parity(self.idx & z)
        return Sparse(self.idx ^ x, (1j ** ny) * sign * self.amp)  # distinct, not sorted

    def rotate(self, x, z, ny, a):
        p = self.word(x, z, ny)
        return Sparse.merged(np.concatenate([self.idx, p.idx]),
                             np.concatenate([np.cos(a / 2) * self.amp, -1j * np.sin(a / 2) * p.amp]))

    def gate1(self, q, U):
        b = ((self.idx >> np.int64(q)) & 1).astype(bool)
        if U[0, 1] == 0 and U[1, 0] == 0:  # diagonal: same support
            return Sparse(self.idx, np.where(b, U[1, 1], U[0, 0]) * self.amp)
        m = np.int64(1) << np.int64(q)
        # rows with the bit clear and with it set are each sorted: two runs
        idx = np.concatenate([self.idx[~b], self.idx[b], self.idx[~b] | m, self.idx[b] & ~m])
        amp = np.concatenate([U[0, 0] * self.amp[~b], U[1, 1] * self.amp[b],
                              U[1, 0] * self.amp[~b], U[0, 1] * self.amp[b]])
        return Sparse.merged(idx, amp)

    def cx(self, c, t):
        bc = ((self.idx >> np.int64(c)) & 1).astype(bool)
        bt = ((self.idx >> np.int64(t)) & 1).astype(bool)
        m = np.int64(1) << np.int64(t)
        parts = [~bc, bc & ~bt, bc & bt]  # unchanged, gaining bit t, losing it: three sorted runs
        idx = np.concatenate([self.idx[parts[0]], self.idx[parts[1]] | m, self.idx[parts[2]] & ~m])
        amp = np.concatenate([self.amp[k] for k in parts])
        o = np.argsort(idx, kind="stable")
        return Sparse(idx[o], amp[o])

    def dense(self, n):
        v = np.zeros(1 << n, dtype=complex)
        v[self.idx] = self.amp
        return v


def same_up_to_phase(a, b):
    """Equal supports (after dropping) and amplitudes up to one phase."""
    if len(a.idx) != len(b.idx) or not np.array_equal(a.idx, b.idx):
        # tiny amplitudes on one side only would also differ: compare on the union
        u = np.union1d(a.idx, b.idx)
        va, vb = np.zeros(len(u), complex), np.zeros(len(u), complex)
        va[np.searchsorted(u, a.idx)] = a.amp
        vb[np.searchsorted(u, b.idx)] = b.amp
    else:
        va, vb = a.amp, b.amp
    k = np.argmax(np.abs(vb))
    ph = va[k] / vb[k]
    return abs(abs(ph) - 1) < gs.TOL and np.max(np.abs(va - ph * vb)) < gs.TOL


def masks(word):
    x, z, ny = word_masks(word)
    return np.int64(x), np.int64(z), ny


def program_state(prog, theta):
    init = sum(1 << q for q, b in enumerate(prog["init"]) if b == "1")
    psi = Sparse.basis(init)
    for r in prog["rotations"]:
        x, z, ny = masks(parse_word(r["word"]))
        a = r["mult"] * (theta[r["param"]] if r["param"] >= 0 else 1.0)
        psi = psi.rotate(x, z, ny, a)
    return psi


def simulate(gates, table):
    """The circuit from |0...0>; returns the state and the largest support on the way."""
    psi, peak = Sparse.basis(0), 1
    for name, ang, qs in gates:
        psi = psi.cx(qs[0], qs[1]) if name == "cx" else psi.gate1(qs[0], table[name](*ang))
        peak = max(peak, len(psi.idx))
    return psi, peak


def read(fmt, src, theta):
    if fmt == "qasm2":
        n, gates = gs.read_qasm2(src, list(theta))
        return n, gates, gs.QELIB1
    if fmt == "qasm3":
        n, gates = gs.read_qasm3(src, list(theta))
        return n, gates, gs.STDGATES
    n, gates, _ = gs.read_listing(src, list(theta))
    return n, gates, gs.LISTING


def check_example(name, path, tmp, rng, against_dense=False):
    prog_path = os.path.join(tmp, name + ".program.json")
    out = os.path.join(tmp, name + ".out")
    jobs = [(v, "qasm2", o) for v, o in gr.VARIANTS.items()] + [("passes", "qasm3", []), ("passes", "listing", [])]
    prog = ref = theta = None
    largest, seen = 0, {}
    for v, fmt, opts in jobs:
        extra = ["--save-program", prog_path] if prog is None else []
        counts = json.loads(gr.cairn("build", "--json", path, "--format", fmt, "-o", out, *extra, *opts))
        if prog is None:
            with open(prog_path) as f:
                prog = json.load(f)
            n = prog["qubits"]
            theta = rng.uniform(-1.0, 1.0, counts["parameters"])
            ref = program_state(prog, theta)
            if against_dense:  # the sparse rotations against gates_sim's expm products
                d = gr.program_state(prog, theta)
                check(gs.same_up_to_phase(ref.dense(n), d), f"{name}: sparse program state differs from the dense one")
        with open(out) as f:
            src = f.read()
        nq, gates, table = read(fmt, src, theta)
        check(nq == n, f"{name}/{v}/{fmt}: register {nq} != {n}")
        cx = sum(1 for g in gates if g[0] == "cx")
        check(cx == counts["gates"]["cnot"] and len(gates) == counts["gates"]["total"],
              f"{name}/{v}/{fmt}: gates read ({cx} cx, {len(gates)} total) differ from the counts printed")
        if fmt != "qasm2":
            # the same lowering as OpenQASM 2.0 with passes, in another writer: the same gates, whose
            # tables differ from qelib1.inc's by global phases only (gates_sim.py checks the tables)
            same = len(gates) == len(seen["passes"]) and all(
                g[0] == h[0] and g[2] == h[2] and np.allclose(g[1], h[1], rtol=0, atol=1e-12)
                for g, h in zip(gates, seen["passes"]))
            check(same, f"{name}/{v}/{fmt}: gates differ from the OpenQASM 2.0 circuit of the same lowering")
            continue
        seen[v] = gates
        psi, peak = simulate(gates, table)
        largest = max(largest, peak)
        check(same_up_to_phase(psi, ref), f"{name}/{v}/{fmt}: circuit state differs from the program's")
        if against_dense:  # the sparse gates against gates_sim's dense simulator
            zero = np.zeros((1 << nq, 1), dtype=complex)
            zero[0, 0] = 1
            d = gs.simulate(nq, gates, table, zero)[:, 0]
            check(gs.same_up_to_phase(psi.dense(nq), d), f"{name}/{v}/{fmt}: sparse gate simulation differs from dense")
    print(f"{name}: {n} qubits, {len(prog['rotations'])} rotations; program state on {len(ref.idx)} of 2^{n} "
          f"basis states; the circuits of 4 lowerings equal it to 1e-10 (at most {largest} basis states on the way), "
          f"OpenQASM 3.0 and the listing have the same gates")


def main():
    rng = np.random.default_rng(29)
    wide = 0
    with tempfile.TemporaryDirectory() as tmp:
        check_example("h2-bravyi-kitaev", os.path.join(SRC, "examples", "h2-bravyi-kitaev.cairn"), tmp, rng,
                      against_dense=True)
        for path in sorted(glob.glob(os.path.join(SRC, "examples", "*.cairn"))):
            name = os.path.basename(path)[:-6]
            r = subprocess.run([gr.CAIRN, "show", "--hamiltonian", "--json", path], capture_output=True, text=True)
            if r.returncode != 0:
                check(False, f"{name}: cairn show --hamiltonian failed: {r.stderr}")
                continue
            h = json.loads(r.stdout)
            n = (h["points"][0] if "points" in h else h)["qubits"]
            if n <= DENSE_MAX:
                continue
            check_example(name, path, tmp, rng)
            wide += 1
    check(wide >= 1, "no example is wider than the dense checks: nothing checked here")
    if gs.FAILS:
        print(f"{len(gs.FAILS)} check(s) failed")
        return 1
    return 0


if __name__ == "__main__":
    sys.exit(main())
