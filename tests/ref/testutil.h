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

/* Relative-difference check that prints got/want/rel on failure. */
#define EXPECT_REL(got, want, tol, ...) do {                              \
    double g_ = (got), w_ = (want), r_ = fabs(g_ - w_) / fabs(w_);      \
    char m_[512];                                                       \
    snprintf(m_, sizeof m_, __VA_ARGS__);                               \
    cr_expect(isfinite(g_) && r_ <= (tol),                              \
              "%s: got %.15g want %.15g rel %.3e > tol %.1e",           \
              m_, g_, w_, r_, (double) (tol));                          \
  } while (0)

/* Suite init: GSL's default handler aborts; every suite turns it off. */
static inline void setup (void) {
  gsl_set_error_handler_off();
}

#endif
