/*
** element.c -- element symbols, names and standard atomic weights
** See Copyright Notice in LICENSE
*/

#include <string.h>
#include <strings.h>

#include "brakelight/bl_element.h"

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


/* English names Z = 1..100, IUPAC spelling, lowercase. */
static const char *const names[BL_ZMAX + 1] = {
  NULL, "hydrogen", "helium", "lithium", "beryllium", "boron", "carbon",
  "nitrogen", "oxygen", "fluorine", "neon", "sodium", "magnesium",
  "aluminium", "silicon", "phosphorus", "sulfur", "chlorine", "argon",
  "potassium", "calcium", "scandium", "titanium", "vanadium", "chromium",
  "manganese", "iron", "cobalt", "nickel", "copper", "zinc", "gallium",
  "germanium", "arsenic", "selenium", "bromine", "krypton", "rubidium",
  "strontium", "yttrium", "zirconium", "niobium", "molybdenum", "technetium",
  "ruthenium", "rhodium", "palladium", "silver", "cadmium", "indium", "tin",
  "antimony", "tellurium", "iodine", "xenon", "caesium", "barium",
  "lanthanum", "cerium", "praseodymium", "neodymium", "promethium",
  "samarium", "europium", "gadolinium", "terbium", "dysprosium", "holmium",
  "erbium", "thulium", "ytterbium", "lutetium", "hafnium", "tantalum",
  "tungsten", "rhenium", "osmium", "iridium", "platinum", "gold", "mercury",
  "thallium", "lead", "bismuth", "polonium", "astatine", "radon", "francium",
  "radium", "actinium", "thorium", "protactinium", "uranium", "neptunium",
  "plutonium", "americium", "curium", "berkelium", "californium",
  "einsteinium", "fermium"
};

/* Other spellings in use (American English and older British). */
static const struct { const char *name; int Z; } aliases[] = {
  {"aluminum", 13}, {"sulphur", 16}, {"cesium", 55}
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


/*
** Symbol first, with its case (so that "Co" is cobalt and "CO" nothing),
** then the names and aliases in any case.
*/
int bl_element_lookup (const char *name) {
  int Z;
  size_t i;
  if (name == NULL)
    return 0;
  if ((Z = bl_element_find(name)) != 0)
    return Z;
  for (Z = 1; Z <= BL_ZMAX; Z++)
    if (strcasecmp(name, names[Z]) == 0)
      return Z;
  for (i = 0; i < sizeof aliases / sizeof aliases[0]; i++)
    if (strcasecmp(name, aliases[i].name) == 0)
      return aliases[i].Z;
  return 0;
}


const char *bl_element_symbol (int Z) {
  return (Z >= 1 && Z <= BL_ZMAX) ? symbols[Z] : NULL;
}


const char *bl_element_name (int Z) {
  return (Z >= 1 && Z <= BL_ZMAX) ? names[Z] : NULL;
}


/*
** Standard atomic weights, g/mol, meant to be those of the IUPAC Commission
** on Isotopic Abundances and Atomic Weights (2021 table).  Written from
** memory, not read from the printed table: the last digit may be off by a
** revision (the 2017 and 2021 tables moved the last digits of several
** single-isotope elements).  Where IUPAC gives an interval (H, Li, B, C, N,
** O, Mg, Si, S, Cl, Ar, Br, Tl, Pb) the conventional value is used.
** Elements without a standard atomic weight carry the mass number of a
** long-lived isotope: the longest-lived one for Pm 145, Po 209, At 210,
** Rn 222, Fr 223, Ra 226, Ac 227, Np 237, Pu 244, Am 243, Cm 247, Bk 247,
** Cf 251, Es 252, Fm 257; Tc 98 (97Tc and 98Tc have half-lives of about
** 4.2 million years that overlap within their uncertainties).
**
** Checked against xraylib's AtomicWeight(Z) for Z = 1..100 (libxrl 4.0.0).
** That table is older and rounded to 0.01 g/mol.  48 of the 100 values agree
** within that rounding (|difference| <= 0.005).  The others differ as far
** as the older revisions it follows do (e.g. Ti 47.90, Ge 72.59, Ba 137.36,
** W 183.92, Au 197.2, U 238.07; at most 0.24 g/mol, Au), or it has
** Tm = 167.27 (erbium's weight; thulium is 168.93) and other mass numbers
** for Tc, Pm, Pu, Bk, Es, Fm.  None of the differences showed an error in
** this table, so no value changed; the check cannot confirm last digits.
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
