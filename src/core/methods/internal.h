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
** bl_hetab_tails: the moments of h beyond q = m that replace the step at
**   q = m by the exact small-angle kernels (m in MeV), of table t's
**   representation (out[0], out[1]; out[2], out[3] are 0); kept in t
**   for its latest masses.
*/
const bl_hetab *bl_hetab_get (int kind, const bl_yukawa *y);
void bl_hetab_release (const bl_hetab *t);
size_t bl_hetab_clear (void);
size_t bl_hetab_count (void);
void bl_hetab_lookup (const bl_hetab *t, double u, double *H1, double *H2);
double bl_hetab_maxerr (const bl_hetab *t);
void bl_hetab_tails (const bl_hetab *t, double m, double out[4]);

/*
** Nuclear size (nucsize.c, its table nuc_table.c made by
** scripts/fit-nucsize.c through `make nuc-table`).
** One grid node of x = ln(m R / hbar c) per spin: N1, N2 (the change of
** phi1, phi2 from a point to a uniform nucleus) at n nodes in ln delta,
** delta = Delta/m, uniformly NUC_DLN apart from lnd0; err the worst
** interpolation error measured at the midpoints (units of phi).
*/
#define NUC_NODES 25     /* nodes in delta: q_N 10^(-3 + j/8), j < 25 */
#define NUC_DLN   0.2878231366242557   /* their step in ln delta */
#define NUC_X0    (-6.907755278982137) /* grid in x = ln(m R / hbar c): */
#define NUC_DX    0.25                 /* from ln 1e-3 ... */
#define NUC_NX    85                   /* ... to ln 1.3e6 */
#define NUC_A     100.0  /* mass number of the probe nucleus of the grid */
#define NUC_TOP   1e-2   /* no node above this delta (small angles end) */
#define NUC_DMIN  1e-4   /* the first node at or below this delta */

struct bl_nuctab {
  int n;
  double lnd0;
  double N1[NUC_NODES], N2[NUC_NODES];
  double err;
};

/* The table: [spin 0, spin 1/2][grid index of x]. */
extern const bl_nuctab bl_nuc_table[2][NUC_NX];

/*
** bl_nucsize_get: the four grid nodes of case c and their weights into h
**   (h->nnuc = 0 below the grid, m R < 1e-3 hbar c: there the effect is
**   below 1e-5); no integral, the table is in the source.
** bl_nucsize_at: N1, N2 of one node at delta = Delta/m, cubic in ln delta
**   between the nodes, constant outside them.
*/
void bl_nucsize_get (const bl_case *c, bl_he *h);
void bl_nucsize_at (const bl_nuctab *t, double delta, double *N1,
                    double *N2);

/* bl_method_prepare's part for method "partial" (partial.c): the case's
** field into h (h->pwready) where bl_partial_check takes the case. */
int bl_partial_prepare (const bl_case *c, bl_he *h);

/* A cleared result of `method` (dispatch.c). */
void bl_method_clear (bl_result *out, int method);

#endif
