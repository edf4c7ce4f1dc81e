"""gates_examples.py — every example's circuit acts as its optimized ansatz.

For each recipe in examples/ whose register is small enough for dense
vectors here (at most 12 qubits after tapering), the same check as
gates_recipes.py: `cairn run --json`, then `cairn build --bind` in OpenQASM
2.0 (plain, passes, tree, short lowerings), OpenQASM 3.0 and the listing;
the numpy gate simulator of gates_sim.py (independent of the C code) runs each
circuit, and its state must equal the rotation program's state (products of
scipy.linalg.expm) to 1e-10 up to a global phase, and its energy with the
Hamiltonian of `cairn show --hamiltonian --json` the report's ansatz energy to
1e-9 hartree.  Scans are checked at their first point.  Larger examples are
checked on sparse states by gates_sparse.py.
"""
import glob
import json
import os
import subprocess
import sys
import tempfile

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
import gates_recipes as gr  # noqa: E402

SRC = os.environ.get("CAIRN_SRCDIR", ".")
MAX_QUBITS = 12


def qubits(path):
    r = subprocess.run([gr.CAIRN, "show", "--hamiltonian", "--json", path], capture_output=True, text=True)
    if r.returncode != 0:
        gr.check(False, f"{path}: cairn show --hamiltonian failed: {r.stderr}")
        return None
    h = json.loads(r.stdout)
    return (h["points"][0] if "points" in h else h)["qubits"]


def main():
    examples = sorted(glob.glob(os.path.join(SRC, "examples", "*.cairn")))
    gr.check(len(examples) >= 6, f"only {len(examples)} examples")
    checked = 0
    with tempfile.TemporaryDirectory() as tmp:
        for path in examples:
            name = os.path.basename(path)[:-6]
            n = qubits(path)
            if n is None:
                continue
            if n > MAX_QUBITS:
                print(f"{name}: {n} qubits, checked on sparse states by gates_sparse.py")
                continue
            gr.check_recipe(name, path, tmp)
            checked += 1
    gr.check(checked >= 5, f"only {checked} examples small enough to simulate")
    if gr.FAILS:
        print(f"{len(gr.FAILS)} check(s) failed")
        return 1
    print(f"circuits of {checked} examples act as their optimized ansatz")
    return 0


if __name__ == "__main__":
    sys.exit(main())
