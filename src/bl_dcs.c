/*
** bl_dcs.c -- Born bremsstrahlung cross sections: fully differential, photon
** angular distribution and photon spectrum
** See Copyright Notice in LICENSE
**
** The fully differential first-order Born cross section of a projectile of
** mass m and charge z e in the static field of an atom (units m = 1):
**
**   d3sigma / (dk dOmega_k dOmega_p) = (norm / (4 pi^2)) (p / (p0 k)) W(q^2) B
**
** norm = z^4 Z^2 alpha r0^2, r0 = alpha hbar/(m c); W(q^2) = G(q)/(Z^2 q^4)
** is the target factor as single poles and pole products (targetfactor
** below: screening, nuclear size, atomic electrons); B is the bracket of
** bl_kin.c (Bethe & Heitler 1934 for spin 1/2, its scalar-QED
** analogue for spin 0).  The azimuth phi is integrated in closed form
** (bl_bracket_azimuth); the two polar angles numerically:
**
**   dsigma/dk = norm (p/(p0 k)) (1/pi) int_0^2 dh0 int_0^2 dh Phi(h0, h),
**   Phi = int_0^pi B W dphi,  h0 = 1 - cos(theta0),  h = 1 - cos(theta).
**
** Maps.  E - p cos(theta) = p (h + hc) with hc = 1/(p (E + p)) ~ 1/(2 E^2):
** the integrand varies on the scale hc, so the variable is
** sigma = ln(1 + h/hc), smooth down to theta = 0.  For fixed theta0 the
** integrand has a second, narrow ridge where the transverse momenta balance,
** p sin(theta) = p0 sin(theta0); there q^2 is smallest and the integrand goes
** like (q_z^2 + p^2 cos^2(theta*) (theta - theta*)^2)^(-3/2).  The inner range
** is split at the ridge and each side mapped by sigma = sigma* +- w sinh(u),
** w the ridge width, which turns the peak into a smooth e^(-2u) tail.
** Every piece is integrated with GSL's adaptive Gauss-Kronrod rule (qag);
** the integrand is positive, so per-piece relative tolerance bounds the total.
*/

#include <float.h>
#include <math.h>

#include <gsl/gsl_errno.h>
#include <gsl/gsl_integration.h>

#include "bl_internal.h"
#include "bl_quad_impl.h"

#ifndef INNER_SHARE
#define INNER_SHARE 0.2   /* inner tolerance as a share of the outer one */
#endif
/* Work budget of one dsigma/dk, in integrand calls (about 0.3 s).  Past it
** the inner integrals get a single panel each, so a request the integrator
** cannot resolve in double precision ends in bounded time, flagged
** BL_ENOTCONV, instead of running for minutes.  Normal points use 1e3 to
** 4e4 calls.  (The fuzzing build lowers it, Makefile "fuzz".) */
#ifndef CALL_BUDGET
#define CALL_BUDGET 5000000UL
#endif
/* Absolute tolerance of the later outer pieces, as a share of rtol times
** the value of the earlier ones. */
#define TAIL_SHARE 0.1
/* An inner error is negligible below this share of rtol times the
** largest outer integrand value seen so far (see piece). */
#define NEGL_SHARE 1e-3
#ifndef QAG_KEY
#define QAG_KEY GSL_INTEG_GAUSS21
#endif
#ifndef QAG_KEY_INNER
#define QAG_KEY_INNER QAG_KEY
#endif


/* State of one integration, carried in gsl_function params. */
typedef struct integ {
  const bl_case *c;
  bl_kin kn;
  bl_polar g;
  bl_quad *q;
  double sstar, w, side;    /* inner map: sigma = sstar + side w sinh(u) */
  double last_err;          /* error estimate of the latest inner integral */
  unsigned long calls0;     /* q->calls when this integral began */
  double fpeak;             /* largest outer integrand value so far */
  double inner_err, inner_val;  /* sums of inner errors and values, each
                                ** times the outer Jacobian, over all calls */
  int status;               /* first failure of any integral */
  int nterm;                /* the target factor, Elwert factor applied */
  bl_term term[BL_TERM_MAX];
  double single[BL_POLE_MAX];
} integ;


const bl_opts bl_opts_bare = {0, BL_NUCLEUS_POINT, 0.0, BL_APPLY_OFF,
                               BL_APPLY_OFF};
const bl_opts bl_opts_default = {1, BL_NUCLEUS_UNIFORM, 0.0, BL_APPLY_AUTO,
                                  BL_APPLY_AUTO};


/* Index of pole value x in c->pole, added if new; -1 when full. */
static int addpole (bl_case *c, double x) {
  int i;
  for (i = 0; i < c->npole; i++)
    if (c->pole[i] == x)
      return i;
  if (c->npole == BL_POLE_MAX)
    return -1;
  c->pole[c->npole] = x;
  c->single_el[c->npole] = c->single_e[c->npole] = 0.0;
  return c->npole++;
}


/*
** Add the term coef w(x1) w(x2) of the elastic (el = 1) or electron part.
** Poles far apart (the larger >= SPLIT_RATIO times the smaller) become
** singles, coef (w_i - w_j)/(x_j - x_i): cheaper.  The subtraction loses
** the relative accuracy 1e-16 q^2 / x_j where q^2 >> x_j, so it is done
** only when that stays below 1e-8 up to the largest q^2 of the case,
** (p0 + p + k)^2 < 4 (p0 + 1)^2: in practice, the nuclear poles of a
** light projectile.  Poles closer than that (ratio >= SPLIT_NEAR) are split
** when both are large, pole >= 1e-6 q^2 max: the error is then below
** 1e-10 pole/(pole_j - pole_i); this turns the ten products of the nuclear
** fit into four singles and four squares.
*/
#define SPLIT_RATIO 1e3
#define SPLIT_NEAR  1.5
static int addterm (bl_case *c, int el, double x1, double x2, double coef) {
  double lo = x1 < x2 ? x1 : x2, hi = x1 < x2 ? x2 : x1;
  int i, j;
  bl_term *t;
  i = addpole(c, lo);
  j = addpole(c, hi);
  if (i < 0 || j < 0)
    return BL_EMODEL;
  if ((hi >= SPLIT_RATIO * lo && hi >= 1e-8 * c->qmax2)
      || (hi >= SPLIT_NEAR * lo && lo >= 1e-6 * c->qmax2)) {
    double *s = el ? c->single_el : c->single_e, f = coef / (hi - lo);
    s[i] += f;
    s[j] -= f;
    return BL_SUCCESS;
  }
  if (c->nterm == BL_TERM_MAX)
    return BL_EMODEL;
  t = &c->term[c->nterm++];
  t->i = i;
  t->j = j;
  t->c = coef;
  return BL_SUCCESS;
}


/*
** The target factor W = G / (Z^2 q^4) as terms c w_i w_j (units m = 1):
**   elastic:   ((Z F_N - F) / (Z q^2))^2 = (sum_i a_i w_i - sum_j c_j u_j)^2,
**     1 - F/Z = sum_i a_i q^2 w_i from the model (Yukawa form), and
**     (1 - F_N)/q^2 = sum_j c_j u_j from the uniform-sphere fit
**     (bl_nucleus.c), u_j = 1/(l_j / R^2 + q^2);
**   electrons: S / (Z^2 q^4) = (1/Z) sum_k g_k w_0 w_k,
**     S/Z = sum_k g_k q^2 w_k from the model's incoherent function,
**     w_0 = 1/q^2.
*/
static int targetfactor (bl_case *c) {
  bl_yukawa y;
  double vp[BL_YUKAWA_MAX + BL_NUCLEUS_NPOLE];   /* poles of the vector */
  double va[BL_YUKAWA_MAX + BL_NUCLEUS_NPOLE];   /* and their weights */
  double m = c->particle.mass;
  int n = 0, i, j, st;
  st = c->screening->yukawa(c->Z, c->params, &y);
  if (st != BL_SUCCESS)
    return st;
  if (y.n < 1 || y.n > BL_YUKAWA_MAX)
    return BL_EMODEL;
  c->ridge_b = HUGE_VAL;
  for (i = 0; i < y.n; i++) {
    double b = y.b[i] / m;
    vp[n] = b * b;
    va[n++] = y.alpha[i];
    if (b * b < c->ridge_b)
      c->ridge_b = b * b;
  }
  if (c->R > 0.0) {
    double Rm = c->R * m / BL_HBARC_MEVFM;   /* R in units of 1/m */
    for (j = 0; j < BL_NUCLEUS_NPOLE; j++) {
      vp[n] = bl_nucleus_pole[j] / (Rm * Rm);
      va[n++] = -bl_nucleus_coef[j];
    }
  }
  c->npole = c->nterm = 0;
  c->qmax2 = 4.0 * (sqrt(c->t0 * (c->t0 + 2.0)) + 1.0)
             * (sqrt(c->t0 * (c->t0 + 2.0)) + 1.0);
  for (i = 0; i < n; i++)
    for (j = i; j < n; j++) {
      st = addterm(c, 1, vp[i], vp[j], va[i] * va[j] * (i == j ? 1.0 : 2.0));
      if (st != BL_SUCCESS)
        return st;
    }
  c->nelastic = c->nterm;   /* electron pair terms follow */
  if (c->opts.electrons) {
    st = c->screening->incoherent(c->Z, c->params, &y);
    if (st != BL_SUCCESS)
      return st;
    if (y.n < 1 || y.n > BL_YUKAWA_MAX)
      return BL_EMODEL;
    for (i = 0; i < y.n; i++) {
      double b = y.b[i] / m;
      st = addterm(c, 0, 0.0, b * b, y.alpha[i] / c->Z);
      if (st != BL_SUCCESS)
        return st;
    }
  }
  return BL_SUCCESS;
}


int bl_case_init (bl_case *c, const bl_particle *p, int Z,
                  const bl_model *screening, const double *params, double T) {
  return bl_case_setup(c, p, Z, screening, params, T, NULL);
}


int bl_case_setup (bl_case *c, const bl_particle *p, int Z,
                   const bl_model *screening, const double *params, double T,
                   const bl_opts *o) {
  double r0, z2, A;
  int i;
  if (c == NULL || bl_particle_check(p) != BL_SUCCESS)
    return BL_EDOMAIN;
  if (Z < 1 || Z > BL_ZMAX || !isfinite(T) || T <= 0.0 || screening == NULL)
    return BL_EDOMAIN;
  if (screening->nparams > (int)(sizeof c->params / sizeof c->params[0]))
    return BL_EMODEL;
  if (o == NULL)
    o = &bl_opts_bare;
  if (!(o->A >= 0.0 && o->A <= 300.0)
      || (o->nucleus != BL_NUCLEUS_POINT && o->nucleus != BL_NUCLEUS_UNIFORM)
      || o->coulomb < BL_APPLY_OFF || o->coulomb > BL_APPLY_AUTO
      || o->elwert < BL_APPLY_OFF || o->elwert > BL_APPLY_AUTO)
    return BL_EDOMAIN;
  c->particle = *p;
  c->Z = Z;
  c->screening = screening;
  if (params != NULL)
    for (i = 0; i < screening->nparams; i++)
      c->params[i] = params[i];
  else
    bl_model_defaults(screening, c->params);
  c->T = T;
  c->t0 = T / p->mass;
  if (!(c->t0 > 0.0 && c->t0 <= BL_T0_MAX))
    return BL_EDOMAIN;
  r0 = BL_ALPHA * BL_HBARC_MEVFM / p->mass;             /* fm */
  z2 = p->charge * p->charge;
  c->norm = z2 * z2 * (double)Z * Z * BL_ALPHA * r0 * r0 / BL_FM2_PER_MB;
  if (!(c->norm >= DBL_MIN && c->norm <= DBL_MAX))
    return BL_EDOMAIN;   /* absurd mass or charge: no representable scale */
  if (screening->yukawa == NULL)
    return BL_EMODEL;
  c->opts = *o;
  if (screening->incoherent == NULL)
    c->opts.electrons = 0;   /* the model has no electron field (none) */
  A = o->A > 0.0 ? o->A : floor(bl_element_mass(Z) + 0.5);
  c->opts.A = A;
  c->R = o->nucleus == BL_NUCLEUS_UNIFORM ? bl_nucleus_radius(A) : 0.0;
  c->warn = (p->flags & BL_PARTICLE_COMPOSITE) ? BL_WARN_POINTLIKE : 0u;
  if (c->opts.electrons && p->mass > 2.0 * BL_ME_MEV)
    c->warn |= BL_WARN_STATIC_E;
  return targetfactor(c);
}


/* Elwert factor (Elwert 1939; Koch & Motz 1959, section II) for a
** projectile of charge z in the field of charge Z:
**   F_E = (beta0/beta) (1 - exp(-2 pi eta/beta0)) / (1 - exp(-2 pi eta/beta)),
** eta = -z Z alpha (> 0 when attracted: electrons).  For eta < 0 the
** exponentials are rewritten so that nothing overflows at beta -> 0. */
double bl_elwert (const bl_case *c, const bl_kin *kn) {
  double b0 = kn->p0 / kn->E0, b = kn->p / kn->E;
  double eta = -c->particle.charge * c->Z * BL_ALPHA;
  double a = 2.0 * BL_PI * fabs(eta);
  if (eta > 0.0)
    return (b0 / b) * expm1(-a / b0) / expm1(-a / b);
  return (b0 / b) * exp(a / b0 - a / b) * expm1(-a / b0) / expm1(-a / b);
}


/*
** Where the corrections hold (README, "Corrections"):
** Elwert: slow projectiles, gamma0 <= 1 + 2 MeV / m_e (Koch & Motz's
** recommendation for electrons up to T = 2 MeV, from memory); the factor
** is a ratio of Sommerfeld factors, so the bound is put on the velocity.
** Coulomb (Davies-Bethe-Maximon): gamma0 >= 100 and gamma >= 10 after
** emission, and a projectile whose Compton wavelength hbar/(m c) is at
** least ten nuclear radii: the correction comes from distances ~ hbar/(m c)
** from the nucleus, where the field must still be a point Coulomb field
** (electrons and positrons; not muons, whose 1.9 fm lies inside heavy
** nuclei).
*/
int bl_elwert_valid (const bl_kin *kn) {
  return kn->E0 <= 1.0 + 2.0 / BL_ME_MEV;
}

int bl_coulomb_valid (const bl_case *c, const bl_kin *kn) {
  double lambda = BL_HBARC_MEVFM / c->particle.mass;          /* fm */
  return kn->E0 >= 100.0 && kn->E >= 10.0
         && lambda >= 10.0 * bl_nucleus_radius(c->opts.A);
}


/* The case's warnings and the Born warning of the point (Koch & Motz 1959
** require 2 pi z Z alpha / beta << 1 for both velocities; we warn once it
** exceeds 1 after emission, the slower side). */
unsigned bl_point_warn (const bl_case *c, const bl_kin *kn) {
  double xi = 2.0 * BL_PI * fabs(c->particle.charge) * c->Z * BL_ALPHA
              * kn->E / kn->p;
  return c->warn | (xi > 1.0 ? BL_WARN_BORN : 0u);
}


int bl_wanted (int opt, int valid, unsigned bit, unsigned *warn) {
  if (opt == BL_APPLY_ON && !valid)
    *warn |= bit;
  return opt == BL_APPLY_ON || (opt == BL_APPLY_AUTO && valid);
}


/*
** Check k and set the kinematics, the target factor for this k (the Elwert
** factor scales the nuclear part) and the warnings that depend on k (Born
** validity: Koch & Motz 1959 require 2 pi z Z alpha / beta << 1 for both
** velocities; we warn once it exceeds 1).
*/
static int setup (const bl_case *c, double k, integ *it, unsigned *warn,
                  unsigned *applied) {
  bl_kin *kn = &it->kn;
  double fe = 1.0;
  int t;
  if (!isfinite(k) || k <= 0.0 || k >= c->T)
    return BL_EDOMAIN;
  bl_kin_set(kn, c->t0, k / c->particle.mass, c->particle.spin);
  if (!(kn->p > 0.0))
    return BL_EDOMAIN;   /* k so close to T that nothing is left */
  *warn = bl_point_warn(c, kn);
  *applied = 0;
  if (bl_wanted(c->opts.elwert, bl_elwert_valid(kn),
             BL_WARN_ELWERT, warn)) {
    fe = bl_elwert(c, kn);
    *applied |= BL_APPLIED_ELWERT;
  }
  for (t = 0; t < c->npole; t++)
    it->single[t] = fe * c->single_el[t] + c->single_e[t];
  it->nterm = c->nterm;
  for (t = 0; t < c->nterm; t++) {
    it->term[t] = c->term[t];
    if (t < c->nelastic)
      it->term[t].c *= fe;
  }
  return BL_SUCCESS;
}


/* Phi(h0, h) at the current outer geometry and inner h. */
static double phi_at (integ *it, double h) {
  bl_bracket br;
  double v;
  if (h > 2.0) {   /* rounding at the ends of the range */
    it->g.dh += 2.0 - h;
    h = 2.0;
  }
  else if (h < 0.0) {
    it->g.dh -= h;
    h = 0.0;
  }
  it->g.h = h;
  it->g.s = sqrt(h * (2.0 - h));
  bl_bracket_set(&it->kn, &it->g, &br);
  it->q->calls++;
  v = bl_bracket_azimuth(&br, it->c->npole, it->c->pole, it->single,
                         it->nterm, it->term);
  /* B >= 0 and W >= 0: a negative value is rounding of cancelling poles
  ** (uniform nucleus without electrons, y -> 1; scripts/sweep.lua found
  ** dsigma/dk < 0 there).  NaN passes on, to be reported. */
  return v < 0.0 ? 0.0 : v;
}


/*
** Inner integrand in u: sigma = sstar + side w sinh(u), dh/dsigma = h + hc.
** Near the ridge (|sigma - sstar| < 1/2) h - h* = (h* + hc) expm1(sigma -
** sstar) keeps the digits of the small difference and h = h* + (h - h*)
** loses none (h + hc >= 0.6 (h* + hc)); elsewhere h = hc expm1(sigma) keeps
** those of a small h (the forward peak) and h - h* is no small difference.
** One expm1 per call either way.
*/
static double inner_f (double u, void *params) {
  integ *it = params;
  double eu = exp(u), sh = 0.5 * (eu - 1.0 / eu), ch = sh + 1.0 / eu;
  double ds, h, hc = it->kn.hc;
  if (u < 1e-3)   /* sinh without cancellation near 0 */
    sh = sinh(u);
  ds = it->side * it->w * sh;
  if (fabs(ds) < 0.5) {
    it->g.dh = (it->g.hs + hc) * expm1(ds);
    h = it->g.hs + it->g.dh;
  }
  else {
    h = hc * expm1(it->sstar + ds);
    it->g.dh = h - it->g.hs;
  }
  return phi_at(it, h) * (h + hc) * it->w * ch;
}


/* Plain inner integrand in sigma; dh/dsigma = h + hc. */
static double inner_plain (double sg, void *params) {
  integ *it = params;
  double h = it->kn.hc * expm1(sg);
  return phi_at(it, h) * (h + it->kn.hc);
}


static void note (integ *it, int st) {
  if (st != GSL_SUCCESS && it->status == GSL_SUCCESS)
    it->status = st;
}


/*
** One inner piece by qag.  First with at most SMALL_LIMIT subintervals
** (enough for every ordinary piece); if that fails but its error is below
** `negl` it is accepted as it is: where the integrand is small (large
** angles, or an elastic field that a nuclear form factor cancels far below
** the rounding of its parts) its own relative accuracy does not matter,
** and chasing it in rounding noise would cost the whole call budget.  The
** error still enters the reported one.  Otherwise qag runs again with the
** full limit and its status counts.
*/
#define SMALL_LIMIT 16
static double piece (integ *it, gsl_function *f, double a, double b,
                     double eps, double negl, size_t limit, double *abserr) {
  double val;
  int st;
  if (limit > SMALL_LIMIT && negl > 0.0) {
    st = gsl_integration_qag(f, a, b, 0.0, eps, SMALL_LIMIT, QAG_KEY_INNER,
                             it->q->ws[1], &val, abserr);
    if (st == GSL_SUCCESS || *abserr <= negl)
      return val;
  }
  st = gsl_integration_qag(f, a, b, 0.0, eps, limit, QAG_KEY_INNER,
                           it->q->ws[1], &val, abserr);
  note(it, st);
  return val;
}


/*
** int_0^2 dh Phi(h0, h) for the polar geometry already in it->g (h0, s0),
** to relative tolerance eps; pieces whose error is below negl need not
** reach it (piece).
*/
static double inner_integral (integ *it, double eps, double negl) {
  const bl_kin *kn = &it->kn;
  double smax = log1p(2.0 / kn->hc), r = kn->p0 * it->g.s0 / kn->p;
  double total = 0.0, abserr_total = 0.0, val, abserr;
  gsl_function f;
  size_t limit = it->q->limit;
  f.params = it;
  if (it->q->calls - it->calls0 > CALL_BUDGET) {
    limit = 1;
    if (it->status == GSL_SUCCESS)
      it->status = BL_ENOTCONV;
  }
  if (r < 1.0) {   /* a forward ridge p sin(theta*) = p0 sin(theta0) */
    double cs = sqrt((1.0 - r) * (1.0 + r));
    double hs = r * r / (1.0 + cs);
    double qz = kn->delta - kn->p0 * it->g.h0 + kn->p * hs;
    double wh;
    int side;
    /* q >= delta for every geometry, so |q_z| >= delta at the ridge; a
    ** smaller value is rounding of the three terms (forward photons) */
    if (fabs(qz) < kn->delta)
      qz = kn->delta;
    wh = hypot(qz, sqrt(it->c->ridge_b)) * r
         / (kn->p * (cs > 1e-300 ? cs : 1e-300));
    it->sstar = log1p(hs / kn->hc);
    it->g.ridge = 1;
    it->g.hs = hs;
    it->g.ss = r;
    it->g.qzs = qz;
    it->w = wh / (hs + kn->hc);
    if (!(it->w > 1e-300))
      it->w = 1e-300;
    f.function = inner_f;
    for (side = -1; side <= 1; side += 2) {
      double len = side < 0 ? it->sstar : smax - it->sstar;
      if (len <= 0.0)
        continue;
      it->side = side;
      val = piece(it, &f, 0.0, asinh(len / it->w), eps, 0.5 * negl, limit,
                  &abserr);
      total += val;
      abserr_total += abserr;
    }
  }
  else {
    it->g.ridge = 0;
    f.function = inner_plain;
    total = piece(it, &f, 0.0, smax, eps, negl, limit, &abserr_total);
  }
  it->last_err = abserr_total;
  return total;
}


/* Outer integrand in sigma0 = ln(1 + h0/hc0). */
static double outer_f (double sg, void *params) {
  integ *it = params;
  double hc0 = it->kn.hc0, jac = hc0 * exp(sg);
  double h0 = hc0 * expm1(sg);
  if (h0 > 2.0)
    h0 = 2.0;
  it->g.h0 = h0;
  it->g.s0 = sqrt(h0 * (2.0 - h0));
  double negl = NEGL_SHARE * it->q->rtol * it->fpeak / jac;
  double v = inner_integral(it, INNER_SHARE * it->q->rtol, negl) * jac;
  if (fabs(v) > it->fpeak)
    it->fpeak = fabs(v);
  it->inner_val += fabs(v);
  it->inner_err += it->last_err * jac;
  return v;
}


static void integ_init (integ *it, const bl_case *c, bl_quad *q) {
  it->c = c;
  it->q = q;
  it->inner_err = it->inner_val = it->last_err = it->fpeak = 0.0;
  it->calls0 = q->calls;
  it->status = GSL_SUCCESS;
}


/*
** The tolerance warning whenever the reported error exceeds rtol |val|,
** even where every integral converged (the inner errors added in finish,
** or a Coulomb correction that leaves a small difference, can do that):
** the error is then larger than asked for, and the result says so.  A
** value clamped to 0 has its own warning.
*/
static void tolcheck (const bl_quad *q, bl_result *out) {
  if (out->err > q->rtol * fabs(out->val) && !(out->warn & BL_WARN_CLAMPED))
    out->warn |= BL_WARN_TOLERANCE;
}


/*
** Fill *out from a raw integral, its error and a factor; set the status
** warnings.  The inner integrals add their errors in the proportion they
** bear to their values, summed over all outer points (so an inner integral
** that struggled where the integrand is negligible costs little).
*/
static int finish (const integ *it, double val, double abserr, double factor,
                   unsigned warn, unsigned applied, bl_result *out) {
  if (it->inner_val > 0.0)
    abserr += it->inner_err / it->inner_val * fabs(val);
  out->val = val * factor;
  out->err = abserr * fabs(factor);
  out->warn = warn;
  out->applied = applied;
  if (!isfinite(out->val) || !isfinite(out->err)) {
    out->warn |= BL_WARN_TOLERANCE;
    return GSL_ERANGE;
  }
  if (it->status != GSL_SUCCESS)
    out->warn |= BL_WARN_TOLERANCE;
  tolcheck(it->q, out);
  return it->status;
}


/*
** Subtract the Coulomb correction of Davies, Bethe & Maximon (1954) from
** dsigma/dk: in the screening-function form (Tsai 1974) it lowers phi1 and
** phi2 of the nuclear part by 4 f(z Z alpha), i.e. by
**   (norm / k) 4 f [(1 + v^2) - (2/3) v]   (spin 1/2),
**   (norm / k) 4 f [2 v - (2/3) v]         (spin 0: 1 + v^2 -> 2 v),
** v = E/E0.  The spin-0 form assumes the correction, an eikonal phase at
** leading order, is the same for both spins.  A correction larger than the
** Born value leaves 0 and a warning.
*/
void bl_coulomb_subtract (const bl_case *c, const bl_kin *kn, bl_result *out) {
  double v = kn->E / kn->E0;
  double f = bl_coulomb_f(c->particle.charge * c->Z * BL_ALPHA);
  double shape = kn->spin > 0.25 ? 1.0 + v * v - 2.0 * v / 3.0
                                 : 4.0 * v / 3.0;
  out->val -= c->norm / (kn->k * c->particle.mass) * 4.0 * f * shape;
  out->applied |= BL_APPLIED_COULOMB;
  if (out->val < 0.0) {
    out->val = 0.0;
    out->warn |= BL_WARN_CLAMPED;
  }
}


int bl_dcs_dk_e (const bl_case *c, double k, bl_quad *q, bl_result *out) {
  integ it;
  gsl_function f;
  double pts[2], val = 0.0, abserr = 0.0, smax, ratio;
  unsigned warn, applied;
  int st, n = 0, i;
  out->val = out->err = 0.0;
  out->warn = out->applied = 0;
  out->method = 0;   /* BL_METHOD_BORN */
  if (c == NULL || q == NULL)
    return BL_EDOMAIN;
  integ_init(&it, c, q);
  st = setup(c, k, &it, &warn, &applied);
  if (st != BL_SUCCESS)
    return st;
  f.function = outer_f;
  f.params = &it;
  smax = log1p(2.0 / it.kn.hc0);
  /* beyond sin(theta0) = p/p0 the ridge no longer exists: a kink */
  ratio = it.kn.p / it.kn.p0;
  pts[n++] = 0.0;
  if (ratio < 1.0) {
    double hr = ratio * ratio / (1.0 + sqrt((1.0 - ratio) * (1.0 + ratio)));
    double sr = log1p(hr / it.kn.hc0);
    if (sr > 0.0 && sr < smax)
      pts[n++] = sr;
  }
  for (i = 0; i < n; i++) {
    double a = pts[i], b = (i + 1 < n) ? pts[i + 1] : smax, v, e;
    /* a later piece (beyond the kink: backward photons) may be negligible
    ** next to the first; it needs only an absolute share of the tolerance */
    st = gsl_integration_qag(&f, a, b, TAIL_SHARE * q->rtol * fabs(val),
                             q->rtol, q->limit, QAG_KEY, q->ws[0], &v, &e);
    note(&it, st);
    val += v;
    abserr += e;
  }
  st = finish(&it, val, abserr,
              c->norm * it.kn.p / (it.kn.p0 * it.kn.k) / BL_PI
              / c->particle.mass, warn, applied, out);
  if (bl_wanted(c->opts.coulomb, bl_coulomb_valid(c, &it.kn), BL_WARN_COULOMB,
             &out->warn)) {
    bl_coulomb_subtract(c, &it.kn, out);
    if (!isfinite(out->val) && st == BL_SUCCESS)
      st = GSL_ERANGE;
    tolcheck(q, out);
  }
  return st;
}


int bl_dcs_angular_e (const bl_case *c, double k, double theta_k, bl_quad *q,
                      bl_result *out) {
  integ it;
  double sh, val;
  unsigned warn, applied;
  int st;
  out->val = out->err = 0.0;
  out->warn = out->applied = 0;
  out->method = 0;   /* BL_METHOD_BORN */
  if (c == NULL || q == NULL || !(theta_k >= 0.0 && theta_k <= BL_PI))
    return BL_EDOMAIN;
  integ_init(&it, c, q);
  st = setup(c, k, &it, &warn, &applied);
  if (st != BL_SUCCESS)
    return st;
  if (c->opts.coulomb == BL_APPLY_ON)
    warn |= BL_WARN_COULOMB;   /* known for dsigma/dk only */
  sh = sin(0.5 * theta_k);
  it.g.h0 = 2.0 * sh * sh;
  it.g.s0 = sin(theta_k);
  val = inner_integral(&it, q->rtol, 0.0);  /* the whole tolerance */
  return finish(&it, val, it.last_err,
                c->norm * it.kn.p / (it.kn.p0 * it.kn.k) / (2.0 * BL_PI * BL_PI)
                / c->particle.mass, warn, applied, out);
}


/*
** Beam-frame angles (photon theta_k, particle theta_p, azimuth phi between
** them around the beam) to the photon frame: with e1 = unit p0_perp and
** e2 = k x e1, the final direction has perpendicular components
**   X = sin(theta_k - theta_p) + 2 cos(theta_k) sin(theta_p) sin^2(phi/2),
**   Y = -sin(theta_p) sin(phi),
** and h = 1 - cos(theta) = 2 sin^2((theta_k - theta_p)/2)
**                         + 2 sin(theta_k) sin(theta_p) sin^2(phi/2).
*/
int bl_dcs_full_e (const bl_case *c, double k, double theta_k, double theta_p,
                   double phi, bl_result *out) {
  integ it;
  bl_kin *kn = &it.kn;
  bl_polar g;
  bl_bracket br;
  double sd, sp, X, Y, rho, v, val;
  unsigned warn, applied;
  int st;
  out->val = out->err = 0.0;
  out->warn = out->applied = 0;
  out->method = 0;   /* BL_METHOD_BORN */
  if (c == NULL || !(theta_k >= 0.0 && theta_k <= BL_PI)
      || !(theta_p >= 0.0 && theta_p <= BL_PI) || !isfinite(phi))
    return BL_EDOMAIN;
  st = setup(c, k, &it, &warn, &applied);
  if (st != BL_SUCCESS)
    return st;
  if (c->opts.coulomb == BL_APPLY_ON)
    warn |= BL_WARN_COULOMB;   /* known for dsigma/dk only */
  sd = sin(0.5 * (theta_k - theta_p));
  sp = sin(0.5 * phi);
  g.ridge = 0;
  g.h0 = 2.0 * sin(0.5 * theta_k) * sin(0.5 * theta_k);
  g.s0 = sin(theta_k);
  g.h = 2.0 * sd * sd + 2.0 * g.s0 * sin(theta_p) * sp * sp;
  X = sin(theta_k - theta_p) + 2.0 * cos(theta_k) * sin(theta_p) * sp * sp;
  Y = -sin(theta_p) * sin(phi);
  rho = hypot(X, Y);
  g.s = rho;
  if (rho == 0.0)
    v = 0.0;
  else if (X > 0.0)
    v = Y * Y / (rho * (rho + X));  /* 1 - cos(phi_k) without cancellation */
  else
    v = (rho - X) / rho;
  bl_bracket_set(kn, &g, &br);
  val = bl_bracket_point(&br, v, c->npole, c->pole, it.single, it.nterm,
                         it.term);
  out->val = val * c->norm * kn->p / (kn->p0 * kn->k) / (4.0 * BL_PI * BL_PI)
             / c->particle.mass;
  out->warn = warn;
  out->applied = applied;
  if (!isfinite(out->val))
    return GSL_ERANGE;
  return BL_SUCCESS;
}
