/*
** kochmotz.h -- closed-form reference cross sections for the tests only
** See Copyright Notice in LICENSE
**
** Independent transcriptions of published bremsstrahlung formulas, used by
** tests/test_*.c to check the numerical core.  Nothing here is part of the
** library and nothing here calls it.
**
** Convention for every function below (the same for all of them):
**   - energies and momenta in units of the projectile mass m (c = 1):
**     t0 = T/m is the initial kinetic energy, k the photon energy, both in
**     units of m c^2;
**   - the return value is the cross section divided by  Z^2 alpha r0^2,
**     r0 = alpha hbar/(m c), and per unit photon energy measured in m c^2.
**     For a projectile of charge z on a target of atomic number Z:
**
**       dsigma/dk [mb/MeV] = z^4 Z^2 alpha r0^2[mb] / (m[MeV]) * km_xxx(t0, k)
**
**     and the fully differential Low form (km_low) is the same per sr^2.
**
** Sources: H. W. Koch and J. W. Motz, Rev. Mod. Phys. 31 (1959) 920 ("KM"
** below, formula numbers as printed there); L. I. Schiff, Phys. Rev. 83
** (1951) 252; F. E. Low, Phys. Rev. 110 (1958) 974.
*/
#ifndef KOCHMOTZ_H
#define KOCHMOTZ_H

/* KM formula 3BN: Bethe-Heitler Born dsigma/dk, point nucleus, no
** screening, any energy.  0 < k < t0. */
double km_3bn (double t0, double k);

/* KM formula 3BN(a): non-relativistic limit of 3BN.  0 < k < t0. */
double km_3bn_nr (double t0, double k);

/* KM formula 3BN(b): extreme-relativistic limit of 3BN.  0 < k < t0. */
double km_3bn_er (double t0, double k);

/* KM formula 3BS(e) (Schiff 1951): high-energy dsigma/dk with exponential
** screening of screening radius `a` in units of hbar/(m c) (a = INFINITY
** gives the unscreened limit).  Valid for E0, E >> 1 only. */
double km_3bse (double t0, double k, double a);

/* Schiff's screening radius 111 Z^(-1/3) hbar/(m_e c), expressed in units of
** hbar/(m c) of a projectile with mass ratio m_over_me = m/m_e. */
double km_schiff_radius (int Z, double m_over_me);

/* Low's soft-photon limit (Low 1958) of d3sigma/(dk dOmega_k dOmega_p) for a
** projectile of spin 0 or 0.5 on a point charge Z, per unit Z^2 alpha r0^2
** (units above, per sr^2).  Angles in the beam frame: theta_k and theta_p
** are the polar angles of the photon and of the outgoing particle from the
** beam axis, phi their azimuth difference.  The elastic factor is evaluated
** with the initial energy E0 and the exact momentum transfer
** q = p0 - p - k of the radiative event (any choice differs at O(k)). */
double km_low (double spin, double t0, double k, double theta_k,
               double theta_p, double phi);

#endif
