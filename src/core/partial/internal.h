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
** Fill *v for the projectile's zza = z Z alpha in the field of screening
** y (bl_models.h: a_i = alpha_i, c_i = b_i / m_mev), a projectile of mass
** m_mev (MeV) and a uniform nucleus of radius R_fm (fm; 0: a point), in
** the units above (c_i in m c/hbar, R = R_fm m_mev / hbar c).  rc is the
** smallest r >= R with |zza| sum_i |a_i| E1(c_i rc) <= tol: the phase
** the potential beyond rc can add to any wave is then at most
** (2 E/p) tol (radial.c).  Returns BL_SUCCESS; BL_EDOMAIN for a NULL
** pointer, non-finite or out-of-range argument (zza finite, 1 <= y->n <=
** BL_YUKAWA_MAX, every alpha_i finite, every b_i finite and >= 0,
** |sum alpha_i - 1| <= BL_PW_SUM_TOL, m_mev > 0, R_fm >= 0, 0 < tol < 1);
** BL_EMODEL for a bare Coulomb term (b_i = 0 with alpha_i != 0: no
** finite rc; a Coulomb tail match is not done here).
*/
int bl_pwpot_init (bl_pwpot *v, double zza, const bl_yukawa *y, double m_mev,
                   double R_fm, double tol);

/* how far sum alpha_i (sum a_i) may be from 1 */
#define BL_PW_SUM_TOL 1e-6
/* largest |kappa| bl_pw_radial accepts */
#define BL_PW_KAPPA_MAX 100000

/*
** The checks of bl_pwpot_init (v not read) and of bl_pw_radial: 0 if
** the arguments are valid, else BL_EDOMAIN (or BL_EMODEL) with a message
** naming the parameter, its value and the allowed range written to
** msg[0..size-1] (msg may be NULL).  bl_pw_radial_check also checks *v
** (every field as bl_pwpot_init makes it, rc >= R finite) and, for a
** point nucleus, |zza sum a_i| < |kappa| (a real power r^gamma).
*/
int bl_pwpot_check (double zza, const bl_yukawa *y, double m_mev,
                    double R_fm, double tol, char *msg, size_t size);
int bl_pw_radial_check (const bl_pwpot *v, double E, int kappa, int n,
                        const double *r, char *msg, size_t size);

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
