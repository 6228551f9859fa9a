/*
** testutil.h -- helpers shared by the Criterion suites
** See Copyright Notice in LICENSE
*/
#ifndef BL_TESTUTIL_H
#define BL_TESTUTIL_H

#include <math.h>
#include <stdio.h>

#include <criterion/criterion.h>
#include <gsl/gsl_errno.h>

#include "brakelight.h"

/* Relative-difference check that prints got/want/rel on failure. */
#define EXPECT_REL(got, want, tol, ...) do {                              \
    double g_ = (got), w_ = (want), r_ = fabs(g_ - w_) / fabs(w_);      \
    char m_[512];                                                       \
    snprintf(m_, sizeof m_, __VA_ARGS__);                               \
    cr_expect(isfinite(g_) && r_ <= (tol),                              \
              "%s: got %.15g want %.15g rel %.3e > tol %.1e",           \
              m_, g_, w_, r_, (double) (tol));                          \
  } while (0)

/* r_e^2 in mb (from the CODATA constants of bl_const.h). */
#define RE2_MB (BL_RE_FM * BL_RE_FM / BL_FM2_PER_MB)

/* Suite init: GSL's default handler aborts; every suite turns it off. */
static inline void setup (void) {
  gsl_set_error_handler_off();
}

/* Born dsigma/dk (mb/MeV) of preset `particle` on Z with screening
** `model` at T (MeV), y = k/T, options o and tolerance rtol; asserts
** success; the whole result into *out when out is not NULL. */
static inline double dsdk_opts (const char *particle, int Z,
                                const char *model, double T, double y,
                                const bl_opts *o, double rtol,
                                bl_result *out) {
  bl_quad *q = bl_quad_alloc(1000);
  bl_case c;
  bl_result r;
  int st;
  cr_assert(q != NULL);
  cr_assert_eq(bl_quad_set_rtol(q, rtol), BL_SUCCESS);
  cr_assert_eq(bl_case_setup(&c, bl_particle_find(particle), Z,
                             bl_model_find(model), NULL, T, o), BL_SUCCESS,
               "case %s Z=%d %s T=%g", particle, Z, model, T);
  st = bl_dcs_dk_e(&c, y * T, q, &r);
  cr_assert_eq(st, BL_SUCCESS, "%s Z=%d %s T=%g y=%g: status %d", particle, Z,
               model, T, y, st);
  bl_quad_free(q);
  if (out != NULL)
    *out = r;
  return r.val;
}

#endif
