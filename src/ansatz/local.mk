## generators: pool rules, screening, selection, symmetry typing, rotation program
libcairn_a_SOURCES += src/ansatz/circuit.c src/ansatz/ans_priv.h include/cairn/pool.h \
	src/ansatz/masks.c src/ansatz/screen.c src/ansatz/reference.c src/ansatz/pool.c \
	src/ansatz/rules.c src/ansatz/entangler.c src/ansatz/symmetry.c src/ansatz/select.c \
	src/ansatz/program.c src/ansatz/table.c src/ansatz/setup.c
