/*
** test_gsl_errors.c -- no GSL failure aborts, none passes silently
** See Copyright Notice in LICENSE
**
** Internal consistency, no outside source.  These suites do NOT switch
** GSL's handler off in their init (unlike the others): they start from
** GSL's default handler, which prints and aborts, as a program that links
** libbrakelight.a without calling gsl_set_error_handler_off() would.
** Criterion runs each test in its own process, so an abort would show as a
** crash.  An integral forced to fail (2 panels per level for a 1e-12
** tolerance) must come back with a non-convergence status, a finite
** estimate and the tolerance warning; a handler of the application's own
** must be kept and called.
*/

#include <math.h>

#include <criterion/criterion.h>
#include <gsl/gsl_errno.h>

#include "brakelight.h"

TestSuite(gsl_errors);

/* A case and a starved workspace (limit 8, rtol 1e-12). */
static bl_quad *starved (bl_case *c) {
  bl_quad *q;
  cr_assert(bl_case_setup(c, bl_particle_find("electron"), 82,
                          bl_model_find("hartree-fock"), NULL, 10.0,
                          &bl_opts_default) == BL_SUCCESS);
  q = bl_quad_alloc(8);
  cr_assert(q != NULL);
  cr_assert(bl_quad_set_rtol(q, 1e-12) == BL_SUCCESS);
  return q;
}

/* The failure is reported, never aborted, never silent. */
static void expect_reported (int st, const bl_result *r) {
  cr_expect(st != BL_SUCCESS, "a starved integral claims success");
  cr_expect(st == GSL_EMAXITER || st == GSL_EROUND || st == GSL_ESING
            || st == BL_ENOTCONV, "unexpected status %d (%s)", st,
            bl_strerror(st));
  cr_expect(isfinite(r->val) && r->val > 0.0 && isfinite(r->err),
            "no usable estimate: %g +- %g", r->val, r->err);
  cr_expect(r->warn & BL_WARN_TOLERANCE, "tolerance warning missing");
}

/* GSL's default handler in place: the first bl_quad_alloc replaces it. */
Test(gsl_errors, default_handler_does_not_abort) {
  bl_case c;
  bl_quad *q;
  bl_result r;
  gsl_set_error_handler(NULL);   /* GSL's default: abort */
  q = starved(&c);
  expect_reported(bl_dcs_dk_e(&c, 3.0, q, &r), &r);
  expect_reported(bl_dcs_angular_e(&c, 3.0, 0.0, q, &r), &r);
  bl_quad_free(q);
}

static int calls;

static void counting_handler (const char *reason, const char *file, int line,
                              int gsl_errno) {
  (void)reason; (void)file; (void)line; (void)gsl_errno;
  calls++;
}

/* An application's own handler stays and sees the failures. */
Test(gsl_errors, own_handler_kept) {
  bl_case c;
  bl_quad *q;
  bl_result r;
  gsl_set_error_handler(counting_handler);
  q = starved(&c);
  expect_reported(bl_dcs_dk_e(&c, 3.0, q, &r), &r);
  cr_expect(calls > 0, "the application's handler was replaced");
  cr_expect(gsl_set_error_handler(NULL) == counting_handler);
  bl_quad_free(q);
}
