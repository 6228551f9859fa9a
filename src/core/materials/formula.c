/*
** formula.c -- chemical formulas: "H2O", "Ca(OH)2", "CuSO4.5H2O"
** See Copyright Notice in LICENSE
**
** Grammar (no blanks anywhere):
**   formula := part { sep [count] part }      sep := '.' | '*'
**   part    := item { item }
**   item    := symbol [count] | '(' part ')' [count] | '[' part ']' [count]
**   symbol  := capital letter, then lowercase letters ("Co", not "CO")
**   count   := digits [ '.' digits ]          integer or decimal, > 0
** A part after a separator is a hydrate or adduct, added count times
** ("CuSO4.5H2O" = CuSO4 + 5 H2O, "CaSO4*0.5H2O").
**
** The '.' after a count is ambiguous: "CuSO4.5H2O" could be CuSO(4.5)H2O.
** Rule: '*' always separates; a '.' between digits is a decimal point
** inside brackets, after a zero integer part ("Fe0.5Ni0.5"), and when the
** number after it is not followed directly by an element or a bracket
** ("YBa2Cu3O6.5"); otherwise (top level, "4.5H") it separates a hydrate.
** So write a decimal count followed by more elements inside brackets:
** "(Cu1.5)Se", or with a zero integer part.
**
** Errors report the byte offset (0-based) and a reason in static storage.
*/

#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "brakelight/bl_errno.h"
#include "materials/internal.h"

#define MAXDEPTH  16       /* nesting of brackets */
#define MAXCOUNT  1e9      /* largest single count */
#define MAXATOMS  1e12     /* largest number of atoms of one element */
#define NUMLEN    40       /* longest count, characters */


typedef struct Parser {
  const char *s;
  size_t pos;                 /* next byte to read */
  int depth;                  /* bracket nesting at pos */
  int seen[BL_ZMAX + 1];      /* elements met so far */
  int nseen;
  size_t errpos;              /* where the first error is */
  const char *reason;         /* its reason; NULL: none yet */
} Parser;


/* Record an error (the first one wins); returns 0 for "failed". */
static int fail (Parser *P, size_t pos, const char *reason) {
  if (P->reason == NULL) {
    P->errpos = pos;
    P->reason = reason;
  }
  return 0;
}


static int isupper_ (int c) { return c >= 'A' && c <= 'Z'; }
static int islower_ (int c) { return c >= 'a' && c <= 'z'; }
static int isdigit_ (int c) { return c >= '0' && c <= '9'; }
static int isopen (int c) { return c == '(' || c == '['; }
static int isclose (int c) { return c == ')' || c == ']'; }


/* Length of the run of digits at s. */
static size_t digits (const char *s) {
  size_t n = 0;
  while (isdigit_((unsigned char)s[n]))
    n++;
  return n;
}


/*
** Is the '.' at s[i] (preceded by the integer digits s[from..i-1]) a
** decimal point?  See the rule in the header comment.
*/
static int decimalpoint (const Parser *P, size_t from, size_t i) {
  const char *s = P->s;
  size_t j, k, n;
  if (!isdigit_((unsigned char)s[i + 1]))
    return 0;
  if (P->depth > 0)
    return 1;
  for (k = from; k < i && s[k] == '0'; k++)
    ;
  if (k == i)
    return 1;  /* integer part 0: "Fe0.5Ni0.5" */
  j = i + 1;   /* the would-be hydrate count */
  n = digits(s + j);
  j += n;
  if (s[j] == '.' && isdigit_((unsigned char)s[j + 1]))
    j += 1 + digits(s + j + 1);  /* decimal hydrate count: "4.0.5H2O" */
  return !(isupper_((unsigned char)s[j]) || isopen((unsigned char)s[j]));
}


/*
** Read an optional count at P->pos into *x (1 if none).  `after_sep`: the
** count leads a part after a separator, where a '.' can only be decimal.
** Returns 0 on error.
*/
static int count (Parser *P, double *x, int after_sep) {
  const char *s = P->s;
  size_t start = P->pos, i = P->pos;
  char buf[NUMLEN + 1];
  i += digits(s + i);
  *x = 1;
  if (i == start)
    return 1;  /* no count */
  if (s[i] == '.' && (after_sep ? isdigit_((unsigned char)s[i + 1])
                                : decimalpoint(P, start, i)))
    i += 1 + digits(s + i + 1);
  if (i - start > NUMLEN)
    return fail(P, start, "count too long (at most 40 characters)");
  memcpy(buf, s + start, i - start);
  buf[i - start] = '\0';
  *x = strtod(buf, NULL);
  if (!(*x > 0))
    return fail(P, start, "count must be > 0");
  if (!(*x <= MAXCOUNT))
    return fail(P, start, "count too large (at most 1e9)");
  P->pos = i;
  return 1;
}


/* acc += f * add, checking the totals; `at` locates an overflow. */
static int addto (Parser *P, double *acc, const double *add, double f,
                  size_t at) {
  int Z;
  for (Z = 1; Z <= BL_ZMAX; Z++)
    if (add[Z] > 0) {
      acc[Z] += f * add[Z];
      if (!(acc[Z] <= MAXATOMS))
        return fail(P, at, "too many atoms of one element (at most 1e12)");
    }
  return 1;
}


static int part (Parser *P, double *acc);


/* One element symbol with its count, added to acc. */
static int element (Parser *P, double *acc) {
  const char *s = P->s;
  size_t start = P->pos, n = 1;
  char sym[4];
  double x;
  int Z;
  while (islower_((unsigned char)s[start + n]))
    n++;
  if (n <= 2) {  /* longer runs are no symbol */
    memcpy(sym, s + start, n);
    sym[n] = '\0';
  }
  else
    sym[0] = '\0';
  Z = bl_element_find(sym);
  if (Z == 0)
    return fail(P, start, "unknown element symbol (known: H to Fm, Z 1..100)");
  if (!P->seen[Z]) {
    P->seen[Z] = 1;
    if (++P->nseen > BL_MATERIAL_MAXCOMP)
      return fail(P, start, "too many different elements (at most 32)");
  }
  P->pos += n;
  if (!count(P, &x, 0))
    return 0;
  acc[Z] += x;
  if (!(acc[Z] <= MAXATOMS))
    return fail(P, start, "too many atoms of one element (at most 1e12)");
  return 1;
}


/* A bracketed group with its count, added to acc. */
static int group (Parser *P, double *acc) {
  double inner[BL_ZMAX + 1] = {0};
  size_t open = P->pos;
  char want = P->s[open] == '(' ? ')' : ']';
  double x;
  int c;
  if (P->depth == MAXDEPTH)
    return fail(P, open, "brackets nested too deep (at most 16)");
  P->pos++;
  P->depth++;
  if (isclose((unsigned char)P->s[P->pos]))
    return fail(P, open, "empty brackets");
  if (!part(P, inner))
    return 0;
  c = (unsigned char)P->s[P->pos];
  if (c == '\0')
    return fail(P, open, "bracket never closed");
  if (c != want) {
    if (isclose(c))
      return fail(P, P->pos, "closing bracket does not match the opening one");
    if (c == '.' || c == '*')
      return fail(P, P->pos, "hydrate separator inside brackets");
    return fail(P, P->pos, "unexpected character");
  }
  P->pos++;
  P->depth--;
  if (!count(P, &x, 0))
    return 0;
  return addto(P, acc, inner, x, open);
}


/*
** A run of items, into acc; stops before anything that cannot start an
** item (the caller judges it).  At least one item.
*/
static int part (Parser *P, double *acc) {
  int items = 0;
  for (;;) {
    int c = (unsigned char)P->s[P->pos];
    if (isupper_(c)) {
      if (!element(P, acc))
        return 0;
    }
    else if (isopen(c)) {
      if (!group(P, acc))
        return 0;
    }
    else if (items > 0)
      return 1;
    else if (c == '\0' || c == '.' || c == '*')
      return fail(P, P->pos, "empty formula part");
    else if (islower_(c))
      return fail(P, P->pos, "element symbols start with a capital letter");
    else if (isdigit_(c))
      return fail(P, P->pos, "count before any element (leading counts only "
                  "after '.' or '*')");
    else if (isclose(c))
      return fail(P, P->pos, "closing bracket without an opening one");
    else
      return fail(P, P->pos, "unexpected character");
    items++;
  }
}


/* The whole formula, into total. */
static int formula (Parser *P, double *total) {
  double f = 1;
  for (;;) {
    double acc[BL_ZMAX + 1] = {0};
    size_t start = P->pos;
    int c;
    if (!part(P, acc) || !addto(P, total, acc, f, start))
      return 0;
    c = (unsigned char)P->s[P->pos];
    if (c == '\0')
      return 1;
    if (isclose(c))
      return fail(P, P->pos, "closing bracket without an opening one");
    if (c != '.' && c != '*')
      return fail(P, P->pos, islower_(c)
                  ? "element symbols start with a capital letter"
                  : "unexpected character");
    P->pos++;
    if (P->s[P->pos] == '\0')
      return fail(P, P->pos, "nothing after the hydrate separator");
    if (!count(P, &f, 1))
      return 0;
  }
}


int bl_material_formula (bl_material *m, const char *text,
                         bl_parse_error *err) {
  double total[BL_ZMAX + 1] = {0};
  Parser P;
  if (m == NULL) {
    if (err != NULL) {
      err->pos = 0;
      err->reason = "no material to fill (NULL)";
    }
    return BL_EDOMAIN;
  }
  memset(&P, 0, sizeof P);
  P.s = text != NULL ? text : "";
  memset(m, 0, sizeof *m);
  if (P.s[0] == '\0')
    fail(&P, 0, "empty formula");
  else if (formula(&P, total) && bl_mat_fill(m, total, P.s) != BL_SUCCESS)
    fail(&P, 0, "no element");  /* not reached: every part has an item */
  if (P.reason != NULL) {
    memset(m, 0, sizeof *m);
    if (err != NULL) {
      err->pos = P.errpos;
      err->reason = P.reason;
    }
    return BL_EDOMAIN;
  }
  if (err != NULL) {
    err->pos = 0;
    err->reason = NULL;
  }
  return BL_SUCCESS;
}
