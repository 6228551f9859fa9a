/*
** test_base.c -- the base room: projectiles, constants, elements and status
** codes; GSL failures never abort; the points found by the sweep and the
** fuzzer, and pointer arguments that are NULL
** See Copyright Notice in LICENSE
**
** Suites: particle, gsl_errors (GSL's default handler on: no init),
** health.
*/

#include <math.h>
#include <stdio.h>
#include <string.h>

#include <criterion/criterion.h>
#include <criterion/new/assert.h>
#include <gsl/gsl_errno.h>

#include "brakelight.h"
#include "base/internal.h"   /* bl_gk_panel: the Gauss-Kronrod rules */
#include "testutil.h"

/* ==================================================================
** projectile presets, particle checks, constants, elements
**
** Published values are quoted from memory (marked so); their tolerances
** cover the last quoted digits and small revisions between editions.
** (formerly tests/test_particle.c)
*/

TestSuite(particle, .init = setup);


/*
** The nine presets of the issue with mass, charge, spin and the composite
** flag.  Masses: Review of Particle Physics (Particle Data Group, 2022
** edition), from memory: e 0.51099895000(15), mu 105.6583755(23),
** pi+- 139.57039(18), K+- 493.677(16), p 938.27208816(29) MeV.  Tolerances:
** 1e-8 relative for e, mu, p (known to better than 3e-8), 1e-5 for pi and
** K (quoted uncertainties 1.3e-6 and 3.2e-5: a later edition may move K).
*/
Test(particle, presets) {
  static const struct {
    const char *name;
    double mass, tol, charge, spin;
    int composite;
  } want[] = {
    { "electron", 0.51099895000, 1e-8, -1.0, 0.5, 0 },
    { "positron", 0.51099895000, 1e-8, +1.0, 0.5, 0 },
    { "muon",     105.6583755,   1e-8, -1.0, 0.5, 0 },
    { "antimuon", 105.6583755,   1e-8, +1.0, 0.5, 0 },
    { "pion+",    139.57039,     1e-5, +1.0, 0.0, 1 },
    { "pion-",    139.57039,     1e-5, -1.0, 0.0, 1 },
    { "kaon+",    493.677,       1e-4, +1.0, 0.0, 1 },
    { "kaon-",    493.677,       1e-4, -1.0, 0.0, 1 },
    { "proton",   938.27208816,  1e-8, +1.0, 0.5, 1 },
  };
  size_t i, n = 0;
  while (bl_particles[n] != NULL)
    n++;
  cr_expect(n == sizeof want / sizeof want[0], "%zu presets, want %zu", n,
            sizeof want / sizeof want[0]);
  for (i = 0; i < sizeof want / sizeof want[0]; i++) {
    const bl_particle *p = bl_particle_find(want[i].name);
    int comp;
    cr_assert(p != NULL, "preset '%s' missing", want[i].name);
    cr_expect(strcmp(p->name, want[i].name) == 0, "name '%s' for '%s'",
              p->name, want[i].name);
    EXPECT_REL(p->mass, want[i].mass, want[i].tol,
               "%s mass (MeV) vs Review of Particle Physics, from memory",
               want[i].name);
    cr_expect(p->charge == want[i].charge, "%s charge %g", want[i].name,
              p->charge);
    cr_expect(p->spin == want[i].spin, "%s spin %g", want[i].name, p->spin);
    comp = (p->flags & BL_PARTICLE_COMPOSITE) != 0;
    cr_expect(comp == want[i].composite, "%s composite flag %d", want[i].name,
              comp);
    cr_expect(bl_particle_check(p) == BL_SUCCESS, "preset %s fails the check",
              want[i].name);
  }
}


/* Look-up by name is case-insensitive (bl_particle.h); unknown -> NULL. */
Test(particle, lookup) {
  static const char *const same[][2] = {
    { "Electron", "electron" }, { "MUON", "muon" }, { "Pion+", "pion+" },
    { "KAON-", "kaon-" }, { "ProToN", "proton" }, { "AntiMuon", "antimuon" },
  };
  size_t i;
  for (i = 0; i < sizeof same / sizeof same[0]; i++) {
    const bl_particle *a = bl_particle_find(same[i][0]);
    cr_expect(a != NULL && a == bl_particle_find(same[i][1]),
              "'%s' should find '%s'", same[i][0], same[i][1]);
  }
  cr_expect(bl_particle_find("tauon") == NULL, "unknown name");
  cr_expect(bl_particle_find("pion") == NULL, "'pion' without a charge");
  cr_expect(bl_particle_find("") == NULL, "empty name");
  cr_expect(bl_particle_find(NULL) == NULL, "NULL name");
}


/* bl_particle_check (bl_particle.h): mass > 0 finite, charge != 0 finite,
** spin 0 or 0.5. */
Test(particle, check_rejects) {
  static const bl_particle bad[] = {
    { "m0",    0.0,      1.0, 0.5, 0 },
    { "m-1",   -1.0,     1.0, 0.5, 0 },
    { "mnan",  NAN,      1.0, 0.5, 0 },
    { "minf",  INFINITY, 1.0, 0.5, 0 },
    { "z0",    1.0,      0.0, 0.5, 0 },
    { "znan",  1.0,      NAN, 0.5, 0 },
    { "zinf",  1.0, INFINITY, 0.5, 0 },
    { "s1",    1.0,      1.0, 1.0, 0 },
    { "s-.5",  1.0,      1.0, -0.5, 0 },
    { "s.25",  1.0,      1.0, 0.25, 0 },
    { "snan",  1.0,      1.0, NAN, 0 },
  };
  static const bl_particle good[] = {
    { "heavy scalar", 300.0,  2.0, 0.0, 0 },
    { "light lepton", 1e-3,  -1.0, 0.5, 0 },
    { "fractional",   2.0,   -1.0 / 3.0, 0.5, 0 },
  };
  size_t i;
  for (i = 0; i < sizeof bad / sizeof bad[0]; i++)
    cr_expect(bl_particle_check(&bad[i]) == BL_EDOMAIN,
              "particle '%s' (m=%g z=%g s=%g) accepted", bad[i].name,
              bad[i].mass, bad[i].charge, bad[i].spin);
  for (i = 0; i < sizeof good / sizeof good[0]; i++)
    cr_expect(bl_particle_check(&good[i]) == BL_SUCCESS,
              "particle '%s' rejected", good[i].name);
  cr_expect(bl_particle_check(NULL) == BL_EDOMAIN, "NULL particle");
}


/*
** Constants of bl_const.h against CODATA 2018 (Tiesinga et al., Rev. Mod.
** Phys. 93 (2021) 025010), from memory, and against each other:
** r_e = alpha hbar c/(m_e c^2) and a_B = hbar c/(alpha m_e c^2) hold to the
** quoted digits (1e-9); r_e^2 = 79.407877 mb (CODATA 2018 r_e, squared).
*/
Test(particle, constants) {
  EXPECT_REL(1.0 / BL_ALPHA, 137.035999084, 1e-11, "1/alpha (CODATA 2018)");
  EXPECT_REL(BL_ME_MEV, 0.51099895000, 1e-10, "m_e c^2 (CODATA 2018)");
  EXPECT_REL(BL_HBARC_MEVFM, 197.3269804, 1e-9, "hbar c (CODATA 2018)");
  EXPECT_REL(BL_NA, 6.02214076e23, 1e-12, "N_A (exact since 2019)");
  EXPECT_REL(BL_RE_FM, 2.8179403262, 1e-10, "r_e (CODATA 2018)");
  EXPECT_REL(BL_RE_FM, BL_ALPHA * BL_HBARC_MEVFM / BL_ME_MEV, 1e-9,
             "r_e vs alpha hbar c / m_e");
  EXPECT_REL(BL_BOHR_FM, BL_HBARC_MEVFM / (BL_ALPHA * BL_ME_MEV), 1e-9,
             "a_B vs hbar c / (alpha m_e)");
  EXPECT_REL(BL_RE_FM * BL_RE_FM / BL_FM2_PER_MB, 79.407877, 1e-7,
             "r_e^2 in mb (CODATA 2018)");
  EXPECT_REL(BL_PI, 3.14159265358979323846, 1e-16, "pi");
}


/*
** Elements: symbol <-> Z round trip for every Z; unknown symbols; range.
** Standard atomic weights: IUPAC (conventional/abridged values), from memory;
** the tolerances are absolute (g/mol) and cover the interval notation of the
** 2009+ tables (H, C, N, O, Si) and rounding of the older values.
*/
Test(particle, elements) {
  static const struct { const char *sym; int Z; double A, tol; } el[] = {
    { "H", 1, 1.008, 0.001 },      { "He", 2, 4.002602, 1e-4 },
    { "C", 6, 12.011, 0.002 },     { "N", 7, 14.007, 0.002 },
    { "O", 8, 15.999, 0.002 },     { "Al", 13, 26.9815385, 1e-3 },
    { "Si", 14, 28.085, 0.003 },   { "Fe", 26, 55.845, 0.003 },
    { "Cu", 29, 63.546, 0.003 },   { "W", 74, 183.84, 0.01 },
    { "Pb", 82, 207.2, 0.1 },      { "U", 92, 238.02891, 1e-3 },
  };
  size_t i;
  int Z;
  for (i = 0; i < sizeof el / sizeof el[0]; i++) {
    cr_expect(bl_element_find(el[i].sym) == el[i].Z, "find('%s') = %d, want %d",
              el[i].sym, bl_element_find(el[i].sym), el[i].Z);
    cr_expect(bl_element_symbol(el[i].Z) != NULL
              && strcmp(bl_element_symbol(el[i].Z), el[i].sym) == 0,
              "symbol(%d) = '%s', want '%s'", el[i].Z,
              bl_element_symbol(el[i].Z) ? bl_element_symbol(el[i].Z) : "(null)",
              el[i].sym);
    cr_expect(fabs(bl_element_mass(el[i].Z) - el[i].A) <= el[i].tol,
              "mass(%s) = %.6f, want %.6f +- %g (IUPAC, from memory)",
              el[i].sym, bl_element_mass(el[i].Z), el[i].A, el[i].tol);
  }
  for (Z = 1; Z <= BL_ZMAX; Z++) {
    const char *s = bl_element_symbol(Z);
    double A = bl_element_mass(Z);
    cr_expect(s != NULL && bl_element_find(s) == Z, "round trip Z=%d ('%s')",
              Z, s ? s : "(null)");
    /* every nucleus has N >= 0 and N/Z < 1.7: A/Z in [1, 2.7] (common
    ** practice sanity bound; true from H to Fm) */
    cr_expect(A >= Z && A <= 2.7 * Z, "mass(Z=%d) = %g outside [Z, 2.7 Z]",
              Z, A);
  }
  cr_expect(bl_element_symbol(100) != NULL
            && strcmp(bl_element_symbol(100), "Fm") == 0, "Z = 100 is Fm");
  cr_expect(bl_element_find("Xx") == 0, "unknown symbol");
  cr_expect(bl_element_find("") == 0, "empty symbol");
  cr_expect(bl_element_find(NULL) == 0, "NULL symbol");
  cr_expect(bl_element_find("Md") == 0, "Md (Z = 101) is outside 1..100");
  cr_expect(bl_element_symbol(0) == NULL && bl_element_symbol(101) == NULL,
            "symbol outside 1..100");
  cr_expect(bl_element_mass(0) == 0.0 && bl_element_mass(101) == 0.0,
            "mass outside 1..100");
}


/* Status codes (bl_errno.h): ours sit above every GSL code, and
** bl_strerror covers both with non-empty text. */
Test(particle, status_codes) {
  static const int ours[] = { BL_EDOMAIN, BL_EUNKNOWN, BL_ENOMEM, BL_EMODEL,
                              BL_ENOTCONV, BL_ENONFINITE, BL_EAMBIGUOUS };
  static const int gsl[] = { GSL_EMAXITER, GSL_EROUND, GSL_EDOM, GSL_ESING };
  size_t i, j;
  cr_expect(BL_SUCCESS == 0 && GSL_SUCCESS == 0, "success is 0");
  for (i = 0; i < sizeof ours / sizeof ours[0]; i++) {
    const char *s = bl_strerror(ours[i]);
    cr_expect(ours[i] > GSL_EOF, "code %d not above GSL's", ours[i]);
    cr_expect(s != NULL && s[0] != '\0', "bl_strerror(%d) empty", ours[i]);
    for (j = 0; j < i; j++)
      cr_expect(strcmp(s, bl_strerror(ours[j])) != 0,
                "codes %d and %d share the text '%s'", ours[i], ours[j], s);
  }
  for (i = 0; i < sizeof gsl / sizeof gsl[0]; i++) {
    const char *s = bl_strerror(gsl[i]);
    cr_expect(s != NULL && strcmp(s, gsl_strerror(gsl[i])) == 0,
              "bl_strerror(%d) = '%s', GSL says '%s'", gsl[i], s ? s : "(null)",
              gsl_strerror(gsl[i]));
  }
  cr_expect(bl_strerror(123456) != NULL, "unknown code gives NULL");
}


/* ==================================================================
** no GSL failure aborts, none passes silently
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
** (formerly tests/test_gsl_errors.c)
*/

TestSuite(gsl_errors);

/* A case and a starved workspace (limit 8, rtol 1e-12).  With the ridge
** map centred at the minimum of q^2 and the nested rules (issue 14) the
** screened dsigma/dk at k = 3 MeV meets even that at T = 10 GeV to
** 100 TeV; unscreened Pb at 10 GeV and k = 1 MeV (y = 1e-4: the
** forward ridge of the smallest momentum transfers, no screening scale
** to smooth it) cannot.  The screened angular distribution at k = 3 MeV
** meets it at 10 and 100 GeV and fails at 1 TeV. */
static bl_quad *starved (bl_case *c, const char *model, double T) {
  bl_quad *q;
  cr_assert(bl_case_setup(c, bl_particle_find("electron"), 82,
                          bl_model_find(model), NULL, T,
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
  q = starved(&c, "none", 1e4);
  expect_reported(bl_dcs_dk_e(&c, 1.0, q, &r), &r);
  bl_quad_free(q);
  q = starved(&c, "hartree-fock", 1e6);
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
  q = starved(&c, "none", 1e4);
  expect_reported(bl_dcs_dk_e(&c, 1.0, q, &r), &r);
  /* the Born integrals no longer call GSL's integrators, so the handler
  ** may not be called; it must still be the one in place */
  cr_log_info("the application's handler was called %d times", calls);
  cr_expect(gsl_set_error_handler(NULL) == counting_handler,
            "the application's handler was replaced");
  bl_quad_free(q);
}


/* ==================================================================
** points found by the parameter sweep (scripts/sweep.lua)
**
** Internal consistency, no outside source: a cross section is never
** negative, and a result whose error exceeds rtol |value| carries the
** tolerance warning.  The points are from `make sweep-smoke` (seed 6),
** before the fixes in src/core/born/dcs.c (phi_at, tolcheck); the T/m limit and
** the normalisation check of bl_case_setup were found by the fuzzer.
** (formerly tests/test_health.c)
*/

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
  bl_opts o = {0, BL_NUCLEUS_UNIFORM, 0.0, BL_APPLY_OFF, BL_APPLY_ON,
               BL_ERAD_ALL};
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
  bl_opts o = {1, BL_NUCLEUS_POINT, 0.0, BL_APPLY_OFF, BL_APPLY_AUTO,
               BL_ERAD_ALL};
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


/*
** Internal consistency: every public function of include/brakelight/ that
** takes a pointer, given NULL in each pointer argument that may not be NULL
** (one at a time, the others valid), returns BL_EDOMAIN (functions with a
** status) or its documented "none" value (0, -1, NULL, no change): never a
** crash.  Pointers documented as optional (options, params, err, bad,
** status, kbreak with nbreak = 0, user data) are not tried here.
*/
static void nullsetup (bl_case *c, bl_quad **q) {
  mkcase(c, BL_ME_MEV, -1.0, 0.5, 29, "thomas-fermi", 1e5,
         &bl_opts_default);
  *q = mkquad(1e-3);
}

Test(health, null_cases_and_cross_sections) {
  const bl_particle *e = bl_particle_find("electron");
  const bl_model *m = bl_model_find("exponential");
  bl_case c;
  bl_quad *q;
  bl_result r;
  nullsetup(&c, &q);
  cr_expect_eq(bl_case_init(NULL, e, 29, m, NULL, 10.0), BL_EDOMAIN);
  cr_expect_eq(bl_case_init(&c, NULL, 29, m, NULL, 10.0), BL_EDOMAIN);
  cr_expect_eq(bl_case_init(&c, e, 29, NULL, NULL, 10.0), BL_EDOMAIN);
  cr_expect_eq(bl_case_setup(NULL, e, 29, m, NULL, 10.0, NULL), BL_EDOMAIN);
  cr_expect_eq(bl_case_setup(&c, NULL, 29, m, NULL, 10.0, NULL), BL_EDOMAIN);
  cr_expect_eq(bl_case_setup(&c, e, 29, NULL, NULL, 10.0, NULL), BL_EDOMAIN);
  bl_quad_free(q);
  nullsetup(&c, &q);   /* a valid case again */
  cr_expect_eq(bl_dcs_full_e(NULL, 1.0, 0.1, 0.1, 0.0, &r), BL_EDOMAIN);
  cr_expect_eq(bl_dcs_full_e(&c, 1.0, 0.1, 0.1, 0.0, NULL), BL_EDOMAIN);
  cr_expect_eq(bl_dcs_angular_e(NULL, 1.0, 1e-5, q, &r), BL_EDOMAIN);
  cr_expect_eq(bl_dcs_angular_e(&c, 1.0, 1e-5, NULL, &r), BL_EDOMAIN);
  cr_expect_eq(bl_dcs_angular_e(&c, 1.0, 1e-5, q, NULL), BL_EDOMAIN);
  cr_expect_eq(bl_dcs_dk_e(NULL, 1.0, q, &r), BL_EDOMAIN);
  cr_expect_eq(bl_dcs_dk_e(&c, 1.0, NULL, &r), BL_EDOMAIN);
  cr_expect_eq(bl_dcs_dk_e(&c, 1.0, q, NULL), BL_EDOMAIN);
  bl_quad_free(q);
}

Test(health, null_methods) {
  bl_case c;
  bl_quad *q;
  bl_he h;
  bl_result r;
  double kb[4], jump[4];
  int meth;
  nullsetup(&c, &q);
  cr_expect_eq(bl_he_prepare(NULL, q, &h), BL_EDOMAIN);
  cr_expect_eq(bl_he_prepare(&c, q, NULL), BL_EDOMAIN);
  cr_expect_eq(bl_method_prepare(NULL, BL_METHOD_AUTO, q, &h), BL_EDOMAIN);
  cr_expect_eq(bl_method_prepare(&c, BL_METHOD_AUTO, q, NULL), BL_EDOMAIN);
  cr_assert_eq(bl_he_prepare(&c, q, &h), BL_SUCCESS);
  cr_expect_eq(bl_he_dk_e(NULL, &h, 1.0, &r), BL_EDOMAIN);
  cr_expect_eq(bl_he_dk_e(&c, NULL, 1.0, &r), BL_EDOMAIN);
  cr_expect_eq(bl_he_dk_e(&c, &h, 1.0, NULL), BL_EDOMAIN);
  cr_expect_eq(bl_complete_dk_e(NULL, 1.0, &r), BL_EDOMAIN);
  cr_expect_eq(bl_complete_dk_e(&c, 1.0, NULL), BL_EDOMAIN);
  cr_expect_eq(bl_he_valid(NULL, 1.0), 0);
  for (meth = 0; meth < BL_METHOD_COUNT; meth++) {
    cr_expect_eq(bl_method_dk_e(NULL, NULL, meth, 1.0, q, &r), BL_EDOMAIN,
                 "method %d", meth);
    cr_expect_eq(bl_method_dk_e(NULL, &h, meth, 1.0, q, &r), BL_EDOMAIN,
                 "method %d", meth);
    cr_expect_eq(bl_method_dk_e(&c, &h, meth, 1.0, q, NULL), BL_EDOMAIN,
                 "method %d", meth);
    cr_expect_eq(bl_method_breaks(NULL, &h, meth, kb, jump, 4), 0);
    cr_expect_eq(bl_method_breaks(&c, &h, meth, NULL, jump, 4), 0);
    cr_expect_eq(bl_method_breaks(&c, &h, meth, kb, NULL, 4), 0);
  }
  cr_expect_eq(bl_method_dk_e(&c, NULL, BL_METHOD_HIGH_ENERGY, 1.0, q, &r),
               BL_EDOMAIN);
  cr_expect_eq(bl_method_find(NULL), -1);
  bl_quad_free(q);
}

static int onef (void *ud, double k, bl_result *out) {
  (void)ud;
  out->val = 1.0 / k;
  out->err = 0.0;
  out->warn = out->applied = 0;
  out->method = BL_METHOD_BORN;
  return BL_SUCCESS;
}

Test(health, null_integrals_and_spectra) {
  bl_case c;
  bl_quad *q;
  bl_he h;
  bl_result r, r1, rs[2];
  double k[2] = {1.0, 2.0};
  int st[2];
  nullsetup(&c, &q);
  cr_expect_eq(bl_kintegral_e(NULL, NULL, 1.0, 2.0, 3.0, NULL, 0, 0, 1e-3, &r),
               BL_EDOMAIN);
  cr_expect_eq(bl_kintegral_e(onef, NULL, 1.0, 2.0, 3.0, NULL, 0, 0, 1e-3,
                              NULL), BL_EDOMAIN);
  cr_expect_eq(bl_kintegral_e(onef, NULL, 1.0, 2.0, 3.0, NULL, 1, 0, 1e-3,
                              &r), BL_EDOMAIN, "breakpoints NULL");
  cr_expect_eq(bl_kintegral2_e(NULL, NULL, 1.0, 2.0, 3.0, NULL, 0, 1e-3, &r,
                               &r1), BL_EDOMAIN);
  cr_expect_eq(bl_kintegral2_e(onef, NULL, 1.0, 2.0, 3.0, NULL, 0, 1e-3, NULL,
                               &r1), BL_EDOMAIN);
  cr_expect_eq(bl_spectrum_dk_e(NULL, 2, k, 1, q, rs, st), BL_EDOMAIN);
  cr_expect_eq(bl_spectrum_dk_e(&c, 2, NULL, 1, q, rs, st), BL_EDOMAIN);
  cr_expect_eq(bl_spectrum_dk_e(&c, 2, k, 1, NULL, rs, st), BL_EDOMAIN);
  cr_expect_eq(bl_spectrum_dk_e(&c, 2, k, 1, q, NULL, st), BL_EDOMAIN);
  cr_assert_eq(bl_he_prepare(&c, q, &h), BL_SUCCESS);
  cr_expect_eq(bl_spectrum_method_e(NULL, &h, BL_METHOD_AUTO, 2, k, 1, q, rs,
                                    st), BL_EDOMAIN);
  cr_expect_eq(bl_spectrum_method_e(&c, &h, BL_METHOD_AUTO, 2, NULL, 1, q, rs,
                                    st), BL_EDOMAIN);
  cr_expect_eq(bl_spectrum_method_e(&c, &h, BL_METHOD_AUTO, 2, k, 1, NULL,
                                    rs, st), BL_EDOMAIN);
  cr_expect_eq(bl_spectrum_method_e(&c, &h, BL_METHOD_AUTO, 2, k, 1, q, NULL,
                                    st), BL_EDOMAIN);
  bl_quad_free(q);
}

Test(health, null_materials_models_and_workspaces) {
  bl_material m, parts[2];
  bl_suppress s;
  const char *names[4];
  double w[2] = {0.5, 0.5}, p[8];
  const bl_particle *e = bl_particle_find("electron");
  cr_assert_eq(bl_material_element(&parts[0], 6), BL_SUCCESS);
  cr_assert_eq(bl_material_element(&parts[1], 8), BL_SUCCESS);
  cr_expect_eq(bl_material_element(NULL, 6), BL_EDOMAIN);
  cr_expect_eq(bl_material_formula(NULL, "H2O", NULL), BL_EDOMAIN);
  cr_expect_eq(bl_material_formula(&m, NULL, NULL), BL_EDOMAIN);
  cr_expect_eq(bl_material_mixture(NULL, 2, parts, w, 1, 0, NULL), BL_EDOMAIN);
  cr_expect_eq(bl_material_mixture(&m, 2, NULL, w, 1, 0, NULL), BL_EDOMAIN);
  cr_expect_eq(bl_material_mixture(&m, 2, parts, NULL, 1, 0, NULL),
               BL_EDOMAIN);
  cr_expect_eq(bl_material_catalogue(NULL, "air"), BL_EDOMAIN);
  cr_expect_eq(bl_material_catalogue(&m, NULL), BL_EUNKNOWN,
               "no name: unknown, as documented");
  cr_expect_eq(bl_material_catalogue_find(NULL), -1);
  cr_expect(bl_material_catalogue_entry(-1) == NULL);
  cr_expect_eq(bl_material_lookup(NULL, "Pb", NULL), BL_EDOMAIN);
  cr_expect_eq(bl_material_lookup(&m, NULL, NULL), BL_EDOMAIN);
  cr_expect_eq(bl_material_suggest(NULL, names, 4), 0);
  cr_expect_eq(bl_material_suggest("water", NULL, 4), 0);
  cr_expect_eq(bl_radiation_length(NULL), 0.0);
  cr_expect_eq(bl_element_find(NULL), 0);
  cr_expect_eq(bl_element_lookup(NULL), 0);
  cr_expect_eq(bl_suppress_init(NULL, BL_SUPPRESS_LPM, &parts[0], e),
               BL_EDOMAIN);
  cr_expect_eq(bl_suppress_init(&s, BL_SUPPRESS_LPM, NULL, e), BL_EDOMAIN);
  cr_expect_eq(bl_suppress_init(&s, BL_SUPPRESS_LPM, &parts[0], NULL),
               BL_EDOMAIN);
  cr_expect_eq(bl_suppress_factor(NULL, 1e3, 1.0), 1.0);
  cr_expect_eq(bl_suppress_find(NULL), -1);
  cr_expect(bl_model_find(NULL) == NULL);
  bl_model_defaults(NULL, p);
  bl_model_defaults(bl_model_find("exponential"), NULL);
  cr_expect(bl_particle_find(NULL) == NULL);
  cr_expect_eq(bl_particle_check(NULL), BL_EDOMAIN);
  cr_expect_eq(bl_quad_set_rtol(NULL, 1e-3), BL_EDOMAIN);
  cr_expect_eq(bl_quad_calls(NULL), 0ul);
  bl_quad_reset_calls(NULL);
  bl_quad_free(NULL);
  cr_expect(bl_quad_rtol(NULL) == 0.0);
}


/* x^k on [-1, 2] (not symmetric, so odd powers count too). */
static double powk (double x, void *par, double *err) {
  *err = 0.0;
  return pow(x, *(const int *)par);
}

/*
** Each Gauss-Kronrod rule of base/quad.c integrates x^k exactly up to its
** degree (3n + 1 for the Kronrod extension of the n-point Gauss rule,
** Kronrod 1965: 11, 17, 23, 31 for 7, 11, 15, 21 points) and not beyond,
** and its Gauss part up to 2n - 1: d = |K - G| vanishes up to that
** degree and not above.  The exact integral is (2^(k+1) - (-1)^(k+1))/(k+1)
** on [-1, 2]; degree + 1 is even, and checked on [-1, 1].
*/
Test(quad, gauss_kronrod_degrees) {
  static const int npt[4] = {7, 11, 15, 21}, deg[4] = {11, 17, 23, 31},
                   gdeg[4] = {5, 9, 13, 19};
  int r, k;
  for (r = 0; r < 4; r++) {
    for (k = 0; k <= deg[r] + 1; k++) {
      bl_gkpanel p;
      double exact = (pow(2.0, k + 1) - pow(-1.0, k + 1)) / (k + 1);
      double rel;
      bl_gk_panel(powk, &k, -1.0, 2.0, npt[r], &p);
      rel = fabs(p.val - exact) / fabs(exact);
      if (k <= deg[r])
        cr_expect(rel < 1e-13, "%d points, x^%d: relative error %g",
                  npt[r], k, rel);
      else {   /* x^(deg+1) on [-1, 1], where it is not diluted */
        bl_gk_panel(powk, &k, -1.0, 1.0, npt[r], &p);
        rel = fabs(p.val - 2.0 / (k + 1)) / (2.0 / (k + 1));
        cr_expect(rel > 1e-12, "%d points exact for x^%d: %g (degree %d?)",
                  npt[r], k, rel, deg[r]);
      }
      if (k <= gdeg[r])
        cr_expect(p.d < 1e-12 * fabs(exact), "%d points, x^%d: d = %g",
                  npt[r], k, p.d);
      else if (k == gdeg[r] + 1)
        cr_expect(p.d > 1e-8 * fabs(exact), "%d points, Gauss exact for "
                  "x^%d", npt[r], k);
    }
  }
}

/* The Legendre polynomial P_k(x), k = *par, by its recurrence. */
static double legk (double x, void *par, double *err) {
  int k = *(const int *)par, j;
  double p0 = 1.0, p1 = x;
  *err = 0.0;
  if (k == 0)
    return 1.0;
  for (j = 1; j < k; j++) {
    double p2 = ((2 * j + 1) * x * p1 - j * p0) / (j + 1);
    p0 = p1;
    p1 = p2;
  }
  return p1;
}

/*
** The nested (Patterson) sequences of base/quad.c, run to their last rule
** by bl_gk_panel (npt = -points), integrate the Legendre polynomials P_k
** (|P_k| <= 1, integral 2 for k = 0, else 0) exactly up to the degree and
** not beyond (Patterson 1968: an extension of a symmetric rule of n points
** and degree D by n + 1 points has degree D + 2 (n + 1), odd: 15, 31, 63
** points from 3 -> 7: 23, 47, 95; 43, 87 from 10 -> 21: 65, 131), and d
** against the rule before it vanishes up to that rule's degree (11, 23,
** 47; 31, 65) and not above.  (Monomials are no test up there: x^132 is
** integrated to 1e-17 by any rule of 87 points.)
*/
Test(quad, nested_degrees) {
  static const int npt[5] = {-15, -31, -63, -43, -87},
                   deg[5] = {23, 47, 95, 65, 131},
                   pdeg[5] = {11, 23, 47, 31, 65};
  int r, k;
  for (r = 0; r < 5; r++) {
    for (k = 0; k <= deg[r] + 1; k++) {
      bl_gkpanel p;
      double e;
      bl_gk_panel(legk, &k, -1.0, 1.0, npt[r], &p);
      e = fabs(p.val - (k == 0 ? 2.0 : 0.0));
      if (k <= deg[r])
        cr_expect(e < 1e-14, "%d points, P_%d: error %g", -npt[r], k, e);
      else
        cr_expect(e > 1e-11, "%d points exact for P_%d: %g (degree %d?)",
                  -npt[r], k, e, deg[r]);
      if (k <= pdeg[r])
        cr_expect(p.d < 1e-13, "%d points, P_%d: d = %g", -npt[r], k, p.d);
      else if (k == pdeg[r] + 1)
        cr_expect(p.d > 1e-6, "%d points, previous rule exact for P_%d",
                  -npt[r], k);
      cr_expect(p.fx == NULL, "%d points: fx left set", -npt[r]);
    }
  }
}

/*
** The nested rules in bl_gk_adapt against the fixed ones: an integrand
** with a peak of width 1e-3 inside [0, 1] (exact value from the
** antiderivative atan), to rtol 1e-8, meets it with both, and the
** reported error bounds the true one.
*/
static double lorentz (double x, void *par, double *err) {
  (void)par;
  *err = 0.0;
  return 1e-3 / ((x - 0.3) * (x - 0.3) + 1e-6);
}

Test(quad, nested_adapt) {
  static const int npt[4] = {21, -31, -63, -87};
  double exact = atan(0.7 / 1e-3) + atan(0.3 / 1e-3);
  bl_quad *q = bl_quad_alloc(200);
  int r;
  cr_assert(q != NULL);
  for (r = 0; r < 4; r++) {
    double v, e;
    int st = bl_gk_adapt(lorentz, NULL, 0.0, 1.0, 0.0, 1e-8, 200, npt[r],
                         q->pan[0], &v, &e);
    cr_expect(st == 0, "npt %d: status %d", npt[r], st);
    cr_expect(fabs(v - exact) <= 1e-8 * exact, "npt %d: %.17g against "
              "%.17g", npt[r], v, exact);
    cr_expect(fabs(v - exact) <= e, "npt %d: error %g, true %g", npt[r], e,
              fabs(v - exact));
  }
  bl_quad_free(q);
}
