#!/bin/sh
# Every bad recipe in this directory gives exactly its golden diagnostic:
# NAME.cairn is checked with `cairn check --color=never NAME.cairn` from this
# directory; its standard error must equal NAME.err byte for byte and its exit
# status must be 1 (or the number in NAME.status).  Files under lib/ are
# fragments that the recipes `use`.  Then every recipe in examples/ must check.
# CAIRN_GOLDEN_UPDATE=1 rewrites the .err files (then read every one of them).
set -u
: "${CAIRN:?}" "${CAIRN_SRCDIR:?}"
cd "$CAIRN_SRCDIR/tests/golden/recipes" || exit 1
tmp=$(mktemp -d) || exit 1
trap 'rm -rf "$tmp"' EXIT
n=0
bad=0
for f in *.cairn; do
  name=${f%.cairn}
  n=$((n + 1))
  want=1
  [ -f "$name.status" ] && want=$(cat "$name.status")
  "$CAIRN" check --color=never "$f" >"$tmp/out" 2>"$tmp/err"
  rc=$?
  if [ "${CAIRN_GOLDEN_UPDATE:-0}" = 1 ]; then
    cp "$tmp/err" "$name.err"
  fi
  if [ "$rc" != "$want" ]; then
    echo "FAIL $f: exit status $rc, expected $want"
    bad=$((bad + 1))
  elif ! cmp -s "$tmp/err" "$name.err"; then
    echo "FAIL $f: diagnostic differs from $name.err"
    diff -u "$name.err" "$tmp/err" | head -40
    bad=$((bad + 1))
  elif [ "$want" != 0 ] && [ -s "$tmp/out" ]; then
    echo "FAIL $f: printed to standard output"
    bad=$((bad + 1))
  fi
done
echo "$n bad recipes, $bad failed"
# ... and the recipes of examples/ are good: exit status 0, no errors (the
# symmetry checker may warn about generators it drops).
cd "$CAIRN_SRCDIR" || exit 1
for f in examples/*.cairn; do
  if ! "$CAIRN" check --color=never "$f" >"$tmp/out" 2>"$tmp/err" || grep -q "error:" "$tmp/err"; then
    echo "FAIL $f does not check:"; cat "$tmp/err"; bad=$((bad + 1))
  fi
done
[ "$n" -ge 40 ] && [ "$bad" = 0 ]
