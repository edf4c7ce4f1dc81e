#!/bin/sh
# n2_fcidump.sh — `make bench-qubit` and `make bench-ans`: psi4 writes a
# 40-qubit active space (N2, cc-pVDZ, 2 core and 6 virtual orbitals frozen:
# 20 active orbitals), then the benchmark PROGRAM (tests/bench/qubit_bench:
# the Hamiltonian in every encoding; tests/bench/ans_bench: screening of every
# flip-set entangler and UCCSD double) runs on it and on its own 100-qubit
# random case.  Without psi4 only the random cases run.
# Usage: n2_fcidump.sh BUILDDIR PYTHON PROGRAM
set -eu
build=${1:-.}
python=${2:-/usr/bin/python3}
program=$3
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
build=$(cd "$build" && pwd)
cd "$tmp" # psi4 leaves scratch files in the working directory
if "$python" - "$tmp/n2.fcidump" <<'PY'
import sys
sys.path.insert(0, "/usr/lib/x86_64-linux-gnu")
import psi4
psi4.core.set_output_file(sys.argv[1] + ".out", False)
psi4.set_memory("1 GB")
psi4.geometry("0 1\nN 0 0 0\nN 0 0 1.0977\nunits angstrom\nsymmetry c1\nno_reorient\nno_com\n")
psi4.set_options({"basis": "cc-pvdz", "scf_type": "pk", "e_convergence": 1e-10,
                  "d_convergence": 1e-10, "frozen_docc": [2], "frozen_uocc": [6]})
e, wfn = psi4.energy("scf", return_wfn=True)
psi4.fcidump(wfn, sys.argv[1])
PY
then
  echo "40-qubit case: N2/cc-pVDZ at 1.0977 A, 20 active orbitals, FCIDUMP written by psi4"
  "$build/tests/bench/$program" "$tmp/n2.fcidump"
else
  echo "psi4 is not available: the 40-qubit FCIDUMP case is skipped"
  "$build/tests/bench/$program"
fi
