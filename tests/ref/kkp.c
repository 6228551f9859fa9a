/*
** kkp.c -- the Kelner-Kokoulin-Petrukhin muon bremsstrahlung cross
** section (nucleus and atomic electrons); for the tests only
** See Copyright Notice in LICENSE
**
** Formula and constants FROM MEMORY (kkp.h names the sources).  Written
** apart from the library: its own constants (CODATA 2018), its own
** integration (composite Gauss-Legendre).
*/
#include <math.h>

#include "kkp.h"

#define KKP_ME     0.51099895       /* m_e c^2, MeV */
#define KKP_MMU    105.6583755      /* m_mu c^2, MeV */
#define KKP_ALPHA  7.2973525693e-3
#define KKP_RE     2.8179403262e-13 /* cm */
#define KKP_NA     6.02214076e23    /* 1/mol */
#define KKP_B      183.0
#define KKP_BP     1429.0


double kkp_dsdv (double Z, double a, double e_mev, double v, int terms) {
  double d, dn, dp, sqe = exp(0.5), z3, z23, pn = 0.0, pe = 0.0, f;
  if (!(Z >= 2.0 && a > 0.0 && v > 0.0 && v < 1.0 - KKP_MMU / e_mev))
    return NAN;
  d = KKP_MMU * KKP_MMU * v / (2.0 * e_mev * (1.0 - v));
  dn = 1.54 * pow(a, 0.27);
  dp = pow(dn, 1.0 - 1.0 / Z);
  z3 = pow(Z, -1.0 / 3.0);
  z23 = z3 * z3;
  if (terms & KKP_NUCLEUS)
    pn = fmax(0.0, log(KKP_B * z3 * (KKP_MMU + d * (dp * sqe - 2.0))
                       / (dp * (KKP_ME + d * sqe * KKP_B * z3))));
  if ((terms & KKP_ELECTRONS)
      && v < 1.0 / (1.0 + KKP_MMU * KKP_MMU / (2.0 * KKP_ME * e_mev)))
    pe = fmax(0.0, log(KKP_BP * z23 * KKP_MMU
                       / ((1.0 + d * KKP_MMU / (KKP_ME * KKP_ME * sqe))
                          * (KKP_ME + d * sqe * KKP_BP * z23))));
  f = KKP_ME * KKP_RE / KKP_MMU;
  return 16.0 / 3.0 * KKP_ALPHA * KKP_NA * f * f * Z * (Z * pn + pe)
         * (1.0 - v + 0.75 * v * v) / (v * a);
}


/* 10-point Gauss-Legendre on [-1, 1] (nodes +-x_i, weights w_i). */
static const double gl_x[5] = {0.1488743389816312, 0.4333953941292472,
                               0.6794095682990244, 0.8650633666889845,
                               0.9739065285171717};
static const double gl_w[5] = {0.2955242247147529, 0.2692667193099963,
                               0.2190863625159820, 0.1494513491505806,
                               0.0666713443086881};

/* int_lo^hi v d sigma/dv dv on n equal panels. */
static double panels (double Z, double a, double e, int terms, double lo,
                      double hi, int n) {
  double h = (hi - lo) / n, s = 0.0;
  int i, j;
  for (i = 0; i < n; i++) {
    double c = lo + (i + 0.5) * h;
    for (j = 0; j < 5; j++) {
      double d = 0.5 * h * gl_x[j];
      s += gl_w[j] * ((c - d) * kkp_dsdv(Z, a, e, c - d, terms)
                      + (c + d) * kkp_dsdv(Z, a, e, c + d, terms));
    }
  }
  return 0.5 * h * s;
}


double kkp_b (double Z, double a, double e_mev, int terms) {
  double vmax = 1.0 - KKP_MMU / e_mev;
  double ve = 1.0 / (1.0 + KKP_MMU * KKP_MMU / (2.0 * KKP_ME * e_mev));
  if (!(Z >= 2.0 && a > 0.0 && vmax > 0.0))
    return NAN;
  if (ve >= vmax)     /* the electrons' end point splits the range */
    return panels(Z, a, e_mev, terms, 0.0, vmax, 800);
  return panels(Z, a, e_mev, terms, 0.0, ve, 400)
         + panels(Z, a, e_mev, terms, ve, vmax, 400);
}
