## chemistry: basis sets, integrals, SCF, transforms, FCIDUMP, MP2, CCSD, FCI
libcairn_a_SOURCES += src/chem/element.c
