/*
** methods/internal.h -- declarations shared by the files of the methods
** (tables.c, nucsize.c, highenergy.c, complete.c, dispatch.c), not public
** See Copyright Notice in LICENSE
*/

#ifndef BL_METHODS_INTERNAL_H
#define BL_METHODS_INTERNAL_H

#include "distorted/internal.h"

/* What a screening table integrates: the nuclear (elastic) part,
** h = f (2 - f) with f = F/Z, or the atomic electrons, h = 1 - S/Z. */
enum { BL_HETAB_ELASTIC, BL_HETAB_ELECTRONS };

/*
** Screening tables (tables.c).
** bl_hetab_get: the cached table of (kind, y), built on first use (about
**   10 ms) under the cache lock, with one reference for the caller; NULL
**   on allocation failure.
** bl_hetab_release: drops that reference (NULL: nothing); unreferenced
**   entries beyond BL_METHOD_CACHE_IDLE are freed, oldest first.
** bl_hetab_clear: frees every unreferenced entry; returns the count left.
** bl_hetab_count: entries held.
** bl_hetab_lookup: H1 and H2 at u = ln Delta (Delta in MeV).
** bl_hetab_maxerr: the worst interpolation error measured when built.
** bl_hetab_tails: the four moments of h beyond q = m that replace the
**   step at q = m by the exact small-angle kernels (m in MeV).
*/
const bl_hetab *bl_hetab_get (int kind, const bl_yukawa *y);
void bl_hetab_release (const bl_hetab *t);
size_t bl_hetab_clear (void);
size_t bl_hetab_count (void);
void bl_hetab_lookup (const bl_hetab *t, double u, double *H1, double *H2);
double bl_hetab_maxerr (const bl_hetab *t);
void bl_hetab_tails (int kind, const bl_yukawa *y, double m, double out[4]);

/*
** Nuclear size (nucsize.c).
** bl_nucsize_get: the four grid nodes of case c and their weights into h
**   (h->nnuc = 0 below the grid), calibrating missing nodes with the Born
**   integral on workspace q; BL_SUCCESS, BL_ENOMEM or a Born failure.
** bl_nucsize_at: N1, N2 of one node at delta = Delta/m.
** Each node in h holds one reference (taken by bl_nucsize_get, also for
** the nodes of a failed call, left in h->nuc); bl_nucsize_release drops
** one (NULL: nothing); bl_nucsize_clear frees the unreferenced nodes and
** returns the count left; bl_nucsize_count counts them.  The nodes are
** bounded by the grid (2 spins x NUC_NX), so no idle bound is needed.
*/
int bl_nucsize_get (const bl_case *c, bl_quad *q, bl_he *h);
void bl_nucsize_release (const bl_nuctab *t);
size_t bl_nucsize_clear (void);
size_t bl_nucsize_count (void);
void bl_nucsize_at (const bl_nuctab *t, double delta, double *N1,
                    double *N2);

/* A cleared result of `method` (dispatch.c). */
void bl_method_clear (bl_result *out, int method);

#endif
