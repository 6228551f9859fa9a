/*
** bl_const.h -- physical constants (CODATA 2018) and particle masses
** See Copyright Notice in LICENSE
*/
#ifndef BL_CONST_H
#define BL_CONST_H

/* CODATA 2018 recommended values (Tiesinga et al., Rev. Mod. Phys. 93 (2021) 025010) */
#define BL_ALPHA       (1.0 / 137.035999084)   /* fine-structure constant */
#define BL_RE_FM       2.8179403262            /* classical electron radius, fm */
#define BL_ME_MEV      0.51099895000           /* electron mass, MeV */
#define BL_HBARC_MEVFM 197.3269804             /* hbar c, MeV fm */
#define BL_NA          6.02214076e23           /* Avogadro constant, 1/mol */
#define BL_BOHR_FM     52917.721090            /* Bohr radius, fm (CODATA 2018: 0.529177210903 A) */
#define BL_FM2_PER_MB  0.1                     /* 1 mb = 0.1 fm^2 */
#define BL_PI          3.14159265358979323846

/* Masses (MeV), Review of Particle Physics (Particle Data Group, 2022) */
#define BL_MMU_MEV     105.6583755
#define BL_MPI_MEV     139.57039
#define BL_MK_MEV      493.677
#define BL_MP_MEV      938.27208816

#endif
