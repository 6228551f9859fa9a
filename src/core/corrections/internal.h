/*
** corrections/internal.h -- the corrections beyond Born and where each
** holds (corrections.c), shared by the methods, not public
** See Copyright Notice in LICENSE
*/

#ifndef BL_CORRECTIONS_INTERNAL_H
#define BL_CORRECTIONS_INTERNAL_H

#include "born/internal.h"

/*
** Shared by the methods of dsigma/dk (born/dcs.c and the methods):
** bl_point_warn: the case's warnings and the Born warning at kn.
** bl_wanted: whether a BL_APPLY_* option applies where `valid` says it
**   holds; sets `bit` in *warn when forced on where it does not.
** bl_elwert / bl_elwert_valid: the Elwert factor and where it holds.
** bl_coulomb_valid / bl_coulomb_subtract: where the Davies-Bethe-Maximon
**   correction holds; subtract it from out->val (clamped at 0).
*/
unsigned bl_point_warn (const bl_case *c, const bl_kin *kn);
int bl_wanted (int opt, int valid, unsigned bit, unsigned *warn);
double bl_elwert (const bl_case *c, const bl_kin *kn);
int bl_elwert_valid (const bl_kin *kn);
int bl_coulomb_valid (const bl_case *c, const bl_kin *kn);
/* The part of the Coulomb rule that holds for every k of case c, and the
** photon energy (MeV) above which the final gamma is too low. */
int bl_coulomb_case_valid (const bl_case *c);
double bl_coulomb_kend (const bl_case *c);
/* The nuclear-size share of the correction (1 for a point nucleus); where
** "auto" subtracts it for the whole case; whether the case's option
** subtracts it at kn (BL_WARN_COULOMB in *warn when forced on where it
** does not hold). */
double bl_coulomb_share (const bl_case *c);
int bl_coulomb_case_auto (const bl_case *c);
int bl_coulomb_wanted (const bl_case *c, const bl_kin *kn, unsigned *warn);
void bl_coulomb_subtract (const bl_case *c, const bl_kin *kn, bl_result *out);

/*
** bl_spin_weights: the weights of phi1 and phi2 at v = E/E0 for spin 0 or
**   1/2 (the screening-function form of the high-energy methods).
** bl_corrections_closed: the corrections of a closed-form method at kn:
**   returns the Elwert factor of the nuclear part (1 when not applied),
**   sets *coul when the Coulomb correction is to be subtracted, and fills
**   out->warn and out->applied.
*/
void bl_spin_weights (double spin, double v, double *w1, double *w2);
double bl_corrections_closed (const bl_case *c, const bl_kin *kn,
                              bl_result *out, int *coul);

#endif
