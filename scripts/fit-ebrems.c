/*
** fit-ebrems.c -- tabulates the bound electron term of electrons and
** positrons, or of muons (src/core/ebrems/) as a ratio to the
** static-charge electron term of the Born target factor; writes
** src/core/ebrems/eb_table.c (e-, e+), eb_table_mu.c (-u: mu-, mu+) or
** eb_table_h.c (-H: the three charge parts of every other projectile)
** See Copyright Notice in LICENSE
**
** Run through `make eb-table` / `make eb-table-mu` (never by `make` or
** `make check`):
**
**   fit-ebrems [-u] [-o FILE] [-j THREADS] [-v]   the whole grid into FILE
**                 (-u: the muon table; -v: one line a node on stderr)
**   fit-ebrems -H [-o FILE] [-j THREADS] [-v]   the table of other
**                 projectiles (any mass from 100 MeV, charge, spin 0 or
**                 1/2): at each node R_P, R_I, R_E at charge +1
**   fit-ebrems -H [-j THREADS] -m N SEED   its interpolation error against
**                 fresh ratios of particles of random spin, mass (ln M
**                 uniform on the mass nodes), charge (-2, -1, 1, 2),
**                 Z = 1...92, tau = T/M (ln uniform up to 10 TeV) and u
**                 (ln(u/(1-u)) uniform on the u nodes): median, 90 %, worst
**   fit-ebrems -q SPIN MASS Z T U   the three parts of one particle of
**                 charge +1 (a quick look)
**   fit-ebrems -p KIND Z T U             one point on stdout (a quick look;
**                 KIND electron, positron, muon, antimuon)
**   fit-ebrems -d KIND Z T U             the same and the ratio with the
**                 projectile's radiation only (the struck electron's own
**                 radiation left out; muons: DEVELOPERS.md, "Muons")
**   fit-ebrems [-u] [-j THREADS] -m N SEED   the interpolation error of
**                 the library's table (bl_case_eratio) against fresh
**                 ratios at N random points (kind, Z = 1...92, ln T
**                 uniform on the table's range; e+-: u uniform on 0.02 ...
**                 0.997; muons: ln(u / (1 - u)) uniform on 1e-4 ... 0.997):
**                 worst, median
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

static double val[2][EBT_NZ][EBM_NT][EBM_NU];
static double rerr[2][EBT_NZ][EBM_NT][EBM_NU];
static int jobnext = 0, misses = 0, progress = 0;
static pthread_mutex_t lock = PTHREAD_MUTEX_INITIALIZER;
static const char *names[2][2] = {{"electron", "positron"},
                                  {"muon", "antimuon"}};
/* the grid of the table made: e+- or (-u) muons */
static int mu = 0, NT = EBT_NT, NU = EBT_NU;
static double LT0 = EBT_LT0, DLT = EBT_DLT;
static const double *UN = bl_ebt_u;
#define kinds (names[mu])


static int ratio_p (const bl_particle *p, int Z, double T, double u,
                    bl_quad *qe, bl_quad *qb, int radiate, double *R,
                    double *err) {
  const bl_model *hf = bl_model_find("hartree-fock");
  bl_ebrems e;
  bl_case ce;
  bl_opts o = bl_opts_default;
  bl_result re, rs;
  double k, st;
  int s1, s2, t;
  o.coulomb = BL_APPLY_OFF;
  o.elwert = BL_APPLY_OFF;
  if (T > BL_EBREMS_T_MAX && T < BL_EBREMS_T_MAX * (1.0 + 1e-12))
    T = BL_EBREMS_T_MAX;   /* the top node exp(ln 1e7) rounded up */
  if (bl_ebrems_init(&e, p, T) != BL_SUCCESS
      || bl_ebrems_set_binding(&e, Z, hf, NULL) != BL_SUCCESS)
    return 1;
  e.radiate = radiate;
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

static int ratio_of (const char *name, int Z, double T, double u,
                     bl_quad *qe, bl_quad *qb, int radiate, double *R,
                     double *err) {
  return ratio_p(bl_particle_find(name), Z, T, u, qe, qb, radiate, R, err);
}

/* The three charge parts of R at charge +1 (DEVELOPERS.md, "Other
** projectiles"): R_P the projectile's radiation, R_E the struck
** electron's, R_I the rest (the interference), one static term for all. */
static int parts (const bl_particle *p, int Z, double T, double u,
                  bl_quad *qe, bl_quad *qb, double R[3], double *err) {
  double a[3], e[3];
  int r;
  for (r = 0; r < 3; r++)   /* BL_EBREMS_RAD_BOTH, _PROJECTILE, _ELECTRON */
    if (ratio_p(p, Z, T, u, qe, qb, r, &a[r], &e[r]))
      return 1;
  R[0] = a[1];
  R[1] = a[0] - a[1] - a[2];
  R[2] = a[2];
  *err = (e[0] + e[1] + e[2]) / a[0];
  return 0;
}

static int ratio (int kind, int Z, double T, double u, bl_quad *qe,
                  bl_quad *qb, double *R, double *err) {
  return ratio_of(kinds[kind], Z, T, u, qe, qb, BL_EBREMS_RAD_BOTH, R, err);
}


static int dcmp (const void *a, const void *b) {
  double x = *(const double *)a, y = *(const double *)b;
  return (x > y) - (x < y);
}


static void *worker (void *arg) {
  bl_quad *qe = bl_quad_alloc(200), *qb = bl_quad_alloc(200);
  int n = 2 * EBT_NZ * NT * NU;
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
    it = NT - 1 - j / (2 * EBT_NZ * NU);
    kind = (j / (EBT_NZ * NU)) % 2;
    iz = (j / NU) % EBT_NZ;
    iu = j % NU;
    if (ratio(kind, bl_ebt_z[iz], exp(LT0 + DLT * it), UN[iu],
              qe, qb, &val[kind][iz][it][iu], &rerr[kind][iz][it][iu]))
      exit(1);
    if (progress)
      fprintf(stderr, "%d/%d %s Z=%d T=%g u=%g R=%.6e\n", j + 1, n,
              kinds[kind], bl_ebt_z[iz], exp(LT0 + DLT * it),
              UN[iu], val[kind][iz][it][iu]);
  }
  bl_quad_free(qe);
  bl_quad_free(qb);
  return NULL;
}


/* -H: the table of other projectiles */
typedef struct hjob {
  int s, m, z, t, u;
  double T;
} hjob;
static double hval[EBH_NS][EBH_NM][EBH_NZ][EBH_NT][EBH_NU][3];
static double herr[EBH_NS][EBH_NM][EBH_NZ][EBH_NT][EBH_NU];
static hjob *hj = NULL;
static int nhj = 0;

/* T of a node: M tau, at most BL_EBREMS_T_MAX; -1 for a node above the
** first one that reaches it (a copy of that one) */
static double hnode_T (int m, int t) {
  double M = exp(EBH_LM0 + EBH_DLM * m);
  double T = M * exp(EBH_LT0 + EBH_DLT * t);
  if (t > 0 && M * exp(EBH_LT0 + EBH_DLT * (t - 1)) >= BL_EBREMS_T_MAX)
    return -1.0;
  return T < BL_EBREMS_T_MAX ? T : BL_EBREMS_T_MAX;
}

/* Run fn on nth threads (at most 8) and wait for them all. */
static void run_threads (void *(*fn) (void *), int nth) {
  pthread_t th[8];
  int i;
  for (i = 0; i < nth; i++)
    pthread_create(&th[i], NULL, fn, NULL);
  for (i = 0; i < nth; i++)
    pthread_join(th[i], NULL);
}

static int hcmp (const void *a, const void *b) {
  const hjob *x = a, *y = b;
  return (x->T < y->T) - (x->T > y->T);   /* hardest (highest T) first */
}

static void *hworker (void *arg) {
  bl_quad *qe = bl_quad_alloc(200), *qb = bl_quad_alloc(200);
  (void)arg;
  if (qe == NULL || qb == NULL)
    exit(1);
  bl_quad_set_rtol(qe, EB_RTOL);
  bl_quad_set_rtol(qb, BORN_RTOL);
  for (;;) {
    bl_particle p = {"node", 0.0, 1.0, 0.0, 0};
    hjob *x;
    int j;
    pthread_mutex_lock(&lock);
    j = jobnext++;
    pthread_mutex_unlock(&lock);
    if (j >= nhj)
      break;
    x = &hj[j];
    p.spin = 0.5 * x->s;
    p.mass = exp(EBH_LM0 + EBH_DLM * x->m);
    if (parts(&p, bl_ebh_z[x->z], x->T, bl_ebh_u[x->u], qe, qb,
              hval[x->s][x->m][x->z][x->t][x->u],
              &herr[x->s][x->m][x->z][x->t][x->u]))
      exit(1);
    if (progress)
      fprintf(stderr, "%d/%d s=%d M=%g Z=%d T=%g u=%g P %.4e I %.4e "
              "E %.4e\n", j + 1, nhj, x->s, p.mass, bl_ebh_z[x->z], x->T,
              bl_ebh_u[x->u], hval[x->s][x->m][x->z][x->t][x->u][0],
              hval[x->s][x->m][x->z][x->t][x->u][1],
              hval[x->s][x->m][x->z][x->t][x->u][2]);
  }
  bl_quad_free(qe);
  bl_quad_free(qb);
  return NULL;
}

static int htable (const char *out, int nth) {
  int s, m, z, t, u, n = 0;
  double worst = 0.0;
  FILE *f;
  hj = malloc(sizeof(hjob) * EBH_NS * EBH_NM * EBH_NZ * EBH_NT * EBH_NU);
  if (hj == NULL)
    return 1;
  for (s = 0; s < EBH_NS; s++)
    for (m = 0; m < EBH_NM; m++)
      for (z = 0; z < EBH_NZ; z++)
        for (t = 0; t < EBH_NT; t++)
          for (u = 0; u < EBH_NU; u++)
            if (hnode_T(m, t) > 0.0) {
              hjob x = {s, m, z, t, u, hnode_T(m, t)};
              hj[n++] = x;
            }
  nhj = n;
  qsort(hj, (size_t)n, sizeof hj[0], hcmp);
  run_threads(hworker, nth);
  f = fopen(out, "w");
  if (f == NULL)
    return 1;
  fprintf(f, "/*\n** eb_table_h.c -- generated by scripts/fit-ebrems.c -H "
          "(make eb-table-h); do not\n** edit\n** See Copyright Notice in "
          "LICENSE\n**\n** The bound electron term of projectiles other "
          "than e+- and mu+-: the parts\n** R_P, R_I, R_E of its ratio to "
          "the static-charge electron term at charge\n** +1 (bl_ebrems_dk_e "
          "with radiate = projectile, the rest, electron;\n** Hartree-Fock "
          "S(q)), per atomic electron, [spin][M node][Z node][tau\n** node]"
          "[u node][part] (src/core/ebrems/table.h).\n** ebrems rtol %g, "
          "Born rtol %g; %d integrals missed their tolerance.\n*/\n\n"
          "#include \"ebrems/table.h\"\n\nconst double bl_ebh_r[EBH_NS]"
          "[EBH_NM][EBH_NZ][EBH_NT][EBH_NU][3] = {\n", EB_RTOL, BORN_RTOL,
          misses);
  for (s = 0; s < EBH_NS; s++) {
    fprintf(f, " { /* spin %s */\n", s ? "1/2" : "0");
    for (m = 0; m < EBH_NM; m++) {
      fprintf(f, "  { /* M = %.5g MeV */\n", exp(EBH_LM0 + EBH_DLM * m));
      for (z = 0; z < EBH_NZ; z++) {
        fprintf(f, "   { /* Z = %d */\n", bl_ebh_z[z]);
        for (t = 0; t < EBH_NT; t++) {
          int tc = t;
          while (hnode_T(m, tc) < 0.0)   /* above T_MAX: that node's copy */
            tc--;
          fprintf(f, "    { /* tau = %.4g%s */\n",
                  exp(EBH_LT0 + EBH_DLT * t), tc < t ? ", held" : "");
          for (u = 0; u < EBH_NU; u++) {
            const double *v = hval[s][m][z][tc][u];
            fprintf(f, "%s{%.6e, %.6e, %.6e}%s", u % 2 ? " " : "     ",
                    v[0], v[1], v[2], u + 1 < EBH_NU ? "," : "");
            if (u % 2 || u + 1 == EBH_NU)
              fprintf(f, "\n");
            if (herr[s][m][z][tc][u] > worst)
              worst = herr[s][m][z][tc][u];
          }
          fprintf(f, "    }%s\n", t + 1 < EBH_NT ? "," : "");
        }
        fprintf(f, "   }%s\n", z + 1 < EBH_NZ ? "," : "");
      }
      fprintf(f, "  }%s\n", m + 1 < EBH_NM ? "," : "");
    }
    fprintf(f, " }%s\n", s + 1 < EBH_NS ? "," : "");
  }
  fprintf(f, "};\n");
  fclose(f);
  fprintf(stderr, "fit-ebrems -H: %d nodes, %d misses, worst relative error "
          "estimate of a ratio %.2e\n", n, misses, worst);
  free(hj);
  return 0;
}


/* -m: the random points, their fresh and table ratios */
typedef struct mpoint {
  int kind, Z;
  double T, u, fresh, got, rel;
} mpoint;
static mpoint *mp = NULL;
static int nmp = 0, mnext = 0;

/* The library's R at point j of -m (mp) or -H -m (hp) against a fresh
** ratio with the quadratures qe, qb: into the point; nonzero on failure. */
static int mpoint_eval (int j, bl_quad *qe, bl_quad *qb);
static int hpoint_eval (int j, bl_quad *qe, bl_quad *qb);

/* A worker of -m and -H -m: the next point until nmp, by `eval`. */
static void measure_points (int (*eval) (int, bl_quad *, bl_quad *)) {
  bl_quad *qe = bl_quad_alloc(200), *qb = bl_quad_alloc(200);
  if (qe == NULL || qb == NULL)
    exit(1);
  bl_quad_set_rtol(qe, 1e-3);
  bl_quad_set_rtol(qb, 1e-5);
  for (;;) {
    int j;
    pthread_mutex_lock(&lock);
    j = mnext++;
    pthread_mutex_unlock(&lock);
    if (j >= nmp)
      break;
    if (eval(j, qe, qb))
      exit(1);
  }
  bl_quad_free(qe);
  bl_quad_free(qb);
}

static void *mworker (void *arg) {
  (void)arg;
  measure_points(mpoint_eval);
  return NULL;
}

static int mpoint_eval (int j, bl_quad *qe, bl_quad *qb) {
  mpoint *x = &mp[j];
  double err;
  bl_case c;
  if (ratio(x->kind, x->Z, x->T, x->u, qe, qb, &x->fresh, &err)
      || bl_case_setup(&c, bl_particle_find(kinds[x->kind]), x->Z,
                       bl_model_find("hartree-fock"), NULL, x->T,
                       &bl_opts_default) != BL_SUCCESS)
    return 1;
  x->got = bl_case_eratio(&c, x->u * c.ekmax);
  x->rel = fabs(x->got - x->fresh) / fmax(x->fresh, 1e-300);
  return 0;
}


/* -H -m: random points of other projectiles (spin, mass, charge, Z, tau,
** u), the library's R (bl_case_eratio, the table) against a fresh
** all-diagram ratio of the particle itself (ratio_p, the generator's
** integrals at rtol 1e-3 / 1e-5) */
typedef struct hpoint {
  bl_particle p;
  int Z;
  double T, u, fresh, got, rel;
} hpoint;
static hpoint *hp = NULL;

static int hpoint_eval (int j, bl_quad *qe, bl_quad *qb) {
  hpoint *x = &hp[j];
  double err;
  bl_case c;
  if (ratio_p(&x->p, x->Z, x->T, x->u, qe, qb, BL_EBREMS_RAD_BOTH,
              &x->fresh, &err)
      || bl_case_setup(&c, &x->p, x->Z, bl_model_find("hartree-fock"),
                       NULL, x->T, &bl_opts_default) != BL_SUCCESS)
    return 1;
  x->got = bl_case_eratio(&c, x->u * c.ekmax);
  x->rel = fabs(x->got - x->fresh) / fmax(x->fresh, 1e-300);
  if (progress)
    fprintf(stderr, "%d/%d done\n", j + 1, nmp);
  return 0;
}

static void *hmworker (void *arg) {
  (void)arg;
  measure_points(hpoint_eval);
  return NULL;
}

/* ln M uniform on the mass nodes, tau = T/M log-uniform from the first
** tau node up to T = BL_EBREMS_T_MAX or the last tau node, ln(u/(1-u))
** uniform on the u nodes, charge -2, -1, 1 or 2, spin 0 or 1/2 */
static int hmeasure (int mn, unsigned seed, int nth) {
  static const double zs[4] = {-2.0, -1.0, 1.0, 2.0};
  double *d = malloc(sizeof(double) * (size_t)mn);
  double a = log(bl_ebh_u[0] / (1.0 - bl_ebh_u[0]));
  double b = log(bl_ebh_u[EBH_NU - 1] / (1.0 - bl_ebh_u[EBH_NU - 1]));
  int j;
  hp = malloc(sizeof(hpoint) * (size_t)mn);
  if (d == NULL || hp == NULL)
    return 1;
  nmp = mn;
  for (j = 0; j < mn; j++) {
    double r[4], lt1;
    int i;
    hp[j].p.name = "random";
    hp[j].p.flags = 0;
    hp[j].p.spin = 0.5 * (rand_r(&seed) % 2);
    hp[j].p.charge = zs[rand_r(&seed) % 4];
    hp[j].Z = 1 + rand_r(&seed) % 92;
    for (i = 0; i < 4; i++)
      r[i] = rand_r(&seed) / (RAND_MAX + 1.0);
    hp[j].p.mass = exp(EBH_LM0 + EBH_DLM * (EBH_NM - 1) * r[0]);
    lt1 = fmin(EBH_LT0 + EBH_DLT * (EBH_NT - 1),
               log(BL_EBREMS_T_MAX / hp[j].p.mass));
    hp[j].T = hp[j].p.mass * exp(EBH_LT0 + (lt1 - EBH_LT0) * r[1]);
    hp[j].u = 1.0 / (1.0 + exp(-(a + (b - a) * r[2])));
  }
  run_threads(hmworker, nth);
  for (j = 0; j < mn; j++) {
    d[j] = hp[j].rel;
    printf("spin %.1f M=%.5g z=%+g Z=%d T=%.5g u=%.6f table %.6g fresh "
           "%.6g rel %.2e\n", hp[j].p.spin, hp[j].p.mass, hp[j].p.charge,
           hp[j].Z, hp[j].T, hp[j].u, hp[j].got, hp[j].fresh, hp[j].rel);
  }
  qsort(d, (size_t)mn, sizeof d[0], dcmp);
  printf("interpolation error of R over %d points: median %.2e, 90 %% %.2e, "
         "worst %.2e; %d integrals missed their tolerance\n", mn, d[mn / 2],
         d[(9 * mn) / 10], d[mn - 1], misses);
  free(d);
  free(hp);
  return 0;
}


int main (int argc, char **argv) {
  const char *out = NULL;
  int nth = 1, i, kind, iz, it, iu, mn = 0, had = 0;
  unsigned mseed = 0;
  FILE *f;
  double worst = 0.0;
  if (argc == 6 && (strcmp(argv[1], "-p") == 0
                    || strcmp(argv[1], "-d") == 0)) {
    bl_quad *qe = bl_quad_alloc(200), *qb = bl_quad_alloc(200);
    double R, err, R1, err1;
    bl_quad_set_rtol(qe, EB_RTOL);
    bl_quad_set_rtol(qb, BORN_RTOL);
    if (ratio_of(argv[2], atoi(argv[3]), atof(argv[4]), atof(argv[5]), qe,
                 qb, BL_EBREMS_RAD_BOTH, &R, &err))
      return 1;
    if (argv[1][1] == 'p') {
      printf("%.6e %.2e\n", R, err);
      return 0;
    }
    if (ratio_of(argv[2], atoi(argv[3]), atof(argv[4]), atof(argv[5]), qe,
                 qb, BL_EBREMS_RAD_PROJECTILE, &R1, &err1))
      return 1;
    printf("all diagrams %.6e (%.1e), projectile radiation only %.6e "
           "(%.1e), struck electron's share %.4f\n", R, err, R1, err1,
           1.0 - R1 / R);
    return 0;
  }
  if (argc == 7 && strcmp(argv[1], "-q") == 0) {
    bl_quad *qe = bl_quad_alloc(200), *qb = bl_quad_alloc(200);
    bl_particle p = {"x", 0.0, 1.0, 0.0, 0};
    double R[3], err[3];
    int r;
    clock_t t0;
    p.spin = atof(argv[2]);
    p.mass = atof(argv[3]);
    bl_quad_set_rtol(qe, EB_RTOL);
    bl_quad_set_rtol(qb, BORN_RTOL);
    for (r = 0; r < 3; r++) {
      t0 = clock();
      if (ratio_p(&p, atoi(argv[4]), atof(argv[5]), atof(argv[6]), qe, qb, r,
                  &R[r], &err[r]))
        return 1;
      fprintf(stderr, "part %d: %.2f s\n", r,
              (double)(clock() - t0) / CLOCKS_PER_SEC);
    }
    printf("all %.6e (%.1e) P %.6e (%.1e) E %.6e (%.1e) I %.6e cI %.4f\n",
           R[0], err[0], R[1], err[1], R[2], err[2], R[0] - R[1] - R[2],
           (R[0] - R[1] - R[2]) / (2.0 * sqrt(R[1] * R[2])));
    return 0;
  }
  for (i = 1; i < argc; i++) {
    if (strcmp(argv[i], "-o") == 0 && i + 1 < argc)
      out = argv[++i];
    else if (strcmp(argv[i], "-v") == 0)
      progress = 1;
    else if (strcmp(argv[i], "-u") == 0)
      mu = 1;
    else if (strcmp(argv[i], "-H") == 0)
      had = 1;
    else if (strcmp(argv[i], "-j") == 0 && i + 1 < argc)
      nth = atoi(argv[++i]);
    else if (strcmp(argv[i], "-m") == 0 && i + 2 < argc) {
      mn = atoi(argv[++i]);
      mseed = (unsigned)atoi(argv[++i]);
      if (mn < 1)
        return 1;
    }
    else
      return 1;
  }
  if (mu) {
    NT = EBM_NT;
    NU = EBM_NU;
    LT0 = EBM_LT0;
    DLT = EBM_DLT;
    UN = bl_ebm_u;
  }
  if (nth < 1 || nth > 8)
    nth = 1;
  if (had && mn == 0)
    return htable(out != NULL ? out : "src/core/ebrems/eb_table_h.c", nth);
  if (had)
    return hmeasure(mn, mseed, nth);
  if (out == NULL)
    out = mu ? "src/core/ebrems/eb_table_mu.c" : "src/core/ebrems/eb_table.c";
  if (nth < 1 || nth > 8)
    nth = 1;
  if (mn > 0) {
    double *d = malloc(sizeof(double) * (size_t)mn);
    int j;
    mp = malloc(sizeof(mpoint) * (size_t)mn);
    if (d == NULL || mp == NULL)
      return 1;
    nmp = mn;
    for (j = 0; j < mn; j++) {
      double r1, r2;
      mp[j].kind = rand_r(&mseed) % 2;
      mp[j].Z = 1 + rand_r(&mseed) % 92;
      r1 = rand_r(&mseed) / (RAND_MAX + 1.0);
      r2 = rand_r(&mseed) / (RAND_MAX + 1.0);
      mp[j].T = exp(LT0 + DLT * (NT - 1) * r1);
      if (mu) {
        double a = log(UN[0] / (1.0 - UN[0]));
        double b = log(UN[NU - 1] / (1.0 - UN[NU - 1]));
        double x = a + (b - a) * r2;
        mp[j].u = 1.0 / (1.0 + exp(-x));
      } else
        mp[j].u = 0.02 + 0.977 * r2;
    }
    run_threads(mworker, nth);
    for (j = 0; j < mn; j++) {
      d[j] = mp[j].rel;
      printf("%s Z=%d T=%.4g u=%.6f table %.6g fresh %.6g rel %.2e\n",
             kinds[mp[j].kind], mp[j].Z, mp[j].T, mp[j].u, mp[j].got,
             mp[j].fresh, mp[j].rel);
    }
    qsort(d, (size_t)mn, sizeof d[0], dcmp);
    printf("interpolation error over %d points: median %.2e, 90 %% %.2e, "
           "worst %.2e\n", mn, d[mn / 2], d[(9 * mn) / 10], d[mn - 1]);
    free(d);
    free(mp);
    return 0;
  }
  run_threads(worker, nth);
  f = fopen(out, "w");
  if (f == NULL)
    return 1;
  if (mu)
    fprintf(f, "/*\n** eb_table_mu.c -- generated by scripts/fit-ebrems.c "
            "-u (make eb-table-mu); do not\n** edit\n** See Copyright "
            "Notice in LICENSE\n**\n** Ratio of the bound electron term of "
            "muons (bl_ebrems_dk_e, all diagrams,\n** Hartree-Fock S(q)) to "
            "the static-charge electron term of the Born target\n** factor, "
            "per atomic electron, [kind][Z node][ln T node][u node]\n** "
            "(src/core/ebrems/table.h).\n** ebrems rtol %g, Born rtol %g; "
            "%d integrals missed their tolerance.\n*/\n\n"
            "#include \"ebrems/table.h\"\n\n"
            "const double bl_ebm_r[2][EBT_NZ][EBM_NT][EBM_NU] = {\n",
            EB_RTOL, BORN_RTOL, misses);
  else
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
      for (it = 0; it < NT; it++) {
        fprintf(f, "      {");
        for (iu = 0; iu < NU; iu++) {
          fprintf(f, "%s%.6e", iu == 0 ? "" : iu % 4 ? ", " : ",\n       ",
                  val[kind][iz][it][iu]);
          if (rerr[kind][iz][it][iu] / val[kind][iz][it][iu] > worst)
            worst = rerr[kind][iz][it][iu] / val[kind][iz][it][iu];
        }
        fprintf(f, "}%s /* T = %.4g MeV */\n", it + 1 < NT ? "," : "",
                exp(LT0 + DLT * it));
      }
      fprintf(f, "    }%s\n", iz + 1 < EBT_NZ ? "," : "");
    }
    fprintf(f, "  }%s\n", kind ? "" : ",");
  }
  fprintf(f, "};\n");
  fclose(f);
  fprintf(stderr, "fit-ebrems: %d misses, worst relative error estimate of "
          "a ratio %.2e\n", misses, worst);
  return 0;
}
