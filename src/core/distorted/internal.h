/*
** distorted/internal.h -- the distorted-wave (Sommerfeld-Maue) cross
** section: the Gauss function of its matrix element, the amplitude, the
** integrals; shared inside the core, not public
** See Copyright Notice in LICENSE
*/

#ifndef BL_DISTORTED_INTERNAL_H
#define BL_DISTORTED_INTERNAL_H

#include <complex.h>

#include "corrections/internal.h"

/*
** V(x) = 2F1(i eta0, i eta; 1; x) and V'(x) for real x < 1 at fixed eta0,
** eta (one photon energy), in the variable u = ln(1 - x).  Near x = 0 a
** series; elsewhere a table made from V, dV/du, d2V/du2 by integrating the
** hypergeometric equation outward from the edge of the series region,
** read by quintic Hermite interpolation.  Values carry the factor
** exp(-scale) (scale = pi |eta0|): V grows like exp(pi min(|eta0|, |eta|))
** for x -> -infinity, and the prefactor of the matrix element makes up
** for it.  Nodes are uniform in tau = w u + 2 sign(u) sqrt(|ab| |u|),
** w = |eta0| + |eta| + 1: the local frequency of V is w for large |u|
** and sqrt(|ab|/|u|) near u = 0 (a Bessel-like start).
*/
typedef struct bl_dwside {
  int n;                      /* nodes 0..n-1; node 0 at the series edge */
  double tau0;                /* tau of node 0 */
  double complex *f;          /* 6 per node: the coefficients of the
                                 quintic in t of the interval it begins */
} bl_dwside;

typedef struct bl_dwhyp {
  double complex a, b;        /* i eta0, i eta */
  double scale;               /* pi |eta0| */
  double x1;                  /* the series for |x| <= x1 */
  double w, ab, sab;          /* the map tau(u); sab = sqrt(ab) */
  double dtau;                /* node spacing in tau */
  bl_dwside neg, pos;         /* u < 0 (0 < x < 1) and u > 0 (x < 0) */
} bl_dwhyp;

/* Prepare V for eta0, eta covering ln(1 - x) in [umin, umax].
** Returns BL_SUCCESS, BL_ENOMEM, or BL_ENOTCONV if the equation could not
** be integrated to the required accuracy. */
int bl_dwhyp_init (bl_dwhyp *h, double eta0, double eta, double umin,
                   double umax);
void bl_dwhyp_free (bl_dwhyp *h);

/* V exp(-scale) and dV/dx exp(-scale) at x, given u = ln(1 - x).
** Returns 0, or -1 when u is outside the prepared range. */
int bl_dwhyp_eval (const bl_dwhyp *h, double x, double u, double complex *V,
                   double complex *Vx);

/*
** One photon energy of the distorted-wave cross section: kinematics,
** zeta = -z Z alpha (> 0 when the field attracts the projectile), the
** table of V and the log of the bracket's scale (amp.c).
*/
typedef struct bl_dwk {
  bl_kin kn;
  double zeta;
  double lnscale, scale;     /* scale = exp(lnscale) */
  bl_dwhyp hyp;
} bl_dwk;

/* ln of the scale of the bracket: (k/zeta)^2 S(eta0) S(eta)
** e^{2 pi (|eta0| - eta0)}, S the Sommerfeld factor. */
double bl_dw_lnscale (const bl_kin *kn, double zeta);

/* Prepare photon energy k (MeV) of case c for ln(1 - x) in [umin, umax]
** (both 0: every geometry of the case).  Free with bl_dwk_free. */
int bl_dwk_init (bl_dwk *d, const bl_case *c, double k, double umin,
                 double umax);
void bl_dwk_free (bl_dwk *d);

/* ln(1 - x) at the geometry (g, v = 1 - cos phi), q^2 with it. */
double bl_dw_u (const bl_kin *kn, const bl_polar *g, double v, double *q2);

/* The bracket B at the geometry (g, v): normalised as the Born bracket
** of born/kin.c, which it becomes as zeta -> 0; q^2 in *q2. */
int bl_dw_bracket (const bl_dwk *d, const bl_polar *g, double v, double *B,
                   double *q2);

/* The parts of the bracket that do not depend on the azimuth, at one
** polar geometry: the momenta (photon frame), q = (qx0 + ps v, -ps sin
** phi, qz), 1 - x = q^2 omxc and the coefficients of D_beta, D_gamma,
** D_delta in V (i cb1, i cg1: a and b are imaginary) and V' (amp.c). */
typedef struct bl_dwpolar {
  double P0x, P0z, ps, Pz, qx0, qz, omxc;
  double cb1, cg1, cb2, cg2, cd;
} bl_dwpolar;

void bl_dw_polar_set (const bl_dwk *d, const bl_polar *g, bl_dwpolar *o);

/* bl_dw_bracket at the polar geometry o, v = 1 - cos phi and
** sphi = sin phi. */
int bl_dw_bracket_at (const bl_dwk *d, const bl_dwpolar *o, double v,
                      double sphi, double *B, double *q2);

/* Estimated relative error of the Sommerfeld-Maue functions at kn (see
** dcs.c). */
double bl_dw_sm_estimate (const bl_case *c, const bl_kin *kn);

/* The fully differential cross section, arguments and units as
** bl_dcs_full_e (born/dcs.c), and dsigma/dk (mb/MeV) at relative tolerance
** rtol.  exceptions: BL_EDOMAIN, BL_ENOMEM, BL_ENONFINITE, GSL's codes of
** an integral that did not converge (out still filled). */
int bl_dw_full_e (const bl_case *c, double k, double theta_k, double theta_p,
                  double phi, bl_result *out);
int bl_dw_dk_e (const bl_case *c, double k, bl_quad *q, bl_result *out);
/* dsigma/dk without the soft-photon rule below BL_DW_SOFT_Y T (the
** tests compare the rule with it where it still resolves). */
int bl_dw_dk_direct_e (const bl_case *c, double k, bl_quad *q,
                       bl_result *out);
/* d2sigma/(dk dOmega_k), mb/(MeV sr), at photon angle theta_k. */
int bl_dw_angular_e (const bl_case *c, double k, double theta_k, bl_quad *q,
                     bl_result *out);

#endif
