"""water_orbitals.py — which orbitals the water study's (4e,4o) window holds
along the stretch: psi4's RHF orbital energies and irreducible
representations (C2v) at each r, and the two highest occupied orbitals, which
`active 4 electrons in 4 orbitals` takes with the two lowest virtual ones.

    /usr/bin/python3 tools/accept/water_orbitals.py

psi4 1.3.2 run live (scf_type pk, e/d_convergence 1e-10, no_reorient, no_com;
C2v symmetry kept here only to label the orbitals; the energies are those of
the c1 calculation that cairn compares with).
"""
import math
import os
import sys
import tempfile

sys.path.insert(0, "/usr/lib/x86_64-linux-gnu")
import psi4  # noqa: E402

BOHR = 0.529177210903  # angstrom; CODATA 2018


def main():
    tmp = tempfile.mkdtemp(prefix="cairn-orb-")
    psi4.set_output_file(os.path.join(tmp, "psi4.out"), False)
    psi4.core.be_quiet()
    psi4.core.IOManager.shared_object().set_default_path(tmp)
    print("| r / Å | E(RHF) / Eh | occupied valence (energy / Eh) | virtual | (4e,4o) window holds |")
    print("|---|---|---|---|---|")
    for k in range(10):
        r = 0.8 + 0.2 * k
        h = math.radians(104.5 / 2)
        psi4.core.clean()
        psi4.geometry(f"0 1\nO 0 0 0\nH 0 {r * math.sin(h) / BOHR!r} {r * math.cos(h) / BOHR!r}\n"
                      f"H 0 {-r * math.sin(h) / BOHR!r} {r * math.cos(h) / BOHR!r}\nunits bohr\nno_reorient\nno_com\n")
        psi4.set_options({"basis": "sto-3g", "scf_type": "pk", "e_convergence": 1e-10, "d_convergence": 1e-10})
        e, wfn = psi4.energy("scf", return_wfn=True)
        ct = wfn.molecule().point_group().char_table()
        orbs = []
        for irrep in range(wfn.nirrep()):
            for i in range(wfn.nmopi()[irrep]):
                orbs.append((wfn.epsilon_a().get(irrep, i), ct.gamma(irrep).symbol().lower()))
        orbs.sort()
        nocc = wfn.nalpha()
        # label each orbital n + irrep, counting within its irrep (1a1 is the core)
        seen, named = {}, []
        for x, s in orbs:
            seen[s] = seen.get(s, 0) + 1
            named.append((x, f"{seen[s]}{s}"))
        occ, vir = named[1:nocc], named[nocc:]
        window = [n for _, n in named[nocc - 2:nocc + 2]]
        print(f"| {r:.1f} | {e:.8f} | " + ", ".join(f"{n} {x:.3f}" for x, n in occ) + " | "
              + ", ".join(f"{n} {x:.3f}" for x, n in vir) + " | " + " ".join(window) + " |")
    return 0


if __name__ == "__main__":
    sys.exit(main())
