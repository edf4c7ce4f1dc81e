#!/bin/sh
# Run-level behaviour of `cairn run` on recipes of tests/integration/:
#  - a register the machine cannot hold is refused before allocation, with the
#    figures (needed, available), quickly, exit 1, and the report still says
#    what was known (the HF energy);
#  - a failed `checked` symmetry makes run exit 1 with a message at the keep
#    line, and the JSON report is still written and records the failed check.
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
[ $fail = 0 ] && echo "run-level behaviour: ok"
exit $fail
