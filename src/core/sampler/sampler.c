/*
** sampler.c -- setup of the event sampler (grid training, cells, the
** envelope) and the generation of events in blocks on threads
** See Copyright Notice in LICENSE
**
** Proposal.  For each element the weight w(y) (map.c: the value times the
** Jacobians of the maps, so that sigma = int w dy over [0, 1)^4) is first
** flattened by a separable grid, trained as in VEGAS (Lepage 1978, J.
** Comput. Phys. 27, 192): per dimension SMP_NBIN bins whose widths are
** moved so that each bin holds an equal share of the smoothed, damped sum
** of (w J)^2 seen in it (our own implementation).  Then the grid's unit
** cube x is cut into cells (conf.cells per dimension); cellpoints trial
** points per cell measure its mean, mean square and largest weight.
** - Unweighted events: a cell is chosen with probability proportional to
**   its envelope env = safety x the largest weight seen, a point uniform
**   in it, kept when u env < w (accept-reject).  A weight above env (an
**   overweight, the envelope being an estimate) is kept with the event
**   weight r = w/env > 1 instead of 1, which leaves the weighted sample
**   unbiased; their number and excess sum(r - 1) are counted, so that a
**   user who drops the weights knows the bias (excess / events).  The
**   envelope is never raised during a run: events stay independent of
**   the order and of the thread count.
** - Weighted events: a cell with probability proportional to its root mean
**   square weight (a floor keeps every cell reachable), weight w V/P.
** Elements: the cells of every element form one list, so the element is
** drawn by its share of the envelope (unweighted; after accept-reject, by
** its share of sigma exactly) or of the proposal (weighted).
** Streams: the events of block b use stream b of the seed; setup uses the
** streams SETUP_STREAM + 16 e + pass, disjoint from them.
*/

#include <math.h>
#include <pthread.h>
#include <stdlib.h>
#include <string.h>

#include "sampler/internal.h"

#define SETUP_STREAM 0x8000000000000000ULL
/* Grid damping exponent and smoothing (VEGAS's usual alpha = 1.5). */
#define GRID_ALPHA 1.5
/* Cells whose trial points were all 0 get this share of the mean
** envelope (they stay reachable; an event there is an overweight). */
#define ENV_FLOOR 1e-3
#define PROB_FLOOR 1e-3


void bl_sampler_conf_default (bl_sampler_conf *conf) {
  if (conf == NULL)
    return;
  conf->iterations = 5;
  conf->points = 10000;
  conf->cells[0] = 8;
  conf->cells[1] = 6;
  conf->cells[2] = 6;
  conf->cells[3] = 4;
  conf->cellpoints = 200;
  conf->safety = 1.3;
  conf->coulomb = 0;
}


static int conf_ok (const bl_sampler_conf *c) {
  long n = 1;
  int d;
  if (c->iterations < 0 || c->iterations > 100 || c->points < 100
      || c->points > 10000000 || c->cellpoints < 2
      || c->cellpoints > 100000 || !(c->safety >= 1.0 && c->safety <= 100.0)
      || (c->coulomb != 0 && c->coulomb != 1))
    return 0;
  for (d = 0; d < SMP_NDIM; d++) {
    if (c->cells[d] < 1 || c->cells[d] > 64)
      return 0;
    n *= c->cells[d];
  }
  return n <= 100000;
}


/*
** The Coulomb factor of element e's nuclear part (conf.coulomb): where the
** case's option applies the Davies-Bethe-Maximon correction Delta(k)
** (bl_coulomb_subtract: a closed form), 1 - Delta/dsigma_N/dk at
** BL_SAMPLER_COULOMB_NODES energies evenly in ln(k/(E0 - k)) over the part of the
** window where it applies (below bl_coulomb_kend, where the final gamma
** falls below its bound), dsigma_N/dk the Born dsigma/dk of the nuclear
** part alone (the case without the electron terms, Elwert factor as the
** value has it) at rtol 1e-5; clamped at 0.  Costs that many integrals.
*/
static int coulomb_table (bl_sampler *s, smp_chan *ch) {
  const bl_case *c = &ch->c;
  bl_case cn = *c;
  bl_quad *q;
  double kc, lo;
  int i, t, n = BL_SAMPLER_COULOMB_NODES, st = BL_SUCCESS;
  ch->ncf = 0;
  if (!(c->opts.coulomb == BL_APPLY_ON
        || (c->opts.coulomb == BL_APPLY_AUTO && bl_coulomb_case_auto(c))))
    return BL_SUCCESS;
  kc = c->opts.coulomb == BL_APPLY_ON ? s->kmax : bl_coulomb_kend(c);
  if (kc > s->kmax)
    kc = s->kmax;
  if (!(kc > s->kmin))
    return BL_SUCCESS;
  /* the nuclear part alone, no correction */
  for (t = 0; t < cn.npole; t++)
    cn.single_e[t] = 0.0;
  cn.nterm = cn.nelastic;
  cn.opts.electrons = 0;
  cn.opts.coulomb = BL_APPLY_OFF;
  q = bl_quad_alloc(1000);
  if (q == NULL)
    return BL_ENOMEM;
  bl_quad_set_rtol(q, 1e-5);
  /* nodes even in x = ln(k / (E0 - k)): both ends resolved, the soft
  ** photons and the tip, where the nuclear part falls fast */
  ch->cf_E0 = c->T + c->particle.mass;
  lo = log(s->kmin / (ch->cf_E0 - s->kmin));
  ch->cf_lo = lo;
  ch->cf_step = (log(kc / (ch->cf_E0 - kc)) - lo) / (n - 1);
  for (i = 0; i < n && st == BL_SUCCESS; i++) {
    double x = exp(lo + i * ch->cf_step), k = ch->cf_E0 * x / (1.0 + x);
    bl_result r, d;
    bl_kin kn;
    if (i == n - 1)
      k = kc * (1.0 - 1e-12);   /* just inside: at kc it stops */
    if (bl_kin_case(c, k, &kn) != BL_SUCCESS) {
      ch->cf[i] = 1.0;
      continue;
    }
    st = bl_dcs_dk_e(&cn, k, q, &r);
    if (st != BL_SUCCESS && bl_status_soft(st))
      st = BL_SUCCESS;
    d.val = r.val;
    d.warn = 0;
    bl_coulomb_subtract(c, &kn, &d);
    ch->cf[i] = r.val > 0.0 ? d.val / r.val : 1.0;
  }
  bl_quad_free(q);
  if (st == BL_SUCCESS)
    ch->ncf = n;
  return st;
}


/* y and the grid's Jacobian at x. */
static double grid_map (const smp_chan *ch, const double x[4], double y[4],
                        int bin[4]) {
  double jac = 1.0;
  int d;
  for (d = 0; d < SMP_NDIM; d++) {
    double t = x[d] * SMP_NBIN;
    int i = (int)t;
    double lo, wd;
    if (i >= SMP_NBIN)
      i = SMP_NBIN - 1;
    lo = ch->edge[d][i];
    wd = ch->edge[d][i + 1] - lo;
    y[d] = lo + (t - i) * wd;
    jac *= SMP_NBIN * wd;
    bin[d] = i;
  }
  return jac;
}


/* The weight at x of element e (0 where not finite: counted by *bad). */
static double trial (const bl_sampler *s, int e, const double x[4],
                     smp_point *pt, int *bad) {
  double y[4];
  int bin[4];
  double jac = grid_map(&s->ch[e], x, y, bin);
  double w = bl_smp_weight(s, &s->ch[e], y, pt) * jac;
  if (!isfinite(w) || w < 0.0) {
    if (bad != NULL)
      (*bad)++;
    return 0.0;
  }
  return w;
}


/* Move the edges of one dimension so that each bin holds an equal share
** of the damped, smoothed sums d. */
static void refine (double *edge, const double *d) {
  double sm[SMP_NBIN], r[SMP_NBIN], tot = 0.0, rt = 0.0, nw[SMP_NBIN + 1];
  double acc = 0.0, per;
  int i, j;
  for (i = 0; i < SMP_NBIN; i++) {
    double a = d[i > 0 ? i - 1 : i], c = d[i < SMP_NBIN - 1 ? i + 1 : i];
    sm[i] = (a + 6.0 * d[i] + c) / 8.0;
    tot += sm[i];
  }
  if (!(tot > 0.0) || !isfinite(tot))
    return;
  for (i = 0; i < SMP_NBIN; i++) {
    double f = sm[i] / tot;
    r[i] = f > 1e-300 && f < 1.0 ? pow((f - 1.0) / log(f), GRID_ALPHA)
                                 : (f >= 1.0 ? 1.0 : 0.0);
    r[i] += 1e-6;   /* no bin may vanish */
    rt += r[i];
  }
  per = rt / SMP_NBIN;
  nw[0] = edge[0];
  nw[SMP_NBIN] = edge[SMP_NBIN];
  j = 0;
  for (i = 1; i < SMP_NBIN; i++) {
    double target = per * i;
    while (j < SMP_NBIN - 1 && acc + r[j] < target) {
      acc += r[j];
      j++;
    }
    nw[i] = edge[j] + (target - acc) / r[j] * (edge[j + 1] - edge[j]);
    if (nw[i] < nw[i - 1])
      nw[i] = nw[i - 1];
  }
  memcpy(edge, nw, sizeof nw);
}


/* Train the grid of element e. */
static void train (bl_sampler *s, int e, unsigned *warn) {
  smp_chan *ch = &s->ch[e];
  double d[SMP_NDIM][SMP_NBIN];
  int it, i, dd;
  for (dd = 0; dd < SMP_NDIM; dd++)
    for (i = 0; i <= SMP_NBIN; i++)
      ch->edge[dd][i] = (double)i / SMP_NBIN;
  for (it = 0; it < s->conf.iterations; it++) {
    bl_rng rng;
    bl_rng_init(&rng, s->seed, SETUP_STREAM + 16u * (uint64_t)e
                               + (uint64_t)it);
    memset(d, 0, sizeof d);
    for (i = 0; i < s->conf.points; i++) {
      double x[4], y[4], w, jac;
      int bin[4];
      smp_point pt;
      for (dd = 0; dd < SMP_NDIM; dd++)
        x[dd] = bl_rng_uniform(&rng);
      jac = grid_map(ch, x, y, bin);
      w = bl_smp_weight(s, ch, y, &pt) * jac;
      if (!isfinite(w) || w < 0.0)
        continue;
      *warn |= pt.warn;
      for (dd = 0; dd < SMP_NDIM; dd++)
        d[dd][bin[dd]] += w * w;
    }
    s->evals += (uint64_t)s->conf.points;
    for (dd = 0; dd < SMP_NDIM; dd++)
      refine(ch->edge[dd], d[dd]);
  }
}


/* The lower corner of cell c of one element, in x. */
static void cell_corner (const bl_sampler *s, int c, int idx[4]) {
  int d;
  for (d = 0; d < SMP_NDIM; d++) {
    idx[d] = c % s->conf.cells[d];
    c /= s->conf.cells[d];
  }
}


static void cell_point (const bl_sampler *s, int c, bl_rng *rng,
                        double x[4]) {
  int idx[4], d;
  cell_corner(s, c, idx);
  for (d = 0; d < SMP_NDIM; d++)
    x[d] = (idx[d] + bl_rng_uniform(rng)) / s->conf.cells[d];
}


/* Measure the cells of element e: envelope, rms, the stratified sigma. */
static void measure (bl_sampler *s, int e, double *rms, double *sig,
                     double *var, unsigned *warn) {
  int c, i, n = s->conf.cellpoints;
  double V = 1.0 / s->ncell;
  bl_rng rng;
  bl_rng_init(&rng, s->seed, SETUP_STREAM + 16u * (uint64_t)e + 15u);
  *sig = *var = 0.0;
  for (c = 0; c < s->ncell; c++) {
    int j = e * s->ncell + c;
    double sum = 0.0, sum2 = 0.0, mx = 0.0, mean, m2;
    for (i = 0; i < n; i++) {
      double x[4], w;
      smp_point pt;
      cell_point(s, c, &rng, x);
      w = trial(s, e, x, &pt, NULL);
      if (w > 0.0)
        *warn |= pt.warn;
      sum += w;
      sum2 += w * w;
      if (w > mx)
        mx = w;
    }
    mean = sum / n;
    m2 = sum2 / n;
    s->env[j] = s->conf.safety * mx;
    rms[j] = sqrt(m2);
    *sig += V * mean;
    *var += V * V * (m2 - mean * mean > 0.0 ? m2 - mean * mean : 0.0)
            / (n - 1);
  }
  s->evals += (uint64_t)s->ncell * (uint64_t)n;
}


/* Cumulative table of a[0..n-1] with floor `floor_share` of the mean;
** returns the total (after the floor, written back into a). */
static double cumulate (double *a, double *cum, int n, double floor_share) {
  double tot = 0.0, fl;
  int j;
  for (j = 0; j < n; j++)
    tot += a[j];
  fl = floor_share * tot / n;
  tot = 0.0;
  for (j = 0; j < n; j++) {
    if (a[j] < fl)
      a[j] = fl;
    tot += a[j];
    cum[j] = tot;
  }
  return tot;
}


/*
** The channels of element e of t into s (from s->n on): where its bound
** electron part is the exact term (bl_method_eexact, unless t->estatic)
** and its end point is above kmin, the nucleus alone and the exact part
** (events with the struck electron's recoil); otherwise the whole value.
*/
static int channels (bl_sampler *s, const bl_target *t, int e) {
  const bl_case *c = &t->c[e];
  smp_chan *ch = &s->ch[s->n];
  int exact = !t->estatic && bl_method_eexact(c) && c->ekmax > s->kmin;
  int i, st;
  for (i = 0; i < 1 + exact; i++) {
    ch[i].elem = e;
    ch[i].atoms = t->atoms[e];
    ch[i].kmax = s->kmax;
    ch[i].kind = exact ? (i == 0 ? SMP_NUCLEUS : SMP_EXACT) : SMP_ALL;
    ch[i].c = *c;
  }
  if (exact) {
    st = bl_method_nuclear(c, &ch[0].c);
    if (st == BL_SUCCESS)
      st = bl_method_eterm(c, &ch[1].eb);
    if (st != BL_SUCCESS)
      return st;
    ch[1].kmax = fmin(s->kmax, c->ekmax);
  }
  for (i = 0; i < 1 + exact; i++) {
    ch[i].lnk = log(ch[i].kmax / s->kmin);
    ch[i].hasridge_b = isfinite(ch[i].c.ridge_b) && ch[i].c.ridge_b > 0.0;
    if (s->conf.coulomb && s->method == BL_METHOD_BORN
        && ch[i].kind != SMP_EXACT) {
      st = coulomb_table(s, &ch[i]);
      if (st != BL_SUCCESS)
        return st;
    }
  }
  s->n += 1 + exact;
  return BL_SUCCESS;
}


int bl_sampler_new (const bl_target *t, double kmin, double kmax,
                    uint64_t seed, const bl_sampler_conf *conf,
                    bl_sampler **out) {
  bl_sampler *s;
  double *rms, sig[SMP_MAXCHAN], var = 0.0, stot = 0.0;
  int e, d, nall, st;
  unsigned warn = 0;
  if (out == NULL)
    return BL_EDOMAIN;
  *out = NULL;
  if (t == NULL || t->n < 1 || t->n > BL_MATERIAL_MAXCOMP
      || !(kmin > 0.0 && kmin < kmax && kmax <= t->T) || !isfinite(kmax)
      || t->method == BL_METHOD_PARTIAL)   /* dsigma/dk only: no angles */
    return BL_EDOMAIN;
  s = calloc(1, sizeof *s);
  if (s == NULL)
    return BL_ENOMEM;
  if (conf != NULL)
    s->conf = *conf;
  else
    bl_sampler_conf_default(&s->conf);
  if (!conf_ok(&s->conf)) {
    free(s);
    return BL_EDOMAIN;
  }
  s->nelem = t->n;
  s->method = t->method == BL_METHOD_DISTORTED ? BL_METHOD_DISTORTED
                                               : BL_METHOD_BORN;
  s->kmin = kmin;
  s->kmax = kmax;
  s->lnk = log(kmax / kmin);
  s->seed = seed;
  s->warn = t->warn;
  for (e = 0; e < t->n; e++) {
    int n0 = s->n;
    st = channels(s, t, e);
    if (st != BL_SUCCESS) {
      bl_sampler_free(s);
      return st;
    }
    if (s->n == n0 + 1 && t->c[e].ebexact)   /* its events on electrons */
      s->warn |= BL_WARN_ERANGE;   /* keep the held ratio dsigma/dk replaces */
  }
  s->ncell = 1;
  for (d = 0; d < SMP_NDIM; d++)
    s->ncell *= s->conf.cells[d];
  nall = s->ncell * s->n;
  s->env = malloc(sizeof(double) * (size_t)nall);
  s->cumenv = malloc(sizeof(double) * (size_t)nall);
  s->prob = malloc(sizeof(double) * (size_t)nall);
  s->cumprob = malloc(sizeof(double) * (size_t)nall);
  rms = s->prob;
  if (s->env == NULL || s->cumenv == NULL || s->prob == NULL
      || s->cumprob == NULL) {
    bl_sampler_free(s);
    return BL_ENOMEM;
  }
  for (e = 0; e < s->n; e++) {
    double v;
    train(s, e, &warn);
    measure(s, e, rms, &sig[e], &v, &warn);
    var += v;
    stot += sig[e];
  }
  if (!(stot > 0.0) || !isfinite(stot) || !isfinite(var)) {
    bl_sampler_free(s);
    return BL_ENONFINITE;
  }
  s->sigma = stot;
  s->err = sqrt(var);
  for (e = 0; e < s->n; e++)
    s->share[s->ch[e].elem] += sig[e] / stot;
  s->envtot = cumulate(s->env, s->cumenv, nall, ENV_FLOOR) / s->ncell;
  cumulate(s->prob, s->cumprob, nall, PROB_FLOOR);
  {   /* normalise the weighted mode's probabilities */
    double tot = s->cumprob[nall - 1];
    int j;
    for (j = 0; j < nall; j++) {
      s->prob[j] /= tot;
      s->cumprob[j] /= tot;
    }
  }
  s->warn |= warn;
  *out = s;
  return BL_SUCCESS;
}


void bl_sampler_free (bl_sampler *s) {
  if (s == NULL)
    return;
  free(s->env);
  free(s->cumenv);
  free(s->prob);
  free(s->cumprob);
  free(s);
}


int bl_sampler_info_get (const bl_sampler *s, bl_sampler_info *out) {
  int e;
  if (out == NULL)
    return BL_EDOMAIN;
  memset(out, 0, sizeof *out);
  if (s == NULL)
    return BL_EDOMAIN;
  out->sigma = s->sigma;
  out->err = s->err;
  out->envelope = s->envtot;
  out->nelem = s->nelem;
  for (e = 0; e < s->nelem; e++)
    out->share[e] = s->share[e];
  out->method = s->method;
  out->warn = s->warn;
  out->evaluations = s->evals;
  out->kmin = s->kmin;
  out->kmax = s->kmax;
  out->seed = s->seed;
  return BL_SUCCESS;
}


int bl_sampler_value (const bl_sampler *s, int i, double k, double h0,
                      double h, double phi, double *out) {
  int j, any = 0;
  if (out == NULL)
    return BL_EDOMAIN;
  *out = 0.0;
  if (s == NULL || i < 0 || i >= s->nelem
      || !(h0 >= 0.0 && h0 <= 2.0) || !(h >= 0.0 && h <= 2.0)
      || !isfinite(phi))
    return BL_EDOMAIN;
  for (j = 0; j < s->n; j++) {   /* the element's channels */
    smp_point pt;
    if (s->ch[j].elem != i)
      continue;
    if (!(k > 0.0 && k < s->ch[j].c.T))
      return BL_EDOMAIN;
    bl_smp_geometry(&s->ch[j], k, h0, h, phi, &pt);
    if (!(pt.kn.p > 0.0))
      return BL_EDOMAIN;
    *out += bl_smp_value(s, &s->ch[j], &pt);
    any = 1;
  }
  if (!any)
    return BL_EDOMAIN;
  return isfinite(*out) ? BL_SUCCESS : BL_ENONFINITE;
}


/* The first j with cum[j] > u cum[n-1] (binary search). */
static int pick (const double *cum, int n, double u) {
  double x = u * cum[n - 1];
  int lo = 0, hi = n - 1;
  while (lo < hi) {
    int mid = (lo + hi) / 2;
    if (cum[mid] > x)
      hi = mid;
    else
      lo = mid + 1;
  }
  return lo;
}


/*
** Block b of a run: its events from the block's first up to hi - 1 (the
** run's numbering); those from lo on go to ev[id - lo].
*/
static void run_block (const bl_sampler *s, int mode, uint64_t b,
                       uint64_t lo, uint64_t hi, uint64_t total,
                       bl_event *ev, bl_sample_stats *st) {
  uint64_t id = b * BL_SAMPLER_BLOCK, end = id + BL_SAMPLER_BLOCK;
  int nall = s->ncell * s->n;
  double V = 1.0 / s->ncell;
  bl_rng rng;
  bl_rng_init(&rng, s->seed, b);
  memset(st, 0, sizeof *st);
  if (end > hi)
    end = hi;
  while (id < end) {
    double x[4], w, weight;
    smp_point pt;
    int j, e, c, bad = 0;
    j = pick(mode == BL_SAMPLE_UNWEIGHTED ? s->cumenv : s->cumprob, nall,
             bl_rng_uniform(&rng));
    e = j / s->ncell;
    c = j % s->ncell;
    cell_point(s, c, &rng, x);
    w = trial(s, e, x, &pt, &bad);
    st->trials++;
    st->nonfinite += (uint64_t)bad;
    if (mode == BL_SAMPLE_UNWEIGHTED) {
      double r;
      if (!(bl_rng_uniform(&rng) * s->env[j] < w))
        continue;
      r = w / s->env[j];
      if (r > 1.0) {
        st->overweights++;
        st->excess += r - 1.0;
      }
      else
        r = 1.0;
      st->sum_r += r;
      st->sum_r2 += r * r;
      weight = r * s->sigma / (double)total;
    }
    else {
      weight = w * V / s->prob[j] / (double)total;
      st->sum_w += weight;
      st->sum_w2 += weight * weight;
    }
    {
      double ua = bl_rng_uniform(&rng), us = bl_rng_uniform(&rng);
      double uh = bl_rng_uniform(&rng);
      if (id >= lo) {
        bl_event *o = &ev[id - lo];
        bl_smp_event(&s->ch[e], &pt, ua, us, uh, o);
        o->elem = s->ch[e].elem;
        o->weight = weight;
        o->id = id;
      }
    }
    if (id >= lo)
      st->events++;
    id++;
  }
}


typedef struct job {
  const bl_sampler *s;
  int mode;
  uint64_t b0, b1, lo, hi, total;
  int start, stride;
  bl_event *ev;
  bl_sample_stats *st;    /* one per block */
} job;


static void runjob (job *jb) {
  uint64_t b;
  for (b = jb->b0 + (uint64_t)jb->start; b < jb->b1; b += (uint64_t)jb->stride)
    run_block(jb->s, jb->mode, b, jb->lo, jb->hi, jb->total, jb->ev,
              &jb->st[b - jb->b0]);
}


static void *threadmain (void *arg) {
  runjob(arg);
  return NULL;
}


int bl_sampler_events (const bl_sampler *s, int mode, uint64_t first,
                       size_t n, uint64_t total, int nthreads, bl_event *ev,
                       bl_sample_stats *stats) {
  uint64_t b0, b1, b;
  size_t nb, nt, t;
  job jb[BL_SPECTRUM_MAX_THREADS];
  pthread_t tid[BL_SPECTRUM_MAX_THREADS];
  int started[BL_SPECTRUM_MAX_THREADS];
  bl_sample_stats *st;
  if (stats != NULL)
    memset(stats, 0, sizeof *stats);
  if (s == NULL || (ev == NULL && n > 0) || nthreads < 0
      || (mode != BL_SAMPLE_UNWEIGHTED && mode != BL_SAMPLE_WEIGHTED)
      || n > BL_SAMPLER_MAXCALL || total < 1 || first > total
      || n > total - first)
    return BL_EDOMAIN;
  if (n == 0)
    return BL_SUCCESS;
  b0 = first / BL_SAMPLER_BLOCK;
  b1 = (first + n - 1) / BL_SAMPLER_BLOCK + 1;
  nb = (size_t)(b1 - b0);
  st = calloc(nb, sizeof *st);
  if (st == NULL)
    return BL_ENOMEM;
  nt = nthreads == 0 ? (size_t)bl_spectrum_threads_auto() : (size_t)nthreads;
  if (nt > BL_SPECTRUM_MAX_THREADS)
    nt = BL_SPECTRUM_MAX_THREADS;
  if (nt > nb)
    nt = nb;
  if (nt < 1)
    nt = 1;
  for (t = 0; t < nt; t++) {
    jb[t].s = s;
    jb[t].mode = mode;
    jb[t].b0 = b0;
    jb[t].b1 = b1;
    jb[t].lo = first;
    jb[t].hi = first + n;
    jb[t].total = total;
    jb[t].start = (int)t;
    jb[t].stride = (int)nt;
    jb[t].ev = ev;
    jb[t].st = st;
    started[t] = 0;
  }
  for (t = 1; t < nt; t++)
    started[t] = pthread_create(&tid[t], NULL, threadmain, &jb[t]) == 0;
  runjob(&jb[0]);
  for (t = 1; t < nt; t++) {
    if (started[t])
      pthread_join(tid[t], NULL);
    else
      runjob(&jb[t]);   /* no thread: the caller does this share */
  }
  if (stats != NULL)
    for (b = 0; b < nb; b++)
      bl_sample_stats_add(stats, &st[b]);
  free(st);
  return BL_SUCCESS;
}


void bl_sample_stats_add (bl_sample_stats *a, const bl_sample_stats *b) {
  if (a == NULL || b == NULL)
    return;
  a->trials += b->trials;
  a->events += b->events;
  a->overweights += b->overweights;
  a->nonfinite += b->nonfinite;
  a->sum_w += b->sum_w;
  a->sum_w2 += b->sum_w2;
  a->sum_r += b->sum_r;
  a->sum_r2 += b->sum_r2;
  a->excess += b->excess;
}


void bl_sampler_sigma (const bl_sampler *s, int mode,
                       const bl_sample_stats *st, uint64_t total,
                       double *sigma, double *err) {
  double sg = 0.0, er = 0.0;
  if (s != NULL && st != NULL) {
    if (mode == BL_SAMPLE_WEIGHTED && st->events > 0) {
      /* a part of a run: scale to the whole */
      double f = (double)total / (double)st->events;
      double v = st->sum_w2 - st->sum_w * st->sum_w / (double)st->events;
      sg = st->sum_w * f;
      er = sqrt((v > 0.0 ? v : 0.0) * f) * sqrt(f);
    }
    else if (mode == BL_SAMPLE_UNWEIGHTED && st->trials > 0) {
      double n = (double)st->trials, m = st->sum_r / n;
      double v = st->sum_r2 / n - m * m;
      sg = s->envtot * m;
      er = s->envtot * sqrt((v > 0.0 ? v : 0.0) / n);
    }
  }
  if (sigma != NULL)
    *sigma = sg;
  if (err != NULL)
    *err = er;
}
