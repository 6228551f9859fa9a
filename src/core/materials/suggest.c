/*
** suggest.c -- names close to a misspelt material name: elements first,
** then catalogue keys
** See Copyright Notice in LICENSE
**
** Elements: a symbol equal to the name in another case ("w": W), then the
** element names within a small edit distance of the whole name (1 for
** names of up to 4 letters, 2 above: "tungstem", "Alumnium").  Catalogue:
** every entry is scored by the closest of its key, aliases, description
** and, so that old labels lead to the new key, the label of xraylib's
** record behind it (never shown: the key is suggested).  The score is
** the edit distance from the name to the best-matching piece of the
** candidate first (so "vinyltoluene" finds "pvt" through its
** description), then to the whole candidate.
*/

#include <string.h>
#include <strings.h>

#include "materials/internal.h"

#define MAXSUGG 8
#define LEN BL_MATERIAL_NAMELEN


/*
** Closeness of a query to a name, both lowercase: the edit distance
** (Levenshtein) from the query to the best-matching piece of the name
** (free first row, minimum over the last row), and to the whole name.
*/
static void distances (const char *q, const char *name, int *part,
                       int *whole) {
  int prevp[LEN + 1], curp[LEN + 1], prevw[LEN + 1], curw[LEN + 1];
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


/* Lowercase copy of s into buf (size LEN), truncated; '_' and '-' become
** blanks, so that keys and written names compare alike. */
static void lower (char *buf, const char *s) {
  size_t i;
  for (i = 0; i < LEN - 1 && s[i] != '\0'; i++) {
    char c = s[i];
    if (c >= 'A' && c <= 'Z')
      c = (char)(c + 'a' - 'A');
    buf[i] = (c == '_' || c == '-') ? ' ' : c;
  }
  buf[i] = '\0';
}


/* A short list sorted by (p, w), ties in the order of arrival. */
typedef struct List {
  int n, nmax;
  int p[MAXSUGG], w[MAXSUGG];
  const char *s[MAXSUGG];
} List;

static void insert (List *l, int p, int w, const char *s) {
  int k;
  for (k = l->n; k > 0 && (p < l->p[k - 1]
                           || (p == l->p[k - 1] && w < l->w[k - 1])); k--)
    if (k < l->nmax) {
      l->p[k] = l->p[k - 1];
      l->w[k] = l->w[k - 1];
      l->s[k] = l->s[k - 1];
    }
  if (k < l->nmax) {
    l->p[k] = p;
    l->w[k] = w;
    l->s[k] = s;
    if (l->n < l->nmax)
      l->n++;
  }
}


/* Score of one candidate string, kept if better than (*p, *w). */
static void consider (const char *q, const char *cand, int *p, int *w) {
  char c[LEN] = "";
  int cp, cw;
  lower(c, cand);
  distances(q, c, &cp, &cw);
  if (cp < *p || (cp == *p && cw < *w)) {
    *p = cp;
    *w = cw;
  }
}


int bl_material_suggest (const char *name, const char **out, int nmax) {
  List el, cat;
  char q[LEN] = "", nm[LEN] = "";
  int i, j, Z, k = 0;
  if (name == NULL || out == NULL || nmax < 1)
    return 0;
  if (nmax > MAXSUGG)
    nmax = MAXSUGG;
  el.n = cat.n = 0;
  el.nmax = cat.nmax = nmax;
  lower(q, name);
  for (Z = 1; Z <= BL_ZMAX; Z++) {
    const char *sym = bl_element_symbol(Z), *full = bl_element_name(Z);
    int p, w;
    if (strcasecmp(name, sym) == 0) {
      insert(&el, 0, 0, sym);
      continue;
    }
    lower(nm, full);
    distances(q, nm, &p, &w);
    if (w <= (strlen(full) <= 4 ? 1 : 2))
      insert(&el, 1, w, full);
  }
  for (i = 0; i < bl_material_catalogue_count(); i++) {
    const bl_catalogue_entry *e = bl_material_catalogue_entry(i);
    const char *label = bl_mat_catalogue_label(i);
    int p = 1 << 20, w = 1 << 20;
    if (label != NULL && strcasecmp(name, label) == 0)
      p = w = -1;  /* the old label of this entry */
    consider(q, e->key, &p, &w);
    for (j = 0; j < BL_CATALOGUE_MAXALIAS && e->aliases[j] != NULL; j++)
      consider(q, e->aliases[j], &p, &w);
    consider(q, e->description, &p, &w);
    if (label != NULL)
      consider(q, label, &p, &w);
    insert(&cat, p, w, e->key);
  }
  for (i = 0; i < el.n && k < nmax; i++)
    out[k++] = el.s[i];
  for (i = 0; i < cat.n && k < nmax; i++)
    out[k++] = cat.s[i];
  return k;
}
