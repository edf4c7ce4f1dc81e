/* element.c — symbols and frozen-core sizes. */
#include "config.h"

#include "cairn/element.h"

#include <ctype.h>
#include <string.h>

/* ORDER Z: index is the atomic number. */
static const char *const symbols[] = {
    "",   "H",  "He", "Li", "Be", "B",  "C",  "N",  "O",  "F",  "Ne", "Na", "Mg", "Al", "Si",
    "P",  "S",  "Cl", "Ar", "K",  "Ca", "Sc", "Ti", "V",  "Cr", "Mn", "Fe", "Co", "Ni", "Cu",
    "Zn", "Ga", "Ge", "As", "Se", "Br", "Kr", "Rb", "Sr", "Y",  "Zr", "Nb", "Mo", "Tc", "Ru",
    "Rh", "Pd", "Ag", "Cd", "In", "Sn", "Sb", "Te", "I",  "Xe", "Cs", "Ba", "La", "Ce", "Pr",
    "Nd", "Pm", "Sm", "Eu", "Gd", "Tb", "Dy", "Ho", "Er", "Tm", "Yb", "Lu", "Hf", "Ta", "W",
    "Re", "Os", "Ir", "Pt", "Au", "Hg", "Tl", "Pb", "Bi", "Po", "At", "Rn", "Fr", "Ra", "Ac",
    "Th", "Pa", "U",  "Np", "Pu", "Am", "Cm", "Bk", "Cf", "Es", "Fm", "Md", "No", "Lr", "Rf",
    "Db", "Sg", "Bh", "Hs", "Mt", "Ds", "Rg", "Cn", "Nh", "Fl", "Mc", "Lv", "Ts", "Og"};

enum { NELEMENTS = (int)(sizeof symbols / sizeof symbols[0]) };

int element_z(const char *symbol, int len) {
  if (len < 1 || len > 2) return 0;
  for (int z = 1; z < NELEMENTS; z++) {
    const char *s = symbols[z];
    if ((int)strlen(s) != len) continue;
    int same = 1;
    for (int i = 0; i < len && same; i++)
      same = tolower((unsigned char)s[i]) == tolower((unsigned char)symbol[i]);
    if (same) return z;
  }
  return 0;
}

const char *element_symbol(int z) { return z >= 1 && z < NELEMENTS ? symbols[z] : NULL; }

int element_core_orbitals(int z) {
  if (z <= 2) return 0;
  if (z <= 10) return 1;
  if (z <= 18) return 5;
  if (z <= 36) return 9;
  return 18; /* through 4p; not reachable with the shipped basis sets */
}
