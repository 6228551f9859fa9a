/*
** lookup.c -- a material by the name a user writes: an element symbol or
** name, a catalogue key or alias, or a chemical formula, tried in that
** order; two-letter strings in the wrong case are refused as ambiguous
** See Copyright Notice in LICENSE
**
** A formula with the composition of a catalogue crystal comes first: it
** keeps the name as written and gets the crystal's density.
**
** Why the catalogue comes before other formulas: some keys and aliases read as
** formulas in capitals ("PWO" would be P + W + O, "PBWO4" P + B + W +
** O4, "CSI" C + S + I), and nobody means those.  Keys and aliases never
** equal an element symbol or name in any case (tests/test_materials.c).
**
** Why "PB" is an error: it is a valid formula (phosphorus + boron) and
** almost always meant as lead; silently reading it either way gives a
** wrong result for someone.  Only whole two-letter strings are judged:
** "CO2" stays carbon dioxide.
*/

#include <ctype.h>
#include <string.h>

#include "brakelight/bl_errno.h"
#include "materials/internal.h"


/*
** 1 if s is two letters, not a symbol as written, a symbol in another
** case ("PB", "pb", "co") and two symbols in capitals ("P" and "B").
*/
static int ambiguous (const char *s) {
  char one[3], a[2], b[2];
  if (!(isalpha((unsigned char)s[0]) && isalpha((unsigned char)s[1])
        && s[2] == '\0') || bl_element_find(s) != 0)
    return 0;
  one[0] = (char)toupper((unsigned char)s[0]);
  one[1] = (char)tolower((unsigned char)s[1]);
  one[2] = '\0';
  a[0] = (char)toupper((unsigned char)s[0]);
  b[0] = (char)toupper((unsigned char)s[1]);
  a[1] = b[1] = '\0';
  return bl_element_find(one) != 0 && bl_element_find(a) != 0
         && bl_element_find(b) != 0;
}


int bl_material_lookup (bl_material *m, const char *spec,
                        bl_parse_error *err) {
  bl_parse_error e = {0, NULL};
  const bl_catalogue_entry *c;
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
  if (bl_material_formula(m, spec, NULL) == BL_SUCCESS
      && (c = bl_mat_crystal(m)) != NULL) {
    m->density = c->density;  /* "PbWO4", "CsI": the formula as written */
    m->entry = c;
    return BL_SUCCESS;
  }
  if (bl_material_catalogue(m, spec) == BL_SUCCESS)
    return BL_SUCCESS;
  if (ambiguous(spec)) {
    memset(m, 0, sizeof *m);
    if (err != NULL)
      err->reason = "an element symbol in another case, and also two "
                    "element symbols";
    return BL_EAMBIGUOUS;
  }
  if (bl_material_formula(m, spec, &e) == BL_SUCCESS)
    return BL_SUCCESS;
  if (err != NULL)
    *err = e;
  memset(m, 0, sizeof *m);
  return BL_EUNKNOWN;
}
