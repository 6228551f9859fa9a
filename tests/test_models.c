/*
** test_models.c -- the registry of screening models
** See Copyright Notice in LICENSE
**
** One loop over bl_models[] checks what every model must provide (unique
** ids and names, references, finite form factors, a Yukawa form consistent
** with the form factor); then model-specific checks name their source.
*/
#include <ctype.h>
#include <math.h>
#include <stdio.h>
#include <string.h>
#include <strings.h>

#include <criterion/criterion.h>
#include <criterion/new/assert.h>
#include <gsl/gsl_errno.h>

#include "brakelight.h"
#include "testutil.h"

TestSuite(models, .init = setup);

/* Sample atomic numbers and momentum transfers (MeV) for every model:
** q from far below the atomic scale (m_e Z^1/3/111 ~ 5e-3 MeV for Pb) to far
** above it. */
static const int Zs[] = { 1, 2, 6, 13, 29, 50, 82, 92, 100 };
static const double qs[] = { 1e-7, 1e-5, 1e-4, 1e-3, 3e-3, 1e-2, 0.1, 1.0,
                             10.0, 1e3 };
#define NZ (sizeof Zs / sizeof Zs[0])
#define NQ (sizeof qs / sizeof qs[0])

static int nmodels (void) {
  int n = 0;
  while (bl_models[n] != NULL)
    n++;
  return n;
}

/* Default parameters of m in a buffer large enough for any model. */
static void defaults (const bl_model *m, double *p) {
  cr_assert(m->nparams >= 0 && m->nparams <= 8,
            "model '%s' has %d parameters (bl_case holds 8)", m->name,
            m->nparams);
  bl_model_defaults(m, p);
}


/* Registry shape: non-empty, ids unique and in increasing order (bl_models.h:
** "in id order"), names unique, lowercase and non-empty. */
Test(models, ids_and_names) {
  int n = nmodels(), i, j;
  cr_assert(n >= 2, "registry holds %d models; none and exponential expected",
            n);
  for (i = 0; i < n; i++) {
    const bl_model *m = bl_models[i];
    const char *c;
    cr_expect(m->name != NULL && m->name[0] != '\0', "model #%d has no name", i);
    for (c = m->name; *c; c++) {
      int upper = isupper((unsigned char) *c) != 0;
      cr_expect(upper == 0, "name '%s' not lowercase", m->name);
    }
    cr_expect(m->description != NULL && m->description[0] != '\0',
              "model '%s' has no description", m->name);
    if (i > 0)
      cr_expect(m->id > bl_models[i - 1]->id, "ids not increasing: %d after %d",
                m->id, bl_models[i - 1]->id);
    for (j = 0; j < i; j++) {
      cr_expect(m->id != bl_models[j]->id, "duplicate id %d", m->id);
      cr_expect(strcasecmp(m->name, bl_models[j]->name) != 0,
                "duplicate name '%s'", m->name);
    }
  }
  /* the stable ids of bl_models.h */
  cr_expect(bl_model_get(BL_MODEL_NONE) != NULL
            && strcmp(bl_model_get(BL_MODEL_NONE)->name, "none") == 0,
            "BL_MODEL_NONE is not 'none'");
  cr_expect(bl_model_get(BL_MODEL_EXPONENTIAL) != NULL
            && strcmp(bl_model_get(BL_MODEL_EXPONENTIAL)->name,
                      "exponential") == 0,
            "BL_MODEL_EXPONENTIAL is not 'exponential'");
}


/* Every model cites at least one reference with key and citation (style.md,
** habit 8: "A test fails if any model lacks a reference"); the list is
** NULL-padded; parameters are documented. */
Test(models, references_and_parameters) {
  int n = nmodels(), i, j;
  for (i = 0; i < n; i++) {
    const bl_model *m = bl_models[i];
    int nref = 0, seen_null = 0;
    for (j = 0; j < BL_MAX_REFS; j++) {
      const bl_ref *r = m->refs[j];
      if (r == NULL) {
        seen_null = 1;
        continue;
      }
      cr_expect(seen_null == 0, "model '%s': reference after a NULL", m->name);
      cr_expect(r->key != NULL && r->key[0] != '\0', "model '%s': ref #%d key",
                m->name, j);
      cr_expect(r->citation != NULL && r->citation[0] != '\0',
                "model '%s': ref #%d has an empty citation", m->name, j);
      nref++;
    }
    cr_expect(nref >= 1, "model '%s' has no reference", m->name);
    cr_expect(m->nparams == 0 || m->params != NULL,
              "model '%s': %d params but no table", m->name, m->nparams);
    for (j = 0; j < m->nparams; j++) {
      const bl_param *p = &m->params[j];
      cr_expect(p->name != NULL && p->name[0] != '\0'
                && p->description != NULL && p->unit != NULL
                && isfinite(p->value),
                "model '%s': parameter #%d incomplete", m->name, j);
    }
    cr_expect(m->form_factor != NULL && m->yukawa != NULL,
              "model '%s' lacks a kernel", m->name);
  }
}


/* Look-ups: by name case-insensitively (bl_models.h), by id, NULL when
** unknown. */
Test(models, lookup) {
  int n = nmodels(), i;
  for (i = 0; i < n; i++) {
    const bl_model *m = bl_models[i];
    char up[64];
    size_t j;
    cr_expect(bl_model_find(m->name) == m, "find('%s')", m->name);
    cr_expect(bl_model_get(m->id) == m, "get(%d)", m->id);
    for (j = 0; m->name[j] && j < sizeof up - 1; j++)
      up[j] = (char) toupper((unsigned char) m->name[j]);
    up[j] = '\0';
    cr_expect(bl_model_find(up) == m, "find('%s') should find '%s'", up,
              m->name);
    if (m->name[0]) {   /* mixed case: first letter upper */
      char mix[64];
      snprintf(mix, sizeof mix, "%s", m->name);
      mix[0] = (char) toupper((unsigned char) mix[0]);
      cr_expect(bl_model_find(mix) == m, "find('%s')", mix);
    }
  }
  cr_expect(bl_model_find("no-such-model") == NULL, "unknown name");
  cr_expect(bl_model_find("") == NULL, "empty name");
  cr_expect(bl_model_find("exponentia") == NULL, "prefix only");
  cr_expect(bl_model_find("exponential ") == NULL, "trailing blank");
  cr_expect(bl_model_find(NULL) == NULL, "NULL name");
  cr_expect(bl_model_get(0) == NULL, "id 0");
  cr_expect(bl_model_get(-1) == NULL, "id -1");
  cr_expect(bl_model_get(99999) == NULL, "id 99999");
}


/*
** Form factors: finite, 0 <= F/Z <= 1, non-increasing in q; screened models
** have F(0)/Z = 1 (the atom's charge, physics.md: F(0) = Z) and F -> 0 at
** large q (F(inf) = 0); "none" is F = 0 (physics.md, screening models).
*/
Test(models, form_factors) {
  int n = nmodels(), i;
  size_t iz, iq;
  for (i = 0; i < n; i++) {
    const bl_model *m = bl_models[i];
    double p[8];
    defaults(m, p);
    for (iz = 0; iz < NZ; iz++) {
      int Z = Zs[iz];
      double prev = m->form_factor(0.0, Z, p);
      if (m->id == BL_MODEL_NONE)
        cr_expect(prev == 0.0, "none: F/Z(0) = %g", prev);
      else
        cr_expect(fabs(prev - 1.0) <= 1e-12, "%s: F/Z(0) = %.15g at Z=%d",
                  m->name, prev, Z);
      for (iq = 0; iq < NQ; iq++) {
        double f = m->form_factor(qs[iq], Z, p);
        cr_expect(isfinite(f) && f >= 0.0 && f <= 1.0,
                  "%s: F/Z(q=%g MeV, Z=%d) = %g", m->name, qs[iq], Z, f);
        cr_expect(f <= prev, "%s: F/Z increases from %g to %g at q=%g, Z=%d",
                  m->name, prev, f, qs[iq], Z);
        if (m->id == BL_MODEL_NONE)
          cr_expect(f == 0.0, "none: F/Z(q=%g) = %g", qs[iq], f);
        prev = f;
      }
      /* q = 1 GeV is 1e5 times the atomic momentum scale */
      cr_expect(m->form_factor(1e3, Z, p) < 1e-6,
                "%s: F/Z(1 GeV, Z=%d) = %g not ~ 0", m->name, Z,
                m->form_factor(1e3, Z, p));
    }
  }
}


/*
** Yukawa form (bl_models.h): 1 - F(q)/Z = sum_i alpha_i q^2/(b_i^2 + q^2)
** with sum_i alpha_i = 1, for every model and element, at every sample q.
** Both sides are closed forms of the same function: tolerance 1e-12
** (absolute on 1 - F/Z, which lies in [0, 1]).  Z outside 1..100 is refused.
*/
Test(models, yukawa_matches_form_factor) {
  int n = nmodels(), i, j;
  size_t iz, iq;
  for (i = 0; i < n; i++) {
    const bl_model *m = bl_models[i];
    double p[8];
    bl_yukawa y;
    defaults(m, p);
    for (iz = 0; iz < NZ; iz++) {
      int Z = Zs[iz], st = m->yukawa(Z, p, &y);
      double sa = 0.0;
      cr_assert(st == BL_SUCCESS, "%s: yukawa(Z=%d) status %d", m->name, Z, st);
      cr_assert(y.n >= 1 && y.n <= BL_YUKAWA_MAX, "%s: %d Yukawa terms",
                m->name, y.n);
      for (j = 0; j < y.n; j++) {
        cr_expect(isfinite(y.alpha[j]) && isfinite(y.b[j]) && y.b[j] >= 0.0,
                  "%s Z=%d term %d: alpha %g b %g", m->name, Z, j, y.alpha[j],
                  y.b[j]);
        sa += y.alpha[j];
      }
      cr_expect(fabs(sa - 1.0) <= 1e-12, "%s Z=%d: sum alpha = %.15g",
                m->name, Z, sa);
      for (iq = 0; iq < NQ; iq++) {
        double q = qs[iq], s = 0.0;
        double want = 1.0 - m->form_factor(q, Z, p);
        for (j = 0; j < y.n; j++)
          s += y.alpha[j] * q * q / (y.b[j] * y.b[j] + q * q);
        cr_expect(fabs(s - want) <= 1e-12,
                  "%s Z=%d q=%g MeV: Yukawa %.15g vs 1 - F/Z %.15g", m->name,
                  Z, q, s, want);
      }
    }
    cr_expect(m->yukawa(0, p, &y) == BL_EDOMAIN, "%s: yukawa(Z=0)", m->name);
    cr_expect(m->yukawa(101, p, &y) == BL_EDOMAIN, "%s: yukawa(Z=101)",
              m->name);
  }
}


/*
** Exponential screening is Schiff's (Schiff 1951; Koch & Motz 1959, 3BS(e)):
** F/Z = 1/(1 + (q a)^2), a = 111 Z^(-1/3) hbar/(m_e c), so with q in MeV
** q a = q * 111 Z^(-1/3) / (m_e c^2).  Closed form: 1e-12.  The Yukawa
** momentum is b = 1/a = m_e Z^(1/3)/111 MeV.
*/
Test(models, exponential_is_schiff) {
  const bl_model *m = bl_model_find("exponential");
  double p[8];
  size_t iz, iq;
  cr_assert(m != NULL, "model 'exponential' missing");
  defaults(m, p);
  for (iz = 0; iz < NZ; iz++) {
    int Z = Zs[iz];
    double a = 111.0 * pow(Z, -1.0 / 3.0) / BL_ME_MEV;   /* 1/MeV */
    bl_yukawa y;
    for (iq = 0; iq < NQ; iq++) {
      double x = qs[iq] * a, want = 1.0 / (1.0 + x * x);
      double got = m->form_factor(qs[iq], Z, p);
      cr_expect(fabs(got - want) <= 1e-12 * want,
                "Z=%d q=%g: F/Z %.15g want %.15g", Z, qs[iq], got, want);
    }
    cr_assert(m->yukawa(Z, p, &y) == BL_SUCCESS);
    cr_expect(y.n == 1 && fabs(y.b[0] * a - 1.0) <= 1e-12,
              "Z=%d: Yukawa n=%d b=%g, want one term with b=%g", Z, y.n,
              y.b[0], 1.0 / a);
  }
}


/* "none": one Yukawa term alpha = 1, b = 0 (bl_models.h: "a point nucleus in
** vacuum is n = 1, alpha = 1, b = 0"). */
Test(models, none_is_point_nucleus) {
  const bl_model *m = bl_model_find("none");
  bl_yukawa y;
  cr_assert(m != NULL, "model 'none' missing");
  cr_assert(m->yukawa(82, NULL, &y) == BL_SUCCESS);
  cr_expect(y.n == 1 && y.alpha[0] == 1.0 && y.b[0] == 0.0,
            "none: n=%d alpha=%g b=%g", y.n, y.alpha[0], y.b[0]);
}
