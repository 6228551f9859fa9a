/*
** target_values.c -- the observables of one material through the C API
** alone, printed with 17 significant digits (enough to tell every double
** apart), for tests/lua/test_c_api.lua, which computes the same through
** the Lua module and requires identical text.
** See Copyright Notice in LICENSE
**
** Usage: target_values MATERIAL T   (electron of kinetic energy T MeV)
** Prints: spectrum at k = T/20, T/4, T/2, 3T/4; energy loss per formula
** unit; photon yield of 0.5 g/cm^2 in 4 bins from T/20 to T.
*/

#include <stdio.h>
#include <stdlib.h>

#include <gsl/gsl_errno.h>

#include "brakelight.h"


static int fail (const char *what, int st) {
  fprintf(stderr, "target_values: %s: %s\n", what, bl_strerror(st));
  return EXIT_FAILURE;
}


int main (int argc, char **argv) {
  static bl_target t;            /* large: not on the stack */
  bl_material m;
  bl_tresult sp[4], el, yield[4];
  double T, k[4], edges[5];
  bl_quad *q;
  int st, i, failZ, failbin, method = BL_METHOD_AUTO;
  if (argc != 3 && argc != 4)
    return fprintf(stderr, "usage: target_values MATERIAL T [METHOD]\n"), 2;
  if (argc == 4 && (method = bl_method_find(argv[3])) < 0)
    return fprintf(stderr, "target_values: unknown method %s\n", argv[3]), 2;
  gsl_set_error_handler_off();
  T = atof(argv[2]);
  st = bl_material_lookup(&m, argv[1], NULL);
  if (st != BL_SUCCESS)
    return fail("material", st);
  q = bl_quad_alloc(1000);
  if (q == NULL)
    return fail("workspace", BL_ENOMEM);
  st = bl_target_setup(&t, bl_particle_find("electron"), &m,
                       bl_model_find("hartree-fock"), NULL, T,
                       &bl_opts_default, method, NULL, &failZ);
  if (st == BL_SUCCESS)
    st = bl_target_prepare(&t, q, &failZ);
  if (st != BL_SUCCESS)
    return fail("target", st);
  k[0] = T / 20;
  k[1] = T / 4;
  k[2] = T / 2;
  k[3] = 3 * T / 4;
  st = bl_target_spectrum_e(&t, 4, k, 2, q, sp, NULL);
  if (st != BL_SUCCESS && !bl_status_soft(st))
    return fail("spectrum", st);
  for (i = 0; i < 4; i++)
    printf("dsdk %.17g %.17g\n", sp[i].r.val, sp[i].r.err);
  st = bl_target_energy_loss_e(&t, q, &el);
  if (st != BL_SUCCESS && !bl_status_soft(st))
    return fail("energy loss", st);
  printf("energy_loss %.17g %.17g\n", el.r.val,
         el.r.err * bl_material_per_gram(&m));   /* as the module does */
  st = bl_target_photon_yield_e(&t, 0.5, T / 20, T, 4, BL_SPACING_LINEAR, q,
                                edges, yield, &failbin);
  if (st != BL_SUCCESS && !bl_status_soft(st))
    return fail("photon yield", st);
  for (i = 0; i < 4; i++)
    printf("photons %.17g %.17g\n", yield[i].r.val, yield[i].r.err);
  bl_target_release(&t);
  bl_quad_free(q);
  return EXIT_SUCCESS;
}
