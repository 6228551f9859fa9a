/*
** bl_spectrum.h -- dsigma/dk at many photon energies, on several threads
** See Copyright Notice in LICENSE
*/
#ifndef BL_SPECTRUM_H
#define BL_SPECTRUM_H

#include <stddef.h>

#include "bl_dcs.h"
#include "bl_method.h"
#include "bl_quad.h"
#include "bl_result.h"

#ifdef __cplusplus
extern "C" {
#endif

/* Largest number of threads bl_spectrum_dk_e starts (more are capped). */
#define BL_SPECTRUM_MAX_THREADS 256

/*
** dsigma/dk (mb/MeV) of case `c` at the n photon energies k[0..n-1] (MeV,
** each in (0, T)), computed by `nthreads` threads:
**   nthreads = 1   serial, in the calling thread, with workspace `q`;
**   nthreads > 1   that many POSIX threads (capped at n and at
**                  BL_SPECTRUM_MAX_THREADS); thread 0 is the calling thread
**                  and uses `q`, every other thread allocates its own
**                  workspace with q's subinterval limit and tolerance;
**   nthreads = 0   one thread per online processor (sysconf).
** Point i goes to thread i mod T (a fixed interleave: adjacent energies,
** which cost alike, land on different threads).  Threads share only
** read-only data (the case, the energies) and write disjoint elements of
** `out` and `status`: every point is computed exactly as bl_dcs_dk_e with
** a fresh call budget computes it, so the results are identical bit for
** bit for every thread count.  Integrand calls of all threads are added to
** q's counter.  If a thread or a workspace cannot be made, its share is
** computed in the calling thread instead (same results, less parallel).
**
** out[i] receives the result of point i (best estimate even when the
** tolerance is not reached); status[i] (if status != NULL) its
** bl_dcs_dk_e status.  Returns BL_SUCCESS, or the status of the lowest
** index i that failed (so the return value does not depend on the thread
** count), or BL_EDOMAIN if n > 0 and k, out or q is NULL, or nthreads < 0.
** exceptions: BL_EDOMAIN, GSL_EMAXITER, GSL_EROUND (out still filled)
*/
int bl_spectrum_dk_e (const bl_case *c, size_t n, const double *k,
                      int nthreads, bl_quad *q, bl_result *out, int *status);

/* Number of threads that nthreads = 0 stands for (online processors, at
** least 1, at most BL_SPECTRUM_MAX_THREADS). */
int bl_spectrum_threads_auto (void);

/*
** The same by `method` (BL_METHOD_*) with the high-energy tables h of the
** case (bl_method_prepare; may be NULL for born and complete).  Same
** threads, same bit-for-bit rule; status[i] is bl_method_dk_e's.
*/
int bl_spectrum_method_e (const bl_case *c, const bl_he *h, int method,
                          size_t n, const double *k, int nthreads, bl_quad *q,
                          bl_result *out, int *status);

#ifdef __cplusplus
}
#endif

#endif
