/*
** fit-ebrems.c -- tabulates the bound electron term of electrons and
** positrons (src/core/ebrems/) as a ratio to the static-charge electron
** term of the Born target factor; writes src/core/ebrems/eb_table.c
** See Copyright Notice in LICENSE
**
** Run through `make eb-table` (never by `make` or `make check`):
**
**   fit-ebrems [-o FILE] [-j THREADS] [-v]   the whole grid into FILE
**                 (-v: one line a node on stderr)
**   fit-ebrems -p KIND Z T U             one point on stdout (a quick look)
**   fit-ebrems -m N SEED                 the interpolation error of the
**                 library's table (bl_case_eratio) against fresh ratios at
**                 N random points (kind, Z = 1...92, ln T uniform on 1 keV
**                 ... 1 GeV, u uniform on 0.02 ... 0.997): worst, median
**
** At each node (kind, Z, T, u = y / y_max, y = k / T, y_max the end point
** on a free electron at rest):
**   R = [bl_ebrems_dk_e, bound by S(q, Z)/Z of "hartree-fock", per atomic
**        electron] / [Born dsigma/dk of the static electron term alone
**        (the target factor S/(Z^2 q^4), elastic part removed) / Z]
** both at photon energy k = u y_max T (DEVELOPERS.md, "Electron-target
** bremsstrahlung", "Wired in").  ebrems at rtol EB_RTOL, Born at BORN_RTOL.
*/

#include <math.h>
#include <pthread.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

#include "brakelight.h"
#include "ebrems/table.h"

#define EB_RTOL   2e-3
#define BORN_RTOL 1e-4

static double val[2][EBT_NZ][EBT_NT][EBT_NU];
static double rerr[2][EBT_NZ][EBT_NT][EBT_NU];
static int jobnext = 0, misses = 0, progress = 0;
static pthread_mutex_t lock = PTHREAD_MUTEX_INITIALIZER;
static const char *kinds[2] = {"electron", "positron"};


static int ratio (int kind, int Z, double T, double u, bl_quad *qe,
                  bl_quad *qb, double *R, double *err) {
  const bl_particle *p = bl_particle_find(kinds[kind]);
  const bl_model *hf = bl_model_find("hartree-fock");
  bl_ebrems e;
  bl_case ce;
  bl_opts o = bl_opts_default;
  bl_result re, rs;
  double k, st;
  int s1, s2, t;
  o.coulomb = BL_APPLY_OFF;
  o.elwert = BL_APPLY_OFF;
  if (bl_ebrems_init(&e, p, T) != BL_SUCCESS
      || bl_ebrems_set_binding(&e, Z, hf, NULL) != BL_SUCCESS)
    return 1;
  k = u * bl_ebrems_kmax(&e);
  /* the static electron term alone: the Born target factor with its
  ** elastic part removed and the electron part as it is (ebt = 0) */
  if (bl_case_setup(&ce, p, Z, hf, NULL, T, &o) != BL_SUCCESS)
    return 1;
  ce.ebt = 0;
  for (t = 0; t < ce.npole; t++)
    ce.single_el[t] = 0.0;
  for (t = 0; t < ce.nelastic; t++)
    ce.term[t].c = 0.0;
  s1 = bl_ebrems_dk_e(&e, k, qe, &re);
  s2 = bl_dcs_dk_e(&ce, k, qb, &rs);
  if (s1 != BL_SUCCESS || s2 != BL_SUCCESS) {
    pthread_mutex_lock(&lock);
    misses++;
    pthread_mutex_unlock(&lock);
  }
  st = rs.val / Z;
  *R = re.val / st;
  *err = fabs(*R) * (re.err / fabs(re.val) + rs.err / fabs(rs.val));
  return 0;
}


static int dcmp (const void *a, const void *b) {
  double x = *(const double *)a, y = *(const double *)b;
  return (x > y) - (x < y);
}


static void *worker (void *arg) {
  bl_quad *qe = bl_quad_alloc(200), *qb = bl_quad_alloc(200);
  int n = 2 * EBT_NZ * EBT_NT * EBT_NU;
  (void)arg;
  if (qe == NULL || qb == NULL)
    exit(1);
  bl_quad_set_rtol(qe, EB_RTOL);
  bl_quad_set_rtol(qb, BORN_RTOL);
  for (;;) {
    int j, kind, iz, it, iu;
    pthread_mutex_lock(&lock);
    j = jobnext++;
    pthread_mutex_unlock(&lock);
    if (j >= n)
      break;
    /* hardest (highest T) first: the threads finish together */
    it = EBT_NT - 1 - j / (2 * EBT_NZ * EBT_NU);
    kind = (j / (EBT_NZ * EBT_NU)) % 2;
    iz = (j / EBT_NU) % EBT_NZ;
    iu = j % EBT_NU;
    if (ratio(kind, bl_ebt_z[iz], exp(EBT_LT0 + EBT_DLT * it), bl_ebt_u[iu],
              qe, qb, &val[kind][iz][it][iu], &rerr[kind][iz][it][iu]))
      exit(1);
    if (progress)
      fprintf(stderr, "%d/%d %s Z=%d T=%g u=%g R=%.6f\n", j + 1, n,
              kinds[kind], bl_ebt_z[iz], exp(EBT_LT0 + EBT_DLT * it),
              bl_ebt_u[iu], val[kind][iz][it][iu]);
  }
  bl_quad_free(qe);
  bl_quad_free(qb);
  return NULL;
}


int main (int argc, char **argv) {
  const char *out = "src/core/ebrems/eb_table.c";
  int nth = 1, i, kind, iz, it, iu;
  pthread_t th[8];
  FILE *f;
  double worst = 0.0;
  if (argc == 6 && strcmp(argv[1], "-p") == 0) {
    bl_quad *qe = bl_quad_alloc(200), *qb = bl_quad_alloc(200);
    double R, err;
    bl_quad_set_rtol(qe, EB_RTOL);
    bl_quad_set_rtol(qb, BORN_RTOL);
    if (ratio(strcmp(argv[2], "positron") == 0, atoi(argv[3]),
              atof(argv[4]), atof(argv[5]), qe, qb, &R, &err))
      return 1;
    printf("%.6f %.2e\n", R, err);
    return 0;
  }
  if (argc == 4 && strcmp(argv[1], "-m") == 0) {
    bl_quad *qe = bl_quad_alloc(200), *qb = bl_quad_alloc(200);
    int nm = atoi(argv[2]), j;
    unsigned seed = (unsigned)atoi(argv[3]);
    double *d = malloc(sizeof(double) * (size_t)(nm > 0 ? nm : 1));
    if (qe == NULL || qb == NULL || d == NULL || nm < 1)
      return 1;
    bl_quad_set_rtol(qe, 1e-3);
    bl_quad_set_rtol(qb, 1e-5);
    for (j = 0; j < nm; j++) {
      int kd = rand_r(&seed) % 2, Z = 1 + rand_r(&seed) % 92;
      double T = exp(EBT_LT0 + EBT_DLT * (EBT_NT - 1)
                     * (rand_r(&seed) / (RAND_MAX + 1.0)));
      double u = 0.02 + 0.977 * (rand_r(&seed) / (RAND_MAX + 1.0));
      double R, err, got;
      bl_case c;
      if (ratio(kd, Z, T, u, qe, qb, &R, &err)
          || bl_case_setup(&c, bl_particle_find(kinds[kd]), Z,
                           bl_model_find("hartree-fock"), NULL, T,
                           &bl_opts_default) != BL_SUCCESS)
        return 1;
      got = bl_case_eratio(&c, u * c.ekmax);
      d[j] = fabs(got - R) / fmax(R, 1e-300);
      printf("%s Z=%d T=%.4g u=%.4f table %.5f fresh %.5f rel %.2e\n",
             kinds[kd], Z, T, u, got, R, d[j]);
    }
    qsort(d, (size_t)nm, sizeof d[0], dcmp);
    printf("interpolation error over %d points: median %.2e, 90 %% %.2e, "
           "worst %.2e\n", nm, d[nm / 2], d[(9 * nm) / 10], d[nm - 1]);
    free(d);
    return 0;
  }
  for (i = 1; i < argc; i++) {
    if (strcmp(argv[i], "-o") == 0 && i + 1 < argc)
      out = argv[++i];
    else if (strcmp(argv[i], "-v") == 0)
      progress = 1;
    else if (strcmp(argv[i], "-j") == 0 && i + 1 < argc)
      nth = atoi(argv[++i]);
  }
  if (nth < 1 || nth > 8)
    nth = 1;
  for (i = 0; i < nth; i++)
    pthread_create(&th[i], NULL, worker, NULL);
  for (i = 0; i < nth; i++)
    pthread_join(th[i], NULL);
  f = fopen(out, "w");
  if (f == NULL)
    return 1;
  fprintf(f, "/*\n** eb_table.c -- generated by scripts/fit-ebrems.c "
          "(make eb-table); do not edit\n** See Copyright Notice in LICENSE"
          "\n**\n** Ratio of the bound electron term (bl_ebrems_dk_e, "
          "Hartree-Fock S(q)) to the\n** static-charge electron term of "
          "the Born target factor, per atomic\n** electron, [kind][Z node]"
          "[ln T node][u node] (src/core/ebrems/table.h).\n** ebrems rtol "
          "%g, Born rtol %g; %d integrals missed their tolerance.\n*/\n\n"
          "#include \"ebrems/table.h\"\n\n"
          "const double bl_ebt_r[2][EBT_NZ][EBT_NT][EBT_NU] = {\n",
          EB_RTOL, BORN_RTOL, misses);
  for (kind = 0; kind < 2; kind++) {
    fprintf(f, "  { /* %s */\n", kinds[kind]);
    for (iz = 0; iz < EBT_NZ; iz++) {
      fprintf(f, "    { /* Z = %d */\n", bl_ebt_z[iz]);
      for (it = 0; it < EBT_NT; it++) {
        fprintf(f, "      {");
        for (iu = 0; iu < EBT_NU; iu++) {
          fprintf(f, "%s%.6e", iu == 0 ? "" : iu % 4 ? ", " : ",\n       ",
                  val[kind][iz][it][iu]);
          if (rerr[kind][iz][it][iu] > worst)
            worst = rerr[kind][iz][it][iu];
        }
        fprintf(f, "}%s /* T = %.4g MeV */\n", it + 1 < EBT_NT ? "," : "",
                exp(EBT_LT0 + EBT_DLT * it));
      }
      fprintf(f, "    }%s\n", iz + 1 < EBT_NZ ? "," : "");
    }
    fprintf(f, "  }%s\n", kind ? "" : ",");
  }
  fprintf(f, "};\n");
  fclose(f);
  fprintf(stderr, "fit-ebrems: %d misses, worst error estimate of a ratio "
          "%.2e\n", misses, worst);
  return 0;
}
