#!/bin/sh
# Run-level behaviour of `cairn run` on recipes of tests/integration/:
#  - a register the machine cannot hold is refused before allocation, with the
#    figures (needed, available), quickly, exit 1, and the report still says
#    what was known (the HF energy);
#  - a failed `checked` symmetry makes run exit 1 with a message at the keep
#    line, and the JSON report is still written and records the failed check;
#  - `cairn check` refuses, with the figures and at the right line, a register
#    whose spin operator S^2 would not fit (30000 orbitals: about 150 TiB) and
#    a pool rule whose generators would not fit (generalized doubles of 200
#    orbitals: about 1.3 TiB), instead of being killed for lack of memory.
#    The FCIDUMP files are written here (header only: `check` reads no more).
set -u
dir=${CAIRN_SRCDIR:-.}/tests/integration
tmp=$(mktemp -d "${TMPDIR:-/tmp}/cairn-int-XXXXXX")
trap 'rm -rf "$tmp"' EXIT
fail=0
say() { echo "FAIL: $*"; fail=1; }

"$CAIRN" run --color=never --no-plot --json "$tmp/big.json" "$dir/big-register.cairn" >"$tmp/out" 2>"$tmp/err"
rc=$?
[ $rc = 1 ] || say "big register: exit $rc, expected 1"
grep -q "a 36-qubit statevector run needs .* TiB .*; this machine has .* available" "$tmp/err" ||
  { say "big register: no refusal with figures"; cat "$tmp/err"; }
grep -q "big-register.cairn:13:3: error:" "$tmp/err" || say "big register: refusal not at the active-space line"
"$PYTHON" - "$tmp/big.json" <<'PY' || fail=1
import json, sys
p = json.load(open(sys.argv[1]))["points"][0]
ok = "failure" in p and "statevector" in p["failure"] and "hf" in p["energies"] and "ansatz" not in p["energies"]
if not ok:
    print("FAIL: big register: report lacks the failure or the HF energy:", p)
sys.exit(0 if ok else 1)
PY

"$CAIRN" run --color=never --no-plot --json "$tmp/n.json" "$dir/broken-number.cairn" >"$tmp/out" 2>"$tmp/err"
rc=$?
[ $rc = 1 ] || say "broken number: exit $rc, expected 1"
grep -q "broken-number.cairn:16:1: error: point 1: the optimized state has <particles> = " "$tmp/err" ||
  { say "broken number: no check message at the keep line"; cat "$tmp/err"; }
"$PYTHON" - "$tmp/n.json" <<'PY' || fail=1
import json, sys
p = json.load(open(sys.argv[1]))["points"][0]
c = [c for c in p.get("checks", []) if c["symmetry"] == "particles"]
ok = len(c) == 1 and not c[0]["passed"] and abs(c[0]["value"] - 2) > 1e-9 and "ansatz" in p["energies"]
if not ok:
    print("FAIL: broken number: report lacks the failed check:", p.get("checks"))
sys.exit(0 if ok else 1)
PY
fcidump() { # norb nelec file
  "$PYTHON" -c "import sys; n = int(sys.argv[1]); print('&FCI NORB=%d, NELEC=%s, MS2=0, ORBSYM=%s ISYM=1, &END' % (n, sys.argv[2], '1,' * n)); print('  1.0 1 1 1 1'); print('  0.5 0 0 0 0')" "$1" "$2" >"$3"
}
recipe() { # fcidump rule file
  printf 'cairn 1\nintegrals "%s"\nencoding jordan-wigner\nreference hartree-fock\npool {\n  %s\n}\nchoose all\n' "$1" "$2" >"$3"
}
fcidump 30000 2 "$tmp/wide.fcidump"
recipe wide.fcidump doubles "$tmp/wide.cairn"
"$CAIRN" check --color=never "$tmp/wide.cairn" >"$tmp/out" 2>"$tmp/err"
rc=$?
[ $rc = 1 ] || say "wide register: exit $rc, expected 1"
grep -q "wide.cairn:2:1: error: a register of 60000 qubits is too large here: its spin operator S^2 alone needs about .* GiB (.* Pauli words); .* GiB are available" "$tmp/err" ||
  { say "wide register: no refusal with figures at the integrals line"; cat "$tmp/err"; }
fcidump 200 100 "$tmp/pool.fcidump"
recipe pool.fcidump "doubles generalized" "$tmp/pool.cairn"
"$CAIRN" check --color=never "$tmp/pool.cairn" >"$tmp/out" 2>"$tmp/err"
rc=$?
[ $rc = 1 ] || say "large pool: exit $rc, expected 1"
grep -q "pool.cairn:6:3: error: this rule makes up to [0-9]* generators on 400 qubits, which need about .* GiB; .* GiB are available" "$tmp/err" ||
  { say "large pool: no refusal with figures at the rule"; cat "$tmp/err"; }
grep -q "warning: the pool has no generators" "$tmp/err" && say "large pool: an empty-pool warning follows the refusal"

[ $fail = 0 ] && echo "run-level behaviour: ok"
exit $fail
