#!/bin/sh
# cairn fmt: the golden pairs (NAME.in.cairn -> NAME.out.cairn), then round
# trip and idempotence on every recipe under examples/ and tests/:
#   fmt(fmt(x)) == fmt(x) byte for byte, `fmt --check` agrees, and when x
#   checks, its formatted copy (beside it, in a scratch copy of the tree)
#   means the same: `cairn diff` exits 0.
set -u
: "${CAIRN:?}" "${CAIRN_SRCDIR:?}"
tmp=$(mktemp -d) || exit 1
trap 'rm -rf "$tmp"' EXIT
bad=0
pairs=0
fail() { echo "FAIL $*"; bad=$((bad + 1)); }

cd "$CAIRN_SRCDIR/tests/golden/fmt" || exit 1
for in in *.in.cairn; do
  name=${in%.in.cairn}
  out=$name.out.cairn
  pairs=$((pairs + 1))
  "$CAIRN" fmt - <"$in" >"$tmp/once" || { fail "$in: fmt failed"; continue; }
  cmp -s "$tmp/once" "$out" || { fail "$in: fmt output differs from $out"; diff -u "$out" "$tmp/once" | head -30; }
  "$CAIRN" fmt - <"$out" >"$tmp/twice" || fail "$out: fmt failed"
  cmp -s "$tmp/twice" "$out" || fail "$out: fmt is not idempotent"
  "$CAIRN" fmt --check "$out" >"$tmp/c1" || fail "$out: fmt --check says it is not formatted"
  if "$CAIRN" fmt --check "$in" >"$tmp/c2"; then fail "$in: fmt --check says it is formatted"; fi
  [ "$(cat "$tmp/c2")" = "$in" ] || fail "$in: fmt --check did not print the file name"
done

# Every recipe under examples/ and tests/, in a scratch copy of the tree.
mkdir "$tmp/tree"
cp -R "$CAIRN_SRCDIR/examples" "$CAIRN_SRCDIR/tests" "$tmp/tree/" || exit 1
chmod -R u+w "$tmp/tree"
cd "$tmp/tree" || exit 1
total=0
formatted=0
same=0
find examples tests -name '*.cairn' ! -name '.fmt-*' | LC_ALL=C sort >"$tmp/list"
while read -r f; do
  total=$((total + 1))
  dir=$(dirname "$f")
  copy="$dir/.fmt-$(basename "$f")"
  "$CAIRN" fmt - <"$f" >"$copy" 2>/dev/null || { rm -f "$copy"; continue; } # syntax errors: nothing to format
  formatted=$((formatted + 1))
  "$CAIRN" fmt - <"$copy" >"$tmp/again" || { fail "$f: formatted text does not parse"; continue; }
  cmp -s "$copy" "$tmp/again" || { fail "$f: fmt is not idempotent"; diff -u "$copy" "$tmp/again" | head -20; }
  if cmp -s "$f" "$copy"; then
    "$CAIRN" fmt --check "$f" >/dev/null || fail "$f: fmt --check disagrees (formatted file)"
  else
    if "$CAIRN" fmt --check "$f" >/dev/null; then fail "$f: fmt --check disagrees (unformatted file)"; fi
  fi
  if "$CAIRN" check "$f" >/dev/null 2>&1; then
    "$CAIRN" diff "$f" "$copy" >"$tmp/d" 2>&1 || { fail "$f: formatting changed its meaning"; cat "$tmp/d"; }
    same=$((same + 1))
  elif "$CAIRN" check "$copy" >/dev/null 2>&1; then
    fail "$f: fails to check, but its formatted copy checks"
  fi
done <"$tmp/list"
# The examples are kept formatted.
(cd "$CAIRN_SRCDIR" && "$CAIRN" fmt --check examples/*.cairn) || fail "examples/ are not in canonical layout"
echo "$pairs golden pairs; $total recipes, $formatted formatted, $same also compared by meaning; $bad failed"
[ "$bad" = 0 ] && [ "$formatted" -ge 20 ]
