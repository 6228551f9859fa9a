/*
** test_health.c -- points found by the parameter sweep (scripts/sweep.lua)
** See Copyright Notice in LICENSE
**
** Internal consistency, no outside source: a cross section is never
** negative, and a result whose error exceeds rtol |value| carries the
** tolerance warning.  The points are from `make sweep-smoke` (seed 6),
** before the fixes in src/core/born/dcs.c (phi_at, tolcheck); the T/m limit and
** the normalisation check of bl_case_setup were found by the fuzzer.
*/

#include <math.h>

#include <criterion/criterion.h>

#include "brakelight.h"
#include "testutil.h"

TestSuite(health, .init = setup);

/* Set up a custom projectile on Z with model `model` and options o. */
static void mkcase (bl_case *c, double mass, double charge, double spin,
                    int Z, const char *model, double T, const bl_opts *o) {
  bl_particle p = {"sweep", mass, charge, spin, 0};
  int st = bl_case_setup(c, &p, Z, bl_model_find(model), NULL, T, o);
  cr_assert(st == BL_SUCCESS, "bl_case_setup: %s", bl_strerror(st));
}

static bl_quad *mkquad (double rtol) {
  bl_quad *q = bl_quad_alloc(1000);
  cr_assert(q != NULL && bl_quad_set_rtol(q, rtol) == BL_SUCCESS);
  return q;
}

/* Sweep point 1592: a heavy spin-0 projectile near the tip on a uniform
** nucleus without electrons, where the poles cancel to rounding; the sum
** of the noise came out as -4.4e-60 +- 2.2e-59 mb/MeV. */
Test(health, never_negative_near_the_tip) {
  bl_opts o = {0, BL_NUCLEUS_UNIFORM, 0.0, BL_APPLY_OFF, BL_APPLY_ON};
  bl_case c;
  bl_result r;
  bl_quad *q = mkquad(1e-3);
  int st;
  mkcase(&c, 96837.098348704749, 1, 0, 59, "none", 1253191.8850314913, &o);
  st = bl_dcs_dk_e(&c, 1253139.977011384, q, &r);
  cr_expect(r.val >= 0.0 && isfinite(r.err), "dsdk = %g +- %g (status %d)",
            r.val, r.err, st);
  bl_quad_free(q);
}

/* Sweep point 600: every integral converged, yet the error (inner errors
** included) was 1.02 rtol |value| without a warning. */
Test(health, error_above_rtol_is_flagged) {
  bl_opts o = {1, BL_NUCLEUS_POINT, 0.0, BL_APPLY_OFF, BL_APPLY_AUTO};
  bl_case c;
  bl_result r;
  bl_quad *q = mkquad(1e-4);
  mkcase(&c, 0.56587557282744128, 1, 0.5, 31, "thomas-fermi",
         28847331.742228892, &o);
  bl_dcs_dk_e(&c, 28847062.689308908, q, &r);
  cr_expect(r.err <= 1e-4 * r.val || (r.warn & BL_WARN_TOLERANCE),
            "err %g > rtol * val = %g without the tolerance warning", r.err,
            1e-4 * r.val);
  bl_quad_free(q);
}

/* Found by the fuzzer: a particle of 4.6e-246 MeV gave NaN; now T/m and
** the normalisation are checked up front. */
Test(health, absurd_particles_refused) {
  bl_particle tiny = {"tiny", 4.6e-246, 2.3e-52, 0.0, 0};
  bl_particle e = *bl_particle_find("electron");
  bl_case c;
  const bl_model *m = bl_model_find("hartree-fock");
  cr_expect(bl_case_setup(&c, &tiny, 1, m, NULL, 0.01, NULL) == BL_EDOMAIN);
  cr_expect(bl_case_setup(&c, &e, 1, m, NULL, 1.01 * BL_T0_MAX * e.mass,
                          NULL) == BL_EDOMAIN);
  cr_expect(bl_case_setup(&c, &e, 1, m, NULL, 0.99 * BL_T0_MAX * e.mass,
                          NULL) == BL_SUCCESS);
  e.charge = 1e90;   /* z^4 overflows */
  cr_expect(bl_case_setup(&c, &e, 1, m, NULL, 10.0, NULL) == BL_EDOMAIN);
}
