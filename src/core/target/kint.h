/*
** kint.h -- the integrals over k with the points' tolerance set by the
** integrator (the core's own variant of bl_kintegral_e)
** See Copyright Notice in LICENSE
*/

#ifndef BL_KINT_H
#define BL_KINT_H

#include "brakelight/bl_integral.h"

/* Ask the next points of f at relative tolerance rtol (ud is f's). */
typedef void (*bl_ktolfunc) (void *ud, double rtol);

/*
** As bl_kintegral_e (moment 0 or 1, out1 NULL) or bl_kintegral2_e (moment
** 0 and out1 not NULL), but the integrator chooses each point's tolerance
** through settol (not NULL) before computing it: rtol/2 where the points
** carry a large share of the integral, up to 1e-2 where their share is
** small; and out->err adds the points' own errors summed with the rules'
** weights instead of the worst relative error times the value.  A point
** remembered at a looser tolerance than the one asked is computed again.
** exceptions: as bl_kintegral_e
*/
int bl_kintegral_tol_e (bl_kfunc f, bl_ktolfunc settol, void *ud, double kmin,
                        double kmax, double T, const double *kbreak,
                        int nbreak, int moment, double rtol, bl_result *out0,
                        bl_result *out1);

#endif
