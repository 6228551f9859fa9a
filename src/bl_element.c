/*
** bl_element.c -- element symbols and atomic weights (from xraylib)
** See Copyright Notice in LICENSE
*/

#include <string.h>

#include <xraylib.h>

#include "bl_element.h"

/* Symbols Z = 1..100 (IUPAC). */
static const char *const symbols[BL_ZMAX + 1] = {
  NULL, "H", "He", "Li", "Be", "B", "C", "N", "O", "F", "Ne", "Na", "Mg", "Al",
  "Si", "P", "S", "Cl", "Ar", "K", "Ca", "Sc", "Ti", "V", "Cr", "Mn", "Fe",
  "Co", "Ni", "Cu", "Zn", "Ga", "Ge", "As", "Se", "Br", "Kr", "Rb", "Sr", "Y",
  "Zr", "Nb", "Mo", "Tc", "Ru", "Rh", "Pd", "Ag", "Cd", "In", "Sn", "Sb", "Te",
  "I", "Xe", "Cs", "Ba", "La", "Ce", "Pr", "Nd", "Pm", "Sm", "Eu", "Gd", "Tb",
  "Dy", "Ho", "Er", "Tm", "Yb", "Lu", "Hf", "Ta", "W", "Re", "Os", "Ir", "Pt",
  "Au", "Hg", "Tl", "Pb", "Bi", "Po", "At", "Rn", "Fr", "Ra", "Ac", "Th", "Pa",
  "U", "Np", "Pu", "Am", "Cm", "Bk", "Cf", "Es", "Fm"
};


int bl_element_find (const char *symbol) {
  int Z;
  if (symbol == NULL)
    return 0;
  for (Z = 1; Z <= BL_ZMAX; Z++)
    if (strcmp(symbol, symbols[Z]) == 0)
      return Z;
  return 0;
}


const char *bl_element_symbol (int Z) {
  return (Z >= 1 && Z <= BL_ZMAX) ? symbols[Z] : NULL;
}


double bl_element_mass (int Z) {
  xrl_error *e = NULL;
  double A;
  if (Z < 1 || Z > BL_ZMAX)
    return 0.0;
  A = AtomicWeight(Z, &e);
  if (e != NULL) {
    xrl_error_free(e);
    return 0.0;
  }
  return A;
}
