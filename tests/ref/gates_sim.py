"""gates_sim.py — the emitted circuits act exactly as the rotation program.

For program shapes built here in numpy, independent of the C code:
  - fermionic singles and doubles G = 2i(T - T^dagger) from dense ladder
    operators under Jordan-Wigner, and the same operators under the parity
    and Bravyi-Kitaev encodings (the basis permutation b = A n mod 2, A the
    lower-triangular ones for parity and the Fenwick-tree matrix of Seeley,
    Richard, Love 2012 for Bravyi-Kitaev), each split into Pauli words by a
    Walsh-Hadamard transform of its matrix;
  - the parity-encoded program tapered by the two-qubit reduction (the
    qubits holding N_alpha and N parity carry only I or Z in N- and
    S_z-conserving generators; Z is replaced by its eigenvalue on the
    reference and the qubit removed);
  - qubit excitations ((X - iY)/2 ladders without parity strings), random
    entangler words, wide supports, mean-field reference rotations (leading
    weight-1 Y and Z rotations with their own parameters), and repeated
    Trotter steps (every rotation k times with mult/k),
the C driver (tests/ref/gates_driver) writes OpenQASM 2.0, OpenQASM 3.0 and
the listing.  Readers written here check each text against the published
grammar subset we emit (OpenQASM 2.0: Cross et al., arXiv:1707.03429, 2017,
with the qelib1.inc gate definitions given there; OpenQASM 3.0: Cross et al.,
ACM Trans. Quantum Comput. 3, 12, 2022, with the stdgates.inc definitions)
and a small statevector simulator here runs the gates.  Checks:
  - the circuit's state equals the program's state, computed here as the
    product of scipy.linalg.expm(-i a P / 2) on the init state (each
    exponential checked against cos(a/2) I - i sin(a/2) P, common practice
    for P^2 = I), to 1e-10 up to a global phase, for random parameters, for
    every shape and for the plain, optimized, tree and short lowerings;
  - plain-lowering cx counts equal sum of 2(w - 1) over the words (common
    practice); optimized circuits never have more gates (or cx) than plain;
  - short excitation circuits give the same unitary as the plain lowering,
    up to a global phase (all basis states simulated), with fewer cx;
  - the tree ladder has lower depth than the chain for wide words;
  - counts printed in the headers equal the gates the readers found.
"""
import json
import os
import re
import subprocess
import sys
import tempfile

import numpy as np
import scipy.linalg

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
# Pauli words as {qubit: letter} and the encodings' basis permutation
# (tests/ref/ref_common.py)
from ref_common import PAULI, dense, permutation, text  # noqa: E402

BUILD = os.environ.get("CAIRN_BUILDDIR", ".")
DRIVER = os.path.join(BUILD, "tests", "ref", "gates_driver")
TOL = 1e-10
FAILS = []


def check(cond, what):
    if not cond:
        FAILS.append(what)
        print("FAIL:", what)


# ---------------------------------------------------------------- Pauli words

def weight(word):
    return len(word)


def popcount(v):
    return bin(v).count("1")


def decompose(M, n, tol=1e-12):
    """Pauli words and real coefficients of a Hermitian matrix M:
    c(P) = Tr(P M) / 2^n.  With P = i^{|a&b|} X^a Z^b, P|i> = i^{|a&b|}
    (-1)^{b.i} |i^a>, so for each x mask a the coefficients over all z masks b
    are a Walsh-Hadamard transform of the diagonal M[i^a, i]."""
    N = 1 << n
    idx = np.arange(N)
    out = []
    for a in range(N):
        v = M[idx ^ a, idx]
        if np.max(np.abs(v)) < tol:
            continue
        h = v.astype(complex).copy()
        step = 1
        while step < N:  # h[b] = sum_i (-1)^{b.i} v[i]
            h = h.reshape(-1, 2, step)
            h = np.stack([h[:, 0, :] + h[:, 1, :], h[:, 0, :] - h[:, 1, :]], axis=1).reshape(N)
            step *= 2
        for b in range(N):
            c = np.conj(1j ** popcount(a & b)) * h[b] / N
            if abs(c) > tol:
                assert abs(c.imag) < 1e-10, "generator not Hermitian"
                word = {}
                for q in range(n):
                    x, z = (a >> q) & 1, (b >> q) & 1
                    if x or z:
                        word[q] = "Y" if x and z else ("X" if x else "Z")
                out.append((word, float(c.real)))
    return out


# ------------------------------------------------------- fermionic operators

def lower_op(n, p, strings=True):
    """Annihilation a_p: |1><0| lowering (X + iY)/2 on qubit p, Z on q < p
    (Jordan-Wigner) or nothing (qubit excitation ladder)."""
    m = np.eye(1, dtype=complex)
    low = np.array([[0, 1], [0, 0]], dtype=complex)  # |0><1|: occupied is 1
    for q in range(n - 1, -1, -1):
        f = low if q == p else (PAULI["Z"] if (strings and q < p) else PAULI["I"])
        m = np.kron(m, f)
    return m


def excitation(n, frm, to, strings=True):
    """G = 2i (T - T^dagger), T = a+_{to[0]} a+_{to[1]} .. a_{frm[1]} a_{frm[0]}."""
    T = np.eye(1 << n, dtype=complex)
    ann = [lower_op(n, p, strings) for p in frm]
    cre = [lower_op(n, p, strings).conj().T for p in to]
    for op in reversed(ann):  # rightmost acts first: a_{frm[0]} first
        T = op @ T
    for op in reversed(cre):
        T = op @ T
    return 2j * (T - T.conj().T)


def encoding_matrix(n, kind):
    A = np.zeros((n, n), dtype=int)
    for j in range(n):
        if kind == "jw":
            A[j, j] = 1
        elif kind == "parity":
            A[j, : j + 1] = 1
        else:  # Bravyi-Kitaev: qubit j holds n_k for k in [j & (j+1), j]
            A[j, j & (j + 1) : j + 1] = 1
    return A


def encode_bits(A, occ):
    n = len(A)
    b = 0
    for j in range(n):
        if sum(A[j, k] * ((occ >> k) & 1) for k in range(n)) % 2:
            b |= 1 << j
    return b


# ----------------------------------------------------------- programs (JSON)

class Program:
    def __init__(self, n, init_bits):
        self.n = n
        self.init = init_bits  # int, bit q = qubit q
        self.gens = []
        self.params = []
        self.rots = []  # (word dict, param, mult, gen)

    def add_param(self, gen):
        self.params.append(gen)
        return len(self.params) - 1

    def add_gen(self, kind, txt, words, frm=(), to=()):
        g = len(self.gens)
        self.gens.append({"kind": kind, "text": txt, "rule": 0, "line": 3 + g, "from": list(frm), "to": list(to)})
        p = self.add_param(g)
        for w, m in words:
            self.rots.append((w, p, m, g))
        return g

    def trotter(self, k):
        """Every generator's rotations repeated k times with mult / k."""
        base = [r for r in self.rots if r[3] >= 0]
        ref = [r for r in self.rots if r[3] < 0]
        self.rots = ref + [(w, p, m / k, g) for _ in range(k) for (w, p, m, g) in base]

    def json(self):
        return {
            "qubits": self.n,
            "init": "".join("1" if (self.init >> q) & 1 else "0" for q in range(self.n)),
            "params": self.params,
            "generators": self.gens,
            "rotations": [{"word": text(w), "param": p, "mult": m, "gen": g} for (w, p, m, g) in self.rots],
        }


def reference_state(prog, theta, use_expm):
    """prod_k exp(-i a_k P_k / 2) |init>.  With use_expm, each factor is
    scipy.linalg.expm of the dense matrix, checked against the closed form."""
    n = prog.n
    psi = np.zeros(1 << n, dtype=complex)
    psi[prog.init] = 1
    for (w, p, m, g) in prog.rots:
        a = theta[p] * m if p >= 0 else m
        P = dense(n, w)
        closed = np.cos(a / 2) * np.eye(1 << n) - 1j * np.sin(a / 2) * P
        if use_expm:
            U = scipy.linalg.expm(-1j * a * P / 2)
            assert np.max(np.abs(U - closed)) < 1e-12, "scipy expm disagrees with cos/sin form"
        else:
            U = closed
        psi = U @ psi
    return psi


# ------------------------------------------------------------ gate simulator

def u3(t, p, l):
    """OpenQASM 2.0 u3 / OpenQASM 3.0 U matrix."""
    return np.array(
        [[np.cos(t / 2), -np.exp(1j * l) * np.sin(t / 2)], [np.exp(1j * p) * np.sin(t / 2), np.exp(1j * (p + l)) * np.cos(t / 2)]]
    )


# qelib1.inc (Cross et al. 2017, appendix): rz(phi) = u1(phi), rx = u3(t,-pi/2,pi/2),
# ry = u3(t,0,0), h = u2(0,pi) = u3(pi/2,0,pi), x = u3(pi,0,pi), s = u1(pi/2).
QELIB1 = {
    "x": lambda: u3(np.pi, 0, np.pi),
    "h": lambda: u3(np.pi / 2, 0, np.pi),
    "s": lambda: u3(0, 0, np.pi / 2),
    "sdg": lambda: u3(0, 0, -np.pi / 2),
    "rx": lambda t: u3(t, -np.pi / 2, np.pi / 2),
    "ry": lambda t: u3(t, 0, 0),
    "rz": lambda t: u3(0, 0, t),
}
# stdgates.inc (Cross et al. 2022): rz(l) = gphase(-l/2) U(0,0,l); the rest as above.
STDGATES = dict(QELIB1)
STDGATES["rz"] = lambda t: np.exp(-1j * t / 2) * u3(0, 0, t)
# The listing: rotations exp(-i a sigma / 2) (docs/listing.md).
LISTING = dict(QELIB1)
LISTING["rx"] = lambda t: scipy.linalg.expm(-1j * t / 2 * PAULI["X"])
LISTING["ry"] = lambda t: scipy.linalg.expm(-1j * t / 2 * PAULI["Y"])
LISTING["rz"] = lambda t: scipy.linalg.expm(-1j * t / 2 * PAULI["Z"])
ONE_QUBIT = {"x": 0, "h": 0, "s": 0, "sdg": 0, "rx": 1, "ry": 1, "rz": 1}


def apply1(psi, n, q, U):
    """psi: (2^n, batch)."""
    B = psi.shape[1]
    v = psi.reshape(1 << (n - q - 1), 2, 1 << q, B)
    v = np.einsum("ab,xbyk->xayk", U, v)
    return v.reshape(1 << n, B)


def apply_cx(psi, n, c, t):
    idx = np.arange(1 << n)
    src = np.where((idx >> c) & 1, idx ^ (1 << t), idx)
    return psi[src]


def simulate(n, gates, table, states):
    """gates: (name, [angles], [qubits])."""
    psi = states.copy()
    for name, ang, qs in gates:
        if name == "cx":
            psi = apply_cx(psi, n, qs[0], qs[1])
        else:
            U = table[name](*ang)
            psi = apply1(psi, n, qs[0], U)
    return psi


def same_up_to_phase(a, b):
    k = np.argmax(np.abs(b))
    if abs(b[k]) < 1e-12:
        return np.max(np.abs(a)) < TOL
    ph = a[k] / b[k]
    if abs(abs(ph) - 1) > TOL:
        return False
    return np.max(np.abs(a - ph * b)) < TOL


def same_unitary_up_to_phase(A, B):
    return same_up_to_phase(A.reshape(-1), B.reshape(-1))


# ---------------------------------------------------------------- expressions

TOKEN = re.compile(
    r"\s*(?:(?P<real>(?:[0-9]+\.[0-9]*|[0-9]*\.[0-9]+)(?:[eE][-+]?[0-9]+)?)|(?P<int>[1-9][0-9]*|0)(?![0-9.eE])"
    r"|(?P<id>[a-z][A-Za-z0-9_]*)|(?P<op>[-+*/()]))"
)


def eval_expr(s, env):
    """Expressions of the grammar subset we emit: real and integer literals
    (OpenQASM 2.0 spelling: a real has a decimal point), pi, identifiers,
    unary minus, + - * /, parentheses."""
    toks, pos = [], 0
    s = s.strip()
    while pos < len(s):
        m = TOKEN.match(s, pos)
        if not m or m.end() == pos:
            raise ValueError(f"bad token in expression {s!r} at {pos}")
        pos = m.end()
        kind = m.lastgroup
        toks.append((kind, m.group(kind)))
    toks.append(("end", ""))
    i = [0]

    def peek():
        return toks[i[0]]

    def take():
        t = toks[i[0]]
        i[0] += 1
        return t

    def atom():
        k, v = take()
        if k in ("real", "int"):
            return float(v)
        if k == "id":
            if v == "pi":
                return np.pi
            if v not in env:
                raise ValueError(f"undeclared identifier {v}")
            return env[v]
        if v == "-":
            return -atom()
        if v == "(":
            x = expr()
            if take()[1] != ")":
                raise ValueError("missing )")
            return x
        raise ValueError(f"unexpected {v!r} in {s!r}")

    def term():
        x = atom()
        while peek()[1] in ("*", "/"):
            op = take()[1]
            y = atom()
            x = x * y if op == "*" else x / y
        return x

    def expr():
        x = term()
        while peek()[1] in ("+", "-"):
            op = take()[1]
            y = term()
            x = x + y if op == "+" else x - y
        return x

    x = expr()
    if peek()[0] != "end":
        raise ValueError(f"trailing text in {s!r}")
    return x


def split_args(s):
    out, depth, cur = [], 0, ""
    for ch in s:
        if ch == "," and depth == 0:
            out.append(cur)
            cur = ""
            continue
        depth += ch == "("
        depth -= ch == ")"
        cur += ch
    if cur.strip():
        out.append(cur)
    return [x.strip() for x in out]


def statements(src):
    """Comments removed, split on ';' and braces."""
    src = re.sub(r"//[^\n]*", "", src)
    out = []
    for part in re.split(r"([;{}])", src):
        if part in (";", "{", "}"):
            out.append(part)
        elif part.strip():
            out.append(" ".join(part.split()))
    return out


CALL = re.compile(r"^([a-z][A-Za-z0-9_]*)\s*(?:\((.*)\))?\s+(.+)$")
IDENT = re.compile(r"^[a-z][A-Za-z0-9_]*$")


def read_qasm2(src, values=None):
    """OpenQASM 2.0 reader for what we emit: returns (n, gates)."""
    st = statements(src)
    if st[:2] != ["OPENQASM 2.0", ";"]:
        raise ValueError("first statement must be OPENQASM 2.0;")
    if st[2:4] != ['include "qelib1.inc"', ";"]:
        raise ValueError('second statement must be include "qelib1.inc";')
    i, n, defs, gates = 4, None, {}, []
    while i < len(st):
        s = st[i]
        if s.startswith("gate "):
            m = re.match(r"^gate ([a-z][A-Za-z0-9_]*)\s*(?:\(([^)]*)\))?\s*(.*)$", s)
            if not m or st[i + 1] != "{":
                raise ValueError(f"bad gate declaration {s!r}")
            name = m.group(1)
            params = [p.strip() for p in m.group(2).split(",")] if m.group(2) else []
            qargs = [a.strip() for a in m.group(3).split(",")]
            for x in params + qargs:
                if not IDENT.match(x):
                    raise ValueError(f"bad identifier {x!r}")
            if len(set(qargs)) != len(qargs) or len(set(params)) != len(params):
                raise ValueError("repeated gate argument")
            body, i = [], i + 2
            while st[i] != "}":
                cm = CALL.match(st[i])
                if not cm or st[i + 1] != ";":
                    raise ValueError(f"bad gate body statement {st[i]!r}")
                g, ex, args = cm.group(1), cm.group(2), split_args(cm.group(3))
                if g not in ONE_QUBIT and g != "cx":
                    raise ValueError(f"gate {g} is not one we emit from qelib1.inc")
                nexp = [] if ex is None else split_args(ex)
                if len(nexp) != (ONE_QUBIT.get(g, 0)):
                    raise ValueError(f"{g}: wrong number of parameters")
                if len(args) != (2 if g == "cx" else 1) or any(a not in qargs for a in args):
                    raise ValueError(f"{g}: arguments must be the gate's own qubit names")
                if g == "cx" and args[0] == args[1]:
                    raise ValueError("cx on one qubit")
                body.append((g, nexp, args))
                i += 2
            defs[name] = (params, qargs, body)
            i += 1
            continue
        if st[i + 1] != ";":
            raise ValueError(f"missing ; after {s!r}")
        m = re.match(r"^qreg ([a-z][A-Za-z0-9_]*)\s*\[([1-9][0-9]*)\]$", s)
        if m:
            if n is not None:
                raise ValueError("second qreg")
            reg, n = m.group(1), int(m.group(2))
            i += 2
            continue
        cm = CALL.match(s)
        if not cm or cm.group(1) not in defs:
            raise ValueError(f"unknown statement {s!r}")
        if n is None:
            raise ValueError("gate applied before qreg")
        params, qargs, body = defs[cm.group(1)]
        vals = [eval_expr(e, {}) for e in split_args(cm.group(2))] if cm.group(2) else []
        if len(vals) != len(params):
            raise ValueError("wrong number of call parameters")
        args = split_args(cm.group(3))
        qmap = {}
        for a, formal in zip(args, qargs):
            am = re.match(r"^([a-z][A-Za-z0-9_]*)\[([0-9]+)\]$", a)
            if not am or am.group(1) != reg or int(am.group(2)) >= n:
                raise ValueError(f"bad qubit {a!r}")
            qmap[formal] = int(am.group(2))
        if len(args) != len(qargs) or len(set(qmap.values())) != len(qargs):
            raise ValueError("call needs distinct qubits, one per argument")
        env = dict(zip(params, vals if values is None else values))
        for g, ex, a in body:
            gates.append((g, [eval_expr(e, env) for e in ex], [qmap[x] for x in a]))
        i += 2
    return n, gates


def read_qasm3(src, values):
    """OpenQASM 3.0 reader for what we emit: inputs bound from `values`."""
    st = statements(src)
    if st[:2] != ["OPENQASM 3.0", ";"]:
        raise ValueError("first statement must be OPENQASM 3.0;")
    if st[2:4] != ['include "stdgates.inc"', ";"]:
        raise ValueError('second statement must be include "stdgates.inc";')
    env, n, reg, gates = {}, None, None, []
    for i in range(4, len(st), 2):
        s = st[i]
        if i + 1 >= len(st) or st[i + 1] != ";":
            raise ValueError(f"missing ; after {s!r}")
        m = re.match(r"^input float\[64\] ([a-z_][A-Za-z0-9_]*)$", s)
        if m:
            name = m.group(1)
            if name in env or n is not None:
                raise ValueError(f"input {name} declared twice or after the qubits")
            pm = re.match(r"^theta_([0-9]+)$", name)
            env[name] = values[int(pm.group(1))]
            continue
        m = re.match(r"^const float\[64\] ([a-z_][A-Za-z0-9_]*) = (.+)$", s)
        if m:
            if m.group(1) in env:
                raise ValueError("constant declared twice")
            env[m.group(1)] = eval_expr(m.group(2), env)
            continue
        m = re.match(r"^qubit\[([1-9][0-9]*)\] ([a-z_][A-Za-z0-9_]*)$", s)
        if m:
            if n is not None:
                raise ValueError("second qubit register")
            n, reg = int(m.group(1)), m.group(2)
            continue
        cm = CALL.match(s)
        if not cm:
            raise ValueError(f"unknown statement {s!r}")
        if n is None:
            raise ValueError("gate before the qubit declaration")
        g, ex, args = cm.group(1), cm.group(2), split_args(cm.group(3))
        if g not in ONE_QUBIT and g != "cx":
            raise ValueError(f"gate {g} is not one we emit from stdgates.inc")
        nexp = [] if ex is None else split_args(ex)
        if len(nexp) != ONE_QUBIT.get(g, 0):
            raise ValueError(f"{g}: wrong number of parameters")
        qs = []
        for a in args:
            am = re.match(r"^([a-z_][A-Za-z0-9_]*)\[([0-9]+)\]$", a)
            if not am or am.group(1) != reg or int(am.group(2)) >= n:
                raise ValueError(f"bad qubit {a!r}")
            qs.append(int(am.group(2)))
        if len(qs) != (2 if g == "cx" else 1) or len(set(qs)) != len(qs):
            raise ValueError(f"{g}: bad operands")
        gates.append((g, [eval_expr(e, env) for e in nexp], qs))
    return n, gates


def read_listing(src, values):
    """cairn's listing (docs/listing.md): header, gates, comments, end."""
    lines = src.split("\n")
    if lines[0] != "cairn gates 1":
        raise ValueError("listing must start with `cairn gates 1`")
    head, gates, n, ended = {}, [], None, False
    env = {f"t{p}": v for p, v in enumerate(values)}
    for ln in lines[1:]:
        if not ln or ln.startswith("#"):
            continue
        if ended:
            raise ValueError("text after end")
        f = ln.split(" ")
        if f[0] in ("source", "qubits", "params", "counts", "lowering", "values", "value", "trotter"):
            if gates:
                raise ValueError("header line after the gates")
            head.setdefault(f[0], []).append(f[1:])
            if f[0] == "qubits":
                n = int(f[1])
            continue
        if f[0] == "end":
            ended = True
            continue
        g = f[0]
        if g not in ONE_QUBIT and g != "cx":
            raise ValueError(f"unknown gate {g}")
        nq = 2 if g == "cx" else 1
        qs = [int(x[1:]) for x in f[1 : 1 + nq]]
        if any(not x.startswith("q") for x in f[1 : 1 + nq]) or any(q >= n for q in qs):
            raise ValueError(f"bad qubits in {ln!r}")
        ang = [eval_expr(x, env) for x in f[1 + nq :]]
        if len(ang) != ONE_QUBIT.get(g, 0):
            raise ValueError(f"bad angle count in {ln!r}")
        gates.append((g, ang, qs))
    if not ended:
        raise ValueError("listing without end")
    return n, gates, head


# ---------------------------------------------------------------- the driver

def run_driver(prog_path, *opts):
    r = subprocess.run([DRIVER, *opts, prog_path], capture_output=True, text=True)
    if r.returncode != 0:
        raise RuntimeError(f"driver {opts} failed: {r.stderr}")
    return r.stdout


def counts(prog_path, *opts):
    return json.loads(run_driver(prog_path, "--counts", *opts))


def header_counts(src, style):
    if style == "listing":
        m = re.search(r"^counts cx (\d+) single (\d+) total (\d+) depth (\d+) cx-depth (\d+)$", src, re.M)
    else:
        m = re.search(r"cx (\d+), single (\d+), total (\d+), depth (\d+), cx depth (\d+)", src)
    return [int(x) for x in m.groups()]


OPTIONS = {
    "plain": ["--no-passes"],
    "passes": [],
    "tree": ["--tree"],
    "short": ["--short"],
    "short-plain": ["--short", "--no-passes"],
}


def check_program(name, prog, rng, tmp, use_expm, expect_short=False):
    n = prog.n
    path = os.path.join(tmp, name + ".json")
    with open(path, "w") as f:
        json.dump(prog.json(), f)
    theta = rng.uniform(-np.pi, np.pi, len(prog.params))
    report = os.path.join(tmp, name + ".report.json")
    with open(report, "w") as f:
        json.dump({"cairn": 1, "points": [{"parameters": list(theta)}]}, f)
    ref = reference_state(prog, theta, use_expm)
    init = np.zeros((1 << n, 1), dtype=complex)  # circuits start from |0...0>
    init[0, 0] = 1
    plain_cx = sum(2 * (weight(w) - 1) for (w, p, m, g) in prog.rots if weight(w) > 1)
    k = {o: counts(path, *OPTIONS[o]) for o in OPTIONS}
    check(k["plain"]["cnot"] == plain_cx, f"{name}: plain cx {k['plain']['cnot']} != sum 2(w-1) = {plain_cx}")
    check(k["plain"]["plain_cnot"] == plain_cx, f"{name}: gate_plain_cx {k['plain']['plain_cnot']} != {plain_cx}")
    for o in ("passes", "tree", "short", "short-plain"):
        check(k[o]["total"] <= k["plain"]["total"], f"{name}/{o}: {k[o]['total']} gates > plain {k['plain']['total']}")
        check(k[o]["cnot"] <= k["plain"]["cnot"], f"{name}/{o}: {k[o]['cnot']} cx > plain {k['plain']['cnot']}")
    if expect_short:
        check(k["short-plain"]["cnot"] < k["plain"]["cnot"], f"{name}: short circuits did not save cx")
    unitaries = {}
    for o, opts in OPTIONS.items():
        q2 = run_driver(path, "--format", "qasm2", "--bind", report, *opts)
        n2, g2 = read_qasm2(q2)
        check(n2 == n, f"{name}/{o}: qasm2 register {n2} != {n}")
        cx2 = sum(1 for g in g2 if g[0] == "cx")
        hc = header_counts(q2, "qasm")
        check(hc[:3] == [cx2, len(g2) - cx2, len(g2)], f"{name}/{o}: qasm2 header counts {hc} vs gates read")
        check(hc[0] == k[o]["cnot"] and hc[3] == k[o]["depth"], f"{name}/{o}: qasm2 header vs --counts")
        psi = simulate(n, g2, QELIB1, init)[:, 0]
        check(same_up_to_phase(psi, ref), f"{name}/{o}: OpenQASM 2.0 state differs from the program's")
        q3 = run_driver(path, "--format", "qasm3", *opts)
        n3, g3 = read_qasm3(q3, theta)
        psi3 = simulate(n3, g3, STDGATES, init)[:, 0]
        check(same_up_to_phase(psi3, ref), f"{name}/{o}: OpenQASM 3.0 state differs from the program's")
        q3b = run_driver(path, "--format", "qasm3", "--bind", report, *opts)
        n3b, g3b = read_qasm3(q3b, [])
        psi3b = simulate(n3b, g3b, STDGATES, init)[:, 0]
        check(same_up_to_phase(psi3b, ref), f"{name}/{o}: bound OpenQASM 3.0 state differs")
        ls = run_driver(path, "--format", "listing", *opts)
        nl, gl, head = read_listing(ls, theta)
        psil = simulate(nl, gl, LISTING, init)[:, 0]
        check(same_up_to_phase(psil, ref), f"{name}/{o}: listing state differs from the program's")
        hl = header_counts(ls, "listing")
        cxl = sum(1 for g in gl if g[0] == "cx")
        check(hl[:3] == [cxl, len(gl) - cxl, len(gl)], f"{name}/{o}: listing header counts {hl} vs gates")
        if n <= 6 and o in ("plain", "short-plain", "short"):
            unitaries[o] = simulate(n, g2, QELIB1, np.eye(1 << n, dtype=complex))
    if "short-plain" in unitaries:
        check(same_unitary_up_to_phase(unitaries["short-plain"], unitaries["plain"]),
              f"{name}: short circuits differ from the plain lowering as unitaries")
        check(same_unitary_up_to_phase(unitaries["short"], unitaries["plain"]),
              f"{name}: optimized short circuits differ from the plain lowering as unitaries")
    return k


def fermionic_program(n, nocc, enc, rng, strings=True, kinds=("single", "double"), maxgens=None, block=False):
    """Spin-conserving singles and doubles occ -> virt (spin orbitals 2p
    alpha, 2p+1 beta), HF reference, under encoding `enc`.  With `block`,
    spin orbital s sits on mode s//2 + (s%2)*(n/2) (alpha block, then beta)."""
    mode = (lambda s: s // 2 + (s % 2) * (n // 2)) if block else (lambda s: s)
    A = encoding_matrix(n, enc)
    Pm = permutation(A) if enc != "jw" else None
    occ = list(range(nocc))
    vir = list(range(nocc, n))
    exc = []
    if "single" in kinds:
        exc += [((i,), (a,)) for i in occ for a in vir if i % 2 == a % 2]
    if "double" in kinds:
        exc += [((i, j), (a, b)) for i in occ for j in occ if i < j for a in vir for b in vir if a < b
                and (i % 2 + j % 2) == (a % 2 + b % 2)]
    if maxgens is not None and len(exc) > maxgens:
        pick = sorted(rng.choice(len(exc), maxgens, replace=False))
        exc = [exc[t] for t in pick]
    ref_occ = sum(1 << mode(i) for i in occ)
    prog = Program(n, encode_bits(A, ref_occ))
    for frm, to in exc:
        G = excitation(n, [mode(s) for s in frm], [mode(s) for s in to], strings)
        if Pm is not None:
            G = Pm @ G @ Pm.T
        words = decompose(G, n)
        kind = ("single" if len(frm) == 1 else "double") if strings else ("qubit-single" if len(frm) == 1 else "qubit-double")
        prog.add_gen(kind, " ".join(map(str, frm)) + " -> " + " ".join(map(str, to)), words, frm, to)
    return prog


def taper_two(prog):
    """Two-qubit reduction of a parity-encoded program in block spin order:
    qubits n/2-1 (N_alpha parity) and n-1 (N parity) carry only I or Z; Z
    becomes its eigenvalue on the reference, and both qubits go."""
    n = prog.n
    cut = [n // 2 - 1, n - 1]
    keep = [q for q in range(n) if q not in cut]
    sign = {q: (-1 if (prog.init >> q) & 1 else 1) for q in cut}
    out = Program(n - 2, sum(1 << j for j, q in enumerate(keep) if (prog.init >> q) & 1))
    out.gens, out.params = prog.gens, prog.params
    for (w, p, m, g) in prog.rots:
        f = m
        for q in cut:
            assert w.get(q, "I") in ("I", "Z"), "generator does not commute with the tapered symmetry"
            if w.get(q) == "Z":
                f *= sign[q]
        out.rots.append(({keep.index(q): l for q, l in w.items() if q not in cut}, p, f, g))
    return out


def main():
    if not os.path.exists(DRIVER):
        print("gates driver not built:", DRIVER)
        return 1
    rng = np.random.default_rng(20240607)
    with tempfile.TemporaryDirectory() as tmp:
        # Fermionic UCCSD-type programs, 6 spin orbitals, 2 electrons, each encoding.
        for enc in ("jw", "parity", "bk"):
            prog = fermionic_program(6, 2, enc, rng)
            k = check_program(f"uccsd-{enc}", prog, rng, tmp, use_expm=True, expect_short=(enc == "jw"))
            print(f"uccsd-{enc} 6 qubits, {len(prog.gens)} generators: cx plain {k['plain']['cnot']}, "
                  f"passes {k['passes']['cnot']}, short {k['short-plain']['cnot']}, short+passes {k['short']['cnot']}; "
                  f"depth chain {k['passes']['depth']} tree {k['tree']['depth']}")
        # 8 spin orbitals, 4 electrons, JW, a sample of the excitations; doubles with long Z strings.
        prog = fermionic_program(8, 4, "jw", rng, maxgens=14)
        k = check_program("uccsd-jw-8", prog, rng, tmp, use_expm=False, expect_short=True)
        print(f"uccsd-jw-8: cx plain {k['plain']['cnot']}, passes {k['passes']['cnot']}, short {k['short']['cnot']}")
        # Tapered: the parity program on 6 qubits reduced to 4.
        full = fermionic_program(6, 2, "parity", rng, block=True)
        tap = taper_two(full)
        th = rng.uniform(-1, 1, len(full.params))
        big = reference_state(full, th, False)
        small = reference_state(tap, th, False)
        keep = [q for q in range(6) if q not in (2, 5)]
        sector = [i for i in range(64) if all(((i >> q) & 1) == ((full.init >> q) & 1) for q in (2, 5))]
        red = np.array([big[i] for i in sector])
        order = [sum(((i >> q) & 1) << j for j, q in enumerate(keep)) for i in sector]
        check(np.max(np.abs(red - small[order])) < TOL and abs(np.linalg.norm(red) - 1) < TOL,
              "tapering in the test itself: reduced state is not the full state in its sector")
        k = check_program("uccsd-parity-tapered", tap, rng, tmp, use_expm=True)
        print(f"uccsd-parity-tapered 4 qubits: cx plain {k['plain']['cnot']}, passes {k['passes']['cnot']}")
        # Qubit excitations (no parity strings).
        prog = fermionic_program(6, 2, "jw", rng, strings=False)
        k = check_program("qubit-exc", prog, rng, tmp, use_expm=True, expect_short=True)
        print(f"qubit-exc: cx plain {k['plain']['cnot']}, short {k['short-plain']['cnot']}")
        # Entanglers with a mean-field reference: leading Y and Z rotations per qubit.
        n = 6
        prog = Program(n, 0b000111)
        for q in range(n):
            p = prog.add_param(-1)
            prog.rots.append(({q: "Y"}, p, 1.0, -1))
            p = prog.add_param(-1)
            prog.rots.append(({q: "Z"}, p, 1.0, -1))
        for t in range(10):
            w = {}
            while len([l for l in w.values() if l in "XY"]) == 0:
                w = {q: "IXYZ"[rng.integers(4)] for q in range(n)}
                w = {q: l for q, l in w.items() if l != "I"}
            if t == 0:  # weight-1 words that meet the mean-field rotations of their qubit
                prog.add_gen("word", "Z3", [({3: "Z"}, 0.5)])
                prog.add_gen("word", "Y4", [({4: "Y"}, -1.5)])
                prog.add_gen("word", "Z3", [({3: "Z"}, 1.0)])
            prog.add_gen("entangler", text(w), [(w, 1.0)])
        check_program("qcc-meanfield", prog, rng, tmp, use_expm=True)
        # Wide supports, fixed-angle rotations, words repeated back to back.
        n = 8
        prog = Program(n, 0b10110010)
        for t in range(8):
            w = {q: "XYZ"[rng.integers(3)] for q in range(n) if rng.random() < 0.85}
            if not w:
                w = {0: "X"}
            prog.add_gen("word", text(w), [(w, float(rng.uniform(-2, 2)))])
            if t % 3 == 0:
                prog.rots.append((w, -1, float(rng.uniform(-1, 1)), len(prog.gens) - 1))
        prog.rots.append(({}, -1, 0.3, -1))  # identity word: a global phase only
        k = check_program("wide", prog, rng, tmp, use_expm=False)
        check(k["tree"]["depth"] < k["passes"]["depth"],
              f"wide: tree depth {k['tree']['depth']} not below chain {k['passes']['depth']}")
        print(f"wide 8 qubits: depth plain {k['plain']['depth']}, chain+passes {k['passes']['depth']}, "
              f"tree+passes {k['tree']['depth']}")
        # Trotter steps: the JW program, three steps.
        prog = fermionic_program(6, 2, "jw", rng)
        prog.trotter(3)
        k = check_program("trotter-3", prog, rng, tmp, use_expm=False, expect_short=True)
        print(f"trotter-3: cx plain {k['plain']['cnot']}, passes {k['passes']['cnot']}")
    if FAILS:
        print(f"{len(FAILS)} check(s) failed")
        return 1
    print("all gate checks passed")
    return 0


if __name__ == "__main__":
    sys.exit(main())
