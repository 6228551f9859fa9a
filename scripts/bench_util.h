/*
** bench_util.h -- what the benchmark programs of scripts/ share: a
** monotonic clock and the comparison of doubles for qsort (medians)
** See Copyright Notice in LICENSE
*/
#ifndef BENCH_UTIL_H
#define BENCH_UTIL_H

#include <time.h>

/* Seconds on the monotonic clock. */
static inline double now (void) {
  struct timespec ts;
  clock_gettime(CLOCK_MONOTONIC, &ts);
  return (double)ts.tv_sec + 1e-9 * (double)ts.tv_nsec;
}

/* qsort comparison of two doubles, ascending. */
static inline int cmp (const void *a, const void *b) {
  double x = *(const double *)a, y = *(const double *)b;
  return (x > y) - (x < y);
}

#endif
