/*
** tsan_spectra.c -- spectra on many threads at once, for ThreadSanitizer
** See Copyright Notice in LICENSE
**
** `make test-tsan` builds the core with gcc -fsanitize=thread into
** build/tsan and runs this program with TSAN_OPTIONS=halt_on_error=1.
** Plain C, no Criterion: Criterion's own worker threads and pipes confuse
** TSan.  Internal consistency, no outside source.
**
** Several application threads start at the same moment (a barrier), each
** with its own case and its own bl_quad, and each computes a spectrum by
** bl_spectrum_dk_e or bl_spectrum_method_e with nthreads > 1, so the
** library's threads of different spectra run side by side.  Every method
** appears (born, high-energy, complete, auto on both sides of its switch),
** and two of the threads prepare the same new high-energy tables at once:
** screening tables and nuclear-size nodes that no other job uses, so their
** first build in the process happens in both threads concurrently.  A
** second round runs the same threads again on the now warm cache (readers
** only).  Then every job of both rounds is computed again serially (bl_method_prepare and one
** bl_method_dk_e per energy, in the main thread) and compared bit for bit:
** value, error, warning and applied bits, method used, status.
**
** Exit status: 0 when every result matches, 1 on a mismatch or a failed
** set-up (each printed on stderr); TSan itself exits with 66 on a report.
*/

#include <pthread.h>
#include <stdio.h>
#include <string.h>

#include <gsl/gsl_errno.h>

#include "brakelight.h"

#define NK    6      /* photon energies per spectrum */
#define LIMIT 200    /* subintervals per nesting level */
#define RTOL  1e-3   /* cheap under TSan (about ten times slower) */
#define ROUNDS 2     /* the first builds the tables, the second reads them */

/* One application thread's work and its results. */
typedef struct job {
  const char *name;       /* for messages */
  const char *particle, *model;
  int Z;
  double T;               /* MeV */
  int method;             /* BL_METHOD_*; -1: bl_spectrum_dk_e (born) */
  int nthreads;           /* passed to the spectrum function */
  double k[NK];
  bl_result out[NK];
  int st[NK], ret;
  const void *el;         /* the screening table used (shared cache) */
  int failed;             /* a set-up step failed: the step */
} job;

static pthread_barrier_t start;


/*
** Case of job j, with every target option of the module's defaults
** (atomic electrons, uniform nucleus, corrections where valid).  0 or -1.
*/
static int makecase (const job *j, bl_case *c) {
  const bl_particle *p = bl_particle_find(j->particle);
  const bl_model *m = bl_model_find(j->model);
  if (p == NULL || m == NULL)
    return -1;
  return bl_case_setup(c, p, j->Z, m, NULL, j->T, &bl_opts_default)
         == BL_SUCCESS ? 0 : -1;
}


/* Thread body: wait for the others, then prepare and compute the spectrum. */
static void *thread_main (void *arg) {
  job *j = arg;
  bl_quad *q = bl_quad_alloc(LIMIT);
  bl_case c;
  bl_he h;
  int ok = q != NULL && bl_quad_set_rtol(q, RTOL) == BL_SUCCESS
           && makecase(j, &c) == 0;
  pthread_barrier_wait(&start);   /* every thread, whatever happened */
  if (!ok)
    j->failed = 1;
  else if (j->method < 0)
    j->ret = bl_spectrum_dk_e(&c, NK, j->k, j->nthreads, q, j->out, j->st);
  else if (bl_method_prepare(&c, j->method, q, &h) != BL_SUCCESS)
    j->failed = 2;
  else {
    j->el = h.ready ? (const void *)h.el : NULL;
    j->ret = bl_spectrum_method_e(&c, &h, j->method, NK, j->k, j->nthreads,
                                  q, j->out, j->st);
  }
  bl_quad_free(q);
  return NULL;
}


static int samebits (const bl_result *a, const bl_result *b) {
  return memcmp(&a->val, &b->val, sizeof a->val) == 0
         && memcmp(&a->err, &b->err, sizeof a->err) == 0
         && a->warn == b->warn && a->applied == b->applied
         && a->method == b->method;
}


/*
** Recompute job j serially in the calling thread and compare with what
** its thread got.  Returns the number of mismatches (printed).
*/
static int check (const job *j) {
  bl_quad *q = bl_quad_alloc(LIMIT);
  bl_case c;
  bl_he h;
  int i, bad = 0, method = j->method < 0 ? BL_METHOD_BORN : j->method;
  if (j->failed) {
    fprintf(stderr, "tsan_spectra: %s: set-up step %d failed in its "
            "thread\n", j->name, j->failed);
    bl_quad_free(q);
    return 1;
  }
  if (q == NULL || bl_quad_set_rtol(q, RTOL) != BL_SUCCESS
      || makecase(j, &c) != 0
      || bl_method_prepare(&c, method, q, &h) != BL_SUCCESS) {
    fprintf(stderr, "tsan_spectra: %s: serial set-up failed\n", j->name);
    bl_quad_free(q);
    return 1;
  }
  if (h.ready && j->el != (const void *)h.el) {
    fprintf(stderr, "tsan_spectra: %s: the thread used another screening "
            "table than the cache holds now\n", j->name);
    bad++;
  }
  for (i = 0; i < NK; i++) {
    bl_result r;
    int st = j->method < 0 ? bl_dcs_dk_e(&c, j->k[i], q, &r)
             : bl_method_dk_e(&c, &h, method, j->k[i], q, &r);
    if (!samebits(&r, &j->out[i]) || st != j->st[i]) {
      fprintf(stderr, "tsan_spectra: %s, k = %.17g MeV: %.17g +- %.17g "
              "(warn %#x, method %d, status %d) on threads, %.17g +- %.17g "
              "(warn %#x, method %d, status %d) serially\n", j->name,
              j->k[i], j->out[i].val, j->out[i].err, j->out[i].warn,
              j->out[i].method, j->st[i], r.val, r.err, r.warn, r.method, st);
      bad++;
    }
  }
  bl_quad_free(q);
  return bad;
}


int main (void) {
  /* Photon energies: fractions of T from the soft end to the tip. */
  static const double y[NK] = {1e-4, 0.01, 0.2, 0.5, 0.9, 0.999};
  job jobs[] = {
    /* the Born integral, bl_spectrum_dk_e on two threads */
    {.name = "born e- Cu 50 MeV", .particle = "electron",
     .model = "hartree-fock", .Z = 29, .T = 50.0, .method = -1,
     .nthreads = 2},
    /* the Born integral through the method dispatch, three threads */
    {.name = "born mu W 2 GeV", .particle = "muon", .model = "thomas-fermi",
     .Z = 74, .T = 2e3, .method = BL_METHOD_BORN, .nthreads = 3},
    /* high-energy: tables of Pb, and nuclear-size nodes of the muon */
    {.name = "high-energy mu Pb 1 TeV", .particle = "muon",
     .model = "thomas-fermi", .Z = 82, .T = 1e6,
     .method = BL_METHOD_HIGH_ENERGY, .nthreads = 2},
    /* complete screening (no tables) */
    {.name = "complete e+ Al 10 GeV", .particle = "positron",
     .model = "exponential", .Z = 13, .T = 1e4,
     .method = BL_METHOD_COMPLETE, .nthreads = 2},
    /* auto: gamma0 ~ 1400, so the soft end is high-energy, the tip Born */
    {.name = "auto pi+ Fe 200 GeV", .particle = "pion+",
     .model = "hartree-fock", .Z = 26, .T = 2e5, .method = BL_METHOD_AUTO,
     .nthreads = 0},
    /* the same new tables (Ag, exponential; the kaon's nuclear-size
    ** nodes) built by two threads at once */
    {.name = "high-energy K+ Ag 5 TeV (a)", .particle = "kaon+",
     .model = "exponential", .Z = 47, .T = 5e6,
     .method = BL_METHOD_HIGH_ENERGY, .nthreads = 2},
    {.name = "high-energy K+ Ag 5 TeV (b)", .particle = "kaon+",
     .model = "exponential", .Z = 47, .T = 5e6,
     .method = BL_METHOD_HIGH_ENERGY, .nthreads = 2},
  };
  enum { NJOB = sizeof jobs / sizeof jobs[0] };
  job run[ROUNDS][NJOB];
  pthread_t t[NJOB];
  int i, n, r, bad = 0, npoints = 0;
  gsl_set_error_handler_off();
  for (i = 0; i < NJOB; i++)
    for (n = 0; n < NK; n++)
      jobs[i].k[n] = y[n] * jobs[i].T;
  for (r = 0; r < ROUNDS; r++) {
    if (pthread_barrier_init(&start, NULL, NJOB) != 0) {
      fprintf(stderr, "tsan_spectra: cannot make a barrier\n");
      return 1;
    }
    for (i = 0; i < NJOB; i++) {
      run[r][i] = jobs[i];
      if (pthread_create(&t[i], NULL, thread_main, &run[r][i]) != 0) {
        fprintf(stderr, "tsan_spectra: cannot start thread %d\n", i);
        return 1;   /* the others wait at the barrier forever: exit */
      }
    }
    for (i = 0; i < NJOB; i++)
      pthread_join(t[i], NULL);
    pthread_barrier_destroy(&start);
  }
  for (r = 0; r < ROUNDS; r++) {
    for (i = 0; i < NJOB; i++) {
      bad += check(&run[r][i]);
      npoints += NK;
    }
    if (run[r][NJOB - 1].el == NULL
        || run[r][NJOB - 1].el != run[r][NJOB - 2].el) {
      fprintf(stderr, "tsan_spectra: round %d: the two threads that built "
              "the Ag tables at once use no or different tables\n", r + 1);
      bad++;
    }
  }
  if (bad) {
    fprintf(stderr, "tsan_spectra: %d mismatches\n", bad);
    return 1;
  }
  printf("tsan_spectra: %d rounds of %d spectra on %d application threads "
         "(%d points): identical to serial bit for bit\n", ROUNDS, NJOB, NJOB,
         npoints);
  return 0;
}
