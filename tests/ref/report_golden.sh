#!/bin/sh
# report_golden.sh — the report writers on fixed test data give the same bytes
# as the golden files, and the same bytes twice in a row (determinism).
#
# Inputs: tests/golden/report/{scan,single}-in.json (psi4 energies plus
# INVENTED ansatz values, see make_inputs.py there).  Outputs compared: the
# terminal report (table and per-point blocks), JSON without timings, CSV and
# SVG.  To accept new output after a deliberate change:
#     CAIRN_GOLDEN_UPDATE=1 make check TESTS=tests/ref/report_golden.sh
set -eu
src=${CAIRN_SRCDIR:-.}
build=${CAIRN_BUILDDIR:-.}
driver=$build/tests/unit/test_report_files
golden=$src/tests/golden/report
[ -x "$driver" ] || { echo "FAIL: $driver is not built"; exit 1; }
tmp=$(mktemp -d "${TMPDIR:-/tmp}/cairn-golden-XXXXXX")
trap 'rm -rf "$tmp"' EXIT
mkdir "$tmp/a" "$tmp/b"
fail=0
for name in scan single; do
  "$driver" "$golden/$name-in.json" "$tmp/a" "$name"
  "$driver" "$golden/$name-in.json" "$tmp/b" "$name"
  for ext in .txt -points.txt .json .csv .svg; do
    out=$name$ext
    if ! cmp -s "$tmp/a/$out" "$tmp/b/$out"; then
      echo "FAIL: $out differs between two runs (not deterministic)"
      fail=1
    fi
    if [ "${CAIRN_GOLDEN_UPDATE:-0}" = 1 ]; then
      cp "$tmp/a/$out" "$golden/$out"
      echo "regenerated $golden/$out"
    elif ! cmp -s "$tmp/a/$out" "$golden/$out"; then
      echo "FAIL: $out differs from the golden file:"
      diff -u "$golden/$out" "$tmp/a/$out" | head -40 || true
      fail=1
    fi
  done
done
[ $fail = 0 ] && echo "report goldens: 10 outputs match, each made twice the same"
exit $fail
