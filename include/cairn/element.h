/* element.h — the periodic table facts cairn needs. */
#ifndef CAIRN_ELEMENT_H
#define CAIRN_ELEMENT_H

/* Atomic number of a symbol (case-insensitive: "he", "HE" and "He"), or 0. */
int element_z(const char *symbol, int len);
/* Canonical symbol ("He") of atomic number z (1..118), or NULL. */
const char *element_symbol(int z);
/* Spatial orbitals in the frozen core of element z, as `freeze core` counts them:
 * 0 for H-He, 1 (1s) for Li-Ne, 5 (1s2s2p) for Na-Ar, 9 (+3s3p) for K-Kr. */
int element_core_orbitals(int z);

#endif
