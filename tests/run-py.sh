#!/bin/sh
# Runs one Python check in a scratch directory of its own, so files that
# reference programs write into the working directory (psi4's timer.dat and
# output files) never land in the build tree.  Usage: run-py.sh TEST.py [ARGS]
test=$1
shift
case $test in /*) ;; *) test=$(pwd)/$test ;; esac
scratch=$(mktemp -d "${TMPDIR:-/tmp}/cairn-check-XXXXXX") || exit 99
cd "$scratch" || exit 99
"${PYTHON:-/usr/bin/python3}" "$test" "$@"
rc=$?
cd / && rm -rf "$scratch"
exit $rc
