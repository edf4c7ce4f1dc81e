#!/bin/sh
# The command line of check, fmt and diff: exit statuses (0 ok, 1 recipe
# errors or differences, 2 usage or I/O), --color, --werror, fmt rewriting in
# place, help and version.
set -u
: "${CAIRN:?}" "${CAIRN_SRCDIR:?}"
tmp=$(mktemp -d) || exit 1
trap 'rm -rf "$tmp"' EXIT
bad=0
n=0
# expect STATUS COMMAND...: run it, compare the exit status
expect() {
  want=$1
  shift
  n=$((n + 1))
  "$@" >"$tmp/out" 2>"$tmp/err"
  rc=$?
  if [ "$rc" != "$want" ]; then
    echo "FAIL ($*): exit status $rc, expected $want"
    cat "$tmp/err"
    bad=$((bad + 1))
  fi
}
# has FILE TEXT: the file contains the text
has() {
  n=$((n + 1))
  grep -qF -- "$2" "$1" || { echo "FAIL: $1 lacks \`$2\`:"; cat "$1"; bad=$((bad + 1)); }
}
lacks() {
  n=$((n + 1))
  if grep -qF -- "$2" "$1"; then echo "FAIL: $1 has \`$2\`"; bad=$((bad + 1)); fi
}
G=$CAIRN_SRCDIR/tests/golden/recipes
E=$CAIRN_SRCDIR/examples

expect 0 "$CAIRN" --version
has "$tmp/out" "cairn "
expect 0 "$CAIRN" --help
has "$tmp/out" "check"
has "$tmp/out" "fmt"
has "$tmp/out" "diff"
expect 0 "$CAIRN" help fmt
has "$tmp/out" "cairn fmt [--check] FILE..."
expect 0 "$CAIRN" check --help
has "$tmp/out" "cairn check"

# check
expect 0 "$CAIRN" check "$E/lih-stretched.cairn" "$E/h4-fcidump.cairn"
has "$tmp/out" "lih-stretched.cairn: ok: 2 electrons in 5 active orbitals (10 qubits), 2 pool rules"
has "$tmp/out" "h4-fcidump.cairn: ok: 4 electrons in 4 active orbitals (8 qubits), 2 pool rules"
expect 1 "$CAIRN" check "$E/lih-stretched.cairn" "$G/unknown-element.cairn"
has "$tmp/out" "lih-stretched.cairn: ok"
has "$tmp/err" "unknown element"
expect 2 "$CAIRN" check
expect 2 "$CAIRN" check "$tmp/no-such.cairn"
has "$tmp/err" "cannot read"
expect 2 "$CAIRN" check --bogus "$G/unknown-element.cairn"
expect 2 "$CAIRN" --color=sometimes check "$G/unknown-element.cairn"
expect 1 "$CAIRN" --color=always check "$G/unknown-element.cairn"
has "$tmp/err" "$(printf '\033[')"
expect 1 "$CAIRN" check --color=never "$G/unknown-element.cairn"
lacks "$tmp/err" "$(printf '\033[')"
# a warning is an error only with --werror
expect 0 "$CAIRN" check "$G/warning-scan-unused.cairn"
has "$tmp/err" "warning:"
expect 1 "$CAIRN" --werror check "$G/warning-scan-unused.cairn"
has "$tmp/err" "error:"
has "$tmp/err" "[--werror]"
lacks "$tmp/err" "warning:"

# fmt rewrites in place, leaves formatted and broken files alone
printf 'cairn   1\nlet  x=1.0\n' >"$tmp/a.cairn"
chmod 640 "$tmp/a.cairn"
cp "$CAIRN_SRCDIR/tests/golden/recipes/unknown-statement.cairn" "$tmp/broken.cairn"
expect 1 "$CAIRN" fmt --check "$tmp/a.cairn"
has "$tmp/out" "$tmp/a.cairn"
expect 0 "$CAIRN" fmt "$tmp/a.cairn"
n=$((n + 1))
[ "$(cat "$tmp/a.cairn")" = "$(printf 'cairn 1\nlet x = 1')" ] || { echo "FAIL: fmt did not rewrite a.cairn"; bad=$((bad + 1)); }
expect 0 "$CAIRN" fmt --check "$tmp/a.cairn"
n=$((n + 1))
[ "$(stat -c %a "$tmp/a.cairn")" = 640 ] || { echo "FAIL: fmt changed the file mode"; bad=$((bad + 1)); }
expect 1 "$CAIRN" fmt "$tmp/broken.cairn"
n=$((n + 1))
cmp -s "$tmp/broken.cairn" "$CAIRN_SRCDIR/tests/golden/recipes/unknown-statement.cairn" || { echo "FAIL: fmt changed a broken file"; bad=$((bad + 1)); }
ls "$tmp" | grep -q tmp && { echo "FAIL: fmt left a temporary file"; bad=$((bad + 1)); }
expect 2 "$CAIRN" fmt
expect 2 "$CAIRN" fmt "$tmp/no-such.cairn"

# diff
D=$CAIRN_SRCDIR/tests/golden/diff
expect 0 "$CAIRN" diff "$D/reformatted.a.cairn" "$D/reformatted.b.cairn"
expect 1 "$CAIRN" diff --json "$D/pool.a.cairn" "$D/pool.b.cairn"
has "$tmp/out" '"same":	false'
expect 2 "$CAIRN" diff "$D/pool.a.cairn"
expect 2 "$CAIRN" diff "$D/pool.a.cairn" "$G/unknown-element.cairn"
has "$tmp/err" "unknown element"

echo "$n command-line checks, $bad failed"
[ "$bad" = 0 ]
