#!/bin/sh
# examples_readme.sh — the recipes printed in README.md work as the README
# says: the annotated recipe of "A short tour" checks without a warning, and
# the two commands of "Your own molecule" (write the recipe, `cairn run
# --json`) give a report and a scan figure, with the ansatz never below the
# exact energy by more than 1e-8 Eh (variational principle; common practice).
set -u
: "${CAIRN:?}" "${CAIRN_SRCDIR:?}" "${PYTHON:=/usr/bin/python3}"
readme=$CAIRN_SRCDIR/README.md
tmp=$(mktemp -d "${TMPDIR:-/tmp}/cairn-readme.XXXXXX") || exit 2
trap 'rm -rf "$tmp"' EXIT
fail=0
# the tour's recipe: from its `cairn 1` line to its `emit` line, indented 4
sed -n '/^    cairn 1  /,/^    emit qasm3/p' "$readme" | sed 's/^    //' >"$tmp/tour.cairn"
[ -s "$tmp/tour.cairn" ] || { echo "FAIL: no tour recipe found in README.md"; exit 1; }
"$CAIRN" --color=never --werror check "$tmp/tour.cairn" || { echo "FAIL: the tour recipe does not check clean"; fail=1; }
# "Your own molecule": the here-document, then the run command, as printed
sed -n "/^    cat > hydrogen-fluoride.cairn <<'EOF'\$/,/^    EOF\$/p" "$readme" | sed 's/^    //' >"$tmp/own.sh"
run=$(sed -n 's/^    \(cairn run --json hydrogen-fluoride.json hydrogen-fluoride.cairn\)$/\1/p' "$readme")
if [ ! -s "$tmp/own.sh" ] || [ -z "$run" ]; then
  echo "FAIL: the two commands of 'Your own molecule' are not in README.md"; exit 1
fi
mkdir "$tmp/bin" && ln -s "$CAIRN" "$tmp/bin/cairn"
(cd "$tmp" && PATH=$tmp/bin:$PATH && sh own.sh && $run >run.out 2>run.err) || {
  echo "FAIL: the commands of 'Your own molecule' failed"; cat "$tmp/run.err"; fail=1; }
[ -s "$tmp/hydrogen-fluoride.svg" ] || { echo "FAIL: no figure hydrogen-fluoride.svg"; fail=1; }
"$PYTHON" - "$tmp/hydrogen-fluoride.json" <<'PYEOF' || fail=1
import json, sys
pts = json.load(open(sys.argv[1]))["points"]
bad = [p for p in pts if p["energies"]["ansatz"] < p["energies"]["exact"] - 1e-8]
print(f"own molecule: {len(pts)} points, largest error {max(p['error'] for p in pts) * 1e3:.4f} mEh")
if len(pts) < 2 or bad:
    print("FAIL: not a scan, or an ansatz energy below the exact one")
    sys.exit(1)
PYEOF
exit $fail
