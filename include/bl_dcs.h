/*
** bl_dcs.h -- Born bremsstrahlung cross sections of a projectile on an atom
** See Copyright Notice in LICENSE
*/
#ifndef BL_DCS_H
#define BL_DCS_H

#include "bl_models.h"
#include "bl_particle.h"
#include "bl_quad.h"
#include "bl_result.h"

#ifdef __cplusplus
extern "C" {
#endif

/* One computation: projectile, target atom, kinetic energy.  Filled by
** bl_case_init; plain data, may be copied; nothing to free. */
typedef struct bl_case {
  bl_particle particle;
  int Z;                      /* atomic number of the target */
  const bl_model *screening;
  double params[8];           /* screening-model parameters (defaults filled) */
  double T;                   /* kinetic energy, MeV */
  /* derived */
  double t0;                  /* T / m */
  double norm;                /* z^4 Z^2 alpha r0^2, mb; r0 = alpha hbar/(m c) */
  int ny;                     /* Yukawa terms of the screening */
  double ya[BL_YUKAWA_MAX];   /* their weights alpha_i */
  double yb[BL_YUKAWA_MAX];   /* b_i^2 in units of m^2 */
  unsigned warn;              /* warnings that hold for every k (BL_WARN_*) */
} bl_case;

/* Prepare a case.  Returns BL_SUCCESS; BL_EDOMAIN for an invalid particle,
** Z outside 1..100 or T not in (0, inf); BL_EMODEL if the model has no
** Yukawa form.  `params` may be NULL (defaults). */
int bl_case_init (bl_case *c, const bl_particle *p, int Z,
                  const bl_model *screening, const double *params, double T);

/* Fully differential d3sigma/(dk dOmega_k dOmega_p), mb/(MeV sr^2), at photon
** energy k (MeV, 0 < k < T), photon polar angle theta_k and final-particle
** polar angle theta_p (radians from the beam axis, in [0, pi]) and azimuth
** phi between them around the beam axis.  exceptions: BL_EDOMAIN */
int bl_dcs_full_e (const bl_case *c, double k, double theta_k,
                   double theta_p, double phi, bl_result *out);

/* d2sigma/(dk dOmega_k), mb/(MeV sr), integrated over the final particle.
** exceptions: BL_EDOMAIN, GSL_EMAXITER, GSL_EROUND (out still filled) */
int bl_dcs_angular_e (const bl_case *c, double k, double theta_k,
                      bl_quad *q, bl_result *out);

/* dsigma/dk, mb/MeV, integrated over photon and particle directions.
** exceptions: BL_EDOMAIN, GSL_EMAXITER, GSL_EROUND (out still filled) */
int bl_dcs_dk_e (const bl_case *c, double k, bl_quad *q, bl_result *out);

#ifdef __cplusplus
}
#endif

#endif
