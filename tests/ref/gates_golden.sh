# gates_golden.sh — golden gate listings of two hand-built rotation programs
# (tests/golden/listing/*.json: an H2 minimal-basis UCCSD program under
# Jordan-Wigner with two Trotter steps, its words from the numpy construction
# of tests/ref/gates_sim.py; entanglers on a qubit mean-field reference, words
# chosen for the demo).  The listings pin the format (docs/listing.md) and the
# lowering; their numbers are checked against numpy in gates_sim.py.
# CAIRN_GOLDEN_UPDATE=1 rewrites the golden files instead of comparing.
set -eu
cd "$CAIRN_SRCDIR"
dir=tests/golden/listing
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
fail=0
check() { # name program options...
  name=$1; prog=$2; shift 2
  "$CAIRN" build --program "$dir/$prog" -o - "$@" >"$tmp/$name" 2>/dev/null
  if [ "${CAIRN_GOLDEN_UPDATE:-0}" = 1 ]; then
    cp "$tmp/$name" "$dir/$name"
  elif ! diff -u "$dir/$name" "$tmp/$name"; then
    echo "FAIL: $name differs from its golden listing"
    fail=1
  fi
}
check h2-uccsd.gates h2-uccsd.json
check h2-uccsd.short.gates h2-uccsd.json --short
check h2-uccsd.plain.gates h2-uccsd.json --no-passes
check qcc-meanfield.gates qcc-meanfield.json
check qcc-meanfield.tree.gates qcc-meanfield.json --tree
exit $fail
