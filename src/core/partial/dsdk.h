/*
** partial/dsdk.h -- dsigma/dk of a spin-1/2 projectile in the static
** field of a screened atom from exact Dirac partial waves (multipole
** sum); not public
** See Copyright Notice in LICENSE
**
** Derivation, normalization and measured accuracy: DEVELOPERS.md,
** "Partial waves: dsigma/dk".  Units as partial/internal.h except where
** a prototype says MeV.
*/

#ifndef BL_PARTIAL_DSDK_H
#define BL_PARTIAL_DSDK_H

#include <stddef.h>

#include "partial/internal.h"

/*
** Reduced matrix element <kappa_a||C_L||kappa_b> of C_L = sqrt(4 pi/(2L+1))
** Y_L between spherical spinors (Edmonds' convention of the Wigner-Eckart
** theorem), closed form (Johnson 2007, "Atomic Structure Theory", sec. 3):
**   (-1)^(j_a + 1/2) sqrt((2j_a+1)(2j_b+1)) (j_a L j_b; -1/2 0 1/2)
** if l_a + L + l_b is even, else 0.  kappa_a, kappa_b != 0, L >= 0
** (0 returned otherwise).
*/
double bl_pw_cred (int ka, int L, int kb);

/*
** Reduced matrix element <kappa_b||sigma . Y_{J L}||kappa_a> of the vector
** spherical harmonic Y_{J L M} = sum <L m 1 q|J M> Y_{L m} e_q dotted
** into the Pauli matrices, L = J - 1, J or J + 1, J >= 1, from closed
** forms in bl_pw_cred (checked against the 9j recoupling in
** tests/test_pwdsdk.c).  0 outside that range.
*/
double bl_pw_sred (int kb, int ka, int J, int L);

/*
** The radial integral of the free field
**   I = int_0^inf (pa r) j_la(pa r) (pb r) j_lb(pb r) j_L(k r) dr
** computed by the quadrature of bl_pw_dsdk (Gauss-Legendre panels up to
** a ray start, complex rays beyond it), and *scale the sum of the
** absolute values of the pieces it is made of (so |I| / scale is the
** relative cancellation).  pa, pb, k > 0 (units of m c), la, lb, L >= 0.
** Returns BL_SUCCESS, BL_EDOMAIN or BL_ENOMEM.
*/
int bl_pw_free3 (double pa, int la, double pb, int lb, double k, int L,
                 double *val, double *scale);

/* What bl_pw_dsdk_x measured (for reports and tests). */
typedef struct bl_pwinfo {
  int lmax;        /* largest l of the initial waves summed */
  int jmax;        /* largest photon multipole J allowed */
  int jused;       /* largest J reached by the adaptive J sums */
  int dused;       /* largest |l_f - l_i| reached */
  int nodes;       /* radial nodes on [0, R] */
  double R;        /* start of the complex rays, units of hbar/(m c) */
  long pairs;      /* (kappa_i, kappa_f) pairs computed */
  double ltail;    /* estimated relative remainder of the l sum */
  double jtail;    /* relative size of the last multipole shell J = jmax */
  int method;      /* BL_PW_DIRECT or BL_PW_BORNSUB: the path taken */
  double born;     /* BL_PW_BORNSUB: the closed-form Born part, mb/MeV */
} bl_pwinfo;

/*
** The two ways of summing (bl_pw_dsdk_m):
** BL_PW_DIRECT: the exact terms T(V) of every (kappa_i, kappa_f, J)
**   summed as they are;
** BL_PW_BORNSUB: the closed-form Born dsigma/dk of the same field
**   (bl_dcs_dk_e) plus the sum of T(V) - T_1(V), T_1 the lowest-order
**   term, [T(eps V) + T(-eps V)] / (2 eps^2), eps such that the scaled
**   field's Sommerfeld parameter |eps zza| E_f/p_f is BL_PW_BORN_NU: the
**   differences fall off much faster in l and J (DEVELOPERS.md,
**   "Partial waves: dsigma/dk").  Falls back to BL_PW_DIRECT where the
**   library's Born cannot represent the field (a uniform nucleus above
**   R = 1.2 * 300^1/3 fm) and where the result cancels so much of Born
**   that T_1's own error (2 nu^2 of Born) and Born's quadrature error
**   exceed rtol/5 of it (e+ at 10 keV, y = 0.9); info->method tells.
*/
/* BL_PW_AUTO: BL_PW_BORNSUB where the photon multipole cap is reached
** (8 + 4 k/max(q_min, 2 c_min) > 60: the direct sum loses every J
** beyond it, the subtraction only the differences: Au e- 3 MeV y = 0.5
** direct 1 % low, outside its err), else BL_PW_DIRECT (faster at and
** below 1 MeV except at small y, DEVELOPERS.md). */
enum { BL_PW_DIRECT = 1, BL_PW_BORNSUB = 2, BL_PW_AUTO = 3 };
#define BL_PW_BORN_NU 1e-4

/*
** Checks of bl_pw_dsdk's arguments: 0 if valid, else BL_EDOMAIN with a
** message naming the parameter, its value and the allowed range in
** msg[0..size-1] (msg may be NULL).
*/
int bl_pw_dsdk_check (const bl_pwpot *v, double m_mev, double z, double T,
                      double k, double rtol, char *msg, size_t size);

/*
** dsigma/dk (mb/MeV, per atom) of a spin-1/2 projectile of mass m_mev
** (MeV) and charge z (units of e) with kinetic energy T (MeV) emitting a
** photon of energy k (MeV, 0 < k < T) in the field v (v->zza must be
** z Z alpha: same sign as z, or 0), integrated over the photon and final
** projectile directions, summed over spins and polarizations, exact to
** first order in the photon field and to all orders in V, in the units
** of the Born bl_dcs_dk_e (its norm z^4 Z^2 alpha r0^2 included).  z
** enters twice: through v->zza and through the z^2 of the photon
** coupling (hence the extra argument; the interface of the brief had
** none).  rtol (1e-6 .. 0.1): relative target of the sums.  *err: the
** estimated error (truncation of the l and J sums).
** exceptions: BL_EDOMAIN, BL_ENOMEM, BL_ENOTCONV (sums not converged
** within their caps; *dsdk and *err still filled), codes of bl_pw_radial.
*/
int bl_pw_dsdk (const bl_pwpot *v, double m_mev, double z, double T,
                double k, double rtol, double *dsdk, double *err);

/* The same, with what was measured in *info (may be NULL). */
int bl_pw_dsdk_x (const bl_pwpot *v, double m_mev, double z, double T,
                  double k, double rtol, double *dsdk, double *err,
                  bl_pwinfo *info);

/* The same by the given method (BL_PW_DIRECT, BL_PW_BORNSUB or
** BL_PW_AUTO; else BL_EDOMAIN); bl_pw_dsdk and bl_pw_dsdk_x use
** BL_PW_DEFAULT. */
int bl_pw_dsdk_m (const bl_pwpot *v, double m_mev, double z, double T,
                  double k, double rtol, int method, double *dsdk,
                  double *err, bl_pwinfo *info);
#define BL_PW_DEFAULT BL_PW_AUTO

#endif
