/*
** base/internal.h -- layout of the integration workspace (core only)
** See Copyright Notice in LICENSE
*/
#ifndef BL_BASE_INTERNAL_H
#define BL_BASE_INTERNAL_H

#include <signal.h>

#include <gsl/gsl_integration.h>

#include "brakelight/bl_quad.h"

#define BL_QUAD_LEVELS 2   /* photon angle, particle angle */

struct bl_quad {
  gsl_integration_workspace *ws[BL_QUAD_LEVELS];
  size_t limit;
  double rtol;
  unsigned long calls;     /* innermost integrand evaluations */
  const volatile sig_atomic_t *stop;   /* stop flag, or NULL */
};

#endif
