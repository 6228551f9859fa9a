/*
** case.c -- one computation (projectile, atom, kinetic energy) and its
** target factor W(q^2) = G(q)/(Z^2 q^4) as simple poles and pole products
** See Copyright Notice in LICENSE
**
** G = [Z F_N - F]^2 + S from the screening model's Yukawa form, the
** uniform-sphere fit of nucleus.c and the model's incoherent function; see
** DEVELOPERS.md, "Target factor".
*/

#include <float.h>
#include <math.h>

#include "born/internal.h"
#include "ebrems/table.h"


const bl_opts bl_opts_bare = {0, BL_NUCLEUS_POINT, 0.0, BL_APPLY_OFF,
                               BL_APPLY_OFF, BL_ERAD_ALL};
const bl_opts bl_opts_default = {1, BL_NUCLEUS_UNIFORM, 0.0, BL_APPLY_AUTO,
                                  BL_APPLY_AUTO, BL_ERAD_ALL};


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
** The projectile's charge form factor as one pole, F_p = lam/(lam + q^2)
** (a monopole with the projectile's mean square radius 6/lam), applied to
** the elastic vector sum_i a_i/(x_i + q^2):
**   lam/((x + q^2)(lam + q^2)) = lam/(lam - x) [1/(x + q^2) - 1/(lam + q^2)],
** so the vector stays a sum of simple poles, one more.  A pole within 2 %
** of lam moves lam to 1.02 times it (the radius by 1 %, within its own
** uncertainty), which bounds the weights' cancellation at 50.  Returns the
** new length; *lam is the pole used.
*/
static int formfactor (double *vp, double *va, int n, double *lam) {
  double extra = 0.0;
  int i;
  for (i = 0; i < n; i++)
    if (fabs(*lam - vp[i]) < 0.02 * vp[i])
      *lam = 1.02 * vp[i];
  for (i = 0; i < n; i++) {
    double f = *lam / (*lam - vp[i]);
    extra -= va[i] * f;
    va[i] *= f;
  }
  vp[n] = *lam;
  va[n] = extra;
  return n + 1;
}


/*
** An electron term coef w_0 w_x (w_0 = 1/q^2) with the form factor on both
** factors: F_p w_0 = w_0 - v and F_p w_x = lam/(lam - x) (w_x - v),
** v = 1/(lam + q^2), so F_p^2 w_0 w_x is four pole products.
*/
static int electronff (bl_case *c, double x, double coef, double lam) {
  double f = coef * lam / (lam - x);
  int st;
  if (fabs(lam - x) < 0.02 * x)
    return BL_EMODEL;   /* an atomic pole at a hadron's: not in practice */
  st = addterm(c, 0, 0.0, x, f);
  if (st == BL_SUCCESS)
    st = addterm(c, 0, 0.0, lam, -f);
  if (st == BL_SUCCESS)
    st = addterm(c, 0, x, lam, -f);
  if (st == BL_SUCCESS)
    st = addterm(c, 0, lam, lam, f);
  return st;
}


/*
** The nucleus's incoherent part (BL_NUCLEUS_INCOHERENT), the closure sum
** over its excited states for Z uncorrelated point protons, Z (1 - F_N^2),
** in the nuclear part of W (DEVELOPERS.md, "The nucleus's incoherent
** part"):
**   Z (1 - F_N^2) / (Z^2 q^4) = (1/Z) U (2 w_0 - U),
**   U = (1 - F_N)/q^2 = sum_j c_j u_j (the uniform-sphere fit),
** unscreened (the electrons stay in their ground state while the nucleus
** is excited: no interference), times F_p^2 with the projectile's form
** factor (lam > 0), applied to each factor as in formfactor().  The
** protons' own size is left out, so that the high-energy method's
** (1 - 1/Z) uniform + (1/Z) point (nucsize.c) is the same quantity.
*/
static int incoherent (bl_case *c, double lam) {
  double up[BL_NUCLEUS_NPOLE + 1], ua[BL_NUCLEUS_NPOLE + 1];
  double wp[BL_NUCLEUS_NPOLE + 2], wa[BL_NUCLEUS_NPOLE + 2];
  double Rm = c->R * c->particle.mass / BL_HBARC_MEVFM;   /* units of 1/m */
  int nu = 0, nw = 0, i, j, st;
  wp[nw] = 0.0;
  wa[nw++] = 2.0;
  for (j = 0; j < BL_NUCLEUS_NPOLE; j++) {
    up[nu] = wp[nw] = bl_nucleus_pole[j] / (Rm * Rm);
    ua[nu++] = bl_nucleus_coef[j];
    wa[nw++] = -bl_nucleus_coef[j];
  }
  if (lam > 0.0) {
    double l2 = lam;
    nu = formfactor(up, ua, nu, &lam);
    nw = formfactor(wp, wa, nw, &l2);
  }
  for (i = 0; i < nu; i++)
    for (j = 0; j < nw; j++) {
      st = addterm(c, 1, up[i], wp[j], ua[i] * wa[j] / c->Z);
      if (st != BL_SUCCESS)
        return st;
    }
  return BL_SUCCESS;
}


/*
** The target factor W = G / (Z^2 q^4) as terms c w_i w_j (units m = 1):
**   elastic:   ((Z F_N - F) / (Z q^2))^2 = (sum_i a_i w_i - sum_j c_j u_j)^2,
**     1 - F/Z = sum_i a_i q^2 w_i from the model (Yukawa form), and
**     (1 - F_N)/q^2 = sum_j c_j u_j from the uniform-sphere fit
**     (src/core/born/nucleus.c), u_j = 1/(l_j / R^2 + q^2);
**   electrons: S / (Z^2 q^4) = (1/Z) sum_k g_k w_0 w_k,
**     S/Z = sum_k g_k q^2 w_k from the model's incoherent function,
**     w_0 = 1/q^2.
*/
static int targetfactor (bl_case *c, double lam) {
  bl_yukawa y;
  double vp[BL_YUKAWA_MAX + BL_NUCLEUS_NPOLE + 1];   /* poles of the vector */
  double va[BL_YUKAWA_MAX + BL_NUCLEUS_NPOLE + 1];   /* and their weights */
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
  if (lam > 0.0)
    n = formfactor(vp, va, n, &lam);
  c->npole = c->nterm = 0;
  c->qmax2 = 4.0 * (sqrt(c->t0 * (c->t0 + 2.0)) + 1.0)
             * (sqrt(c->t0 * (c->t0 + 2.0)) + 1.0);
  for (i = 0; i < n; i++)
    for (j = i; j < n; j++) {
      st = addterm(c, 1, vp[i], vp[j], va[i] * va[j] * (i == j ? 1.0 : 2.0));
      if (st != BL_SUCCESS)
        return st;
    }
  if (c->R > 0.0 && c->opts.nucleus == BL_NUCLEUS_INCOHERENT) {
    st = incoherent(c, lam);
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
      st = lam > 0.0 ? electronff(c, b * b, y.alpha[i] / c->Z, lam)
                     : addterm(c, 0, 0.0, b * b, y.alpha[i] / c->Z);
      if (st != BL_SUCCESS)
        return st;
    }
  }
  return BL_SUCCESS;
}


double bl_case_norm (const bl_particle *p, int Z) {
  double r0 = BL_ALPHA * BL_HBARC_MEVFM / p->mass;      /* fm */
  double z2 = p->charge * p->charge;
  return z2 * z2 * (double)Z * Z * BL_ALPHA * r0 * r0 / BL_FM2_PER_MB;
}


int bl_case_init (bl_case *c, const bl_particle *p, int Z,
                  const bl_model *screening, const double *params, double T) {
  return bl_case_setup(c, p, Z, screening, params, T, NULL);
}


/* Below m R = 0.1 hbar c the incoherent part is below 1e-3 / Z of the
** value (1 - F_N^2 ~ q^2 R^2 / 5 at the transfers q < m that count):
** not flagged (electrons on any nucleus: m R < 0.02 hbar c). */
#define NINCOH_MR_MIN 0.1

int bl_case_setup (bl_case *c, const bl_particle *p, int Z,
                   const bl_model *screening, const double *params, double T,
                   const bl_opts *o) {
  double A;
  int i, lepton, mu, proj;
  if (c == NULL || bl_particle_check(p) != BL_SUCCESS)
    return BL_EDOMAIN;
  if (Z < 1 || Z > BL_ZMAX || !isfinite(T) || T <= 0.0 || screening == NULL)
    return BL_EDOMAIN;
  if (screening->nparams > (int)(sizeof c->params / sizeof c->params[0]))
    return BL_EMODEL;
  if (o == NULL)
    o = &bl_opts_bare;
  if (!(o->A >= 0.0 && o->A <= 300.0)
      || o->nucleus < BL_NUCLEUS_POINT || o->nucleus > BL_NUCLEUS_INCOHERENT
      || o->coulomb < BL_APPLY_OFF || o->coulomb > BL_APPLY_AUTO
      || o->elwert < BL_APPLY_OFF || o->elwert > BL_APPLY_AUTO
      || (o->eradiation != BL_ERAD_ALL && o->eradiation != BL_ERAD_PROJECTILE))
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
  c->norm = bl_case_norm(p, Z);
  if (!(c->norm >= DBL_MIN && c->norm <= DBL_MAX))
    return BL_EDOMAIN;   /* absurd mass or charge: no representable scale */
  if (screening->yukawa == NULL)
    return BL_EMODEL;
  c->opts = *o;
  if (screening->incoherent == NULL)
    c->opts.electrons = 0;   /* the model has no electron field (none) */
  A = o->A > 0.0 ? o->A : floor(bl_element_mass(Z) + 0.5);
  c->opts.A = A;
  c->R = o->nucleus != BL_NUCLEUS_POINT ? bl_nucleus_radius(A) : 0.0;
  c->warn = (p->flags & BL_PARTICLE_COMPOSITE) ? BL_WARN_POINTLIKE : 0u;
  if (o->nucleus == BL_NUCLEUS_INCOHERENT
      && c->R * p->mass / BL_HBARC_MEVFM > NINCOH_MR_MIN)
    c->warn |= BL_WARN_NINCOH;
  c->ebt = 0;
  c->ebexact = 0;
  c->ekmax = 0.0;
  lepton = p->spin == 0.5 && fabs(fabs(p->charge) - 1.0) <= 1e-12;
  mu = lepton && fabs(p->mass - BL_MMU_MEV) <= 1e-12 * BL_MMU_MEV;
  lepton = lepton && (mu || fabs(p->mass - BL_ME_MEV) <= 1e-12 * BL_ME_MEV);
  proj = c->opts.electrons && c->opts.eradiation == BL_ERAD_PROJECTILE;
  if (proj && lepton && !mu)
    return BL_EDOMAIN;   /* e-/e+: the two lines do not separate */
  if (c->opts.electrons && lepton && !proj) {
    /* e-, e+, mu-, mu+: the bound electron term (src/core/ebrems/table.c);
    ** end point k_max = T m_e / (m_e + E0 - p0), E0 - p0 = m^2 / (E0 + p0) */
    double m = p->mass, e0 = T + m, p0 = sqrt(T * (T + 2.0 * m));
    c->ebt = 1 + (mu ? BL_EBT_MUON : BL_EBT_ELECTRON) + (p->charge > 0.0);
    c->ekmax = mu ? T / (1.0 + m * m / (BL_ME_MEV * (e0 + p0)))
                  : T / (1.0 + BL_ME_MEV / (e0 + p0));   /* as before */
    bl_ebt_rows(c->ebt - 1, Z, T, c->ebrow, &c->ebwz, &c->ebwb);
  } else if (c->opts.electrons && (p->mass >= BL_EBH_M_MIN || mu)) {
    /* any other projectile: the three charge parts (table.c); held, and
    ** warned, outside the table's mass and energy ranges.  A muon comes
    ** here only for its projectile's radiation alone (R_P; the muon mass
    ** lies 5.7 % above the table's first mass node). */
    double m = p->mass, e0 = T + m, p0 = sqrt(T * (T + 2.0 * m));
    c->ebt = 1 + BL_EBT_OTHER;
    c->ekmax = T / (1.0 + m * m / (BL_ME_MEV * (e0 + p0)));
    bl_ebh_rows(p->spin == 0.5, m, Z, T, c->ebrow);
    if (T > BL_EBREMS_T_MAX)
      c->warn |= BL_WARN_ERANGE;
    else if (m > BL_EBH_M_MAX * (1.0 + 1e-12) || T < BL_EBH_TAU_MIN * m)
      c->ebexact = 1;
  } else if (c->opts.electrons && p->mass > 2.0 * BL_ME_MEV)
    c->warn |= BL_WARN_STATIC_E;
  return targetfactor(c, 0.0);
}


int bl_case_set_formfactor (bl_case *c, double radius) {
  double r;
  if (c == NULL || !(radius > 0.0) || !isfinite(radius))
    return BL_EDOMAIN;
  r = radius * c->particle.mass / BL_HBARC_MEVFM;   /* units of 1/m */
  if (!(r > 0.0) || !isfinite(6.0 / (r * r)))
    return BL_EDOMAIN;
  return targetfactor(c, 6.0 / (r * r));
}


/* Measured (DEVELOPERS.md, "Muons"): at u = 1e-5 the true ratio is 1.00
** of the held one at 100 MeV (the struck electron's binding stops the
** rise there), 3.1 at 10 GeV, 9.7 at 1 TeV; flagged from 1 GeV, where
** 1e-4 k_max reaches 10 keV. */
#define EHELD_T_MIN 1e3
/* Other projectiles: flagged where 1e-3 k_max, their first node, is above
** 10 keV (the muons' 1e-4 k_max at 1 GeV is 9 keV); DEVELOPERS.md, "Other
** projectiles". */
#define EHELD_K_MIN 0.01

/* The projectile's radiation alone (BL_ERAD_PROJECTILE) keeps no such
** rise: R_P at u = 1e-4 against its value held from the first node u =
** 1e-3, fresh integrals, muon on Z = 1, 11, 26 from 3 MeV to 10 TeV: at
** most 2.3 % off (300 MeV, Z = 26; 0.1-1.5 % elsewhere); not flagged
** (DEVELOPERS.md, "Muons: the projectile's radiation alone"). */
double bl_case_eheld_k (const bl_case *c) {
  if (c != NULL && c->opts.eradiation == BL_ERAD_PROJECTILE)
    return 0.0;
  if (c != NULL && c->ebt - 1 == BL_EBT_OTHER)
    return bl_ebh_u[0] * c->ekmax >= EHELD_K_MIN ? bl_ebh_u[0] * c->ekmax
                                                 : 0.0;
  return c != NULL && c->ebt - 1 >= BL_EBT_MUON && c->T >= EHELD_T_MIN
         ? bl_ebm_u[0] * c->ekmax : 0.0;
}


int bl_case_eheld (const bl_case *c, double k) {
  return k > 0.0 && k < bl_case_eheld_k(c);
}


double bl_case_eratio (const bl_case *c, double k) {
  if (c == NULL || c->ebt == 0)
    return 1.0;
  if (!(k < c->ekmax))
    return 0.0;
  if (c->ebt - 1 == BL_EBT_OTHER)   /* R_P alone: the limit z -> inf */
    return bl_ebh_eval(c->ebrow, c->opts.eradiation == BL_ERAD_PROJECTILE
                                 ? INFINITY : c->particle.charge,
                       k / c->ekmax);
  return bl_ebt_eval(c->ebt - 1, c->ebrow, c->ebwz, c->ebwb, c->T,
                     k / c->ekmax);
}
