#!/bin/sh
# cairn diff: for each pair NAME.a.cairn / NAME.b.cairn in this directory,
# `cairn diff NAME.a.cairn NAME.b.cairn` prints exactly NAME.out and exits 0
# when NAME.out is empty (same meaning), 1 otherwise; with NAME.json, the
# --json form is compared too.  Diffing a recipe with itself is always empty.
# CAIRN_GOLDEN_UPDATE=1 rewrites NAME.out and NAME.json (then read them).
set -u
: "${CAIRN:?}" "${CAIRN_SRCDIR:?}"
cd "$CAIRN_SRCDIR/tests/golden/diff" || exit 1
tmp=$(mktemp -d) || exit 1
trap 'rm -rf "$tmp"' EXIT
n=0
bad=0
for a in *.a.cairn; do
  name=${a%.a.cairn}
  b=$name.b.cairn
  n=$((n + 1))
  "$CAIRN" diff "$a" "$b" >"$tmp/out" 2>"$tmp/err"
  rc=$?
  [ "${CAIRN_GOLDEN_UPDATE:-0}" = 1 ] && cp "$tmp/out" "$name.out"
  want=1
  [ -s "$name.out" ] || want=0
  if [ "$rc" != "$want" ]; then
    echo "FAIL $name: exit status $rc, expected $want"; cat "$tmp/err"; bad=$((bad + 1))
  elif ! cmp -s "$tmp/out" "$name.out"; then
    echo "FAIL $name: output differs from $name.out"; diff -u "$name.out" "$tmp/out"; bad=$((bad + 1))
  fi
  if [ -f "$name.json" ]; then
    "$CAIRN" diff --json "$a" "$b" >"$tmp/json" 2>/dev/null
    [ "${CAIRN_GOLDEN_UPDATE:-0}" = 1 ] && cp "$tmp/json" "$name.json"
    cmp -s "$tmp/json" "$name.json" || { echo "FAIL $name: --json differs from $name.json"; bad=$((bad + 1)); }
  fi
  for f in "$a" "$b"; do
    "$CAIRN" diff "$f" "$f" >"$tmp/self" || { echo "FAIL $f differs from itself"; bad=$((bad + 1)); }
  done
done
echo "$n diff cases, $bad failed"
[ "$bad" = 0 ]
