# gates_build.sh — the `cairn build` command on rotation programs: output
# formats by option and by extension, counts printed, atomic writes (a
# failed write leaves the old file and no temporary), --bind errors that name
# the field, usage errors with exit status 2, same bytes on every run.
set -eu
cd "$CAIRN_SRCDIR"
prog=tests/golden/listing/h2-uccsd.json
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
fail=0
no() { echo "FAIL: $*"; fail=1; }

"$CAIRN" build --program "$prog" -o "$tmp/a.gates" >"$tmp/say" || no "build to a listing failed"
head -1 "$tmp/a.gates" | grep -qx 'cairn gates 1' || no "listing header"
grep -q '^gates: cx [0-9]*, single [0-9]*, total [0-9]*, depth [0-9]*, cx depth [0-9]*$' "$tmp/say" || no "counts line"
grep -q "^wrote $tmp/a.gates (listing, [0-9]* bytes)$" "$tmp/say" || no "wrote line"
"$CAIRN" build --program "$prog" -o "$tmp/a.qasm" >/dev/null && head -1 "$tmp/a.qasm" | grep -qx 'OPENQASM 3.0;' || no ".qasm is OpenQASM 3.0"
"$CAIRN" build --program "$prog" -o "$tmp/a.qasm2" >/dev/null && head -1 "$tmp/a.qasm2" | grep -qx 'OPENQASM 2.0;' || no ".qasm2 is OpenQASM 2.0"
"$CAIRN" build --program "$prog" --format qasm2 -o "$tmp/b.gates" >/dev/null && head -1 "$tmp/b.gates" | grep -qx 'OPENQASM 2.0;' || no "--format wins over the extension"
"$CAIRN" build --program "$prog" -o "$tmp/c.gates" >/dev/null
cmp -s "$tmp/a.gates" "$tmp/c.gates" || no "two runs differ"
"$CAIRN" build --program "$prog" --json | /usr/bin/python3 -c 'import json,sys; j=json.load(sys.stdin); assert j["gates"]["cnot"] > 0 and len(j["generators"]) == 3' || no "--json counts"

# the rotation program written back reads in and lowers to the same listing
"$CAIRN" build --program "$prog" --save-program "$tmp/p.json" -o "$tmp/d.gates" >/dev/null || no "--save-program"
"$CAIRN" build --program "$tmp/p.json" -o "$tmp/e.gates" >/dev/null || no "saved program does not read back"
[ "$(tail -n +3 "$tmp/d.gates")" = "$(tail -n +3 "$tmp/e.gates")" ] || no "saved program lowers differently"

# a failed write keeps the old file and leaves no temporary beside it
echo old >"$tmp/keep.gates"
echo '{"points": [{"parameters": [1, 2]}]}' >"$tmp/short.json"
if "$CAIRN" build --program "$prog" --bind "$tmp/short.json" -o "$tmp/keep.gates" 2>"$tmp/err"; then no "bad --bind accepted"; fi
grep -q 'points\[0\].parameters has 2 values; the program has 3 parameters' "$tmp/err" || no "bind error names the field: $(cat "$tmp/err")"
[ "$(cat "$tmp/keep.gates")" = old ] || no "old file clobbered"
if "$CAIRN" build --program "$prog" -o "$tmp/nodir/x.gates" 2>"$tmp/err" >/dev/null; then no "write into a missing directory succeeded"; else rc=$?; [ $rc -eq 2 ] || no "exit $rc for an I/O error"; fi
grep -q "cannot write $tmp/nodir/x.gates" "$tmp/err" || no "I/O error message: $(cat "$tmp/err")"
[ -z "$(ls "$tmp" | grep -v -e '\.gates$' -e '\.qasm' -e '^say$' -e '^err$' -e '^short.json$' -e '^p.json$')" ] || no "temporary files left: $(ls "$tmp")"

# bound values from a report: the listing lists them, OpenQASM 3.0 has constants
echo '{"points": [{"parameters": [0.25, -0.5, 1e-3]}]}' >"$tmp/r.json"
"$CAIRN" build --program "$prog" --bind "$tmp/r.json" -o - 2>/dev/null | grep -qx 'value t2 0.001' || no "bound listing values"
"$CAIRN" build --program "$prog" --bind "$tmp/r.json" --format qasm3 -o - 2>/dev/null | grep -qx 'const float\[64\] theta_1 = -0.5;' || no "bound qasm3 constants"

# usage and input errors: exit status 2, a message
for args in "--format qasm4 $prog" "--point x $prog" "--bogus $prog" "" "--program $tmp/none.json" "$prog $prog"; do
  # shellcheck disable=SC2086
  if "$CAIRN" build $args >/dev/null 2>"$tmp/err"; then no "build $args succeeded"; else
    rc=$?; [ $rc -eq 2 ] || no "build $args: exit $rc"; fi
  [ -s "$tmp/err" ] || no "build $args: no message"
done
exit $fail
