"""particles.py — the particle-number study: an entangler recipe that breaks
particle number, with and without `keep particles penalty MU`.

The hydroxide anion OH- (STO-3G, oxygen 1s frozen, 8 electrons in 5 orbitals)
with the qubit mean-field reference and 8 entanglers chosen by gradient.
Neither the product-state reference nor the entanglers conserve the particle
number, and the lowest energy of the active-space Hamiltonian over all
particle numbers is not the anion's: it lies at 7 electrons (the neutral
radical), so an unconstrained optimization drifts there and ends far below the
8-electron exact energy.  The penalty MU <(N - 8)^2> holds <N> only when MU
exceeds the energy the drift gains (about 0.3 Eh here).

    /usr/bin/python3 tools/accept/particles.py write | check
    /usr/bin/python3 tools/accept/particles.py run [--cairn PATH]

`run` runs every variant (`cairn run --json`) and prints a Markdown table:
<N>, <S_z>, <S^2>, the error against the exact 8-electron energy (mEh; 1.6 mEh
is chemical accuracy, common practice) and the spread of the final energies
over the starts, plus the lowest energy of each particle-number sector of the
Hamiltonian (numpy eigvalsh on the matrix built from `cairn show --hamiltonian
--json`).
"""
import json
import os
import subprocess
import sys
import tempfile
import textwrap
import time

import numpy as np

HERE = os.path.dirname(os.path.abspath(__file__))
TOP = os.path.dirname(os.path.dirname(HERE))
STUDY = os.path.join(TOP, "examples", "study")
MUS = (None, 0.1, 0.3, 0.5, 1, 5)  # hartree


def name_of(mu):
    return "hydroxide-free" if mu is None else f"hydroxide-penalty-{mu}"


def recipe_text(mu):
    desc = ("Particle-number study, hydroxide anion: qubit mean-field reference and 8 entanglers, "
            + ("no particle-number constraint." if mu is None else f"particle-number penalty {mu} hartree.")
            + " Written by tools/accept/particles.py: edit the script.")
    lines = ["cairn 1"] + ["# " + l for l in textwrap.wrap(desc, 76)]
    lines += ["", 'use "hydroxide-molecule.cairn"', "", "encoding jordan-wigner", "reference mean-field", ""]
    if mu is not None:
        lines += [f"keep particles penalty {mu}", ""]
    lines += ["pool {", "  entanglers", "}", "choose 8 by gradient", "order by gradient", "trotter 1", "",
              "optimize lbfgs tolerance 1e-10 iterations 2000 starts 8 seed 7"]
    return "\n".join(lines) + "\n"


def path_of(mu):
    return os.path.join(STUDY, name_of(mu) + ".cairn")


def hamiltonian_matrix(cairn, path):
    """The dense qubit Hamiltonian built with numpy from `cairn show
    --hamiltonian --json` (P|b> = i^(#Y) (-1)^(popcount(b & zmask)) |b ^ xmask>)."""
    d = json.loads(subprocess.run([cairn, "show", "--hamiltonian", "--json", path], capture_output=True,
                                  text=True, check=True).stdout)
    n = d["qubits"]
    dim = 1 << n
    b = np.arange(dim)
    pop = np.array([bin(k).count("1") for k in range(dim)])
    H = np.eye(dim, dtype=complex) * d["constant"]
    for t in d["terms"]:
        xm = zm = ny = 0
        for tok in t["pauli"].split():
            l, q = tok[0], int(tok[1:])
            if l in "XY":
                xm |= 1 << q
            if l in "ZY":
                zm |= 1 << q
            ny += l == "Y"
        c = t["coeff"]
        H[b ^ xm, b] += c * (1j ** ny) * (1 - 2 * (pop[b & zm] & 1))
    return n, H, pop


def sector_minima(cairn, path):
    n, H, pop = hamiltonian_matrix(cairn, path)
    out = {}
    for k in range(n + 1):
        s = np.where(pop == k)[0]
        out[k] = float(np.linalg.eigvalsh(H[np.ix_(s, s)])[0])
    return out


def cmd_run(args):
    cairn = args[args.index("--cairn") + 1] if "--cairn" in args else os.path.join(TOP, "cairn")
    t0 = time.time()
    with tempfile.TemporaryDirectory() as tmp:
        rows = []
        for mu in MUS:
            rep = os.path.join(tmp, name_of(mu) + ".json")
            r = subprocess.run([cairn, "run", "--json", rep, path_of(mu)], capture_output=True, text=True)
            if r.returncode not in (0, 1):
                print(f"cairn run {path_of(mu)}: exit {r.returncode}: {r.stderr}", file=sys.stderr)
                return 1
            with open(rep) as f:
                rows.append((mu, json.load(f)["points"][0]))
    mins = sector_minima(cairn, path_of(None))
    print("| keep particles | ⟨N̂⟩ | ⟨Ŝz⟩ | ⟨Ŝ²⟩ | E − E(exact, N = 8) / mEh | spread over 8 starts / mEh |")
    print("|---|---|---|---|---|---|")
    for mu, p in rows:
        s = p["symmetry"]
        e = p["optimizer"]["start_energies"]
        err = p["error"] * 1e3
        ok = "✓" if abs(p["error"]) <= 1.6e-3 else "✗"
        print(f"| {'(none)' if mu is None else f'penalty {mu}'} | {s['particles']:.5f} | {s['spin_z']:.4f} "
              f"| {s['spin_squared']:.4f} | {err:.2f} {ok} | {(max(e) - min(e)) * 1e3:.3g} |")
    print()
    print("lowest energy of each particle-number sector (numpy, from `cairn show --hamiltonian --json`):")
    print("| N | " + " | ".join(str(k) for k in range(5, 11)) + " |")
    print("|---|" + "---|" * 6)
    print("| E / Eh | " + " | ".join(f"{mins[k]:.6f}" for k in range(5, 11)) + " |")
    print(f"\nstudy: {len(MUS)} recipes, {time.time() - t0:.1f} s wall")
    print("command: /usr/bin/python3 tools/accept/particles.py run")
    return 0


def main():
    cmd = sys.argv[1] if len(sys.argv) > 1 else ""
    if cmd == "write":
        for mu in MUS:
            with open(path_of(mu) + ".tmp", "w") as f:
                f.write(recipe_text(mu))
            os.replace(path_of(mu) + ".tmp", path_of(mu))
        return 0
    if cmd == "check":
        bad = 0
        for mu in MUS:
            try:
                with open(path_of(mu)) as f:
                    ok = f.read() == recipe_text(mu)
            except OSError:
                ok = False
            if not ok:
                print(f"{path_of(mu)}: missing or not what `particles.py write` makes")
                bad += 1
        return 1 if bad else 0
    if cmd == "run":
        return cmd_run(sys.argv[2:])
    print("usage: particles.py write | check | run [--cairn PATH]", file=sys.stderr)
    return 2


if __name__ == "__main__":
    sys.exit(main())
