/*
** bl_integral.h -- integrals over the photon energy: cross sections,
** radiated energy, binned yields
** See Copyright Notice in LICENSE
*/

#ifndef BL_INTEGRAL_H
#define BL_INTEGRAL_H

#include "bl_result.h"

#ifdef __cplusplus
extern "C" {
#endif

/*
** A differential cross section in k: fills *out at photon energy k
** (0 < k < T) and returns BL_SUCCESS, a non-convergence status (the
** estimate is used, with the tolerance warning) or a hard failure (the
** integral stops and returns it).  May be called from the integrator only,
** never concurrently for one integral.
*/
typedef int (*bl_kfunc) (void *ud, double k, bl_result *out);

/* Most breakpoints one integral takes. */
#define BL_KINT_MAXBREAK 8

/*
** out = int_kmin^kmax k^moment f(k) dk  (moment 0 or 1), T the end of the
** spectrum (kmax <= T).  kmin = 0 is allowed (the k -> 0 end of k f(k) is
** integrable and is integrated exactly, by the map k = a w^2, never cut);
** the range through k -> T is mapped so that a square-root edge of f is
** smooth.  kbreak[0..nbreak-1] (may be NULL when nbreak = 0; at most
** BL_KINT_MAXBREAK) are photon energies where f jumps or kinks (a
** correction switching on): the rule never straddles them.  rtol is the
** relative tolerance of the integral: the quadrature aims at rtol/2, and
** the points should be computed to rtol/2; out->err adds the quadrature
** error and the worst relative error of a point times the value, and a
** total above rtol |value| gives BL_ENOTCONV with the tolerance warning.  out->warn and
** out->applied unite those of every point; out->method is that of the
** last point if all agree, else -1.  exceptions: BL_EDOMAIN, BL_ENOMEM,
** BL_ENOTCONV (estimate in out), the first hard failure of f
*/
int bl_kintegral_e (bl_kfunc f, void *ud, double kmin, double kmax, double T,
                    const double *kbreak, int nbreak, int moment, double rtol,
                    bl_result *out);

/*
** Both moments at once on shared evaluations: out0 = int f, out1 =
** int k f, over the same range.  Same rules as bl_kintegral_e.
*/
int bl_kintegral2_e (bl_kfunc f, void *ud, double kmin, double kmax, double T,
                     const double *kbreak, int nbreak, double rtol,
                     bl_result *out0, bl_result *out1);

#ifdef __cplusplus
}
#endif

#endif
