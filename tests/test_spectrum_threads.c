/*
** test_spectrum_threads.c -- bl_spectrum_dk_e: threads change nothing
** See Copyright Notice in LICENSE
**
** Internal consistency, no outside source: a spectrum computed on 2, 3 or
** "all" threads must equal the serial loop of bl_dcs_dk_e bit for bit
** (value, error, warnings and status of every point), and the call counter
** must see the work of every thread.
*/

#include <string.h>

#include <criterion/criterion.h>

#include "brakelight.h"
#include "testutil.h"

TestSuite(spectrum_threads, .init = setup);

#define NK 9
#define RTOL 1e-3


/* A case: particle preset `name` on element Z, exponential screening, T MeV. */
static bl_case make_case (const char *name, int Z, double T) {
  bl_case c;
  const bl_particle *p = bl_particle_find(name);
  const bl_model *m = bl_model_find("exponential");
  int st;
  cr_assert(p != NULL && m != NULL);
  st = bl_case_init(&c, p, Z, m, NULL, T);
  cr_assert(st == BL_SUCCESS, "bl_case_init: %s", bl_strerror(st));
  return c;
}

/* A workspace with tolerance RTOL; aborts the test if it cannot be made. */
static bl_quad *make_quad (void) {
  bl_quad *q = bl_quad_alloc(200);
  cr_assert(q != NULL);
  cr_assert(bl_quad_set_rtol(q, RTOL) == BL_SUCCESS);
  return q;
}

/* The serial reference: bl_dcs_dk_e point by point with one workspace. */
static void serial (const bl_case *c, const double *k, size_t n,
                    bl_result *out, int *st, unsigned long *calls) {
  bl_quad *q = make_quad();
  size_t i;
  for (i = 0; i < n; i++)
    st[i] = bl_dcs_dk_e(c, k[i], q, &out[i]);
  *calls = bl_quad_calls(q);
  bl_quad_free(q);
}

/* Bitwise equality of two results (value, error, warnings). */
static void expect_same (const bl_result *a, const bl_result *b, size_t i,
                         int threads) {
  cr_expect(memcmp(&a->val, &b->val, sizeof a->val) == 0 &&
            memcmp(&a->err, &b->err, sizeof a->err) == 0 &&
            a->warn == b->warn,
            "point %zu, %d threads: %.17g +- %.17g (warn %u) vs serial "
            "%.17g +- %.17g (warn %u)", i, threads, b->val, b->err, b->warn,
            a->val, a->err, a->warn);
}


/* Serial versus 1, 2, 3 and automatic threads, bit for bit (the issue's
** check); the counter of the caller's workspace holds every call. */
Test(spectrum_threads, bitwise_equal_to_serial) {
  bl_case c = make_case("electron", 82, 100.0);
  double k[NK];
  bl_result ref[NK], got[NK];
  int rst[NK], gst[NK];
  unsigned long rcalls;
  int threads[] = { 1, 2, 3, 0 };
  size_t i, j;
  for (i = 0; i < NK; i++)
    k[i] = 100.0 * (0.02 + 0.96 * (double)i / (NK - 1));
  serial(&c, k, NK, ref, rst, &rcalls);
  for (j = 0; j < sizeof threads / sizeof threads[0]; j++) {
    bl_quad *q = make_quad();
    int st;
    memset(got, 0xff, sizeof got);
    memset(gst, 0xff, sizeof gst);
    st = bl_spectrum_dk_e(&c, NK, k, threads[j], q, got, gst);
    cr_expect(st == BL_SUCCESS, "%d threads: status %s", threads[j],
              bl_strerror(st));
    for (i = 0; i < NK; i++) {
      expect_same(&ref[i], &got[i], i, threads[j]);
      cr_expect(gst[i] == rst[i], "point %zu: status %d vs %d", i, gst[i],
                rst[i]);
    }
    cr_expect(bl_quad_calls(q) == rcalls, "%d threads: %lu calls, serial %lu",
              threads[j], bl_quad_calls(q), rcalls);
    cr_expect(bl_quad_rtol(q) == RTOL);
    bl_quad_free(q);
  }
}


/* Spin 0, a heavy projectile, more threads than points, no status array. */
Test(spectrum_threads, more_threads_than_points) {
  bl_case c = make_case("pion+", 6, 5000.0);
  double k[3] = { 50.0, 2500.0, 4900.0 };
  bl_result ref[3], got[3];
  int rst[3];
  unsigned long rcalls;
  bl_quad *q = make_quad();
  size_t i;
  serial(&c, k, 3, ref, rst, &rcalls);
  cr_expect(bl_spectrum_dk_e(&c, 3, k, 8, q, got, NULL) == BL_SUCCESS);
  for (i = 0; i < 3; i++)
    expect_same(&ref[i], &got[i], i, 8);
  bl_quad_free(q);
}


/* A bad energy: the returned status is that of the lowest failing index,
** whatever the thread count; the other points are still computed. */
Test(spectrum_threads, failure_is_deterministic) {
  bl_case c = make_case("electron", 29, 10.0);
  double k[6] = { 1.0, 2.0, 12.0, 4.0, -1.0, 9.0 };  /* #2, #4 outside (0, T) */
  int threads[] = { 1, 2, 4 };
  size_t j;
  for (j = 0; j < 3; j++) {
    bl_result got[6];
    int gst[6];
    bl_quad *q = make_quad();
    int st = bl_spectrum_dk_e(&c, 6, k, threads[j], q, got, gst);
    cr_expect(st == BL_EDOMAIN, "%d threads: status %d", threads[j], st);
    cr_expect(gst[2] == BL_EDOMAIN && gst[4] == BL_EDOMAIN);
    cr_expect(gst[0] == BL_SUCCESS && gst[5] == BL_SUCCESS && got[5].val > 0);
    bl_quad_free(q);
  }
}


/* Argument checks: negative thread count, NULL arrays; n = 0 is a no-op. */
Test(spectrum_threads, arguments) {
  bl_case c = make_case("electron", 29, 10.0);
  double k[1] = { 5.0 };
  bl_result r[1];
  bl_quad *q = make_quad();
  cr_expect(bl_spectrum_dk_e(&c, 1, k, -1, q, r, NULL) == BL_EDOMAIN);
  cr_expect(bl_spectrum_dk_e(&c, 1, NULL, 1, q, r, NULL) == BL_EDOMAIN);
  cr_expect(bl_spectrum_dk_e(&c, 1, k, 1, NULL, r, NULL) == BL_EDOMAIN);
  cr_expect(bl_spectrum_dk_e(&c, 1, k, 1, q, NULL, NULL) == BL_EDOMAIN);
  cr_expect(bl_spectrum_dk_e(&c, 0, NULL, 2, q, NULL, NULL) == BL_SUCCESS);
  cr_expect(bl_spectrum_threads_auto() >= 1);
  bl_quad_free(q);
}
