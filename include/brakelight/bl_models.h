/*
** bl_models.h -- registry of screening models
** See Copyright Notice in LICENSE
*/
#ifndef BL_MODELS_H
#define BL_MODELS_H

#ifdef __cplusplus
extern "C" {
#endif

#define BL_MAX_REFS   4
#define BL_YUKAWA_MAX 8

/* A literature reference, defined once in src/core/models/references.c. */
typedef struct bl_ref {
  const char *key;       /* "Schiff1951" */
  const char *citation;  /* authors, journal, volume, page, year */
  const char *doi;       /* may be NULL */
} bl_ref;

/* A model parameter with its default. */
typedef struct bl_param {
  const char *name;
  const char *description;
  double value;          /* default */
  const char *unit;
} bl_param;

/*
** Screening of the nuclear charge as a sum of Yukawa terms:
**   1 - F(q)/Z = sum_i alpha_i q^2 / (b_i^2 + q^2),   sum_i alpha_i = 1,
** q and b_i in MeV (momentum).  A point nucleus in vacuum is n = 1,
** alpha = 1, b = 0.  The angular integrals use this form in closed form.
*/
typedef struct bl_yukawa {
  int n;
  double alpha[BL_YUKAWA_MAX];
  double b[BL_YUKAWA_MAX];   /* MeV */
} bl_yukawa;

/* Stable ids: never reassigned. */
enum {
  BL_MODEL_NONE         = 1,
  BL_MODEL_EXPONENTIAL  = 2,
  BL_MODEL_THOMAS_FERMI = 3,
  BL_MODEL_HARTREE_FOCK = 4
};

typedef struct bl_model {
  int id;
  const char *name;          /* Lua-facing, lowercase */
  const char *description;
  const bl_ref *refs[BL_MAX_REFS];   /* NULL-padded, at least one */
  int nparams;
  const bl_param *params;
  /* F(q)/Z, the atomic form factor per electron, q in MeV; pure kernel. */
  double (*form_factor) (double q, int Z, const double *p);
  /* Fill the Yukawa representation for element Z: BL_SUCCESS or BL_EDOMAIN. */
  int (*yukawa) (int Z, const double *p, bl_yukawa *out);
  /*
  ** The field of the atomic electrons (incoherent scattering function S,
  ** S(0) = 0, S(inf) = Z) in the same Yukawa form, but linear:
  **   S(q)/Z = sum_i alpha_i q^2 / (b_i^2 + q^2),   sum_i alpha_i = 1,
  ** q and b_i in MeV.  NULL: the model has no electron field (S = 0).
  */
  int (*incoherent) (int Z, const double *p, bl_yukawa *out);
} bl_model;

/* NULL-terminated registry, in id order. */
extern const bl_model *const bl_models[];

/* Model by name (case-insensitive) or id; NULL if unknown.  Borrowed. */
const bl_model *bl_model_find (const char *name);
const bl_model *bl_model_get (int id);

/* Default parameter values of a model, copied to p[0..nparams-1]. */
void bl_model_defaults (const bl_model *m, double *p);

#ifdef __cplusplus
}
#endif

#endif
