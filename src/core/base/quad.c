/*
** quad.c -- integration workspace
** See Copyright Notice in LICENSE
*/

#include <pthread.h>
#include <stdlib.h>

#include <gsl/gsl_errno.h>

#include "brakelight/bl_errno.h"
#include "base/internal.h"


/*
** GSL's default error handler prints and aborts; the core reads status
** codes only.  The first bl_quad_alloc of the process switches the
** handler off when, and only when, GSL's default is in place: a handler
** of the application's own is put back untouched.  luaopen_brakelight and
** the runner switch it off themselves; this covers a program that links
** libbrakelight.a and does not (tests/test_base.c, suite gsl_errors).
*/
static pthread_once_t gsl_once = PTHREAD_ONCE_INIT;

static void gsl_quiet (void) {
  gsl_error_handler_t *prev = gsl_set_error_handler_off();
  if (prev != NULL)   /* NULL: the default, which aborts */
    gsl_set_error_handler(prev);
}


bl_quad *bl_quad_alloc (size_t limit) {
  bl_quad *q;
  int i;
  pthread_once(&gsl_once, gsl_quiet);
  if (limit < 8)
    return NULL;
  q = calloc(1, sizeof *q);
  if (q == NULL)
    return NULL;
  for (i = 0; i < BL_QUAD_LEVELS; i++) {
    q->ws[i] = gsl_integration_workspace_alloc(limit);
    if (q->ws[i] == NULL) {
      bl_quad_free(q);
      return NULL;
    }
  }
  q->limit = limit;
  q->rtol = BL_QUAD_RTOL_DEFAULT;
  return q;
}


void bl_quad_free (bl_quad *q) {
  int i;
  if (q == NULL)
    return;
  for (i = 0; i < BL_QUAD_LEVELS; i++)
    if (q->ws[i] != NULL)
      gsl_integration_workspace_free(q->ws[i]);
  free(q);
}


int bl_quad_set_rtol (bl_quad *q, double rtol) {
  if (q == NULL || !(rtol >= BL_QUAD_RTOL_MIN && rtol <= BL_QUAD_RTOL_MAX))
    return BL_EDOMAIN;
  q->rtol = rtol;
  return BL_SUCCESS;
}


double bl_quad_rtol (const bl_quad *q) {
  return q != NULL ? q->rtol : 0.0;
}


unsigned long bl_quad_calls (const bl_quad *q) {
  return q != NULL ? q->calls : 0;
}


void bl_quad_reset_calls (bl_quad *q) {
  if (q != NULL)
    q->calls = 0;
}


void bl_quad_set_stop (bl_quad *q, const volatile sig_atomic_t *flag) {
  if (q != NULL)
    q->stop = flag;
}


int bl_quad_stopped (const bl_quad *q) {
  return q != NULL && q->stop != NULL && *q->stop != 0;
}
