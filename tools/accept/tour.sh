#!/bin/sh
# tour.sh — run the commands of the README's tour and print each one with its
# output, as the README shows them.  Run from the top of a built tree:
#     sh tools/accept/tour.sh [CAIRN] > tour.txt
# It works in a scratch copy of examples/, so no file of the tree changes.
set -u
top=$(pwd)
CAIRN=${1:-$top/cairn}
tmp=$(mktemp -d "${TMPDIR:-/tmp}/cairn-tour.XXXXXX") || exit 2
trap 'rm -rf "$tmp"' EXIT
cp -R "$top/examples" "$tmp/" && cd "$tmp" || exit 2
mkdir -p bin && ln -s "$CAIRN" bin/cairn && PATH=$tmp/bin:$PATH
show() {
  printf '$ %s\n' "$*"
  sh -c "$*" 2>&1
  printf '(exit %s)\n\n' "$?"
}
show cairn check examples/water-scan.cairn
sed 's/^keep particles penalty 1$/keep particles exactly/' examples/h2-bravyi-kitaev.cairn >h2-exact.cairn
show cairn check h2-exact.cairn
show cairn show examples/h2-bravyi-kitaev.cairn
show cairn run examples/h2-bravyi-kitaev.cairn
show cairn build examples/h2-bravyi-kitaev.cairn
show head -n 12 examples/h2-bravyi-kitaev.qasm
show cairn diff examples/study/water-44-hf-choose-08.cairn examples/study/water-44-hf-choose-12.cairn
