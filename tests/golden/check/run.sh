#!/bin/sh
# run.sh — recipes that must fail the symmetry checker, each with its golden
# diagnostics: `cairn check NAME.cairn` must exit 1 and print exactly
# NAME.err on stderr.  With CAIRN_GOLDEN_UPDATE=1 (or --update), rewrite the
# .err files instead (review the diff before committing).  Needs CAIRN (the built binary) and
# CAIRN_SRCDIR in the environment, as `make check` sets them.
set -u
dir="${CAIRN_SRCDIR:-.}/tests/golden/check"
update=0
[ "${1:-}" = "--update" ] && update=1
[ "${CAIRN_GOLDEN_UPDATE:-0}" = 1 ] && update=1
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
cd "$dir" || exit 99
fail=0
n=0
for f in *.cairn; do
  name=${f%.cairn}
  n=$((n + 1))
  "$CAIRN" --color=never check "$f" >"$tmp/out" 2>"$tmp/err"
  st=$?
  if [ "$update" = 1 ]; then
    cp "$tmp/err" "$name.err"
  fi
  if [ "$st" != 1 ]; then
    echo "FAIL: $f: exit status $st, expected 1"
    fail=1
  fi
  if ! cmp -s "$tmp/err" "$name.err"; then
    echo "FAIL: $f: diagnostics differ from $name.err:"
    diff -u "$name.err" "$tmp/err" | head -40
    fail=1
  fi
done
echo "$n recipes checked"
exit $fail
