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

/* The struck electron line's momentum transfers, exactly: t[0] = (p4 -
** p2)^2, t[1] = (p3 - p2)^2, and the vectors v[0] = p4 - p2, v[1] = p3 -
** p2 in the frame of the momenta they go with (nv = 0: no vectors, nv = 1:
** v[0] only, nv = 2: both). */
typedef struct bl_ebq {
  double t[2];
  double v[2][4];
  int nv;
} bl_ebq;

/* Momenta of one point, lab frame, units of m_e: p[0] = p1 (projectile in),
** p[1] = p2 (electron at rest), p[2] = p3 (projectile out), p[3] = p4
** (electron out), p[4] = k. */
typedef struct bl_ebpoint {
  double p[5][4];
  double f[5][4];  /* the same momenta in the rest frame of p3 + p4, axes
                   ** (ex, ey, ez) of bl_ebframe */
  double q24, q23; /* (p4 - p2)^2 and (p3 - p2)^2, free of cancellation */
  bl_ebq q;        /* the same with the vectors in the pair frame (f) */
  double pstar;    /* |p3| = |p4| in the rest frame of p3 + p4 */
  double w;        /* invariant mass of p3 + p4 */
} bl_ebpoint;

/* What one photon (energy k, direction h_k = 1 - cos theta_k, sine sk)
** fixes: the pair's invariant mass, its frame (ez along P = p1 + p2 - k,
** ex towards the photon), the photon there, the smallest recoils. */
typedef struct bl_ebframe {
  double k, hk, sk, ck, kap;    /* kap = p1.k */
  double w, w2, ps, e3s, e4s;   /* W, W^2, p*, E3*, E4* */
  double P0, Pn, g, gb;         /* lab |P|, gamma, gamma beta of the pair */
  double ez[3], ex[3], ey[3];   /* lab components of the axes */
  double k0s, kT, kzs, sks, cks; /* the photon in the pair frame */
  double E1s;                   /* the projectile's energy there */
  double t4min, t3min;          /* T4 at hs = 0, E3 - m at hs = 2 */
} bl_ebframe;

/* The frame at photon energy k (m_e) and direction: 0, or -1 beyond the end
** point. */
int bl_eb_frame_set (const bl_ebrems *c, double k, double hk, double sk,
                     bl_ebframe *f);

/* The point of f whose projectile moves in the pair frame along
** n = (tx, ty, 1 - hs) (axes ex, ey, ez), hs2 = 2 - hs (both given, each
** free of cancellation near its pole). */
void bl_eb_point_at (const bl_ebrems *c, const bl_ebframe *f, double hs,
                     double hs2, double tx, double ty, bl_ebpoint *x);

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

/* The same with the struck electron line's transfers given (NULL: from
** the components). */
void bl_eb_amplitudes_q (const bl_ebrems *c, const double p[5][4],
                         const double eps[2][4], const bl_ebq *qy,
                         double complex M[2][BL_EB_NAMP]);
double bl_eb_msq_q (const bl_ebrems *c, const double p[5][4],
                    const bl_ebq *qy);

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

/* The binding weight S(q)/Z of x (1 for a free electron; 0 <= w <= 1). */
double bl_eb_binding (const bl_ebrems *c, const bl_ebpoint *x);

/* lambda_e^2 / m_e in mb/MeV. */
double bl_eb_unit (void);

/*
** The largest photon polar variable h_k = 1 - cos(theta_k) at photon
** energy k (m_e) that leaves W >= m + m_e: h_k <= (t0/k - 1/y_max) / p0
** (may be <= 0: no direction; callers clamp to [0, 2]).
*/
static inline double bl_eb_hkmax (const bl_ebrems *c, double k) {
  return (c->t0 / k - 1.0 / c->ymax) / c->p0;
}

#endif
