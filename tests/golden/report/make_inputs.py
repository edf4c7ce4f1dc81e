#!/usr/bin/python3
"""Regenerate the test-data inputs of the report golden test:

    /usr/bin/python3 tests/golden/report/make_inputs.py tests/golden/report

scan-in.json and single-in.json are JSON reports (schema v1) of a water
symmetric stretch in STO-3G (angle 104.5 deg).  What is real and what is not:

- nuclear, hf, mp2, ccsd, exact: psi4 1.3.2 run live by this script
  (scf_type pk, e/d_convergence 1e-10, symmetry c1, no_reorient, no_com; the
  exact energy is psi4's full CI over all 7 orbitals);
- everything about the ansatz (energies, generators, theta, symmetry values,
  gate counts, optimizer traces, checks) and the failed point are INVENTED
  test data for the writers: they are not results of cairn.

The golden outputs beside these files are what the report writers make of
them (tests/ref/report_golden.sh).
"""
import json
import math
import os
import sys

sys.path.insert(0, "/usr/lib/x86_64-linux-gnu")
import psi4  # noqa: E402

NOTE = ("test data: nuclear/hf/mp2/ccsd/exact from psi4 1.3.2 (full CI over all orbitals); "
        "ansatz values, generators, symmetry, gates, optimizer and failures are invented")


def water(r):
    """psi4's energies of the water stretch at O-H distance r (angstrom)."""
    a = math.radians(104.5 / 2)
    mol = psi4.geometry(f"""
0 1
O 0 0 0
H 0 {r * math.sin(a)!r} {r * math.cos(a)!r}
H 0 {-r * math.sin(a)!r} {r * math.cos(a)!r}
symmetry c1
no_reorient
no_com
units angstrom
""")
    e = {"nuclear": mol.nuclear_repulsion_energy(), "hf": psi4.energy("scf"), "mp2": psi4.energy("mp2"),
         "ccsd": psi4.energy("ccsd"), "exact": psi4.energy("fci")}
    psi4.core.clean()
    return e


def psi4_settings():
    """psi4 set up for water(): quiet, one thread, the reference settings."""
    psi4.core.be_quiet()
    psi4.set_memory("500 MB")
    psi4.set_num_threads(1)
    psi4.set_options({"basis": "sto-3g", "scf_type": "pk", "e_convergence": 1e-10, "d_convergence": 1e-10,
                      "r_convergence": 1e-9, "mp2_type": "conv"})


def main():
    out = sys.argv[1] if len(sys.argv) > 1 else os.path.dirname(os.path.abspath(__file__))
    psi4_settings()
    gens = [("double", "8 9 -> 10 11", -0.1812, 0.1105, 13), ("double", "6 7 -> 12 13", -0.0921, 0.0634, 13),
            ("single", "8 -> 10", 0.0213, -0.0121, 4), ("qubit-double", "6 9 -> 10 13", -0.0077, 0.0049, 13)]
    invented_err_mEh = [0.021, 0.048, 0.19, 0.62, 1.24, 2.1, 3.55]
    points = []
    for k, r in enumerate([0.8, 1.0, 1.2, 1.4, 1.6, 1.8, 2.0]):
        e = water(r)
        err = invented_err_mEh[k] * 1e-3
        e["ansatz"] = e["exact"] + err
        p = {"params": {"r": r}, "qubits": 14, "electrons": 10, "orbitals": 7, "energies": e, "error": err,
             "exact_spin_squared": 0.0,
             "generators": [{"kind": g[0], "text": g[1], "gradient": g[2] * (1 + 0.3 * k), "theta": g[3] * (1 + 0.5 * k),
                             "cnot": g[4]} for g in gens],
             "symmetry": {"particles": 10.0, "spin_z": 0.0, "spin_squared": 1e-7 * (k + 1)},
             "gates": {"cnot": 43, "single": 71, "depth": 52},
             "optimizer": {"method": "lbfgs", "iterations": 20 + 3 * k, "converged": True, "starts": 1}}
        if r == 1.8:
            p["checks"] = [{"symmetry": "spin-squared", "value": 3.2e-5, "target": 0, "tolerance": 1e-6,
                            "passed": False}]
        if r == 2.0:
            e["ccsd_converged"] = False
            p["optimizer"]["converged"] = False
        points.append(p)
    points.append({"params": {"r": 2.2}, "qubits": 14, "electrons": 10, "orbitals": 7,
                   "energies": {"nuclear": 4.400732782283687 * 2.0 / 2.2}, "generators": [],
                   "failure": "SCF did not converge in 100 iterations (invented failure)"})
    scan = {"_test_data": NOTE, "cairn": 1, "recipe": "water-stretch", "file": "examples/water-stretch.cairn",
            "basis": "sto-3g", "scan": {"name": "r", "unit": "angstrom"}, "points": points}
    with open(os.path.join(out, "scan-in.json"), "w") as f:
        json.dump(scan, f, indent=1)
        f.write("\n")

    # One point (r = 1.0) with an invented optimizer history of 3 starts.
    p = dict(points[1])
    p.pop("params")
    ex = p["energies"]["exact"]
    trace = [p["energies"]["hf"]] + [ex + 0.1 * 0.55 ** k + 4.8e-5 for k in range(1, 22)]
    p["optimizer"] = {"method": "lbfgs", "iterations": len(trace), "converged": True, "starts": 3, "best_start": 1,
                      "start_energies": [ex + 2.1e-3, ex + 4.8e-5, ex + 4.9e-5], "trace": trace}
    p["energies"]["ansatz"] = ex + 4.8e-5
    p["error"] = 4.8e-5
    p["checks"] = [{"symmetry": "spin-squared", "value": 2e-7, "target": 0, "tolerance": 1e-6, "passed": True}]
    single = {"_test_data": NOTE, "cairn": 1, "recipe": "water", "file": "examples/water.cairn", "basis": "sto-3g",
              "points": [p]}
    with open(os.path.join(out, "single-in.json"), "w") as f:
        json.dump(single, f, indent=1)
        f.write("\n")


if __name__ == "__main__":
    main()
