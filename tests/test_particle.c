/*
** test_particle.c -- projectile presets, particle checks, constants, elements
** See Copyright Notice in LICENSE
**
** Published values are quoted from memory (marked so); their tolerances
** cover the last quoted digits and small revisions between editions.
*/
#include <math.h>
#include <stdio.h>
#include <string.h>

#include <criterion/criterion.h>
#include <criterion/new/assert.h>
#include <gsl/gsl_errno.h>

#include "brakelight.h"
#include "testutil.h"

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
** quoted digits (1e-9); r_e^2 = 79.407877 mb (physics.md).
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
             "r_e^2 in mb (physics.md)");
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
                              BL_ENOTCONV };
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
