/*
** materials/internal.h -- declarations shared by the material files, not
** public: fill.c makes every material; formula.c, catalogue.c, lookup.c
** and suggest.c build on it (never the other way round)
** See Copyright Notice in LICENSE
*/
#ifndef BL_MATERIALS_INTERNAL_H
#define BL_MATERIALS_INTERNAL_H

#include "brakelight/bl_element.h"
#include "brakelight/bl_material.h"

/*
** Fill *m from atoms[Z] (atoms of element Z per formula unit, Z =
** 0..BL_ZMAX, entry 0 ignored, entries <= 0 skipped): components ordered by
** Z, molar mass, mass fractions; name copied (truncated to fit), density 0.
** BL_SUCCESS, or BL_EDOMAIN when there is no element or more than
** BL_MATERIAL_MAXCOMP of them (*m is then emptied: n = 0).
*/
int bl_mat_fill (bl_material *m, const double atoms[BL_ZMAX + 1],
                 const char *name);

/* Copy src into dst (size BL_MATERIAL_NAMELEN), truncating. */
void bl_mat_setname (char *dst, const char *src);

/* Give the component of element Z the atomic weight A (g/mol; an
** effective element) and recompute the molar mass and mass fractions;
** nothing if Z is not a component. */
void bl_mat_setA (bl_material *m, int Z, double A);

/* Compare two names in any case, ignoring ' ', '-' and '_': 0 if equal,
** else -1 or 1 (catalogue.c). */
int bl_mat_namecmp (const char *a, const char *b);

/* The label of xraylib's record behind catalogue entry i, or NULL (an
** entry of our own): for suggestions only, never shown (catalogue.c). */
const char *bl_mat_catalogue_label (int i);

/* The crystal entry of the catalogue with the composition of *m, or
** NULL (catalogue.c). */
const bl_catalogue_entry *bl_mat_crystal (const bl_material *m);

#endif
