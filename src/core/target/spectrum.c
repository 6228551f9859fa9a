/*
** spectrum.c -- dsigma/dk at many photon energies, on several threads
** See Copyright Notice in LICENSE
**
** The photon energies of one spectrum are independent integrals, so they
** are shared out among threads by a fixed interleave (point i to thread
** i mod T).  Each thread owns its workspace (bl_quad) and writes only its
** own elements of the output arrays; the case and the energies are read
** only.  No locks, no shared counters: the result of every point is what
** the serial loop gives, bit for bit.
*/

#include <pthread.h>
#include <stddef.h>
#include <unistd.h>

#include "brakelight/bl_errno.h"
#include "brakelight/bl_spectrum.h"
#include "base/internal.h"


/* One thread's share: points start, start + stride, ... below n. */
typedef struct share {
  const bl_case *c;
  const bl_he *h;           /* high-energy tables (may be NULL) */
  int method;               /* BL_METHOD_* */
  const double *k;
  size_t n, start, stride;
  bl_quad *q;               /* workspace of this share (owned or borrowed) */
  bl_result *out;
  int *status;              /* may be NULL */
  size_t bad;               /* lowest failing index of the share, or n */
  int badst;                /* its status */
  int owned;                /* q was allocated for this share */
  int started;              /* a thread runs this share */
  pthread_t tid;
} share;


/*
** Compute the points of share s in increasing index order; record the
** first failure.  Safe to run on any thread: touches only s, its
** workspace and its own elements of out and status.
*/
static void runshare (share *s) {
  size_t i;
  s->bad = s->n;
  s->badst = BL_SUCCESS;
  for (i = s->start; i < s->n; i += s->stride) {
    int st = bl_method_dk_e(s->c, s->h, s->method, s->k[i], s->q, &s->out[i]);
    if (s->status != NULL)
      s->status[i] = st;
    if (st != BL_SUCCESS && s->bad == s->n) {
      s->bad = i;
      s->badst = st;
    }
  }
}


/* pthread entry point: run the share given as argument. */
static void *threadmain (void *arg) {
  runshare((share *)arg);
  return NULL;
}


int bl_spectrum_threads_auto (void) {
  long np = sysconf(_SC_NPROCESSORS_ONLN);
  if (np < 1)
    return 1;
  return np > BL_SPECTRUM_MAX_THREADS ? BL_SPECTRUM_MAX_THREADS : (int)np;
}


int bl_spectrum_dk_e (const bl_case *c, size_t n, const double *k,
                      int nthreads, bl_quad *q, bl_result *out, int *status) {
  return bl_spectrum_method_e(c, NULL, BL_METHOD_BORN, n, k, nthreads, q, out,
                              status);
}


int bl_spectrum_method_e (const bl_case *c, const bl_he *h, int method,
                          size_t n, const double *k, int nthreads, bl_quad *q,
                          bl_result *out, int *status) {
  share sh[BL_SPECTRUM_MAX_THREADS];
  size_t nt, t, bad;
  int badst;
  if (nthreads < 0 || c == NULL)
    return BL_EDOMAIN;
  if (n == 0)
    return BL_SUCCESS;
  if (k == NULL || out == NULL || q == NULL)
    return BL_EDOMAIN;
  nt = nthreads == 0 ? (size_t)bl_spectrum_threads_auto() : (size_t)nthreads;
  if (nt > BL_SPECTRUM_MAX_THREADS)
    nt = BL_SPECTRUM_MAX_THREADS;
  if (nt > n)
    nt = n;
  for (t = 0; t < nt; t++) {  /* describe every share; workspaces */
    share *s = &sh[t];
    s->c = c;
    s->h = h;
    s->method = method;
    s->k = k;
    s->n = n;
    s->start = t;
    s->stride = nt;
    s->out = out;
    s->status = status;
    s->q = q;
    s->owned = 0;
    s->started = 0;
    if (t > 0) {
      bl_quad *w = bl_quad_alloc(q->limit);
      if (w != NULL) {
        w->rtol = q->rtol;  /* same tolerance as the caller's */
        w->stop = q->stop;  /* and the same stop flag */
        s->q = w;
        s->owned = 1;
      }
    }
  }
  for (t = 1; t < nt; t++)  /* start threads for shares with a workspace */
    if (sh[t].owned)
      sh[t].started = (pthread_create(&sh[t].tid, NULL, threadmain,
                                      &sh[t]) == 0);
  runshare(&sh[0]);  /* the calling thread's own share */
  for (t = 1; t < nt; t++) {
    if (sh[t].started)
      pthread_join(sh[t].tid, NULL);
    else {
      /* no thread (or no workspace): the caller computes this share.  A
      ** borrowed q gets the same fresh call budget per point, so the
      ** values do not change. */
      runshare(&sh[t]);
    }
  }
  bad = n;
  badst = BL_SUCCESS;
  for (t = 0; t < nt; t++) {
    if (sh[t].bad < bad) {
      bad = sh[t].bad;
      badst = sh[t].badst;
    }
    if (sh[t].owned) {
      q->calls += sh[t].q->calls;  /* the caller sees every call */
      bl_quad_free(sh[t].q);
    }
  }
  return badst;
}
