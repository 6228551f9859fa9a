/*
** bl_corrections.h -- where the corrections beyond the first Born
** approximation hold: the bounds the core applies, exported so that
** messages and documentation take their numbers from here
** See Copyright Notice in LICENSE
*/
#ifndef BL_CORRECTIONS_H
#define BL_CORRECTIONS_H

#include "bl_const.h"

/*
** Elwert factor: slow projectiles, gamma0 <= BL_ELWERT_GAMMA0_MAX (Koch &
** Motz's recommendation for electrons up to T = 2 MeV, from memory); the
** factor is a ratio of Sommerfeld factors, so the bound is on the velocity.
*/
#define BL_ELWERT_T_ELECTRON 2.0   /* MeV: the bound for electrons */
#define BL_ELWERT_GAMMA0_MAX (1.0 + BL_ELWERT_T_ELECTRON / BL_ME_MEV)

/*
** Coulomb correction (Davies, Bethe & Maximon 1954): gamma0 >=
** BL_COULOMB_GAMMA0_MIN before and gamma >= BL_COULOMB_GAMMA_MIN after
** emission, and a Compton wavelength hbar/(m c) of at least
** BL_COULOMB_RADII nuclear radii (the correction comes from distances
** ~ hbar/(m c), where the field must still be a point Coulomb field).
*/
#define BL_COULOMB_GAMMA0_MIN 100.0
#define BL_COULOMB_GAMMA_MIN  10.0
#define BL_COULOMB_RADII      10.0

/*
** Born validity: Koch & Motz (1959) require 2 pi |z| Z alpha / beta << 1
** for both velocities (BL_BORN_XI_MAX, the bound the messages quote); the
** core warns (BL_WARN_BORN) where the size of the Coulomb effects,
** bl_coulomb_effect, exceeds BL_SYS_WARN.
*/
#define BL_BORN_XI_MAX 1.0

#ifdef __cplusplus
extern "C" {
#endif

/* The Born parameter 2 pi |z| Z alpha / beta of a projectile of charge z
** and mass m (MeV) at kinetic energy T (MeV) in the field of charge Z. */
double bl_born_xi (double z, int Z, double T, double m);

/* The estimated relative size of the Coulomb effects the first Born
** approximation leaves out, for a projectile of charge z and mass m (MeV)
** of kinetic energy T emitting k (MeV) on charge Z: the larger of the
** Elwert factor's departure from 1 and f(zZ alpha)/(ln(2 E0 E/k) - 1/2).
** BL_WARN_BORN is set where it exceeds BL_SYS_WARN.  0 for bad
** arguments. */
double bl_coulomb_effect (double z, int Z, double m, double T, double k);

#ifdef __cplusplus
}
#endif

#endif
