## generators: pool rules, screening, selection, symmetry typing, rotation program
libcairn_a_SOURCES += src/ansatz/circuit.c
