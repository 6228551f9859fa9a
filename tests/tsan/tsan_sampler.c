/*
** tsan_sampler.c -- make test-tsan: one sampler used by three application
** threads at once, each call itself on two threads (bl_sampler_events),
** against the serial events bit for bit; a ThreadSanitizer report stops
** the program (halt_on_error).  Plain C: Criterion's own threads confuse
** TSan.
** See Copyright Notice in LICENSE
*/

#include <pthread.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include <gsl/gsl_errno.h>

#include "brakelight.h"

#define N 3000
#define NAPP 3

static const bl_sampler *S;
static bl_event ref[2][N], got[NAPP][2][N];

static void *app (void *arg) {
  int a = (int)(size_t)arg, mode;
  for (mode = 0; mode < 2; mode++)
    if (bl_sampler_events(S, mode, 0, N, N, 2, got[a][mode], NULL) != 0)
      fprintf(stderr, "tsan_sampler: thread %d failed\n", a);
  return NULL;
}

int main (void) {
  bl_material m;
  bl_target t;
  bl_sampler *s;
  bl_sampler_conf conf;
  pthread_t tid[NAPP];
  int a, mode, bad = 0;
  gsl_set_error_handler_off();
  bl_sampler_conf_default(&conf);
  conf.iterations = 2;
  conf.points = 2000;
  conf.cellpoints = 8;
  if (bl_material_lookup(&m, "water", NULL) != 0
      || bl_target_setup(&t, bl_particle_find("electron"), &m,
                         bl_model_find("hartree-fock"), NULL, 10.0,
                         &bl_opts_default, BL_METHOD_BORN, NULL, NULL) != 0
      || bl_sampler_new(&t, 0.1, 10.0, 5, &conf, &s) != 0) {
    fprintf(stderr, "tsan_sampler: setup failed\n");
    return 1;
  }
  S = s;
  for (mode = 0; mode < 2; mode++)
    bl_sampler_events(s, mode, 0, N, N, 1, ref[mode], NULL);
  for (a = 0; a < NAPP; a++)
    pthread_create(&tid[a], NULL, app, (void *)(size_t)a);
  for (a = 0; a < NAPP; a++)
    pthread_join(tid[a], NULL);
  for (a = 0; a < NAPP; a++)
    for (mode = 0; mode < 2; mode++)
      if (memcmp(got[a][mode], ref[mode], sizeof ref[mode]) != 0) {
        fprintf(stderr, "tsan_sampler: thread %d mode %d differs\n", a, mode);
        bad = 1;
      }
  bl_sampler_free(s);
  bl_target_release(&t);
  printf("tsan_sampler: %d threads x 2 modes x %d events, %s\n", NAPP, N,
         bad ? "DIFFERENT" : "bit for bit the serial events");
  return bad;
}
