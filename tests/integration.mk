## run-level integration checks (tests/integration/)
TESTS += tests/integration/run.sh
EXTRA_DIST += tests/integration/run.sh tests/integration/big-register.cairn tests/integration/broken-number.cairn
