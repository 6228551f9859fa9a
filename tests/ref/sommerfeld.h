/*
** sommerfeld.h -- Sommerfeld's exact non-relativistic bremsstrahlung
** dsigma/dk (dipole approximation, exact in Z alpha, bare point nucleus) and
** the complex Gauss hypergeometric function it needs; for the tests only
** See Copyright Notice in LICENSE
**
** Sources: A. Sommerfeld, Ann. Phys. (Leipzig) 403 (1931) 257; the formula
** as quoted by H. W. Koch and J. W. Motz, Rev. Mod. Phys. 31 (1959) 920
** (the neighbourhood of formula 3BN(a), its non-relativistic Born limit) and
** by V. B. Berestetskii, E. M. Lifshitz and L. P. Pitaevskii, Quantum
** Electrodynamics, section 92.  Hypergeometric identities: M. Abramowitz and
** I. A. Stegun, Handbook of Mathematical Functions (1964), chapter 15 ("AS"
** below, formula numbers as printed there).
**
** Nothing here calls the library: constants are defined again (CODATA 2018)
** and every formula is written out independently.
*/
#ifndef SOMMERFELD_H
#define SOMMERFELD_H

#include <complex.h>

/* ---- the Gauss hypergeometric function 2F1(a, b; c; x) ---------------- */

/* Maclaurin series of 2F1(a, b; c; x) and its derivative for real |x| < 1
** (complex a, b, c; c not 0, -1, -2, ...), summed term by term until the
** terms fall below 1e-17 of the sum.  Returns the cancellation ratio
** max|term| / |sum| (1 when nothing cancels; 10^d means about d digits
** lost), or -1 when |x| >= 1 or the series did not end in 100000 terms. */
double som_hyp2f1_maclaurin (double complex a, double complex b,
                             double complex c, double x,
                             double complex *f, double complex *df);

/* 2F1(a, b; c; w) and d/dw of it for real 0 <= w < 1, with omw = 1 - w
** given separately (so that 1 - w keeps its digits near w = 1; pass
** omw = 1 - w when that is exact enough).  The Maclaurin series at a
** starting point w_s <= 1/2 where it does not cancel, then analytic
** continuation along the real axis by Taylor re-expansion of the solution of
** the hypergeometric differential equation (AS 15.5.1) in steps of at most
** half the distance to the singular points 0 and 1, halved further while the
** step's terms cancel by more than a factor 16.  Returns 0, or -1 for
** arguments outside the domain or a walk that does not finish. */
int som_hyp2f1_unit (double complex a, double complex b, double complex c,
                     double w, double omw, double complex *f,
                     double complex *df);

/* 2F1(a, b; c; x) for real x <= 0 by Pfaff's transformation (AS 15.3.4)
**   2F1(a, b; c; x) = (1 - x)^(-a) 2F1(a, c - b; c; x/(x - 1)),
** x/(x - 1) in [0, 1), evaluated by som_hyp2f1_unit.  Returns 0 or -1. */
int som_hyp2f1_neg (double complex a, double complex b, double complex c,
                    double x, double complex *f);

/* 2F1(a, b; c; w) near w = 1 (0 < w < 1, omw = 1 - w) by the connection
** formula AS 15.3.6 (series in 1 - w; Gamma functions from GSL's
** gsl_sf_lngamma_complex_e).  Valid when c - a - b is not an integer; for
** the tests of the continuation only.  Returns the cancellation ratio of
** the two terms and their series (10^d: about d digits lost; it grows with
** |c - a - b| near an integer and with large imaginary parameters), or -1
** on failure. */
double som_hyp2f1_conn (double complex a, double complex b, double complex c,
                        double w, double omw, double complex *f);

/* The two functions of Sommerfeld's formula, for real x <= 0:
**   som_F  = 2F1(i nu0, i nu; 1; x),
**   som_F1 = 2F1(1 + i nu0, 1 + i nu; 2; x)   (d som_F/dx = -nu0 nu som_F1).
** Return 0 or -1. */
int som_F (double nu0, double nu, double x, double complex *f);
int som_F1 (double nu0, double nu, double x, double complex *f);

/* ---- the cross section --------------------------------------------------- */

/* Which momenta the non-relativistic formula is fed with (both are the same
** to O(beta^2); their difference is the ambiguity of using a
** non-relativistic formula at a finite energy):
**   SOM_P_REL  p = sqrt(t (t + 2)), beta = p/(1 + t)   (t = T/(m c^2); the
**              library's kinematics, and nu = Z alpha E/p is the parameter
**              of relativistic Coulomb waves)            -- the default
**   SOM_P_NR   p = sqrt(2 t), beta = p. */
enum { SOM_P_REL = 0, SOM_P_NR = 1 };

/* Sommerfeld's dsigma/dk in mb/MeV for a projectile of charge z (units of
** e, signed: -1 for an electron, +1 for a positron), mass m_mev (MeV) and
** kinetic energy t_mev (MeV) emitting a photon k_mev (MeV, 0 < k < T) on a
** bare point nucleus of charge Z (> 0; non-integer allowed).  Attracted
** when z Z < 0.  With SOM_P_REL momenta.  Static field (no recoil, no
** reduced mass).  NaN outside the domain or where |nu0| > 100 (overflow of
** e^(2 pi nu0) is avoided only up to there). */
double som_dsdk (double z, double Z, double m_mev, double t_mev,
                 double k_mev);

/* The same with the momenta convention conv (SOM_P_REL or SOM_P_NR). */
double som_dsdk_conv (double z, double Z, double m_mev, double t_mev,
                      double k_mev, int conv);

/* Koch & Motz (1959) formula 3BN(a), the non-relativistic Born limit
**   dsigma/dk = (16/3) z^4 Z^2 alpha r0^2 / (k p0^2) ln((p0 + p)/(p0 - p)),
** in mb/MeV, with the momenta of conv (same arguments as som_dsdk_conv). */
double som_born_nr (double z, double Z, double m_mev, double t_mev,
                    double k_mev, int conv);

/* Kramers' (1923) semiclassical cross section (H. A. Kramers, Phil. Mag.
** 46 (1923) 836), the limit of Sommerfeld's for nu0, nu >> 1 (attracted):
**   dsigma/dk = (16 pi/(3 sqrt 3)) z^4 Z^2 alpha r0^2 / (k p0^2),
** in mb/MeV, with the momenta of conv (same arguments as som_dsdk_conv). */
double som_kramers (double z, double Z, double m_mev, double t_mev,
                    double k_mev, int conv);

/* The Gaunt factor g = som_dsdk_conv / som_kramers (same arguments): 1 in
** the classical limit of an attracted projectile; (sqrt 3/pi) ln((p0 +
** p)/(p0 - p)) in the Born limit. */
double som_gaunt (double z, double Z, double m_mev, double t_mev,
                  double k_mev, int conv);

/* The Coulomb parameters of the formula for these arguments: nu0 = -z Z
** alpha/beta0, nu = -z Z alpha/beta (> 0 when attracted).  Returns 0, or -1
** outside the domain. */
int som_nu (double z, double Z, double m_mev, double t_mev, double k_mev,
            int conv, double *nu0, double *nu);

#endif
