/*
** partial/internal.h -- the partial-wave room: exact Dirac continuum
** states in the static field of a screened atom, and the bremsstrahlung
** cross sections built from them; not public
** See Copyright Notice in LICENSE
**
** Units: hbar = c = m = 1 (m the projectile's mass): r in hbar/(m c),
** energies in m c^2, momenta in m c.
*/

#ifndef BL_PARTIAL_INTERNAL_H
#define BL_PARTIAL_INTERNAL_H

#include "brakelight.h"

/*
** The projectile's potential energy in the static field of the atom:
**   V(r) = zza * [ phi_N(r) - 1/r + sum_i a_i e^{-c_i r} / r ],
** zza = z Z alpha (< 0 attracts: electrons, negative muons), phi_N the
** potential shape of a uniform sphere of radius R (1/r outside; R = 0 a
** point nucleus), a_i and c_i the screening model's Yukawa form
** (alpha_i, b_i / m of bl_yukawa: sum a_i = 1; n = 1, a = 1, c = 0 is
** the bare nucleus).  This is the Fourier transform of the Born core's
** elastic charge (Z F_N - F)/q^2.
** rc: beyond rc the potential is taken as 0 (free waves); set by
** bl_pwpot_init from the tolerance it is given.
*/
typedef struct bl_pwpot {
  double zza;
  int n;
  double a[BL_YUKAWA_MAX], c[BL_YUKAWA_MAX];
  double R;
  double rc;
} bl_pwpot;

/*
** Regular solution of the radial Dirac equation (g = P/r, f = Q/r):
**   P' = -kappa P/r + (E + 1 - V) Q,
**   Q' =  kappa Q/r - (E - 1 - V) P,
** for total energy E > 1 and kappa != 0 (l = kappa for kappa > 0,
** -kappa - 1 for kappa < 0; lbar = l - sgn kappa), normalized so that
** for r >= rc, with x = p r and p = sqrt(E^2 - 1),
**   P = x (cos d j_l(x) - sin d y_l(x)),
**   Q = sgn(kappa) p/(E + 1) x (cos d j_lbar(x) - sin d y_lbar(x)),
** (x j_l -> sin(x - l pi/2), x y_l -> -cos(x - l pi/2)).
** Fills P[i], Q[i] at the n increasing radii r[i] > 0 (any may lie beyond
** rc, where the free form above is used) and the phase shift d in
** *delta (modulo pi, in (-pi/2, pi/2]).  Returns 0 or a BL_E* code.
*/
int bl_pw_radial (const bl_pwpot *v, double E, int kappa, int n,
                  const double *r, double *P, double *Q, double *delta);

#endif
