/*
** bl_suppress.h -- Landau-Pomeranchuk-Migdal and dielectric suppression of
** soft photons in a dense medium
** See Copyright Notice in LICENSE
*/

#ifndef BL_SUPPRESS_H
#define BL_SUPPRESS_H

#include "bl_material.h"
#include "bl_particle.h"

#ifdef __cplusplus
extern "C" {
#endif

enum {
  BL_SUPPRESS_NONE       = 0,
  BL_SUPPRESS_LPM        = 1,   /* Migdal (1956) */
  BL_SUPPRESS_DIELECTRIC = 2    /* LPM and Ter-Mikaelian's dielectric */
};

/* The medium seen by one projectile.  Plain data. */
typedef struct bl_suppress {
  int mode;           /* BL_SUPPRESS_* */
  double elpm;        /* LPM energy of this projectile, MeV */
  double plasma;      /* hbar omega_p of the medium, MeV */
  double s1;          /* Migdal's s1 = (Z^1/3 / 184)^2, Z averaged */
  double mass;        /* projectile mass, MeV */
  double X0cm;        /* radiation length, cm */
} bl_suppress;

/*
** Set *s for the medium m (density > 0 required unless mode is NONE) and
** projectile p:
**   E_LPM = (m_e c^2)^2 alpha X0 / (4 pi hbar c) (m/m_e)^4 / z^2,
**   hbar omega_p = 28.816 eV sqrt(rho <Z/A>),
** exceptions: BL_EDOMAIN (unknown mode, no density, bad particle)
*/
int bl_suppress_init (bl_suppress *s, int mode, const bl_material *m,
                      const bl_particle *p);

/*
** The factor (<= 1) multiplying dsigma/dk at total energy E0 (MeV) and
** photon energy k (MeV), 0 < k < E0 - m; 1 for mode NONE and for k
** outside (0, E0).
*/
double bl_suppress_factor (const bl_suppress *s, double E0, double k);

/* Migdal's functions (Stanev et al. 1982 fits): G(s), phi(s) and xi(s). */
double bl_migdal_G (double s);
double bl_migdal_phi (double s);
double bl_migdal_xi (double s, double s1);

/* Name of a mode ("none", "lpm", "lpm+dielectric"); id of a name or -1. */
const char *bl_suppress_name (int mode);
int bl_suppress_find (const char *name);

#ifdef __cplusplus
}
#endif

#endif
