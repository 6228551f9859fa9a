/*
** ebrems/internal.h -- the amplitudes of electron-target bremsstrahlung and
** the kinematics of one phase-space point, shared inside the core (and with
** tests/test_ebrems.c), not public
** See Copyright Notice in LICENSE
*/
#ifndef BL_EBREMS_INTERNAL_H
#define BL_EBREMS_INTERNAL_H

#include <complex.h>

#include "brakelight/bl_ebrems.h"

/* Momenta of one point, lab frame, units of m_e: p[0] = p1 (projectile in),
** p[1] = p2 (electron at rest), p[2] = p3 (projectile out), p[3] = p4
** (electron out), p[4] = k. */
typedef struct bl_ebpoint {
  double p[5][4];
  double pstar;    /* |p3| = |p4| in the rest frame of p3 + p4 */
  double w;        /* invariant mass of p3 + p4 */
} bl_ebpoint;

/* Number of amplitudes per polarisation: 2^4 spin states (spin 0: 4). */
#define BL_EB_NAMP 16

/*
** The helicity amplitudes M[pol][s] (e^3 included) for the two polarisation
** vectors eps[0], eps[1] (real four-vectors, contravariant), spin index
** s = ((s1 * 2 + s2) * 2 + s3) * 2 + s4 (s1 = s3 = 0 for spin 0).
*/
void bl_eb_amplitudes (const bl_ebrems *c, const double p[5][4],
                       const double eps[2][4],
                       double complex M[2][BL_EB_NAMP]);

/* Two real transverse unit polarisation vectors of the photon k. */
void bl_eb_polarisations (const double k[4], double eps[2][4]);

/* sum |M|^2 over spins and the two polarisations (m_e^-2). */
double bl_eb_msq (const bl_ebrems *c, const double p[5][4]);

/*
** The point at photon energy k (m_e), photon direction h_k = 1 - cos(theta_k)
** (sine sk), and projectile direction in the p3 + p4 rest frame:
** h_s = 1 - cos(theta_s) (sine ss), azimuth phi_s.  0 if the point is
** kinematically allowed (x filled), -1 if not (beyond the end point).
*/
int bl_eb_point_set (const bl_ebrems *c, double k, double hk, double sk,
                     double hs, double ss, double phis, bl_ebpoint *x);

/* d5sigma/(dk dOmega_k dOmega_s) at x in units of lambda_e^2 / m_e per
** sr^2 (lambda_e = hbar / (m_e c)). */
double bl_eb_d5 (const bl_ebrems *c, const bl_ebpoint *x);

/* lambda_e^2 / m_e in mb/MeV. */
double bl_eb_unit (void);

#endif
