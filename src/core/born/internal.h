/*
** born/internal.h -- kinematics, the Born bracket and the nucleus fit,
** shared inside the core, not public
** See Copyright Notice in LICENSE
*/

#ifndef BL_BORN_INTERNAL_H
#define BL_BORN_INTERNAL_H

#include <math.h>

#include "brakelight.h"

/* The uniform-sphere fit of nucleus.c: poles in units of R^-2. */
#define BL_NUCLEUS_NPOLE 4
extern const double bl_nucleus_pole[BL_NUCLEUS_NPOLE];
extern const double bl_nucleus_coef[BL_NUCLEUS_NPOLE];

/* R = 1.2 A^1/3 fm. */
double bl_nucleus_radius (double A);

/*
** Kinematics of one photon energy, in units of the projectile mass
** (hbar = c = m = 1).  Filled by bl_kin_set; read-only afterwards.
*/
typedef struct bl_kin {
  double E0, p0;      /* initial total energy and momentum */
  double E, p;        /* final */
  double k;           /* photon energy */
  double delta;       /* p0 - p - k > 0, smallest momentum transfer */
  double hc0, hc;     /* 1/(p0 (E0+p0)), 1/(p (E+p)): D0 = p0 (h0 + hc0) */
  double spin;        /* 0 or 0.5 */
} bl_kin;

/* Polar geometry in the frame with the photon along z: h = 1 - cos(theta),
** s = sin(theta), for the initial (h0, s0) and final (h, s) directions. */
typedef struct bl_polar {
  double h0, s0, h, s;
  /* Near the ridge p s = p0 s0 (set ridge = 1): h* and s* = p0 s0 / p of the
  ** ridge, q_z there, and dh = h - h* known without rounding. */
  int ridge;
  double hs, ss, qzs, dh;
} bl_polar;

/*
** The bracket B of the Born cross section, written for fixed polar angles as
**   B(v) = L0 + L1 v - x (M0 + M1 v),   x = q^2 = Q0 + b v,   v = 1 - cos(phi),
** with every coefficient >= 0 (M0 = M1 = 0 for spin 0).
*/
typedef struct bl_bracket {
  double L0, L1, M0, M1;
  double Q0, b;
} bl_bracket;

/* Kinematics for kinetic energy t0 and photon energy k (units of m);
** requires 0 < k < t0. */
void bl_kin_set (bl_kin *kn, double t0, double k, double spin);

/* Bracket coefficients at the polar geometry g. */
void bl_bracket_set (const bl_kin *kn, const bl_polar *g, bl_bracket *br);

/*
** The target factor W(x) = sum_i single[i] w_i + sum_t c_t w_i w_j,
** w_i = 1/(pole[i] + x), sorted for the closed-form azimuth once per case
** and photon energy (bl_wpoles_set), not once per call: per pole its
** single coefficient, the coefficient of its square w_i^2 and the sum of
** the coefficients of the pairs i < j whose larger pole it is; the pairs
** i < j themselves (one term per pair, repeated pairs merged).
*/
#define BL_WPOLES 1
typedef struct bl_wpoles {
  int npole, npair;
  double pole[BL_POLE_MAX];
  double single[BL_POLE_MAX];
  double square[BL_POLE_MAX];
  double second[BL_POLE_MAX];
  int pi[BL_TERM_MAX], pj[BL_TERM_MAX];
  double pc[BL_TERM_MAX];
} bl_wpoles;

/* Fill w from the lists (pole[i] >= 0, pole[i] <= pole[j] in every term,
** indices < npole <= BL_POLE_MAX). */
void bl_wpoles_set (bl_wpoles *w, int npole, const double *pole,
                    const double *single, int nterm, const bl_term *term);

/* Azimuthal integral  int_0^pi B(v) W(x) dphi  of the target factor w;
** closed form. */
double bl_bracket_azimuth (const bl_bracket *br, const bl_wpoles *w);

/*
** The brackets of up to BL_NODE_MAX inner nodes at one outer geometry, one
** array per coefficient (the nodes of one Gauss-Kronrod panel, in lanes).
*/
#define BL_NODE_MAX 24   /* 21 nodes, whole steps of 4 lanes */
/* The lanes: n nodes rounded up to whole steps of BL_LANES (arrays of
** BL_NODE_MAX, a multiple of it, with finite values past n). */
#define BL_LANES 4
#define BL_LANES_UP(n) \
  ((int)(((unsigned)(n) + BL_LANES - 1) & ~(unsigned)(BL_LANES - 1)))
typedef struct bl_brackets {
  double L0[BL_NODE_MAX], L1[BL_NODE_MAX], M0[BL_NODE_MAX], M1[BL_NODE_MAX];
  double Q0[BL_NODE_MAX], b[BL_NODE_MAX];
} bl_brackets;

/* bl_bracket_set at n <= BL_NODE_MAX geometries that differ from g only
** in h[i] and dh[i] (h - h* where g->ridge; s = sqrt(h (2 - h))): the same
** values node by node.  The lane functions work in whole steps of 4: h,
** dh, u hold finite values up to n rounded up to 4, and every output
** array has BL_NODE_MAX places (the places past n are scratch). */
void bl_bracket_set_n (const bl_kin *kn, const bl_polar *g, int n,
                       const double *h, const double *dh, bl_brackets *br);

/* out[i] = exp(x[i]), expm1(x[i]) for i < n <= BL_NODE_MAX, to 1 ulp
** (kin.c); out holds BL_NODE_MAX (written up to n rounded up to 4), and
** so does the x of bl_exp_n (values up to n rounded up to 4). */
void bl_exp_n (const double *x, int n, double *out);
void bl_expm1_n (const double *x, int n, double *out);

/* The sinh map of an inner ridge side at n <= BL_NODE_MAX points (kin.c):
** h, dh = h - h* and dh/du at u[i]. */
void bl_ridge_map_n (const double *u, int n, double sw, double w,
                     double sstar, double hs, double hc, double *h,
                     double *dh, double *jac);

/* bl_bracket_azimuth of n such brackets into out[i]: the same values. */
void bl_bracket_azimuth_n (const bl_brackets *br, int n, const bl_wpoles *w,
                           double *out);

/* The target factor W(x) of the same lists at q^2 = x. */
double bl_target_w (double x, int npole, const double *pole,
                    const double *single, int nterm, const bl_term *term);

/* B(v) W(x) at one azimuth. */
double bl_bracket_point (const bl_bracket *br, double v, int npole,
                         const double *pole, const double *single, int nterm,
                         const bl_term *term);

/*
** A method that needs the polar integrals of dsigma/dk but not the Born
** azimuth (the distorted waves) gives its own Phi(h0, h) = int_0^pi B W
** dphi at the polar geometry g (h0, s0, h, s and the ridge fields), with
** br the Born bracket's coefficients there (q^2 = br->Q0 + br->b v), and
** its error in *err; it counts its calls into q.  Such a method takes
** neither the Elwert factor nor the Coulomb correction nor the Born
** warning: those are Born's.
*/
typedef struct bl_azimuth {
  double (*phi) (void *ctx, const bl_polar *g, const bl_bracket *br,
                 double *err);
  void *ctx;
} bl_azimuth;

/* bl_dcs_dk_e and bl_dcs_angular_e with the azimuthal integral of az
** (NULL: Born's closed form). */
int bl_dcs_dk_az_e (const bl_case *c, double k, bl_quad *q,
                    const bl_azimuth *az, bl_result *out);
int bl_dcs_angular_az_e (const bl_case *c, double k, double theta_k,
                         bl_quad *q, const bl_azimuth *az, bl_result *out);

/* The polar geometry g (ridge off) and v = 1 - cos(phi_k) in the photon
** frame from beam-frame angles: photon theta_k, particle theta_p, azimuth
** phi between them around the beam (kin.c). */
void bl_polar_beam (double theta_k, double theta_p, double phi, bl_polar *g,
                    double *v);

/* Kinematics of photon energy k (MeV) of case c, with the checks every
** method makes: BL_EDOMAIN unless 0 < k < T and the final momentum is
** positive. */
int bl_kin_case (const bl_case *c, double k, bl_kin *kn);

/*
** The ridge peak of the inner integrand at h* = hs (sin(theta*) = r,
** cos(theta*) = cs) for the photon direction h0, pole the smallest
** screening pole (0: none): *qzs q_z at h* (at least delta: a smaller
** value is rounding), *off the distance from h* to the minimum of q^2;
** returns the peak's width in h (derivation: born/dcs.c, ridge_width).
*/
static inline double bl_ridge_width (const bl_kin *kn, double h0, double hs,
                                     double r, double cs, double pole,
                                     double *qzs, double *off) {
  double qz = kn->delta - kn->p0 * h0 + kn->p * hs;
  if (fabs(qz) < kn->delta)
    qz = kn->delta;
  *qzs = qz;
  *off = -r * r * qz / kn->p;
  return r * hypot(cs * qz, sqrt(pole)) / kn->p;
}

/*
** The centre of the ridge's sinh map over [lo, hi] in sigma = ln(1 +
** h/hc): the minimum of q^2, hs + *off, where it lies inside, else hs
** itself (*off set to 0).
*/
static inline double bl_ridge_centre (const bl_kin *kn, double hs,
                                      double lo, double hi, double *off) {
  double hm = hs + *off, sm = log1p(hm / kn->hc);
  if (hm > 0.0 && hm < 2.0 && sm > lo && sm < hi)
    return hm;
  *off = 0.0;
  return hs;
}

/*
** The q_z = 0 peak where there is no ridge (r = p0 s0 / p >= 1): *hz =
** (p0 h0 - delta) / p and its width *wh in h (HUGE_VAL outside (0, 2));
** 1 where it lies in (0, 2) and *wh < wmax (born/dcs.c, zpeak_at).
*/
static inline int bl_zpeak (const bl_kin *kn, double h0, double s0,
                            double pole, double wmax, double *hz,
                            double *wh) {
  double sz, dt;
  *hz = (kn->p0 * h0 - kn->delta) / kn->p;
  *wh = HUGE_VAL;
  if (!(*hz > 0.0 && *hz < 2.0))
    return 0;
  sz = sqrt(*hz * (2.0 - *hz));
  dt = kn->p0 * s0 - kn->p * sz;
  *wh = hypot(dt, sqrt(pole)) * sz / (kn->p * fmax(sz, fabs(1.0 - *hz)));
  return *wh < wmax;
}

#endif
