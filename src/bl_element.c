/*
** bl_element.c -- element symbols and standard atomic weights
** See Copyright Notice in LICENSE
*/

#include <string.h>

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


/*
** Standard atomic weights, g/mol: IUPAC Commission on Isotopic Abundances and
** Atomic Weights, 2021 table.  Written from memory and not yet compared with
** the printed table digit by digit: treat the last digit with care.  The
** conventional value is used where IUPAC gives an interval: H, Li, B, C, N, O, Mg, Si, S, Cl, Ar,
** Br, Tl, Pb).  Elements without a standard atomic weight (Tc, Pm, Po and
** Z >= 84 except Th, Pa, U) carry the mass number of their longest-lived
** isotope.  xraylib's AtomicWeight is not used: its table predates several
** revisions (e.g. W 183.92 against 183.84).
*/
static const double weights[BL_ZMAX + 1] = {
  0.0,
  1.008, 4.002602, 6.94, 9.0121831, 10.81, 12.011, 14.007, 15.999,
  18.998403163, 20.1797, 22.98976928, 24.305, 26.9815384, 28.085,
  30.973761998, 32.06, 35.45, 39.95, 39.0983, 40.078, 44.955908, 47.867,
  50.9415, 51.9961, 54.938043, 55.845, 58.933194, 58.6934, 63.546, 65.38,
  69.723, 72.630, 74.921595, 78.971, 79.904, 83.798, 85.4678, 87.62,
  88.90584, 91.224, 92.90637, 95.95, 98.0, 101.07, 102.90549, 106.42,
  107.8682, 112.414, 114.818, 118.710, 121.760, 127.60, 126.90447, 131.293,
  132.90545196, 137.327, 138.90547, 140.116, 140.90766, 144.242, 145.0,
  150.36, 151.964, 157.25, 158.925354, 162.500, 164.930328, 167.259,
  168.934218, 173.045, 174.9668, 178.486, 180.94788, 183.84, 186.207,
  190.23, 192.217, 195.084, 196.966570, 200.592, 204.38, 207.2, 208.98040,
  209.0, 210.0, 222.0, 223.0, 226.0, 227.0, 232.0377, 231.03588, 238.02891,
  237.0, 244.0, 243.0, 247.0, 247.0, 251.0, 252.0, 257.0
};


double bl_element_mass (int Z) {
  return (Z >= 1 && Z <= BL_ZMAX) ? weights[Z] : 0.0;
}
