/*
** none.c -- no screening: a point nucleus in vacuum
** See Copyright Notice in LICENSE
*/

#include "models/internal.h"


/*
** F(q)/Z = 0 for every q: no atomic electrons.
*/
static double none_ff (double q, int Z, const double *p) {
  (void)q; (void)Z; (void)p;
  return 0.0;
}


/* 1 - F/Z = 1 = q^2 / (0 + q^2): one term with b = 0. */
static int none_yukawa (int Z, const double *p, bl_yukawa *out) {
  (void)p;
  if (Z < 1 || Z > BL_ZMAX)
    return BL_EDOMAIN;
  out->n = 1;
  out->alpha[0] = 1.0;
  out->b[0] = 0.0;
  return BL_SUCCESS;
}

const bl_model bl_model_none = {
  BL_MODEL_NONE, "none",
  "unscreened Coulomb field of a point nucleus (Bethe-Heitler)",
  {&bl_ref_BetheHeitler1934, &bl_ref_KochMotz1959, NULL, NULL},
  0, NULL, none_ff, none_yukawa, NULL
};
