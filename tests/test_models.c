/*
** test_models.c -- the models room: the registry of screening models, the
** Thomas-Fermi and Hartree-Fock models against their sources, and their
** cross sections side by side
** See Copyright Notice in LICENSE
**
** Suites: models, screening, models_dsdk.
*/

#include <ctype.h>
#include <math.h>
#include <stdio.h>
#include <string.h>
#include <strings.h>

#include <criterion/criterion.h>
#include <criterion/new/assert.h>
#include <gsl/gsl_errno.h>
#include <gsl/gsl_integration.h>
#include <xraylib.h>

#include "brakelight.h"
#include "testutil.h"

/* ==================================================================
** the registry of screening models
**
** One loop over bl_models[] checks what every model must provide (unique
** ids and names, references, finite form factors, a Yukawa form consistent
** with the form factor); then model-specific checks name their source.
** (formerly tests/test_models.c)
*/

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
** have F(0)/Z = 1 (F(0) = Z counts the atom's electrons) and F -> 0 at
** large q (F(inf) = 0); "none" is F = 0 (the bare nucleus of Bethe & Heitler 1934).
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


/* ==================================================================
** the Thomas-Fermi and Hartree-Fock screening models
**
** The generic checks every model passes are in test_models.c.  Here: the
** models against their sources.  Complete-screening constants are computed
** by numerical quadrature (GSL qag in ln q) of the Yukawa forms the models
** hand to the core, never by the closed forms the models use, with q in
** units of m_e c (an electron projectile, delta -> 0):
**   L  = 1 + int_0^1 (1 - F/Z)^2 dq/q,   L' = 1 + int_0^1 S/Z dq/q.
** The Hartree-Fock fits are compared with the xraylib library present
** (FF_Rayl, SF_Compt), so a table regenerated from another library version
** or a stale src/core/models/hf_table.c fails here.
** (formerly tests/test_screening.c)
*/

TestSuite(screening, .init = setup);

/* x = sin(theta/2)/lambda [1/A] per q [MeV]: x = q / (4 pi hbar c). */
#define X_PER_MEV (1.0 / (4.0 * BL_PI * BL_HBARC_MEVFM * 1e-5))

/*
** Stated accuracy of the Hartree-Fock fits over the fitted range
** x = 1e-3 ... 100 1/A (the header of src/core/models/hf_table.c gives the measured
** worst cases; these bounds round them up).
*/
#define HF_XMIN      1e-3
#define HF_XMAX      100.0
#define HF_F_WORST   1.9e-2    /* max |F_fit - F_table| / Z (1.81e-2) */
#define HF_S_WORST   1.85e-2   /* max |S_fit - S_table| / Z (1.77e-2) */
#define HF_L_WORST   2.5e-3    /* L, L' of fit and table (2.0e-3, 2.2e-3) */
#define HF_ZTAB      98        /* last element xraylib tabulates */

static const bl_model *model (const char *name) {
  const bl_model *m = bl_model_find(name);
  cr_assert(m != NULL, "screening model '%s' missing", name);
  return m;
}


/* ------------------------------------------------------------ quadrature */

/* Integrand in t = ln q (q in m_e c): (1 - F/Z)^2 (elastic) or S/Z. */
typedef struct yk {
  const bl_yukawa *y;
  int squared;
} yk;

static double yk_integrand (double t, void *par) {
  const yk *k = par;
  double q = exp(t) * BL_ME_MEV, s = 0.0;   /* MeV */
  int i;
  for (i = 0; i < k->y->n; i++)
    s += k->y->alpha[i] * q * q / (k->y->b[i] * k->y->b[i] + q * q);
  return k->squared ? s * s : s;
}


/*
** 1 + int_0^1 g dq/q for g = the Yukawa sum (squared or not), q in m_e c:
** adaptive Gauss-Kronrod in ln q from 1e-9 times the smallest momentum
** (g ~ q^2 or q^4 below it: the rest is < 1e-17) up to q = 1, split at
** every ln b_i.
*/
static double constant (const bl_yukawa *y, int squared) {
  gsl_integration_workspace *w = gsl_integration_workspace_alloc(1000);
  double pts[BL_YUKAWA_MAX + 2], bmin = HUGE_VAL, sum = 0.0;
  gsl_function f;
  yk k;
  int i, n = 0, j;
  k.y = y;
  k.squared = squared;
  f.function = yk_integrand;
  f.params = &k;
  for (i = 0; i < y->n; i++)
    if (y->b[i] < bmin)
      bmin = y->b[i];
  pts[n++] = log(1e-9 * bmin / BL_ME_MEV);
  for (i = 0; i < y->n; i++) {
    double t = log(y->b[i] / BL_ME_MEV);
    if (t > pts[0] && t < 0.0)
      pts[n++] = t;
  }
  pts[n++] = 0.0;
  for (i = 1; i < n; i++)          /* sort the break points */
    for (j = i; j > 0 && pts[j] < pts[j - 1]; j--) {
      double t = pts[j]; pts[j] = pts[j - 1]; pts[j - 1] = t;
    }
  for (i = 0; i + 1 < n; i++) {
    double r, e;
    int st = gsl_integration_qag(&f, pts[i], pts[i + 1], 1e-14, 1e-13, 1000,
                                 GSL_INTEG_GAUSS61, w, &r, &e);
    cr_assert(st == GSL_SUCCESS, "qag: %s", gsl_strerror(st));
    sum += r;
  }
  gsl_integration_workspace_free(w);
  return 1.0 + sum;
}


static double lrad_of (const bl_model *m, int Z) {
  bl_yukawa y;
  cr_assert(m->yukawa(Z, NULL, &y) == BL_SUCCESS, "%s: yukawa(%d)", m->name,
            Z);
  return constant(&y, 1);
}


static double lradp_of (const bl_model *m, int Z) {
  bl_yukawa y;
  cr_assert(m->incoherent != NULL, "%s: no electron field", m->name);
  cr_assert(m->incoherent(Z, NULL, &y) == BL_SUCCESS, "%s: incoherent(%d)",
            m->name, Z);
  return constant(&y, 0);
}


/* Quadrature check: a single Yukawa term b = m_e c has L' = 1 + ln(2)/2
** (int_0^1 q/(1 + q^2) dq) and L = 1 + (ln 2 - 1/2)/2 (exact). */
Test(screening, quadrature_closed_forms) {
  bl_yukawa y;
  y.n = 1;
  y.alpha[0] = 1.0;
  y.b[0] = BL_ME_MEV;
  EXPECT_REL(constant(&y, 0), 1.0 + 0.5 * log(2.0), 1e-13, "L' of b = 1");
  EXPECT_REL(constant(&y, 1), 1.0 + 0.5 * (log(2.0) - 0.5), 1e-13,
             "L of b = 1");
}


/* --------------------------------------------------------- Thomas-Fermi */

/*
** Moliere's fit (Moliere 1947, Z. Naturforsch. 2a, 133): F/Z = sum alpha_i
** b_i^2/(b_i^2 + q^2), alpha = (0.10, 0.55, 0.35), b_i = beta_i hbar c /
** a_TF, beta = (6.0, 1.20, 0.30), a_TF = 0.88534 a_B Z^-1/3.  Same closed
** form evaluated here: 1e-12 relative; the Yukawa terms are these, with
** positive weights.
*/
Test(screening, thomas_fermi_is_moliere) {
  static const double al[3] = {0.10, 0.55, 0.35}, be[3] = {6.0, 1.20, 0.30};
  static const double qs[] = {1e-5, 1e-3, 1e-2, 0.1, 1.0};
  const bl_model *m = model("thomas-fermi");
  int Z, i;
  size_t k;
  for (Z = 1; Z <= BL_ZMAX; Z++) {
    double a = 0.88534 * BL_BOHR_FM * pow(Z, -1.0 / 3.0);   /* fm */
    bl_yukawa y;
    for (k = 0; k < sizeof qs / sizeof qs[0]; k++) {
      double want = 0.0;
      for (i = 0; i < 3; i++) {
        double b = be[i] * BL_HBARC_MEVFM / a;
        want += al[i] * b * b / (b * b + qs[k] * qs[k]);
      }
      EXPECT_REL(m->form_factor(qs[k], Z, NULL), want, 1e-12,
                 "Z=%d q=%g MeV", Z, qs[k]);
    }
    cr_assert(m->yukawa(Z, NULL, &y) == BL_SUCCESS);
    cr_expect(y.n == 3, "Z=%d: %d terms", Z, y.n);
    for (i = 0; i < 3; i++) {
      cr_expect(y.alpha[i] == al[i], "Z=%d alpha_%d = %g", Z, i, y.alpha[i]);
      EXPECT_REL(y.b[i], be[i] * BL_HBARC_MEVFM / a, 1e-13, "Z=%d b_%d", Z,
                 i);
    }
  }
}


/*
** Elastic complete-screening constant of Moliere's fit against Tsai's
** L_rad = ln(184.15 Z^-1/3) (Tsai 1974, Rev. Mod. Phys. 46, 815, the
** Thomas-Fermi value) for Z = 6..92.  a first measurement gave 0.25 %;
** our quadrature (and an independent SciPy one) gives 0.096 % at Z = 6
** rising to 0.254 % at Z = 92, so that figure was rounded:
** tolerance 0.26 %.
*/
Test(screening, thomas_fermi_lrad_is_tsai) {
  const bl_model *m = model("thomas-fermi");
  int Z;
  for (Z = 6; Z <= 92; Z++)
    EXPECT_REL(lrad_of(m, Z), log(184.15 * pow(Z, -1.0 / 3.0)), 2.6e-3,
               "thomas-fermi L_rad, Z=%d", Z);
}


/*
** The electron field is matched to Tsai's L'_rad (bl_lrad_prime: Tsai 1974,
** ln(1194 Z^-2/3) for Z >= 5, his values 6.144, 5.621, 5.805, 5.924 for
** Z = 1..4).  The model solves for the radius in closed form; here the
** constant comes from quadrature of the Yukawa form it returns: 1e-9
** absolute, Z = 1..100.  The shape is Moliere's: his weights, momenta in
** his ratios.
*/
Test(screening, thomas_fermi_electrons_match_tsai) {
  static const double al[3] = {0.10, 0.55, 0.35}, be[3] = {6.0, 1.20, 0.30};
  const bl_model *m = model("thomas-fermi");
  int Z, i;
  for (Z = 1; Z <= BL_ZMAX; Z++) {
    bl_yukawa y;
    double got = lradp_of(m, Z), want = bl_lrad_prime(Z);
    cr_expect(fabs(got - want) <= 1e-9, "Z=%d: L' %.12f, Tsai %.12f", Z, got,
              want);
    cr_assert(m->incoherent(Z, NULL, &y) == BL_SUCCESS);
    cr_expect(y.n == 3);
    for (i = 0; i < 3; i++) {
      cr_expect(y.alpha[i] == al[i], "Z=%d alpha_%d", Z, i);
      EXPECT_REL(y.b[i] / y.b[0], be[i] / be[0], 1e-14, "Z=%d b_%d/b_0", Z, i);
    }
  }
  /* Tsai's explicit hydrogen value, not through bl_lrad_prime */
  cr_expect(fabs(lradp_of(m, 1) - 6.144) <= 1e-9, "H: L' = %.12f",
            lradp_of(m, 1));
}


/*
** The inelastic screening radius shrinks like Z^(-2/3) (the reason for
** not using S = Z [1 - (F/Z)^2], src/core/models/thomas_fermi.c): from Z = 10 to 90 the
** momentum grows by 9^(2/3) = 4.33 in the large-A limit, where
** L' = 1 + ln A - sum alpha ln beta; the exact ratio differs by the
** finite-A terms, ~1 %.  Tolerance 3 %.
*/
Test(screening, thomas_fermi_electron_radius_scaling) {
  const bl_model *m = model("thomas-fermi");
  bl_yukawa y10, y90;
  cr_assert(m->incoherent(10, NULL, &y10) == BL_SUCCESS);
  cr_assert(m->incoherent(90, NULL, &y90) == BL_SUCCESS);
  EXPECT_REL(y90.b[0] / y10.b[0], pow(9.0, 2.0 / 3.0), 3e-2,
             "b(90)/b(10)");
}


/* --------------------------------------------------------- Hartree-Fock */

/* F/Z and S/Z of the fits at q (MeV). */
static double hf_f (const bl_model *m, int Z, double q) {
  return m->form_factor(q, Z, NULL);
}

static double hf_s (const bl_model *m, int Z, double q) {
  bl_yukawa y;
  double s = 0.0;
  int i;
  cr_assert(m->incoherent(Z, NULL, &y) == BL_SUCCESS);
  for (i = 0; i < y.n; i++)
    s += y.alpha[i] * q * q / (y.b[i] * y.b[i] + q * q);
  return s;
}

/* xraylib's table per electron at x (1/A); NaN where it refuses. */
static double xrl_table (int S, int Z, double x) {
  xrl_error *err = NULL;
  double v = S ? SF_Compt(Z, x, &err) : FF_Rayl(Z, x, &err);
  if (err != NULL) {
    xrl_error_free(err);
    return NAN;
  }
  return v / Z;
}


/*
** The generated fits against the xraylib library present: for every
** tabulated element, at 100 points per decade of x in [1e-3, 100] 1/A
** placed between the generator's fit points, |fit - table| / Z stays
** within the worst case stated above (source: xraylib's FF_Rayl and
** SF_Compt, i.e. the tables the fits were made from).
*/
Test(screening, hartree_fock_matches_xraylib) {
  const bl_model *m = model("hartree-fock");
  double wf = 0.0, ws = 0.0;
  int Z, j, zf = 0, zs = 0, n = 0;
  for (Z = 1; Z <= HF_ZTAB; Z++)
    for (j = 0; j < 500; j++) {
      double x = HF_XMIN * pow(10.0, (j + 0.37) / 100.0), q = x / X_PER_MEV;
      double tf = xrl_table(0, Z, x), ts = xrl_table(1, Z, x);
      double df = fabs(hf_f(m, Z, q) - tf), ds = fabs(hf_s(m, Z, q) - ts);
      cr_assert(isfinite(tf) && isfinite(ts), "xraylib refuses Z=%d x=%g",
                Z, x);
      if (df > wf) { wf = df; zf = Z; }
      if (ds > ws) { ws = ds; zs = Z; }
      n++;
    }
  cr_expect(wf <= HF_F_WORST, "max |F_fit - F_table|/Z = %.3e (Z=%d) > %.1e",
            wf, zf, HF_F_WORST);
  cr_expect(ws <= HF_S_WORST, "max |S_fit - S_table|/Z = %.3e (Z=%d) > %.1e",
            ws, zs, HF_S_WORST);
  cr_log_info("hartree-fock vs xraylib (%d points): F %.2e (Z=%d), "
              "S %.2e (Z=%d)", n, wf, zf, ws, zs);
}


/*
** Every fit is a valid screening function for all momenta (the generator
** rejects others): on q = 1e-8 ... 1e3 MeV, 40 points per decade,
** 0 <= F/Z <= 1 non-increasing and 0 <= S/Z <= 1 non-decreasing (slack
** 1e-13 for rounding); the terms: sum alpha = 1 (1e-12), sum |alpha| <= 10,
** b > 0 and b_{i+1}/b_i >= 1.1 (documented in src/core/models/hf_table.c and
** scripts/fit-hf.c), for Z = 1..100 and both sums.
*/
Test(screening, hartree_fock_fits_are_valid) {
  const bl_model *m = model("hartree-fock");
  int Z, j, i, k;
  for (Z = 1; Z <= BL_ZMAX; Z++) {
    double pf = 1.0 + 1e-13, ps = -1e-13;
    for (k = 0; k < 2; k++) {
      bl_yukawa y;
      double sa = 0.0, aa = 0.0;
      int st = k ? m->incoherent(Z, NULL, &y) : m->yukawa(Z, NULL, &y);
      cr_assert(st == BL_SUCCESS && y.n >= 1 && y.n <= BL_YUKAWA_MAX);
      for (i = 0; i < y.n; i++) {
        sa += y.alpha[i];
        aa += fabs(y.alpha[i]);
        cr_expect(y.b[i] > 0.0 && isfinite(y.b[i]), "Z=%d b_%d", Z, i);
        if (i > 0)
          cr_expect(y.b[i] >= 1.1 * y.b[i - 1] * (1.0 - 1e-12),
                    "Z=%d %s: b_%d/b_%d = %g", Z, k ? "S" : "F", i, i - 1,
                    y.b[i] / y.b[i - 1]);
      }
      cr_expect(fabs(sa - 1.0) <= 1e-12, "Z=%d: sum alpha %.15g", Z, sa);
      cr_expect(aa <= 10.0 + 1e-12, "Z=%d: sum |alpha| %g", Z, aa);
    }
    for (j = 0; j <= 440; j++) {
      double q = 1e-8 * pow(10.0, j / 40.0);
      double f = hf_f(m, Z, q), s = hf_s(m, Z, q);
      cr_expect(f >= -1e-13 && f <= 1.0 + 1e-13 && f <= pf + 1e-13,
                "Z=%d q=%g: F/Z %.15g after %.15g", Z, q, f, pf);
      cr_expect(s >= -1e-13 && s <= 1.0 + 1e-13 && s >= ps - 1e-13,
                "Z=%d q=%g: S/Z %.15g after %.15g", Z, q, s, ps);
      pf = f;
      ps = s;
    }
  }
}


/*
** Hydrogen and helium: the fits reproduce Tsai's constants from exact and
** Hartree-Fock wave functions (Tsai 1974): L_rad 5.31, L'_rad 6.144 (H),
** 4.79, 5.621 (He).  The tables themselves give 5.310, 6.144, 4.793, 5.606
** (measured by quadrature of xraylib's tables; our generator: 5.3104, 6.1437, 4.7931, 5.6056),
** helium's L' 0.27 % below Tsai's; tolerance 0.5 % for each.
*/
Test(screening, hartree_fock_h_he_are_tsai) {
  const bl_model *m = model("hartree-fock");
  EXPECT_REL(lrad_of(m, 1), 5.31, 5e-3, "H L_rad");
  EXPECT_REL(lradp_of(m, 1), 6.144, 5e-3, "H L'_rad");
  EXPECT_REL(lrad_of(m, 2), 4.79, 5e-3, "He L_rad");
  EXPECT_REL(lradp_of(m, 2), 5.621, 5e-3, "He L'_rad");
}


/*
** The complete-screening constants of fit and table agree to the stated
** HF_L_WORST for every tabulated element.  The table's constants come from
** adaptive quadrature of xraylib's FF_Rayl, SF_Compt in ln x up to
** q = m_e c (x = 20.6 1/A), plus the part below x = 1e-3 (where SF_Compt
** starts) from the small-q laws (1 - F/Z)^2 ~ q^4, S/Z ~ q^2.  (The same
** quantities as the generator's, by a different rule: adaptive 21-point
** Gauss-Kronrod here, composite Simpson there.)
*/
typedef struct tabpar {
  int Z, S;
} tabpar;

static double tab_integrand (double t, void *par) {
  const tabpar *tp = par;
  double v = xrl_table(tp->S, tp->Z, exp(t));
  return tp->S ? v : (1.0 - v) * (1.0 - v);
}

static double table_constant (int Z, int S) {
  gsl_integration_workspace *w = gsl_integration_workspace_alloc(2000);
  double x0 = HF_XMIN, xe = BL_ME_MEV * X_PER_MEV, r, e, g0;
  tabpar tp;
  gsl_function f;
  int st;
  tp.Z = Z;
  tp.S = S;
  f.function = tab_integrand;
  f.params = &tp;
  st = gsl_integration_qag(&f, log(x0), log(xe), 1e-10, 1e-8, 2000,
                           GSL_INTEG_GAUSS21, w, &r, &e);
  gsl_integration_workspace_free(w);
  /* the spline's kinks can stop qag with a round-off report; its estimate
  ** stands if its error (<= 1e-4) is small against HF_L_WORST */
  cr_assert(st == GSL_SUCCESS || (st == GSL_EROUND && e <= 1e-4 * r),
            "qag on xraylib Z=%d: %s (%g +- %g)", Z, gsl_strerror(st), r, e);
  g0 = tab_integrand(log(x0), &tp);
  return 1.0 + r + g0 / (S ? 2.0 : 4.0);
}

Test(screening, hartree_fock_constants_match_xraylib) {
  const bl_model *m = model("hartree-fock");
  int Z;
  /* the measured table values for H and He, as a check of the
  ** table quadrature itself: 5.310, 6.144, 4.793, 5.606 (to 1e-3) */
  cr_expect(fabs(table_constant(1, 0) - 5.310) <= 1e-3);
  cr_expect(fabs(table_constant(1, 1) - 6.144) <= 1e-3);
  cr_expect(fabs(table_constant(2, 0) - 4.793) <= 1e-3);
  cr_expect(fabs(table_constant(2, 1) - 5.606) <= 1e-3);
  for (Z = 1; Z <= HF_ZTAB; Z++) {
    EXPECT_REL(lrad_of(m, Z), table_constant(Z, 0), HF_L_WORST,
               "L of fit vs xraylib, Z=%d", Z);
    EXPECT_REL(lradp_of(m, Z), table_constant(Z, 1), HF_L_WORST,
               "L' of fit vs xraylib, Z=%d", Z);
  }
}


/*
** Against Tsai's Thomas-Fermi constants (Tsai 1974: ln(184.15 Z^-1/3),
** ln(1194 Z^-2/3)), which the tables approach as Z grows and lie below for
** Z >= 5.  a first measurement put the tables within 1.5 % (L_rad, Z >= 6) and
** 8 % (L'_rad, light elements); our quadrature of the same tables gives
** larger largest departures, both at neon: L_rad -1.83 %, L'_rad -9.1 %
** (Z = 6..20), and -1.13 %, -4.75 % for Z = 21..98.  The fits move these
** by up to 0.2 %.  Bounds, measured on the fits (-2.00 %, -9.19 %,
** -1.03 %, -4.80 %) and rounded up:
*/
#define HF_LRAD_LT   2.2e-2   /* L_rad,  Z = 6..20 */
#define HF_LRAD_HV   1.2e-2   /* L_rad,  Z = 21..100 */
#define HF_LRADP_LT  9.5e-2   /* L'_rad, Z = 5..20 */
#define HF_LRADP_HV  5.0e-2   /* L'_rad, Z = 21..100 */

Test(screening, hartree_fock_near_thomas_fermi) {
  const bl_model *m = model("hartree-fock");
  int Z;
  for (Z = 6; Z <= BL_ZMAX; Z++)
    EXPECT_REL(lrad_of(m, Z), log(184.15 * pow(Z, -1.0 / 3.0)),
               Z <= 20 ? HF_LRAD_LT : HF_LRAD_HV,
               "hartree-fock L_rad, Z=%d", Z);
  for (Z = 5; Z <= BL_ZMAX; Z++)
    EXPECT_REL(lradp_of(m, Z), log(1194.0 * pow(Z, -2.0 / 3.0)),
               Z <= 20 ? HF_LRADP_LT : HF_LRADP_HV,
               "hartree-fock L'_rad, Z=%d", Z);
}


/*
** Beyond the tables (Z = 99, 100) the fits are Z = 98's with the momenta
** scaled by (Z/98)^(1/3) (F) and (Z/98)^(2/3) (S), the Thomas-Fermi
** scalings behind Tsai's L_rad and L'_rad (src/core/models/hf_table.c): same
** weights, momenta in that ratio (1e-14).
*/
Test(screening, hartree_fock_beyond_tables) {
  const bl_model *m = model("hartree-fock");
  bl_yukawa f98, s98, f, s;
  int Z, i;
  cr_assert(m->yukawa(98, NULL, &f98) == BL_SUCCESS);
  cr_assert(m->incoherent(98, NULL, &s98) == BL_SUCCESS);
  for (Z = 99; Z <= 100; Z++) {
    cr_assert(m->yukawa(Z, NULL, &f) == BL_SUCCESS);
    cr_assert(m->incoherent(Z, NULL, &s) == BL_SUCCESS);
    cr_assert(f.n == f98.n && s.n == s98.n);
    for (i = 0; i < f.n; i++) {
      cr_expect(f.alpha[i] == f98.alpha[i], "Z=%d F alpha_%d", Z, i);
      EXPECT_REL(f.b[i] / f98.b[i], cbrt(Z / 98.0), 1e-14, "Z=%d F b_%d", Z,
                 i);
    }
    for (i = 0; i < s.n; i++) {
      cr_expect(s.alpha[i] == s98.alpha[i], "Z=%d S alpha_%d", Z, i);
      EXPECT_REL(s.b[i] / s98.b[i], pow(Z / 98.0, 2.0 / 3.0), 1e-14,
                 "Z=%d S b_%d", Z, i);
    }
  }
}


/* Both models refuse elements outside 1..100 for both fields. */
Test(screening, domain) {
  static const char *names[] = {"thomas-fermi", "hartree-fock"};
  size_t i;
  for (i = 0; i < 2; i++) {
    const bl_model *m = model(names[i]);
    bl_yukawa y;
    cr_expect(m->yukawa(0, NULL, &y) == BL_EDOMAIN, "%s yukawa(0)", names[i]);
    cr_expect(m->yukawa(101, NULL, &y) == BL_EDOMAIN, "%s yukawa(101)",
              names[i]);
    cr_expect(m->incoherent(0, NULL, &y) == BL_EDOMAIN, "%s incoherent(0)",
              names[i]);
    cr_expect(m->incoherent(101, NULL, &y) == BL_EDOMAIN,
              "%s incoherent(101)", names[i]);
  }
}


/* ==================================================================
** Hartree-Fock against Thomas-Fermi in dsigma/dk (moved from the
** real-atoms suite)
** (formerly tests/test_target.c)
*/

TestSuite(models_dsdk, .init = setup);

/* Hartree-Fock against Thomas-Fermi (the README table).  Bound 3 %: the
** models' complete-screening constants differ by up to 1.8 % in L_rad and
** 9 % in L'_rad (xraylib's atoms against Tsai's values, measured in
** the screening suite above), the latter weighted by about 1/(Z + 1) in
** dsigma/dk; at partial screening the spread is smaller.  Measured: at
** most 1.27 % (C, 100 MeV, y = 0.1). */
Test(models_dsdk, hartree_fock_near_thomas_fermi, .timeout = 120) {
  static const int Zs[] = {6, 29, 82};
  static const double Ts[] = {1.0, 10.0, 100.0}, ys[] = {0.1, 0.5, 0.9};
  size_t i, j, l;
  for (i = 0; i < 3; i++)
    for (j = 0; j < 3; j++)
      for (l = 0; l < 3; l++) {
        double hf = dsdk_opts("electron", Zs[i], "hartree-fock", Ts[j], ys[l],
                         &bl_opts_default, 1e-5, NULL);
        double tf = dsdk_opts("electron", Zs[i], "thomas-fermi", Ts[j], ys[l],
                         &bl_opts_default, 1e-5, NULL);
        EXPECT_REL(hf, tf, 0.03, "HF vs TF, Z=%d T=%g y=%g", Zs[i], Ts[j],
                   ys[l]);
      }
}
