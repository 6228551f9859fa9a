/*
** fit-nucsize.c -- calibrates the nuclear-size correction of the
** high-energy method on the exact Born integral; writes the generated
** table src/core/methods/nuc_table.c
** See Copyright Notice in LICENSE
**
** Run through `make nuc-table` (never by `make` or `make check`):
**
**   fit-nucsize [-o FILE] [-r RTOL] [-j THREADS]
**                 the whole grid (2 spins x NUC_NX nodes of m R) into FILE
**                 (default src/core/methods/nuc_table.c); summary on stderr
**   fit-nucsize -x IX -s SPIN   one grid node on stdout (a quick look)
**
** What it computes (see src/core/methods/nucsize.c for the method): for
** each spin and each node x = ln(m R / hbar c) = NUC_X0 + NUC_DX ix, a
** probe particle of that m R on a bare nucleus of A = NUC_A (Z = 50, no
** screening, no electrons), at delta = Delta/m = q_N 10^(-3 + j/8),
** q_N = 1/(m R), j = 0 ... NUC_NODES - 1, as long as delta <= NUC_TOP (from
** NUC_DMIN = 1e-4 instead where q_N 1e-3 is above it):
**   d(v) = [Born_uniform - Born_point] k / norm = w1(v) N1 - w2(v) N2
** at v = E/E0 = 0.5 and 0.1 for spin 1/2 (solved for N1, N2) and at 0.5
** for spin 0 (N2 = 0), with the final gamma E = (1 - v) / (2 delta): at
** least 1/(2 q_N 10^0) = m R / 2, far above the range of the correction
** (gamma >= 20 m R where "auto" uses it; gamma >= 2.5e2 m R at the first
** node).  Then at the midpoints j + 1/2 the same, against the runtime
** interpolation (bl_nucsize_at): the worst difference where the method
** holds (delta <= q_N / (2 BL_HE_GAMMA_MR), gamma >= BL_HE_GAMMA_MR m R)
** is the node's err, which enters the error of a result.
** Every Born integral runs at RTOL (default 1e-7); a tolerance miss keeps
** its estimate and is counted in the summary.
*/

#include <math.h>
#include <pthread.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

#include <gsl/gsl_errno.h>
#include <gsl/gsl_version.h>

#include "methods/internal.h"


static double rtol = 1e-7;
static bl_nuctab table[2][NUC_NX];
static int misses = 0, jobnext = 0, verbose = 0;
static pthread_mutex_t lock = PTHREAD_MUTEX_INITIALIZER;


static int miss (int st) {
  return st == GSL_EMAXITER || st == GSL_EROUND || st == BL_ENOTCONV;
}


/* d(v) at delta for probe p; 0 or a failure status. */
static int point (const bl_particle *p, double delta, double v, bl_quad *q,
                  double *diff) {
  bl_opts o = bl_opts_bare;
  bl_case cp, cu;
  bl_result rp, ru;
  double m = p->mass, gam = (1.0 - v) / (2.0 * delta);
  double gam0 = gam / v, k = (gam0 - gam) * m;
  const bl_model *none = bl_model_get(BL_MODEL_NONE);
  int st;
  o.A = NUC_A;
  if ((st = bl_case_setup(&cp, p, 50, none, NULL, (gam0 - 1.0) * m, &o)))
    return st;
  o.nucleus = BL_NUCLEUS_UNIFORM;
  if ((st = bl_case_setup(&cu, p, 50, none, NULL, (gam0 - 1.0) * m, &o)))
    return st;
  st = bl_dcs_dk_e(&cp, k, q, &rp);
  if (st != BL_SUCCESS && !miss(st))
    return st;
  if (st != BL_SUCCESS) {
    pthread_mutex_lock(&lock);
    misses++;
    pthread_mutex_unlock(&lock);
  }
  st = bl_dcs_dk_e(&cu, k, q, &ru);
  if (st != BL_SUCCESS && !miss(st))
    return st;
  if (st != BL_SUCCESS) {
    pthread_mutex_lock(&lock);
    misses++;
    pthread_mutex_unlock(&lock);
  }
  *diff = (ru.val - rp.val) * k / cp.norm;
  return BL_SUCCESS;
}


/* N1, N2 at delta (both v for spin 1/2). */
static int nodeval (const bl_particle *p, double delta, bl_quad *q,
                    double *N1, double *N2) {
  static const double vs[2] = {0.5, 0.1};
  double d[2], w1[2], w2[2];
  int i, nv = p->spin > 0.25 ? 2 : 1, st;
  for (i = 0; i < nv; i++) {
    if ((st = point(p, delta, vs[i], q, &d[i])))
      return st;
    bl_spin_weights(p->spin, vs[i], &w1[i], &w2[i]);
  }
  if (nv == 1) {
    *N1 = d[0] / w1[0];
    *N2 = 0.0;
  }
  else {   /* w1 N1 - w2 N2 = d at both v */
    double det = -w1[0] * w2[1] + w1[1] * w2[0];
    *N1 = (-d[0] * w2[1] + d[1] * w2[0]) / det;
    *N2 = (w1[0] * d[1] - w1[1] * d[0]) / det;
  }
  return BL_SUCCESS;
}


/* Grid node (sp, ix): the probe's mass from m R on the A = NUC_A nucleus. */
static int build (int sp, int ix, bl_quad *q, bl_nuctab *t) {
  double mR = exp(NUC_X0 + NUC_DX * ix), qN = 1.0 / mR;
  bl_particle probe = {"nuclear-size probe", 1.0, -1.0, 0.0, 0u};
  bl_opts o = bl_opts_bare;
  bl_case c;
  double lnd, N1, N2;
  int j, st;
  probe.spin = sp ? 0.5 : 0.0;
  o.A = NUC_A;
  o.nucleus = BL_NUCLEUS_UNIFORM;
  if ((st = bl_case_setup(&c, &probe, 50, bl_model_get(BL_MODEL_NONE), NULL,
                          1.0, &o)))
    return st;
  probe.mass = mR * BL_HBARC_MEVFM / c.R;
  memset(t, 0, sizeof *t);
  /* from 1e-3 q_N, or from NUC_DMIN if that is lower: N also changes
  ** with delta at delta ~ 1e-2 (q ~ m), so for m R < 10 a first node at
  ** 1e-3 q_N left N constant from too high a delta (3 MeV masses on Pb,
  ** m R = 0.108: 1.4e-3 of the value, measured against Born) */
  t->lnd0 = fmin(log(qN) - 3.0 * log(10.0), log(NUC_DMIN));
  for (j = 0; j < NUC_NODES && exp(t->lnd0 + j * NUC_DLN) <= NUC_TOP; j++) {
    if ((st = nodeval(&probe, exp(t->lnd0 + j * NUC_DLN), q, &t->N1[j],
                      &t->N2[j])))
      return st;
    t->n = j + 1;
  }
  for (j = 0; j + 1 < t->n; j++) {   /* measured interpolation error */
    double i1, i2;
    lnd = t->lnd0 + (j + 0.5) * NUC_DLN;
    if ((st = nodeval(&probe, exp(lnd), q, &N1, &N2)))
      return st;
    bl_nucsize_at(t, exp(lnd), &i1, &i2);
    if (exp(lnd) <= qN / BL_HE_GAMMA_MR / 2.0 || j == 0)
      t->err = fmax(t->err, fmax(fabs(i1 - N1), fabs(i2 - N2)));
    if (verbose)
      printf("midpoint delta %.6e  N1 %+.10f (%+.2e)  N2 %+.10f (%+.2e)\n",
             exp(lnd), N1, i1 - N1, N2, i2 - N2);
  }
  return BL_SUCCESS;
}


static void *worker (void *arg) {
  bl_quad *q = bl_quad_alloc(1000);
  int *status = arg;
  *status = q == NULL ? BL_ENOMEM : BL_SUCCESS;
  if (q != NULL)
    bl_quad_set_rtol(q, rtol);
  while (*status == BL_SUCCESS) {
    int job, st;
    pthread_mutex_lock(&lock);
    job = jobnext++;
    pthread_mutex_unlock(&lock);
    if (job >= 2 * NUC_NX)
      break;
    st = build(job % 2, job / 2, q, &table[job % 2][job / 2]);
    if (st != BL_SUCCESS) {
      fprintf(stderr, "fit-nucsize: spin %g node %d: %s\n", 0.5 * (job % 2),
              job / 2, bl_strerror(st));
      *status = st;
    }
  }
  bl_quad_free(q);
  return NULL;
}


static void write_node (FILE *f, const bl_nuctab *t, int ix) {
  int j;
  fprintf(f, "    {%d, %.17g,   /* m R = %.4g hbar c */\n     {", t->n,
          t->lnd0, exp(NUC_X0 + NUC_DX * ix));
  for (j = 0; j < NUC_NODES; j++)
    fprintf(f, "%.10g%s", t->N1[j], j + 1 < NUC_NODES ? (j % 5 == 4
            ? ",\n      " : ", ") : "},\n     {");
  for (j = 0; j < NUC_NODES; j++)
    fprintf(f, "%.10g%s", t->N2[j], j + 1 < NUC_NODES ? (j % 5 == 4
            ? ",\n      " : ", ") : "},\n");
  fprintf(f, "     %.3g},\n", t->err);
}


int main (int argc, char **argv) {
  const char *out = "src/core/methods/nuc_table.c";
  int i, nthr = 2, one = -1, sp = 1, st[8], sp_, ix;
  double worst[2] = {0, 0}, t0;
  struct timespec ts;
  FILE *f;
  gsl_set_error_handler_off();
  for (i = 1; i < argc; i++) {
    if (strcmp(argv[i], "-o") == 0 && i + 1 < argc)
      out = argv[++i];
    else if (strcmp(argv[i], "-r") == 0 && i + 1 < argc)
      rtol = atof(argv[++i]);
    else if (strcmp(argv[i], "-j") == 0 && i + 1 < argc)
      nthr = atoi(argv[++i]);
    else if (strcmp(argv[i], "-x") == 0 && i + 1 < argc)
      one = atoi(argv[++i]);
    else if (strcmp(argv[i], "-s") == 0 && i + 1 < argc)
      sp = atof(argv[++i]) > 0.25;
    else {
      fprintf(stderr, "usage: fit-nucsize [-o FILE] [-r RTOL] [-j THREADS] "
              "| -x IX [-s SPIN]\n");
      return 2;
    }
  }
  if (nthr < 1 || nthr > 8 || !(rtol >= 1e-10 && rtol <= 1e-3)) {
    fprintf(stderr, "fit-nucsize: -j in 1..8, -r in [1e-10, 1e-3]\n");
    return 2;
  }
  if (one >= 0) {
    bl_quad *q = bl_quad_alloc(1000);
    bl_nuctab t;
    int s;
    if (one >= NUC_NX || q == NULL)
      return 2;
    bl_quad_set_rtol(q, rtol);
    verbose = 1;
    if ((s = build(sp, one, q, &t)) != BL_SUCCESS) {
      fprintf(stderr, "fit-nucsize: %s\n", bl_strerror(s));
      return 1;
    }
    for (i = 0; i < t.n; i++)
      printf("delta %.6e  N1 %+.10f  N2 %+.10f\n",
             exp(t.lnd0 + i * NUC_DLN), t.N1[i], t.N2[i]);
    printf("interpolation error %.3g\n", t.err);
    bl_quad_free(q);
    return 0;
  }
  clock_gettime(CLOCK_MONOTONIC, &ts);
  t0 = ts.tv_sec + 1e-9 * ts.tv_nsec;
  {
    pthread_t th[8];
    for (i = 0; i < nthr; i++)
      pthread_create(&th[i], NULL, worker, &st[i]);
    for (i = 0; i < nthr; i++)
      pthread_join(th[i], NULL);
    for (i = 0; i < nthr; i++)
      if (st[i] != BL_SUCCESS)
        return 1;
  }
  clock_gettime(CLOCK_MONOTONIC, &ts);
  for (sp_ = 0; sp_ < 2; sp_++)
    for (ix = 0; ix < NUC_NX; ix++)
      worst[sp_] = fmax(worst[sp_], table[sp_][ix].err);
  f = fopen(out, "w");
  if (f == NULL) {
    perror(out);
    return 1;
  }
  fprintf(f,
    "/*\n"
    "** nuc_table.c -- nuclear-size correction of the high-energy method\n"
    "** See Copyright Notice in LICENSE\n"
    "**\n"
    "** GENERATED FILE, do not edit: made by scripts/fit-nucsize.c through\n"
    "** `make nuc-table` (Born integrals at rtol %g, GSL %s).\n"
    "**\n"
    "** Per spin (0, 1/2) and grid node x = ln(m R / hbar c) = %.6f + %g ix,\n"
    "** ix = 0 ... %d: N1, N2 at delta = Delta/m = exp(lnd0 + %.6f j),\n"
    "** j < n (src/core/methods/nucsize.c), and the worst interpolation\n"
    "** error measured at the midpoints where the high-energy method holds\n"
    "** (delta <= q_N / 6), in units of phi: %.2g (spin 0),\n"
    "** %.2g (spin 1/2).  %d of the Born integrals missed their tolerance\n"
    "** (their estimates are used).\n"
    "*/\n\n#include \"methods/internal.h\"\n\n"
    "const bl_nuctab bl_nuc_table[2][NUC_NX] = {\n",
    rtol, GSL_VERSION, NUC_X0, NUC_DX, NUC_NX - 1, NUC_DLN, worst[0],
    worst[1], misses);
  for (sp_ = 0; sp_ < 2; sp_++) {
    fprintf(f, "  {   /* spin %s */\n", sp_ ? "1/2" : "0");
    for (ix = 0; ix < NUC_NX; ix++)
      write_node(f, &table[sp_][ix], ix);
    fprintf(f, "  },\n");
  }
  fprintf(f, "};\n");
  fclose(f);
  fprintf(stderr, "fit-nucsize: wrote %s in %.0f s; interpolation error "
          "%.2g (spin 0), %.2g (spin 1/2); %d tolerance misses\n", out,
          ts.tv_sec + 1e-9 * ts.tv_nsec - t0, worst[0], worst[1], misses);
  return 0;
}
