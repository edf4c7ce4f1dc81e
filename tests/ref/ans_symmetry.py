#!/usr/bin/python3
"""Symmetry signatures against commutators of dense matrices built with numpy.

cairn types each generator against N, S_z and S^2 with the Pauli algebra of
the encoding.  Here N, S_z, S^2 are built as dense matrices in the occupation
basis (second quantization by explicit matrices), carried into each encoding
by its GF(2) matrix, and commuted with the dense generator rebuilt from the
Pauli words cairn reports; every reported signature must match.  Facts of the
trade checked on the way: spin-conserving fermionic (and qubit) excitations
commute with N and S_z; spin-adapted singles and pair doubles commute with
S^2; a single Pauli word with an X or Y letter (an entangler) does not commute
with N.  Integrals: psi4 run live (H4, STO-3G, RHF).
"""
import os
import sys
import tempfile

import numpy as np

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
import ans_common as C  # noqa: E402

RULES = ["excite 0 -> 3", "excite 0 1 -> 4 7", "word X0 Y1", "word Z0 Z5", "singles", "singles spin-adapted",
         "doubles", "doubles paired", "doubles generalized", "qubit singles", "qubit doubles", "entanglers"]


def main():
    failures = []
    with tempfile.TemporaryDirectory() as tmp:
        h4 = os.path.join(tmp, "h4.fcidump")
        C.psi4_fcidump("H 0 0 0\nH 0 0 0.9\nH 0 0 1.8\nH 0 0 2.7", h4)
        norb = C.read_fcidump(h4)[0]
        n = 2 * norb
        a = C.annihilators(n)
        ops_occ = C.spin_operators(n, a)
        names = ("particles", "spin_z", "spin_squared")
        for enc in ("jordan-wigner", "bravyi-kitaev", "parity"):
            P = C.permutation(C.encoding_matrix(enc, n))
            ops = [P @ O @ P.T for O in ops_occ]
            j = C.driver(["--encoding", enc, h4] + RULES)
            counted = {k: 0 for k in names}
            for g in j["generators"]:
                G = sum(w["coeff"] * C.pauli_matrix(w["pauli"], n) for w in g["words"])
                for name, O in zip(names, ops):
                    comm = np.linalg.norm(G @ O - O @ G)
                    dense = bool(comm < 1e-9)
                    if g["symmetry"].get(name) != dense:
                        failures.append("%s %s %s: %s reported %s, dense commutator norm %.3g"
                                        % (enc, g["kind"], g["text"], name, g["symmetry"].get(name), comm))
                    counted[name] += dense
                kind, text = g["kind"], g["text"]
                sym = g["symmetry"]
                if kind in ("single", "double", "qubit-single", "qubit-double") and not (sym["particles"] and sym["spin_z"]):
                    failures.append("%s %s %s should keep N and S_z" % (enc, kind, text))
                if kind == "entangler" and sym["particles"]:
                    failures.append("%s entangler %s should not commute with N" % (enc, text))
                if g.get("spin_adapted") and not sym["spin_squared"]:
                    failures.append("%s spin-adapted single %s should keep S^2" % (enc, text))
                if kind == "double" and g["from"][0] // 2 == g["from"][1] // 2 and g["to"][0] // 2 == g["to"][1] // 2 \
                        and not sym["spin_squared"]:
                    failures.append("%s pair double %s should keep S^2" % (enc, text))
            print("%-13s %3d generators; commute with N: %d, S_z: %d, S^2: %d"
                  % (enc, len(j["generators"]), counted["particles"], counted["spin_z"], counted["spin_squared"]))
            kinds = {g["kind"] for g in j["generators"]}
            if len(kinds) != 7:
                failures.append("%s: kinds %s" % (enc, sorted(kinds)))
    for f in failures[:40]:
        print("FAIL:", f)
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
