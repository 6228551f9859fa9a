/*
** lookup.c -- a material by the name a user writes: an element symbol or
** name, a chemical formula, or a standard composition, tried in that order
** See Copyright Notice in LICENSE
*/

#include <string.h>

#include "brakelight/bl_errno.h"
#include "materials/internal.h"


int bl_material_lookup (bl_material *m, const char *spec,
                        bl_parse_error *err) {
  bl_parse_error e = {0, NULL};
  int Z;
  if (err != NULL) {
    err->pos = 0;
    err->reason = NULL;
  }
  if (m == NULL || spec == NULL)
    return BL_EDOMAIN;
  Z = bl_element_lookup(spec);
  if (Z != 0)
    return bl_material_element(m, Z);
  if (bl_material_formula(m, spec, &e) == BL_SUCCESS)
    return BL_SUCCESS;
  if (bl_material_standard(m, spec) == BL_SUCCESS)
    return BL_SUCCESS;
  if (err != NULL)
    *err = e;
  memset(m, 0, sizeof *m);
  return BL_EUNKNOWN;
}
