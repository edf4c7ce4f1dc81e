#!/bin/sh
# accept_study_recipes.sh — the acceptance-study recipes under examples/study
# are what their scripts write (tools/accept/water.py, particles.py), check
# clean (`cairn check --werror`) and are in canonical layout (`cairn fmt
# --check`).  The studies themselves take minutes and are not run here; the
# particle-number study's check is tests/ref/accept_particles.py.
set -eu
: "${CAIRN:?}" "${CAIRN_SRCDIR:?}" "${PYTHON:=/usr/bin/python3}"
cd "$CAIRN_SRCDIR/examples/study"
fail=0
"$PYTHON" "$CAIRN_SRCDIR/tools/accept/water.py" check || fail=1
"$PYTHON" "$CAIRN_SRCDIR/tools/accept/particles.py" check || fail=1
n=0
for f in water-[0-9]*.cairn hydroxide-free.cairn hydroxide-penalty-*.cairn; do
  "$CAIRN" --werror check "$f" >/dev/null || { echo "FAIL: cairn check $f"; fail=1; }
  n=$((n + 1))
done
"$CAIRN" fmt --check ./*.cairn || { echo "FAIL: cairn fmt --check"; fail=1; }
# the water study has 50 variants and the particle study 6 (keep in step with the scripts)
[ "$n" -eq 56 ] || { echo "FAIL: expected 56 study recipes, found $n"; fail=1; }
echo "$n study recipes checked"
exit $fail
