## acceptance studies and the examples tour (tests/ref/accept_*, examples_*)
ACCEPT_TESTS = tests/ref/accept_uccsd.py tests/ref/accept_particles.py \
	tests/ref/accept_study_recipes.sh tests/ref/examples_run.sh tests/ref/examples_readme.sh
TESTS += $(ACCEPT_TESTS)
EXTRA_DIST += $(ACCEPT_TESTS) tools/accept examples/study docs/figures docs/water-study.md \
	examples/h2-bravyi-kitaev.cairn examples/h4-generalized.cairn examples/lih-paired-parity.cairn \
	examples/n2-compile.cairn examples/water-qcc.cairn
