/*
** bl_quad.h -- integration workspace: tolerances, GSL workspaces, counters
** See Copyright Notice in LICENSE
*/
#ifndef BL_QUAD_H
#define BL_QUAD_H

#include <signal.h>
#include <stddef.h>

#ifdef __cplusplus
extern "C" {
#endif

typedef struct bl_quad bl_quad;

/* New workspace with at most `limit` subintervals per nesting level
** (limit >= 8) and relative tolerance BL_QUAD_RTOL_DEFAULT.  NULL on allocation failure.
** The first call in a process replaces GSL's default error handler (which
** aborts) by none, unless the application has installed its own. */
bl_quad *bl_quad_alloc (size_t limit);

/* Free; NULL is a no-op. */
void bl_quad_free (bl_quad *q);

/* The range of relative tolerances a workspace accepts, and its default. */
#define BL_QUAD_RTOL_MIN     1e-12
#define BL_QUAD_RTOL_MAX     0.5
#define BL_QUAD_RTOL_DEFAULT 1e-4

/* Relative tolerance for the next integrals: BL_EDOMAIN unless
** BL_QUAD_RTOL_MIN <= rtol <= BL_QUAD_RTOL_MAX. */
int bl_quad_set_rtol (bl_quad *q, double rtol);
double bl_quad_rtol (const bl_quad *q);

/* Integrand evaluations since the last reset (for tests and benchmarks). */
unsigned long bl_quad_calls (const bl_quad *q);
void bl_quad_reset_calls (bl_quad *q);

/*
** A stop flag for the computations that use this workspace (NULL: none, the
** default).  While *flag is non-zero, bl_method_dk_e (so every dsigma/dk
** point of a spectrum, an integral over k or a yield) returns BL_EINTR
** without computing; a point already running finishes.  The flag is read,
** never written: a signal handler may set it (sig_atomic_t).  Threads of
** bl_spectrum_* read the flag of the caller's workspace.
*/
void bl_quad_set_stop (bl_quad *q, const volatile sig_atomic_t *flag);

/* 1 if q has a stop flag that is set, 0 otherwise (also for q = NULL). */
int bl_quad_stopped (const bl_quad *q);

#ifdef __cplusplus
}
#endif

#endif
