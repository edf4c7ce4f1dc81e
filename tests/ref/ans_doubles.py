#!/usr/bin/python3
"""Fermionic doubles at the Hartree-Fock reference against the closed form, and
closed-shell pool counts.

For T = a+_a a+_b a_j a_i (i j -> a b, cairn's convention) and
U = exp(theta (T - T+)), dE/dtheta at theta = 0 = <HF|[H, T - T+]|HF>
= 2 <ij||ab> with <pq||rs> = <pq|rs> - <pq|sr> and <pq|rs> = (pr|qs) when the
spins of p, r and of q, s agree (common practice: the Slater rules for a double
excitation from the reference).  Evaluated here from the FCIDUMP integrals
psi4 writes (RHF, run live), with no statevector, for water and LiH in every
encoding.  Singles at canonical RHF orbitals have zero gradient (Brillouin's
theorem, common practice).  Counts: 2 o v singles and 2 C(o,2) C(v,2) + o^2 v^2
doubles for a closed shell with o occupied and v virtual orbitals (common
practice).
"""
import os
import sys
import tempfile
from math import comb

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
import ans_common as C  # noqa: E402


def phys(h2, p, q, r, s):
    """<pq|rs> over spin orbitals (2k alpha, 2k+1 beta) from chemists' (pq|rs)."""
    if p % 2 != r % 2 or q % 2 != s % 2:
        return 0.0
    return h2[p // 2, r // 2, q // 2, s // 2]


def main():
    failures = []
    with tempfile.TemporaryDirectory() as tmp:
        cases = []
        w = os.path.join(tmp, "water.fcidump")
        C.psi4_fcidump("O 0 0 0\nH 0 0.757 0.587\nH 0 -0.757 0.587", w)
        cases.append((w, "H2O STO-3G"))
        l = os.path.join(tmp, "lih.fcidump")
        C.psi4_fcidump("Li 0 0 0\nH 0 0 1.6", l)
        cases.append((l, "LiH STO-3G"))
        for path, label in cases:
            norb, nelec, ms2, h1, h2, const = C.read_fcidump(path)
            o, v = nelec // 2, norb - nelec // 2
            for enc in ("jordan-wigner", "bravyi-kitaev", "parity"):
                j = C.driver(["--encoding", enc, path, "doubles", "singles"])
                gens = j["generators"]
                nd = sum(g["kind"] == "double" for g in gens)
                ns = sum(g["kind"] == "single" for g in gens)
                if nd != 2 * comb(o, 2) * comb(v, 2) + o * o * v * v or ns != 2 * o * v:
                    failures.append("%s %s: %d doubles, %d singles" % (label, enc, nd, ns))
                worst = 0.0
                for g in gens:
                    words = len(g["words"])
                    if g["kind"] == "double":
                        i, jj = g["from"]
                        a, b = g["to"]
                        ref = 2 * (phys(h2, i, jj, a, b) - phys(h2, i, jj, b, a))
                        worst = max(worst, abs(ref - g["gradient"]))
                        if abs(ref - g["gradient"]) > 1e-10:
                            failures.append("%s %s %s: gradient %r, 2<ij||ab> = %r" % (label, enc, g["text"], g["gradient"], ref))
                        if words != 8:
                            failures.append("%s %s %s: %d words, not 8" % (label, enc, g["text"], words))
                    else:
                        if abs(g["gradient"]) > 1e-6:
                            failures.append("%s %s single %s: gradient %r (Brillouin: 0)" % (label, enc, g["text"], g["gradient"]))
                        if words != 2:
                            failures.append("%s %s %s: %d words, not 2" % (label, enc, g["text"], words))
                print("%-11s %-13s %3d doubles %2d singles, worst |g - 2<ij||ab>| = %.2e" % (label, enc, nd, ns, worst))
    for f in failures[:40]:
        print("FAIL:", f)
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
