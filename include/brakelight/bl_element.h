/*
** bl_element.h -- chemical elements: symbol, name, atomic number, atomic mass
** See Copyright Notice in LICENSE
*/
#ifndef BL_ELEMENT_H
#define BL_ELEMENT_H

#ifdef __cplusplus
extern "C" {
#endif

#define BL_ZMAX 100

/* Atomic number of an element symbol ("Pb", case as in the periodic table);
** 0 if unknown. */
int bl_element_find (const char *symbol);

/*
** Atomic number of an element symbol (case as in the periodic table:
** "Co" is cobalt, "CO" is not a symbol) or English name in any case
** ("lead", "Aluminium"; also "aluminum", "cesium", "sulphur"); 0 if none.
** Also declared in bl_material.h.
*/
int bl_element_lookup (const char *name);

/* Symbol of element Z (1..BL_ZMAX); NULL outside. Static storage. */
const char *bl_element_symbol (int Z);

/* English name of element Z in IUPAC spelling, lowercase ("aluminium",
** "caesium", "sulfur"); NULL outside 1..BL_ZMAX. Static storage. */
const char *bl_element_name (int Z);

/* Standard atomic weight of element Z, g/mol; 0 outside 1..BL_ZMAX. */
double bl_element_mass (int Z);

/* Tsai's radiation logarithms of element Z and the Coulomb correction
** (Davies, Bethe & Maximon; base/radlog.c): L_rad, L'_rad (Tsai's values
** for Z = 1..4) and f(a), a = z Z alpha. */
double bl_lrad (int Z);
double bl_lrad_prime (int Z);
double bl_coulomb_f (double a);

#ifdef __cplusplus
}
#endif

#endif
