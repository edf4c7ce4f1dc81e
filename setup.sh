#!/bin/sh
# setup.sh — from a fresh Debian machine to a built cairn.
#   ./setup.sh demo    install what is missing, build, run the main demo
#   ./setup.sh check   install what is missing, build, run the test suite
set -eu
cd "$(dirname "$0")"
what=${1:-demo}

# Build tools and libraries; the reference programs the tests compare against
# (psi4, numpy, scipy) and the SVG renderer the plot test uses.
build_pkgs="gcc make autoconf automake pkg-config flex bison libopenblas-dev liblapacke-dev libnlopt-dev libcjson-dev libcmocka-dev"
test_pkgs="psi4 python3 python3-numpy python3-scipy librsvg2-bin clang libclang-rt-14-dev"
pkgs=$build_pkgs
[ "$what" = check ] && pkgs="$pkgs $test_pkgs"

missing=""
for p in $pkgs; do
  dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing="$missing $p"
done
if [ -n "$missing" ]; then
  echo "setup: installing$missing"
  sudo=""
  [ "$(id -u)" = 0 ] || sudo=sudo
  $sudo apt-get update -qq
  DEBIAN_FRONTEND=noninteractive $sudo apt-get install -y -qq --no-install-recommends $missing >/dev/null
fi

[ -x configure ] || autoreconf -fi
[ -f Makefile ] || ./configure --enable-werror
jobs=$(nproc 2>/dev/null || echo 2)
make -j"$jobs"

case $what in
  demo)
    # Check every example, then simulate the water bond-stretch scan (report on
    # the terminal; JSON, CSV and the SVG figure in demo/) and lower the
    # stretched-LiH recipe to gates.
    ./cairn check examples/*.cairn
    mkdir -p demo
    ./cairn run --json demo/water-scan.json examples/water-scan.cairn
    ./cairn build -o demo/lih-stretched.qasm --format qasm3 examples/lih-stretched.cairn
    echo "setup: demo outputs in demo/ (water-scan.svg is the scan figure)"
    ;;
  check)
    make -j"$jobs" check
    ;;
  *)
    echo "usage: ./setup.sh demo|check" >&2
    exit 2
    ;;
esac
