/*
** fuzz_formula.c -- libFuzzer harness over the material parser of the core
** See Copyright Notice in LICENSE
**
** The input is split at its first two NUL bytes into up to three strings.
** Each goes through bl_material_formula, bl_material_lookup and
** bl_material_suggest; the parsed ones are mixed by bl_material_mixture
** with fractions taken from the last bytes.  Beyond the sanitizers, the
** harness checks the contracts of include/brakelight/bl_material.h and aborts when
** one is broken:
**   success -> 1..BL_MATERIAL_MAXCOMP components, ordered by Z, each Z in
**              1..100 with atoms > 0 and finite, mass fractions summing to
**              1, a finite positive molar mass and radiation length, a
**              NUL-terminated name;
**   failure -> BL_EDOMAIN/BL_EUNKNOWN with an error position inside the
**              string and a reason.
*/

#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "brakelight.h"

#define MAXLEN 256   /* longest string tried */


/* Abort with a message: a broken contract is a finding. */
static void broken (const char *what, const char *s) {
  fprintf(stderr, "fuzz_formula: %s for input '%.80s'\n", what, s);
  abort();
}


/* Check the contract of a material returned with BL_SUCCESS. */
static void checkmat (const bl_material *m, const char *s) {
  double wsum = 0.0, x0;
  int i;
  if (memchr(m->name, '\0', sizeof m->name) == NULL)
    broken("name not terminated", s);
  if (m->n < 1 || m->n > BL_MATERIAL_MAXCOMP)
    broken("component count out of range", s);
  for (i = 0; i < m->n; i++) {
    const bl_component *c = &m->comp[i];
    if (c->Z < 1 || c->Z > 100 || (i > 0 && c->Z <= m->comp[i - 1].Z))
      broken("Z out of range or out of order", s);
    if (!(c->atoms > 0.0) || !isfinite(c->atoms) || !(c->A > 0.0))
      broken("atoms or A not positive and finite", s);
    if (!(c->mass_fraction >= 0.0 && c->mass_fraction <= 1.0 + 1e-12))
      broken("mass fraction outside [0, 1]", s);
    wsum += c->mass_fraction;
  }
  if (fabs(wsum - 1.0) > 1e-9)
    broken("mass fractions do not sum to 1", s);
  if (!(m->molar_mass > 0.0) || !isfinite(m->molar_mass))
    broken("molar mass not positive and finite", s);
  if (!(m->density >= 0.0) || !isfinite(m->density))
    broken("density negative or not finite", s);
  if (m->entry != NULL && m->density != m->entry->density)
    broken("catalogue entry without its density", s);
  x0 = bl_radiation_length(m);
  if (!(x0 > 0.0) || !isfinite(x0))
    broken("radiation length not positive and finite", s);
}


/* Check a failure report. */
static void checkerr (int st, const bl_parse_error *e, const char *s,
                      int parser) {
  if (st != BL_EDOMAIN && st != BL_EUNKNOWN
      && (parser || st != BL_EAMBIGUOUS || strlen(s) != 2))
    broken("unexpected status", s);
  if (parser && (e->reason == NULL || e->pos > strlen(s)))
    broken("error position outside the string or no reason", s);
}


int LLVMFuzzerTestOneInput (const uint8_t *data, size_t size) {
  char buf[3][MAXLEN + 1];
  bl_material m[3], mix;
  double frac[3];
  int ok[3], nparts = 0, i, bad, st;
  size_t pos = 0;
  for (i = 0; i < 3; i++) {
    size_t n = 0;
    while (pos < size && data[pos] != 0 && n < MAXLEN)
      buf[i][n++] = (char)data[pos++];
    buf[i][n] = '\0';
    if (pos < size)
      pos++;   /* the separator */
  }
  for (i = 0; i < 3; i++) {
    bl_parse_error e = {0, NULL};
    const char *near[8];
    int n, j;
    st = bl_material_formula(&m[i], buf[i], &e);
    if (st == BL_SUCCESS)
      checkmat(&m[i], buf[i]);
    else
      checkerr(st, &e, buf[i], 1);
    e.reason = NULL;
    st = bl_material_lookup(&m[i], buf[i], &e);
    ok[i] = (st == BL_SUCCESS);
    if (ok[i])
      checkmat(&m[i], buf[i]);
    else
      checkerr(st, &e, buf[i], 0);
    n = bl_material_suggest(buf[i], near, 8);
    if (n < 0 || n > 8)
      broken("suggestion count out of range", buf[i]);
    for (j = 0; j < n; j++)
      if (near[j] == NULL)
        broken("NULL suggestion", buf[i]);
  }
  /* a mixture of the parts that parsed, fractions from the last bytes */
  for (i = 0; i < 3; i++)
    if (ok[i]) {
      uint8_t x = size > (size_t)i ? data[size - 1 - (size_t)i] : 1;
      m[nparts] = m[i];
      frac[nparts++] = x == 255 ? NAN : x / 64.0;
    }
  if (nparts > 0) {
    int by_mass = size > 0 && (data[0] & 1), norm = size > 0 && (data[0] & 2);
    st = bl_material_mixture(&mix, nparts, m, frac, by_mass, norm, &bad);
    if (st == BL_SUCCESS)
      checkmat(&mix, "(mixture)");
    else if (st != BL_EDOMAIN || bad < -1 || bad >= nparts)
      broken("mixture failure without a valid part index", "(mixture)");
  }
  return 0;
}
