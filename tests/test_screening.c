/*
** test_screening.c -- the Thomas-Fermi and Hartree-Fock screening models
** See Copyright Notice in LICENSE
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
*/
#include <math.h>
#include <stdio.h>

#include <criterion/criterion.h>
#include <criterion/new/assert.h>
#include <gsl/gsl_errno.h>
#include <gsl/gsl_integration.h>
#include <xraylib.h>

#include "brakelight.h"
#include "testutil.h"

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
** Moliere's fit (Moliere 1947; as quoted in physics.md): F/Z = sum alpha_i
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
** Thomas-Fermi value) for Z = 6..92.  physics.md reports 0.25 % measured;
** our quadrature (and an independent SciPy one) gives 0.096 % at Z = 6
** rising to 0.254 % at Z = 92, so physics.md's figure is rounded:
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
** not using S = Z [1 - (F/Z)^2], physics.md): from Z = 10 to 90 the
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
** (physics.md, measured; our generator: 5.3104, 6.1437, 4.7931, 5.6056),
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
  /* physics.md's measured table values for H and He, as a check of the
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
** Z >= 5.  physics.md reports the tables within 1.5 % (L_rad, Z >= 6) and
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
