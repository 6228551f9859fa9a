/*
** bl_internal.h -- declarations shared by the core files, not public
** See Copyright Notice in LICENSE
*/
#ifndef BL_INTERNAL_H
#define BL_INTERNAL_H

#include "brakelight.h"

/* References (src/bl_references.c). */
extern const bl_ref bl_ref_BetheHeitler1934;
extern const bl_ref bl_ref_KochMotz1959;
extern const bl_ref bl_ref_Schiff1951;
extern const bl_ref bl_ref_Low1958;
extern const bl_ref bl_ref_Moliere1947;
extern const bl_ref bl_ref_Tsai1974;
extern const bl_ref bl_ref_Hubbell1975;
extern const bl_ref bl_ref_Schoonjans2011;

/* Screening models (one file each). */
extern const bl_model bl_model_none;
extern const bl_model bl_model_exponential;
extern const bl_model bl_model_thomas_fermi;
extern const bl_model bl_model_hartree_fock;

/*
** Hartree-Fock screening: Yukawa fits of xraylib's F and S per element,
** generated into src/bl_hf_table.c by scripts/fit-hf.c (`make hf-table`):
**   F/Z = sum_i fa_i fb_i^2/(fb_i^2 + q^2),
**   S/Z = sum_i sa_i q^2/(sb_i^2 + q^2),
** q and b in MeV, sum fa = sum sa = 1 (either sign), b increasing.
*/
typedef struct bl_hf_fit {
  int nf, ns;                                  /* terms of F and S */
  double fa[BL_YUKAWA_MAX], fb[BL_YUKAWA_MAX];
  double sa[BL_YUKAWA_MAX], sb[BL_YUKAWA_MAX];
  int zsrc;                                    /* element whose table
                                               ** was fitted */
} bl_hf_fit;

extern const bl_hf_fit bl_hf_table[BL_ZMAX];   /* index Z - 1 */
extern const double bl_hf_qmax;                /* MeV: upper end of the fit */

/* The uniform-sphere fit of bl_nucleus.c: poles in units of R^-2. */
#define BL_NUCLEUS_NPOLE 4
extern const double bl_nucleus_pole[BL_NUCLEUS_NPOLE];
extern const double bl_nucleus_coef[BL_NUCLEUS_NPOLE];

/* R = 1.2 A^1/3 fm. */
double bl_nucleus_radius (double A);

/*
** Kinematics of one photon energy, in units of the projectile mass
** (hbar = c = m = 1).  Filled by bl_kin_set; read-only afterwards.
*/
typedef struct bl_kin {
  double E0, p0;      /* initial total energy and momentum */
  double E, p;        /* final */
  double k;           /* photon energy */
  double delta;       /* p0 - p - k > 0, smallest momentum transfer */
  double hc0, hc;     /* 1/(p0 (E0+p0)), 1/(p (E+p)): D0 = p0 (h0 + hc0) */
  double spin;        /* 0 or 0.5 */
} bl_kin;

/* Polar geometry in the frame with the photon along z: h = 1 - cos(theta),
** s = sin(theta), for the initial (h0, s0) and final (h, s) directions. */
typedef struct bl_polar {
  double h0, s0, h, s;
  /* Near the ridge p s = p0 s0 (set ridge = 1): h* and s* = p0 s0 / p of the
  ** ridge, q_z there, and dh = h - h* known without rounding. */
  int ridge;
  double hs, ss, qzs, dh;
} bl_polar;

/*
** The bracket B of the Born cross section, written for fixed polar angles as
**   B(v) = L0 + L1 v - x (M0 + M1 v),   x = q^2 = Q0 + b v,   v = 1 - cos(phi),
** with every coefficient >= 0 (M0 = M1 = 0 for spin 0).
*/
typedef struct bl_bracket {
  double L0, L1, M0, M1;
  double Q0, b;
} bl_bracket;

/* Kinematics for kinetic energy t0 and photon energy k (units of m);
** requires 0 < k < t0. */
void bl_kin_set (bl_kin *kn, double t0, double k, double spin);

/* Bracket coefficients at the polar geometry g. */
void bl_bracket_set (const bl_kin *kn, const bl_polar *g, bl_bracket *br);

/* Azimuthal integral  int_0^pi B(v) W(x) dphi  with
** W(x) = sum_i single[i] w_i + sum_t c_t w_i w_j, w_i = 1/(pole[i] + x),
** pole[i] >= 0 and pole[i] <= pole[j] in every term; closed form. */
double bl_bracket_azimuth (const bl_bracket *br, int npole,
                           const double *pole, const double *single,
                           int nterm, const bl_term *term);

/* B(v) W(x) at one azimuth. */
double bl_bracket_point (const bl_bracket *br, double v, int npole,
                         const double *pole, const double *single, int nterm,
                         const bl_term *term);

/*
** Shared by the methods of dsigma/dk (src/bl_dcs.c):
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
void bl_coulomb_subtract (const bl_case *c, const bl_kin *kn, bl_result *out);

#endif
