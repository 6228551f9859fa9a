/*
** test_reentrant.c -- the core from two threads at once
** See Copyright Notice in LICENSE
**
** Internal consistency, no outside source.  The core keeps no mutable
** static state (the material catalogue is a constant table; the GSL
** handler switch is set once under pthread_once), so work done by two
** threads at the same time must equal the same work done serially, bit for
** bit.  Each job sets up its own cases (all target options on: screening,
** atomic electrons, uniform nucleus, corrections where valid), looks up
** materials and computes dsigma/dk at several k and an angular
** distribution; two different jobs and two copies of one job run
** concurrently.  Under `make test-asan` the same test runs instrumented.
*/

#include <pthread.h>
#include <string.h>

#include <criterion/criterion.h>

#include "brakelight.h"
#include "testutil.h"

TestSuite(reentrant, .init = setup);

#define NK 6
#define NA 3
#define ROUNDS 2   /* each thread repeats its job (more overlap) */

/* One job and its results. */
typedef struct job {
  const char *particle, *model, *material;
  double T;
  bl_result dk[NK], ang[NA];
  int st_dk[NK], st_ang[NA];
  double x0;       /* radiation length of the material */
  int nmat;        /* its component count */
  int failed;      /* a setup step failed (reported by the caller) */
} job;


/* Run job j once: everything from scratch, own workspace. */
static void runjob (job *j) {
  const bl_particle *p = bl_particle_find(j->particle);
  const bl_model *m = bl_model_find(j->model);
  bl_material mat;
  bl_case c;
  bl_quad *q = bl_quad_alloc(200);
  int i;
  if (p == NULL || m == NULL || q == NULL
      || bl_quad_set_rtol(q, 1e-3) != BL_SUCCESS
      || bl_material_lookup(&mat, j->material, NULL) != BL_SUCCESS
      || bl_case_setup(&c, p, mat.comp[mat.n - 1].Z, m, NULL, j->T,
                       &bl_opts_default) != BL_SUCCESS) {
    j->failed = 1;
    bl_quad_free(q);
    return;
  }
  j->nmat = mat.n;
  j->x0 = bl_radiation_length(&mat);
  for (i = 0; i < NK; i++)
    j->st_dk[i] = bl_dcs_dk_e(&c, j->T * (0.05 + 0.9 * i / (NK - 1)), q,
                              &j->dk[i]);
  for (i = 0; i < NA; i++)
    j->st_ang[i] = bl_dcs_angular_e(&c, 0.4 * j->T, 0.05 * i, q, &j->ang[i]);
  bl_quad_free(q);
}

static void *thread_main (void *arg) {
  int r;
  for (r = 0; r < ROUNDS; r++)
    runjob(arg);
  return NULL;
}

static int samebits (const bl_result *a, const bl_result *b) {
  return memcmp(&a->val, &b->val, sizeof a->val) == 0
         && memcmp(&a->err, &b->err, sizeof a->err) == 0
         && a->warn == b->warn && a->applied == b->applied;
}

/* Results of a concurrent run equal the serial ones, bit for bit. */
static void expect_equal (const job *ser, const job *par) {
  int i;
  cr_assert(!ser->failed && !par->failed, "setup of %s on %s failed",
            ser->particle, ser->material);
  cr_expect(ser->nmat == par->nmat);
  cr_expect(memcmp(&ser->x0, &par->x0, sizeof ser->x0) == 0);
  for (i = 0; i < NK; i++)
    cr_expect(samebits(&ser->dk[i], &par->dk[i])
              && ser->st_dk[i] == par->st_dk[i],
              "%s on %s, dsdk point %d: %.17g +- %.17g (status %d) in a "
              "thread vs %.17g +- %.17g (status %d) serially", par->particle,
              par->material, i, par->dk[i].val, par->dk[i].err,
              par->st_dk[i], ser->dk[i].val, ser->dk[i].err, ser->st_dk[i]);
  for (i = 0; i < NA; i++)
    cr_expect(samebits(&ser->ang[i], &par->ang[i])
              && ser->st_ang[i] == par->st_ang[i],
              "%s on %s, angular point %d differs", par->particle,
              par->material, i);
}

/* Run a and b at the same time on two threads; then serially; compare. */
static void concurrent_vs_serial (const job *a, const job *b) {
  job pa = *a, pb = *b, sa = *a, sb = *b;
  pthread_t ta, tb;
  cr_assert(pthread_create(&ta, NULL, thread_main, &pa) == 0);
  cr_assert(pthread_create(&tb, NULL, thread_main, &pb) == 0);
  pthread_join(ta, NULL);
  pthread_join(tb, NULL);
  runjob(&sa);
  runjob(&sb);
  expect_equal(&sa, &pa);
  expect_equal(&sb, &pb);
}


/* Two different jobs; both look up catalogue materials (whose mass
** fractions come from xraylib's records) at the same time. */
Test(reentrant, two_jobs_bitwise) {
  job a = {.particle = "electron", .model = "hartree-fock",
           .material = "water", .T = 20.0};
  job b = {.particle = "muon", .model = "thomas-fermi",
           .material = "lead_glass", .T = 5000.0};
  concurrent_vs_serial(&a, &b);
}

/* The same job twice at once: identical inputs, identical outputs. */
Test(reentrant, same_job_twice) {
  job a = {.particle = "positron", .model = "exponential",
           .material = "Pb", .T = 1.0};
  concurrent_vs_serial(&a, &a);
}

/* Spectra from two threads at once, each itself on two threads
** (bl_spectrum_dk_e), against serial bl_dcs_dk_e. */
typedef struct spec {
  bl_case c;
  double k[NK];
  bl_result out[NK];
  int st[NK], ret;
} spec;

static void *spec_main (void *arg) {
  spec *s = arg;
  bl_quad *q = bl_quad_alloc(200);
  if (q == NULL || bl_quad_set_rtol(q, 1e-3) != BL_SUCCESS)
    s->ret = -1;
  else
    s->ret = bl_spectrum_dk_e(&s->c, NK, s->k, 2, q, s->out, s->st);
  bl_quad_free(q);
  return NULL;
}

Test(reentrant, spectra_in_two_threads) {
  static const char *const names[2] = {"electron", "kaon+"};
  static const int Zs[2] = {29, 92};
  spec s[2];
  pthread_t t[2];
  int i, j;
  for (i = 0; i < 2; i++) {
    const bl_particle *p = bl_particle_find(names[i]);
    double T = i == 0 ? 50.0 : 2e4;
    cr_assert(p != NULL);
    cr_assert(bl_case_setup(&s[i].c, p, Zs[i], bl_model_find("hartree-fock"),
                            NULL, T, &bl_opts_default) == BL_SUCCESS);
    for (j = 0; j < NK; j++)
      s[i].k[j] = T * (0.01 + 0.98 * j / (NK - 1));
  }
  for (i = 0; i < 2; i++)
    cr_assert(pthread_create(&t[i], NULL, spec_main, &s[i]) == 0);
  for (i = 0; i < 2; i++)
    pthread_join(t[i], NULL);
  for (i = 0; i < 2; i++) {
    bl_quad *q = bl_quad_alloc(200);
    cr_assert(q != NULL && bl_quad_set_rtol(q, 1e-3) == BL_SUCCESS);
    cr_expect(s[i].ret >= 0);
    for (j = 0; j < NK; j++) {
      bl_result r;
      int st = bl_dcs_dk_e(&s[i].c, s[i].k[j], q, &r);
      cr_expect(samebits(&r, &s[i].out[j]) && st == s[i].st[j],
                "%s, k = %g: %.17g in threads vs %.17g serially", names[i],
                s[i].k[j], s[i].out[j].val, r.val);
    }
    bl_quad_free(q);
  }
}
