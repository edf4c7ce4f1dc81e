"""gates_acceptance.py — the acceptance table of issue 7: two-qubit gate cost
and error of qubit coupled cluster (QCC: entanglers chosen by gradient on a
qubit mean-field reference) against one-step Trotterized UCCSD (all
spin-conserving singles and doubles on Hartree-Fock), for H2, LiH and H2O in
STO-3G, every figure made by `cairn run --json` (error against the exact
energy of the active space) and `cairn build --json` (cx counts).

For QCC the number of entanglers grows (choose N by gradient) until the error
is within chemical accuracy, 1.6 mEh (1 kcal/mol; common practice).

    /usr/bin/python3 tests/bench/gates_acceptance.py [CAIRN] [--max N]

prints a Markdown table (the one in README.md) and the commands it ran.
Not part of `make check`: it optimizes tens of ansatze (minutes).
"""
import json
import os
import subprocess
import sys
import tempfile

CHEM_ACC = 1.6e-3  # hartree; 1 kcal/mol, common practice

MOLECULES = [
    ("H2", "atoms angstrom {\n  H 0 0 0\n  H 0 0 0.74\n}\n", ""),
    ("LiH", "atoms angstrom {\n  Li 0 0 0\n  H 0 0 1.595\n}\n", "orbitals {\n  freeze core\n}\n"),
    ("H2O", "atoms angstrom {\n  O 0 0 0\n  H 0 0.7571 0.5861\n  H 0 -0.7571 0.5861\n}\n",
     "orbitals {\n  freeze core\n}\n"),
]


def recipe(atoms, orbitals, kind, n=None):
    head = "cairn 1\n" + atoms + "charge 0\nmultiplicity 1\nbasis sto-3g\n" + orbitals + "encoding jordan-wigner\n"
    if kind == "uccsd":
        body = ("reference hartree-fock\nkeep particles exactly\nkeep spin-z exactly\n"
                "pool {\n  singles\n  doubles\n}\nchoose all\norder as written\ntrotter 1\n")
    else:
        body = (f"reference mean-field\npool {{\n  entanglers\n}}\nchoose {n} by gradient\norder by gradient\n"
                "trotter 1\n")
    return head + body + "optimize lbfgs tolerance 1e-10 iterations 2000\n"


def run(cmd, log):
    log.append(" ".join(cmd))
    r = subprocess.run(cmd, capture_output=True, text=True)
    if r.returncode not in (0, 1):
        raise RuntimeError(f"{' '.join(cmd)}: exit {r.returncode}: {r.stderr}")
    return r


def measure(cairn, path, tmp, log):
    out = os.path.join(tmp, "report.json")
    run([cairn, "run", "--json", out, path], log)
    with open(out) as f:
        rep = json.load(f)
    pt = rep["points"][0]
    b = json.loads(run([cairn, "build", "--json", path], log).stdout)
    p = json.loads(run([cairn, "build", "--json", "--no-passes", path], log).stdout)
    sh = json.loads(run([cairn, "build", "--json", "--short", path], log).stdout)
    return {
        "qubits": pt["qubits"],
        "generators": len(pt.get("generators", [])),
        "error": pt["error"],
        "cx_plain": p["gates"]["cnot"],
        "cx": b["gates"]["cnot"],
        "cx_short": sh["gates"]["cnot"],
        "depth": b["gates"]["depth"],
    }


def main():
    args = [a for a in sys.argv[1:]]
    nmax = 40
    if "--max" in args:
        i = args.index("--max")
        nmax = int(args[i + 1])
        del args[i : i + 2]
    cairn = args[0] if args else os.path.join(os.environ.get("CAIRN_BUILDDIR", "."), "cairn")
    log, rows = [], []
    with tempfile.TemporaryDirectory() as tmp:
        for name, atoms, orb in MOLECULES:
            path = os.path.join(tmp, f"{name}-uccsd.cairn")
            with open(path, "w") as f:
                f.write(recipe(atoms, orb, "uccsd"))
            u = measure(cairn, path, tmp, log)
            rows.append((name, "UCCSD, 1 Trotter step", u))
            q = None
            for n in range(1, nmax + 1):
                path = os.path.join(tmp, f"{name}-qcc-{n}.cairn")
                with open(path, "w") as f:
                    f.write(recipe(atoms, orb, "qcc", n))
                q = measure(cairn, path, tmp, log)
                if abs(q["error"]) <= CHEM_ACC:
                    break
            k = q["generators"]
            rows.append((name, f"QCC, {k} entangler{'' if k == 1 else 's'}", q))
    print("| molecule | qubits | ansatz | generators | cx plain | cx with passes | cx short + passes | depth "
          "| error / mEh | within 1.6 mEh |")
    print("|---|---|---|---|---|---|---|---|---|---|")
    for name, what, m in rows:
        ok = "yes" if abs(m["error"]) <= CHEM_ACC else "no"
        print(f"| {name} | {m['qubits']} | {what} | {m['generators']} | {m['cx_plain']} | {m['cx']} | {m['cx_short']} "
              f"| {m['depth']} | {m['error'] * 1e3:.2e} | {ok} |")
    print()
    print("commands (recipes written to a temporary directory):")
    for c in log:
        print("  " + c)
    return 0


if __name__ == "__main__":
    sys.exit(main())
