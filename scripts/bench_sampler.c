/*
** bench_sampler.c -- make bench: the event sampler (issue 15).  Electrons
** on W at 10 MeV and 10 GeV, exact Born method, Hartree-Fock screening
** with the atomic electrons and the uniform nucleus, photons 0.01 T < k <
** T: setup time (target 1 s), unweighting efficiency (expected from setup
** and measured), unweighted and weighted events per second on one thread
** (target 1e5/s), the overweights, and the two-thread rate as a ratio to
** one thread in the same run.  Never a test.
** See Copyright Notice in LICENSE
*/

#include <stdio.h>
#include <stdlib.h>
#include <time.h>

#include <gsl/gsl_errno.h>

#include "brakelight.h"

#include "bench_util.h"

#define N 500000

int main (void) {
  static const double Ts[] = {10.0, 1e4};
  bl_event *ev = malloc(N * sizeof *ev);
  int i;
  gsl_set_error_handler_off();
  if (ev == NULL)
    return 1;
  for (i = 0; i < 2; i++) {
    bl_material m;
    bl_target t;
    bl_sampler *s = NULL;
    bl_sampler_info info;
    bl_sample_stats st;
    bl_quad *q = bl_quad_alloc(1000);
    double t0, setup, ru, rw, r2, sg, er;
    if (q == NULL || bl_material_lookup(&m, "W", NULL) != BL_SUCCESS
        || bl_target_setup(&t, bl_particle_find("electron"), &m,
                           bl_model_find("hartree-fock"), NULL, Ts[i],
                           &bl_opts_default, BL_METHOD_BORN, NULL, NULL)
           != BL_SUCCESS
        || bl_target_prepare(&t, q, NULL) != BL_SUCCESS)
      return 1;
    t0 = now();
    if (bl_sampler_new(&t, 0.01 * Ts[i], Ts[i], 1, NULL, &s) != BL_SUCCESS)
      return 1;
    setup = now() - t0;
    bl_sampler_info_get(s, &info);
    t0 = now();
    bl_sampler_events(s, BL_SAMPLE_UNWEIGHTED, 0, N, N, 1, ev, &st);
    ru = N / (now() - t0);
    bl_sampler_sigma(s, BL_SAMPLE_UNWEIGHTED, &st, N, &sg, &er);
    printf("e- on W, T = %g MeV, born: setup %.3f s (%llu evaluations; "
           "target 1 s); efficiency %.3f expected, %.3f measured; "
           "overweights %.2g of events (excess %.2g)\n", Ts[i], setup,
           (unsigned long long)info.evaluations, info.sigma / info.envelope,
           (double)st.events / st.trials, (double)st.overweights / N,
           st.excess / N);
    t0 = now();
    bl_sampler_events(s, BL_SAMPLE_WEIGHTED, 0, N, N, 1, ev, NULL);
    rw = N / (now() - t0);
    t0 = now();
    bl_sampler_events(s, BL_SAMPLE_UNWEIGHTED, 0, N, N, 2, ev, NULL);
    r2 = N / (now() - t0);
    printf("  unweighted %.3g events/s on one thread (%.2fx the 1e5/s "
           "target), weighted %.3g/s; two threads %.2fx one; sigma %.6g +- "
           "%.2g mb (setup %.6g +- %.2g)\n", ru, ru / 1e5, rw, r2 / ru, sg,
           er, info.sigma, info.err);
    bl_sampler_free(s);
    bl_target_release(&t);
    bl_quad_free(q);
  }
  free(ev);
  return 0;
}
