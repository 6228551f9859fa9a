/*
** registry.c -- the registry of screening models
** See Copyright Notice in LICENSE
*/

#include <stddef.h>
#include <strings.h>

#include "models/internal.h"

/* In id order; a new model is one file plus one line here. */
const bl_model *const bl_models[] = {
  &bl_model_none,
  &bl_model_exponential,
  &bl_model_thomas_fermi,
  &bl_model_hartree_fock,
  NULL
};


const bl_model *bl_model_find (const char *name) {
  int i;
  if (name == NULL)
    return NULL;
  for (i = 0; bl_models[i] != NULL; i++)
    if (strcasecmp(name, bl_models[i]->name) == 0)
      return bl_models[i];
  return NULL;
}


const bl_model *bl_model_get (int id) {
  int i;
  for (i = 0; bl_models[i] != NULL; i++)
    if (bl_models[i]->id == id)
      return bl_models[i];
  return NULL;
}


void bl_model_defaults (const bl_model *m, double *p) {
  int i;
  if (m == NULL || p == NULL)
    return;
  for (i = 0; i < m->nparams; i++)
    p[i] = m->params[i].value;
}
