/*
** models/internal.h -- declarations shared by the model files and the
** registry, not public
** See Copyright Notice in LICENSE
*/

#ifndef BL_MODELS_INTERNAL_H
#define BL_MODELS_INTERNAL_H

#include "brakelight.h"

/* References (references.c). */
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
** generated into hf_table.c by scripts/fit-hf.c (`make hf-table`):
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

#endif
