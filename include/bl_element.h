/*
** bl_element.h -- chemical elements: symbol, atomic number, atomic mass
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

/* Symbol of element Z (1..BL_ZMAX); NULL outside. Static storage. */
const char *bl_element_symbol (int Z);

/* Standard atomic weight of element Z, g/mol; 0 outside 1..BL_ZMAX. */
double bl_element_mass (int Z);

#ifdef __cplusplus
}
#endif

#endif
