/*
** hartree_fock.c -- Hartree-Fock atoms: tabulated F and S as Yukawa
** sums
** See Copyright Notice in LICENSE
**
** The atomic form factor F(q) and the incoherent scattering function S(q)
** of free atoms as xraylib tabulates them (FF_Rayl, SF_Compt: Hartree-Fock
** and related wave functions; Hubbell et al. 1975; Schoonjans et al. 2011),
** fitted per element by Yukawa sums so that the core keeps its closed-form
** azimuthal integral:
**
**   F(q)/Z = sum_i alpha_i b_i^2 / (b_i^2 + q^2)       (elastic)
**   S(q)/Z = sum_i alpha'_i q^2 / (b'_i^2 + q^2)        (atomic electrons)
**
** with sum alpha = sum alpha' = 1, so F(0) = Z, S(0) = 0, F -> 0 and S -> Z
** at large q, whatever the fit.  The fits, their method, the range they
** cover and their measured accuracy are in the header of the generated
** src/core/models/hf_table.c (scripts/fit-hf.c, `make hf-table`).  In short: fitted
** for q <= bl_hf_qmax = 2.48 MeV (x = 100 1/A), where the library's tables
** are sound; beyond, the Yukawa form runs to F = 0 and S = Z, which the
** tables are within 6e-4 Z of.  The weights may be negative (a bound shell
** is close to a double pole, which positive weights cannot follow): every
** fit is checked to be a valid screening function, 0 <= F/Z <= 1
** non-increasing and 0 <= S/Z <= 1 non-decreasing for all q, with
** sum |alpha| <= 10.  Z = 99 and 100, beyond the tables, are Z = 98 scaled
** as the Thomas-Fermi atom scales.
**
** Validity: free neutral atoms (no chemical binding, no solid-state
** effects); the elastic part reproduces Tsai's exact complete-screening
** constants of hydrogen and helium (tests/test_models.c, suite screening).
*/

#include <math.h>

#include "models/internal.h"


/* The fit of element Z, or NULL outside 1..BL_ZMAX. */
static const bl_hf_fit *hf_entry (int Z) {
  if (Z < 1 || Z > BL_ZMAX)
    return NULL;
  return &bl_hf_table[Z - 1];
}


/*
** F(q)/Z of the fit, q in MeV.  Z outside 1..BL_ZMAX gives NaN (callers
** check Z through the yukawa kernel first).
*/
static double hf_ff (double q, int Z, const double *p) {
  const bl_hf_fit *e = hf_entry(Z);
  double s = 0.0, q2 = q * q;
  int i;
  (void)p;
  if (e == NULL)
    return NAN;
  for (i = 0; i < e->nf; i++)
    s += e->fa[i] * e->fb[i] * e->fb[i] / (e->fb[i] * e->fb[i] + q2);
  return s;
}


static int hf_yukawa (int Z, const double *p, bl_yukawa *out) {
  const bl_hf_fit *e = hf_entry(Z);
  int i;
  (void)p;
  if (e == NULL)
    return BL_EDOMAIN;
  out->n = e->nf;
  for (i = 0; i < e->nf; i++) {
    out->alpha[i] = e->fa[i];
    out->b[i] = e->fb[i];
  }
  return BL_SUCCESS;
}


static int hf_incoherent (int Z, const double *p, bl_yukawa *out) {
  const bl_hf_fit *e = hf_entry(Z);
  int i;
  (void)p;
  if (e == NULL)
    return BL_EDOMAIN;
  out->n = e->ns;
  for (i = 0; i < e->ns; i++) {
    out->alpha[i] = e->sa[i];
    out->b[i] = e->sb[i];
  }
  return BL_SUCCESS;
}

const bl_model bl_model_hartree_fock = {
  BL_MODEL_HARTREE_FOCK, "hartree-fock",
  "Hartree-Fock form factor and incoherent scattering function of the free "
  "atom (xraylib tables), fitted by Yukawa sums",
  {&bl_ref_Hubbell1975, &bl_ref_Schoonjans2011, NULL, NULL},
  0, NULL, hf_ff, hf_yukawa, hf_incoherent
};
