/*
** standard.c -- standard compositions from xraylib's list of
** compounds and mixtures (NIST's compositions, with densities)
** See Copyright Notice in LICENSE
**
** xraylib hands out freshly allocated names and records; this file copies
** what it needs once into static storage (so bl_material_standard_name can
** return borrowed pointers) and frees xraylib's copies at once.  xraylib
** is always called with an error object (freed here) or NULL: it never
** prints.
*/

#include <pthread.h>
#include <string.h>
#include <strings.h>

#include <xraylib.h>

#include "brakelight/bl_errno.h"
#include "materials/internal.h"

#define MAXSTD 400   /* room for names; libxrl 4.0.0 has 180 */


static char stdnames[MAXSTD][BL_MATERIAL_NAMELEN];
static int nstd;
static pthread_once_t once = PTHREAD_ONCE_INIT;


/* Copy xraylib's list of names into stdnames (once per process). */
static void loadnames (void) {
  xrl_error *e = NULL;
  int i, n = 0;
  char **list = GetCompoundDataNISTList(&n, &e);
  if (e != NULL)
    xrl_error_free(e);
  if (list == NULL)
    return;
  for (i = 0; i < n; i++) {
    /* names that do not fit are left out rather than truncated */
    if (nstd < MAXSTD && list[i] != NULL
        && strlen(list[i]) < BL_MATERIAL_NAMELEN)
      bl_mat_setname(stdnames[nstd++], list[i]);
    xrlFree(list[i]);
  }
  xrlFree(list);
}


int bl_material_standard_count (void) {
  pthread_once(&once, loadnames);
  return nstd;
}


const char *bl_material_standard_name (int i) {
  pthread_once(&once, loadnames);
  return (i >= 0 && i < nstd) ? stdnames[i] : NULL;
}


/* Index of a standard name: exact match first, then any case; -1. */
static int findstd (const char *name) {
  int i;
  pthread_once(&once, loadnames);
  for (i = 0; i < nstd; i++)
    if (strcmp(name, stdnames[i]) == 0)
      return i;
  for (i = 0; i < nstd; i++)
    if (strcasecmp(name, stdnames[i]) == 0)
      return i;
  return -1;
}


/*
** Mass fractions w_Z of xraylib's record become atoms per average atom:
** (w_Z / A_Z) / sum_Z (w_Z / A_Z).  bl_mat_fill recomputes the mass
** fractions from these, which gives back w_Z / sum w (the record's own
** fractions, normalized) whatever the atomic weights.
*/
int bl_material_standard (bl_material *m, const char *name) {
  double atoms[BL_ZMAX + 1] = {0};
  struct compoundDataNIST *c;
  xrl_error *e = NULL;
  double total = 0, rho;
  int i, idx, st = BL_SUCCESS;
  if (m == NULL)
    return BL_EDOMAIN;
  memset(m, 0, sizeof *m);
  if (name == NULL || (idx = findstd(name)) < 0)
    return BL_EUNKNOWN;   /* no name is an unknown name (as before) */
  c = GetCompoundDataNISTByName(stdnames[idx], &e);
  if (e != NULL)
    xrl_error_free(e);
  if (c == NULL)
    return BL_EUNKNOWN;
  for (i = 0; i < c->nElements && st == BL_SUCCESS; i++) {
    int Z = c->Elements[i];
    double w = c->massFractions[i];
    if (Z < 1 || Z > BL_ZMAX || !(w >= 0))
      st = BL_EUNKNOWN;  /* a record we cannot represent */
    else if (w > 0)
      atoms[Z] += w / bl_element_mass(Z);
  }
  rho = c->density;
  FreeCompoundDataNIST(c);
  for (i = 1; i <= BL_ZMAX; i++)
    total += atoms[i];
  if (st != BL_SUCCESS || !(total > 0))
    return BL_EUNKNOWN;
  for (i = 1; i <= BL_ZMAX; i++)
    atoms[i] /= total;
  if (bl_mat_fill(m, atoms, stdnames[idx]) != BL_SUCCESS)
    return BL_EUNKNOWN;
  m->density = rho > 0 ? rho : 0;
  return BL_SUCCESS;
}


/*
** Closeness of a query to a name, both lowercase: first the edit distance
** from the query to the best-matching piece of the name (so "water"
** matches "Water, Liquid" at 0), then the edit distance to the whole name.
** Both by the usual dynamic programme (Levenshtein); the first lets the
** match start and end anywhere in the name (free first row, minimum over
** the last row).
*/
static void distances (const char *q, const char *name, int *part,
                       int *whole) {
  int prevp[BL_MATERIAL_NAMELEN + 1], curp[BL_MATERIAL_NAMELEN + 1];
  int prevw[BL_MATERIAL_NAMELEN + 1], curw[BL_MATERIAL_NAMELEN + 1];
  size_t lq = strlen(q), ln = strlen(name), i, j;
  for (j = 0; j <= ln; j++) {
    prevp[j] = 0;
    prevw[j] = (int)j;
  }
  for (i = 1; i <= lq; i++) {
    curp[0] = curw[0] = (int)i;
    for (j = 1; j <= ln; j++) {
      int sub = (q[i - 1] != name[j - 1]);
      int a = prevp[j - 1] + sub, b = prevp[j] + 1, c = curp[j - 1] + 1;
      curp[j] = a < b ? (a < c ? a : c) : (b < c ? b : c);
      a = prevw[j - 1] + sub; b = prevw[j] + 1; c = curw[j - 1] + 1;
      curw[j] = a < b ? (a < c ? a : c) : (b < c ? b : c);
    }
    memcpy(prevp, curp, (ln + 1) * sizeof *curp);
    memcpy(prevw, curw, (ln + 1) * sizeof *curw);
  }
  *part = prevp[0];
  for (j = 1; j <= ln; j++)
    if (prevp[j] < *part)
      *part = prevp[j];
  *whole = prevw[ln];
}


/* Lowercase copy of s into buf (size BL_MATERIAL_NAMELEN), truncated. */
static void lower (char *buf, const char *s) {
  size_t i;
  for (i = 0; i < BL_MATERIAL_NAMELEN - 1 && s[i] != '\0'; i++)
    buf[i] = (s[i] >= 'A' && s[i] <= 'Z') ? (char)(s[i] + 'a' - 'A') : s[i];
  buf[i] = '\0';
}


int bl_material_suggest (const char *name, const char **out, int nmax) {
  int bestp[8], bestw[8], besti[8];
  char q[BL_MATERIAL_NAMELEN] = "", cand[BL_MATERIAL_NAMELEN] = "";
  int i, k, n = 0;
  if (name == NULL || out == NULL || nmax < 1)
    return 0;
  if (nmax > 8)
    nmax = 8;
  pthread_once(&once, loadnames);
  lower(q, name);
  for (i = 0; i < nstd; i++) {
    int p, w;
    lower(cand, stdnames[i]);
    distances(q, cand, &p, &w);
    /* insertion into the sorted short list (ties keep list order) */
    for (k = n; k > 0 && (p < bestp[k - 1]
                          || (p == bestp[k - 1] && w < bestw[k - 1])); k--)
      if (k < nmax) {
        bestp[k] = bestp[k - 1];
        bestw[k] = bestw[k - 1];
        besti[k] = besti[k - 1];
      }
    if (k < nmax) {
      bestp[k] = p;
      bestw[k] = w;
      besti[k] = i;
      if (n < nmax)
        n++;
    }
  }
  for (k = 0; k < n; k++)
    out[k] = stdnames[besti[k]];
  return n;
}
