/*
** map.c -- the sampler's maps from the unit cube to the photon-frame
** variables, the value drawn from, and the lab-frame event
** See Copyright Notice in LICENSE
**
** Variables (units of the projectile mass inside, as the Born room):
** y0 -> k = kmin (kmax/kmin)^y0 (dsigma/dk ~ 1/k);
** y1 -> sigma0 = ln(1 + h0/hc0), uniform on [0, ln(1 + 2/hc0)] (the
**   forward peak of the photon, width ~1/E0, made flat);
** y2 -> the particle angle h to the photon: where the ridge p sin(theta) =
**   p0 sin(theta0) exists, sigma = ln(1 + h/hc) = sigma* + w sinh(u), u
**   uniform between the ends (the ridge peak of width w becomes a flat
**   core with tails in e^-|u|: the integrator's map, born/dcs.c); where a
**   narrow backward ridge exists too (slow projectiles), y2 < 1/2 maps the
**   forward half theta < pi/2 and y2 >= 1/2 the backward half, each around
**   its ridge; without a ridge sigma is uniform;
** y3 -> phi in [0, pi] with density 1/(m + b v), v = 1 - cos(phi),
**   q^2 = Q0 + b v, m = Q0 + the smallest screening pole: tan(phi/2) =
**   sqrt(m/(m + 2b)) tan(psi/2), psi = pi y3 (the pole of W in the
**   azimuth, of width (Q0 + pole)/b, made flat).
** The grid (sampler.c) adapts what these maps leave.  The sign of phi and
** the overall azimuth around the beam are uniform (the value depends on
** cos(phi) only): factors 2 and 2 pi.
*/

#include <math.h>

#include "sampler/internal.h"

/* The backward ridge gets its own half of y2 when its width in h is below
** this (as born/dcs.c, BACK_WIDTH). */
#define BACK_WIDTH 0.1


/* Width in h of the ridge at h* = hs (born/dcs.c, ridge_width), and q_z
** there (at least delta: a smaller value is rounding). */
static double ridge_width (const smp_chan *ch, const bl_kin *kn, double h0,
                           double hs, double r, double cs, double *qzs) {
  double qz = kn->delta - kn->p0 * h0 + kn->p * hs;
  double pole = ch->hasridge_b ? ch->c.ridge_b : 0.0;
  if (fabs(qz) < kn->delta)
    qz = kn->delta;
  *qzs = qz;
  return hypot(qz, sqrt(pole)) * r / (kn->p * (cs > 1e-300 ? cs : 1e-300));
}


/*
** h from t in [0, 1) by the sinh map around the ridge hs over [lo, hi] in
** sigma; sets the ridge fields of g; returns dh/dt.
*/
static double ridge_map (const bl_kin *kn, bl_polar *g, double hs,
                         double wh, double qzs, double r, double lo,
                         double hi, double t) {
  double hc = kn->hc, sstar = log1p(hs / hc), w = wh / (hs + hc);
  double ua, ub, u, ds, h;
  if (!(w > 1e-300))
    w = 1e-300;
  ua = sstar > lo ? asinh((sstar - lo) / w) : 0.0;
  ub = hi > sstar ? asinh((hi - sstar) / w) : 0.0;
  u = -ua + t * (ua + ub);
  ds = w * sinh(u);
  g->ridge = 1;
  g->hs = hs;
  g->ss = r;
  g->qzs = qzs;
  if (fabs(ds) < 0.5) {
    g->dh = (hs + hc) * expm1(ds);
    h = hs + g->dh;
  }
  else {
    h = hc * expm1(sstar + ds);
    g->dh = h - hs;
  }
  if (h > 2.0) {
    g->dh += 2.0 - h;
    h = 2.0;
  }
  else if (h < 0.0) {
    g->dh -= h;
    h = 0.0;
  }
  g->h = h;
  return (ua + ub) * w * cosh(u) * (h + hc);
}


/* q_z, the transverse difference and the two parts of W at the geometry
** and azimuth in pt (bracket and v set). */
static void parts (const smp_chan *ch, smp_point *pt) {
  const bl_case *c = &ch->c;
  const bl_kin *kn = &pt->kn;
  const bl_polar *g = &pt->g;
  double x, w[BL_POLE_MAX], fe = 1.0;
  int i, t;
  if (g->ridge) {
    pt->qz = g->qzs + kn->p * g->dh;
    pt->dt = -kn->p * g->dh * (2.0 - g->h - g->hs) / (g->s + g->ss);
  }
  else {
    pt->qz = kn->delta - kn->p0 * g->h0 + kn->p * g->h;
    pt->dt = kn->p0 * g->s0 - kn->p * g->s;
  }
  pt->warn = bl_point_warn(c, kn);
  if (bl_wanted(c->opts.elwert, bl_elwert_valid(kn), BL_WARN_ELWERT,
                &pt->warn))
    fe = bl_elwert(c, kn);
  x = pt->br.Q0 + pt->br.b * pt->v;
  pt->wel = pt->we = 0.0;
  for (i = 0; i < c->npole; i++) {
    w[i] = 1.0 / (c->pole[i] + x);
    pt->wel += c->single_el[i] * w[i];
    pt->we += c->single_e[i] * w[i];
  }
  for (t = 0; t < c->nterm; t++) {   /* term indices are < npole */
    // cppcheck-suppress uninitvar ; every w[i], i < npole, is set above
    double v = c->term[t].c * w[c->term[t].i] * w[c->term[t].j];
    if (t < c->nelastic)
      pt->wel += v;
    else
      pt->we += v;
  }
  if (ch->ncf > 0) {   /* the Coulomb factor, linear in ln(k/(E0 - k)) */
    double u = (log(pt->kmev / (ch->cf_E0 - pt->kmev)) - ch->cf_lo)
               / ch->cf_step;
    if (u >= 0.0 && u <= ch->ncf - 1) {
      int i = (int)u;
      if (i > ch->ncf - 2)
        i = ch->ncf - 2;
      fe *= ch->cf[i] + (u - i) * (ch->cf[i + 1] - ch->cf[i]);
    }
  }
  pt->wel *= fe;
  pt->we *= bl_case_eratio(c, pt->kmev);   /* e-/e+: the bound term */
}


/*
** Beam-frame angles of the photon-frame geometry (for
** bl_method_full_scaled_e: the events on electrons keep static kinematics):
** theta_k = theta0; 1 - cos(theta_p) = 2 sin^2((theta - theta0)/2) + s s0 v
** (the angle between p and the beam, without cancellation); the azimuth
** between k and p around the beam from p's transverse components in the
** frame where k has azimuth 0: (cos(theta) s0 - s cos(theta0) cos(phi),
** -s sin(phi)).
*/
static void beam_angles (const smp_point *pt, double *tk, double *tp,
                         double *phib) {
  const bl_polar *g = &pt->g;
  double th0 = 2.0 * asin(sqrt(0.5 * g->h0)), th = 2.0 * asin(sqrt(0.5 * g->h));
  double sd = sin(0.5 * (th - th0));
  double hp = 2.0 * sd * sd + g->s * g->s0 * pt->v;
  double X = (1.0 - g->h) * g->s0 - g->s * (1.0 - g->h0) * (1.0 - pt->v);
  if (hp > 2.0)
    hp = 2.0;
  *tk = th0;
  *tp = 2.0 * asin(sqrt(0.5 * hp));
  *phib = fabs(atan2(g->s * pt->sphi, X));
}


/* The value at pt, whose geometry, v and bracket are set. */
double bl_smp_value (const bl_sampler *s, const smp_chan *ch, smp_point *pt) {
  const bl_case *c = &ch->c;
  const bl_kin *kn = &pt->kn;
  double x, B, f;
  parts(ch, pt);
  if (s->method == BL_METHOD_DISTORTED) {
    bl_result r;
    double tk, tp, phib;
    beam_angles(pt, &tk, &tp, &phib);
    if (bl_method_full_scaled_e(c, s->method, pt->kmev, tk, tp, phib, &r)
        != BL_SUCCESS)
      return NAN;
    return r.val > 0.0 ? r.val : 0.0;
  }
  x = pt->br.Q0 + pt->br.b * pt->v;
  B = pt->br.L0 + pt->br.L1 * pt->v - x * (pt->br.M0 + pt->br.M1 * pt->v);
  f = B * (pt->wel + pt->we);
  if (f < 0.0)   /* rounding of cancelling poles, as born/dcs.c */
    f = 0.0;
  return f * c->norm * kn->p / (kn->p0 * kn->k) / (4.0 * BL_PI * BL_PI)
         / c->particle.mass;
}


void bl_smp_geometry (const smp_chan *ch, double kmev, double h0, double h,
                   double phi, smp_point *pt) {
  const bl_case *c = &ch->c;
  pt->kmev = kmev;
  bl_kin_set(&pt->kn, c->t0, kmev / c->particle.mass, c->particle.spin);
  pt->g.ridge = 0;
  pt->g.h0 = h0;
  pt->g.s0 = sqrt(h0 * (2.0 - h0));
  pt->g.h = h;
  pt->g.s = sqrt(h * (2.0 - h));
  pt->v = 1.0 - cos(phi);
  pt->sphi = fabs(sin(phi));
  bl_bracket_set(&pt->kn, &pt->g, &pt->br);
}


double bl_smp_weight (const bl_sampler *s, const smp_chan *ch, const double y[4],
                   smp_point *pt) {
  const bl_case *c = &ch->c;
  bl_kin *kn = &pt->kn;
  bl_polar *g = &pt->g;
  double k = s->kmin * exp(y[0] * s->lnk), jac = k * s->lnk;
  double smax0, sg0, r, smax, m, b, f;
  pt->kmev = k;
  if (!(k < c->T))
    return 0.0;
  bl_kin_set(kn, c->t0, k / c->particle.mass, c->particle.spin);
  if (!(kn->p > 0.0))
    return 0.0;
  /* photon angle */
  smax0 = log1p(2.0 / kn->hc0);
  sg0 = y[1] * smax0;
  g->h0 = kn->hc0 * expm1(sg0);
  if (g->h0 > 2.0)
    g->h0 = 2.0;
  g->s0 = sqrt(g->h0 * (2.0 - g->h0));
  jac *= smax0 * (g->h0 + kn->hc0);
  /* particle angle */
  smax = log1p(2.0 / kn->hc);
  r = kn->p0 * g->s0 / kn->p;
  if (r < 1.0) {
    double cs = sqrt((1.0 - r) * (1.0 + r));
    double hs = r * r / (1.0 + cs), hb = 1.0 + cs, qzs, qzb = 0.0;
    double wh = ridge_width(ch, kn, g->h0, hs, r, cs, &qzs);
    double wb = hb < 2.0 ? ridge_width(ch, kn, g->h0, hb, r, cs, &qzb) : 1.0;
    if (hb < 2.0 && wb < BACK_WIDTH) {
      double sm = log1p(1.0 / kn->hc);   /* theta = pi/2 */
      if (y[2] < 0.5)
        jac *= 2.0 * ridge_map(kn, g, hs, wh, qzs, r, 0.0, sm, 2.0 * y[2]);
      else
        jac *= 2.0 * ridge_map(kn, g, hb, wb, qzb, r, sm, smax,
                               2.0 * y[2] - 1.0);
    }
    else
      jac *= ridge_map(kn, g, hs, wh, qzs, r, 0.0, smax, y[2]);
  }
  else {
    double sg = y[2] * smax;
    g->ridge = 0;
    g->h = kn->hc * expm1(sg);
    if (g->h > 2.0)
      g->h = 2.0;
    jac *= smax * (g->h + kn->hc);
  }
  g->s = sqrt(g->h * (2.0 - g->h));
  /* azimuth */
  bl_bracket_set(kn, g, &pt->br);
  b = pt->br.b;
  m = pt->br.Q0 + (ch->hasridge_b ? c->ridge_b : 0.0);
  if (b > 0.0 && m > 0.0) {
    double R = sqrt(m * (m + 2.0 * b));
    double t = sqrt(m / (m + 2.0 * b)) * tan(0.5 * BL_PI * y[3]);
    double t2 = t * t;
    pt->v = 2.0 * t2 / (1.0 + t2);
    pt->sphi = 2.0 * t / (1.0 + t2);
    jac *= BL_PI * (m + b * pt->v) / R;
  }
  else {
    double phi = BL_PI * y[3];
    pt->v = 1.0 - cos(phi);
    pt->sphi = sin(phi);
    jac *= BL_PI;
  }
  f = bl_smp_value(s, ch, pt);
  return f * jac * 4.0 * BL_PI * ch->atoms;
}


/*
** The lab frame: the photon direction khat = (s0 cos A, s0 sin A, cos
** theta0) at the overall azimuth A; e1 = the unit part of the beam axis
** across khat = (-cos(theta0) cos A, -cos(theta0) sin A, s0); e2 = khat x
** e1 = (sin A, -cos A, 0).  In the photon frame p = p [(1 - h) khat + s
** (cos(phi) e1 + sin(phi) e2)] and q = p0 - p - k = q_z khat + (dt + p s
** v) e1 - p s sin(phi) e2, q_z and dt without cancellation (parts).
*/
void bl_smp_event (const smp_chan *ch, const smp_point *pt, double u_az,
                double u_sign, double u_hit, bl_event *ev) {
  const bl_case *c = &ch->c;
  const bl_kin *kn = &pt->kn;
  const bl_polar *g = &pt->g;
  double m = c->particle.mass, A = 2.0 * BL_PI * u_az;
  double ca = cos(A), sa = sin(A), c0 = 1.0 - g->h0, cth = 1.0 - g->h;
  double sphi = u_sign < 0.5 ? pt->sphi : -pt->sphi, cphi = 1.0 - pt->v;
  double kh[3], e1[3], e2[3], q1, q2, pm = m * kn->p, kmev = pt->kmev;
  double tot = pt->wel + pt->we;
  int d;
  kh[0] = g->s0 * ca;
  kh[1] = g->s0 * sa;
  kh[2] = c0;
  e1[0] = -c0 * ca;
  e1[1] = -c0 * sa;
  e1[2] = g->s0;
  e2[0] = sa;
  e2[1] = -ca;
  e2[2] = 0.0;
  q1 = pt->dt + kn->p * g->s * pt->v;
  q2 = -kn->p * g->s * sphi;
  ev->p0[0] = c->T + m;
  ev->p0[1] = ev->p0[2] = 0.0;
  ev->p0[3] = m * kn->p0;
  ev->k[0] = kmev;
  ev->p[0] = (c->T - kmev) + m;
  for (d = 0; d < 3; d++) {
    ev->k[d + 1] = kmev * kh[d];
    ev->p[d + 1] = pm * (cth * kh[d] + g->s * (cphi * e1[d] + sphi * e2[d]));
    ev->q[d] = m * (pt->qz * kh[d] + q1 * e1[d] + q2 * e2[d]);
  }
  ev->Z = c->Z;
  ev->hit = tot > 0.0 && u_hit * tot < pt->we ? BL_HIT_ELECTRON
                                               : BL_HIT_NUCLEUS;
  ev->kk = kmev;
  ev->h0 = g->h0;
  ev->h = g->h;
  ev->phi = atan2(sphi, cphi);
  if (ev->phi < 0.0)
    ev->phi += 2.0 * BL_PI;
}
