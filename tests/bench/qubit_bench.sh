#!/bin/sh
# qubit_bench.sh — `make bench` for the qubit layer: psi4 writes a 40-qubit
# active space (N2, cc-pVDZ, 2 core and 6 virtual orbitals frozen: 20 active
# orbitals), then qubit_bench builds its Hamiltonian and the 100-qubit random
# one in every encoding.  Usage: qubit_bench.sh BUILDDIR [PYTHON]
set -eu
build=${1:-.}
python=${2:-/usr/bin/python3}
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
  "$build/tests/bench/qubit_bench" "$tmp/n2.fcidump"
else
  echo "psi4 is not available: the 40-qubit FCIDUMP case is skipped"
  "$build/tests/bench/qubit_bench"
fi
