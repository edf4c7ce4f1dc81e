"""spectrum.py — the lowest states of a recipe's active-space Hamiltonian in
the sector of its electron count and S_z = 0, with <S^2> of each, to tell
which state an ansatz landed on (the water study: a quintet at 2.6 angstrom).

    /usr/bin/python3 tools/accept/spectrum.py RECIPE [COUNT] [--cairn PATH]
    /usr/bin/python3 tools/accept/spectrum.py --water R [--space 44|86] [COUNT]

RECIPE must have one point (no `vary`).  --water R writes such a recipe to a
temporary file: the water study's geometry at r = R angstrom and its
active space (default 44).

Builds the Hamiltonian with numpy from `cairn show --hamiltonian --json` (the
matrix builder of particles.py; Jordan-Wigner recipes only: spin orbital 2p is
orbital p alpha, 2p+1 beta), S^2 = S-S+ + Sz^2 + Sz from Jordan-Wigner ladder
operators built here, and diagonalizes with numpy eigh.  Prints E, E - E0 in
mEh and <S^2> of the COUNT (default 8) lowest states.
"""
import json
import os
import subprocess
import sys
import tempfile

import numpy as np

HERE = os.path.dirname(os.path.abspath(__file__))
sys.path.insert(0, HERE)
sys.dont_write_bytecode = True  # no __pycache__ beside the scripts
import particles  # noqa: E402


def ladder(n, p):
    """Jordan-Wigner annihilator a_p on n qubits (dense): a_p|b> = (-1)^(bits below p) |b - p>."""
    dim = 1 << n
    A = np.zeros((dim, dim))
    for b in range(dim):
        if b >> p & 1:
            A[b ^ (1 << p), b] = (-1) ** bin(b & ((1 << p) - 1)).count("1")
    return A


def main():
    args = sys.argv[1:]
    cairn = os.path.join(os.path.dirname(os.path.dirname(HERE)), "cairn")
    if "--cairn" in args:
        i = args.index("--cairn")
        cairn = args[i + 1]
        del args[i:i + 2]
    tmp = None
    if "--water" in args:
        i = args.index("--water")
        rv = float(args[i + 1])
        del args[i:i + 2]
        space = "44"
        if "--space" in args:
            i = args.index("--space")
            space = args[i + 1]
            del args[i:i + 2]
        study = os.path.join(os.path.dirname(os.path.dirname(HERE)), "examples", "study")
        with open(os.path.join(study, "water-geometry.cairn")) as f:
            geo = [l for l in f.read().splitlines() if not l.startswith(("vary ", "let r ", "cairn "))]
        with open(os.path.join(study, f"space-{space}.cairn")) as f:
            orb = [l for l in f.read().splitlines() if not l.startswith("cairn ")]
        tmp = tempfile.NamedTemporaryFile("w", suffix=".cairn", delete=False)
        tmp.write("\n".join(["cairn 1", f"let r = {rv!r} angstrom"] + geo + orb + ["encoding jordan-wigner"]) + "\n")
        tmp.close()
        args.insert(0, tmp.name)
    try:
        return spectrum(cairn, args, f"water ({space[0]}e,{space[1]}o), r = {rv} angstrom" if tmp else None)
    finally:
        if tmp:
            os.unlink(tmp.name)


def spectrum(cairn, args, label=None):
    if not args:
        print("usage: spectrum.py RECIPE [COUNT] [--cairn PATH]", file=sys.stderr)
        return 2
    count = int(args[1]) if len(args) > 1 else 8
    show = json.loads(subprocess.run([cairn, "show", "--hamiltonian", "--json", args[0]], capture_output=True,
                                     text=True, check=True).stdout)
    if show.get("encoding") != "jordan-wigner" or show.get("removed", 0):
        print("spectrum.py: needs a Jordan-Wigner recipe without tapering", file=sys.stderr)
        return 2
    n, H, pop = particles.hamiltonian_matrix(cairn, args[0])
    a = [ladder(n, p) for p in range(n)]
    norb = n // 2
    sp = sum(a[2 * i].T @ a[2 * i + 1] for i in range(norb))
    sz = sum(0.5 * (a[2 * i].T @ a[2 * i] - a[2 * i + 1].T @ a[2 * i + 1]) for i in range(norb))
    s2 = sp.T @ sp + sz @ sz + sz
    txt = subprocess.run([cairn, "check", args[0]], capture_output=True, text=True).stdout
    nel = int(txt.split(" electrons in ")[0].split()[-1])
    sel = np.where((pop == nel) & np.isclose(np.diag(sz), 0.0))[0]
    w, v = np.linalg.eigh(H[np.ix_(sel, sel)].real)
    s2v = np.einsum("ik,ij,jk->k", v, s2[np.ix_(sel, sel)], v)
    print(f"{label or args[0]}: {nel} electrons, S_z = 0; the {count} lowest states")
    print("| E / Eh | E − E0 / mEh | ⟨Ŝ²⟩ |")
    print("|---|---|---|")
    for k in range(min(count, len(w))):
        print(f"| {w[k]:.8f} | {(w[k] - w[0]) * 1e3:.2f} | {s2v[k]:.3f} |")
    return 0


if __name__ == "__main__":
    sys.exit(main())
