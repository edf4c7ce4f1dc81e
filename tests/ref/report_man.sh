#!/bin/sh
# report_man.sh — doc/cairn.1 renders without a single warning (groff -man
# -ww, and man --warnings when man is installed), has the sections a manual
# page is expected to have, and documents every command `cairn --help` lists.
set -eu
src=${CAIRN_SRCDIR:-.}
cairn=${CAIRN:-./cairn}
page=$src/doc/cairn.1
command -v groff >/dev/null 2>&1 || { echo "SKIP: groff is not installed"; exit 77; }
tmp=$(mktemp -d "${TMPDIR:-/tmp}/cairn-man-XXXXXX")
trap 'rm -rf "$tmp"' EXIT
fail=0
groff -man -Tutf8 -ww "$page" >"$tmp/page.txt" 2>"$tmp/warn.txt"
if [ -s "$tmp/warn.txt" ]; then
  echo "FAIL: groff warns about $page:"; cat "$tmp/warn.txt"; fail=1
fi
if command -v man >/dev/null 2>&1; then
  MANWIDTH=80 man --warnings -l "$page" >/dev/null 2>"$tmp/manwarn.txt" || true
  if [ -s "$tmp/manwarn.txt" ]; then
    echo "FAIL: man --warnings -l $page:"; cat "$tmp/manwarn.txt"; fail=1
  fi
fi
for s in NAME SYNOPSIS DESCRIPTION COMMANDS "RECIPE LANGUAGE" "EXIT STATUS" FILES EXAMPLES; do
  grep -q "^\.SH \"*$s\"*\$" "$page" || { echo "FAIL: no section $s"; fail=1; }
done
# every command of `cairn --help` has its entry under COMMANDS
sed 's/\x1b\[[0-9;]*m//g; s/.\x08//g' "$tmp/page.txt" | sed -n '/^COMMANDS/,/^RECIPE LANGUAGE/p' >"$tmp/commands.txt"
n=0
for c in $("$cairn" --help | sed -n '/^commands:/,/^$/p' | awk 'NR > 1 && NF { print $1 }'); do
  n=$((n + 1))
  grep -q "^ *cairn $c\b" "$tmp/commands.txt" || { echo "FAIL: command $c is not in COMMANDS"; fail=1; }
done
[ $n -ge 7 ] || { echo "FAIL: found only $n commands in cairn --help"; fail=1; }
# the recipe under EXAMPLES passes `cairn check` and is in `cairn fmt` layout
sed -n '/^\.SH EXAMPLES/,/^\.SH/p' "$page" | awk '/^\.nf/ { n++; on = n == 1; next } /^\.fi/ { on = 0 } on' |
  sed 's/\\-/-/g' >"$tmp/example.cairn"
if ! "$cairn" --color=never check "$tmp/example.cairn" >"$tmp/check.txt" 2>&1; then
  echo "FAIL: the example recipe of the man page does not pass cairn check:"; cat "$tmp/check.txt"; fail=1
fi
if ! "$cairn" fmt --check "$tmp/example.cairn" >/dev/null 2>&1; then
  echo "FAIL: the example recipe of the man page is not in cairn fmt layout"; fail=1
fi
lines=$(wc -l <"$tmp/page.txt")
[ "$lines" -gt 100 ] || { echo "FAIL: the rendered page has only $lines lines"; fail=1; }
[ $fail = 0 ] && echo "man page: no warnings, 8 sections, $n commands documented, example recipe checks and is formatted, $lines lines rendered"
exit $fail
