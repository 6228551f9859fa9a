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

#include "ebrems/internal.h"
#include "sampler/internal.h"

/* The backward ridge gets its own half of y2 when its width in h is below
** this (as born/dcs.c, BACK_WIDTH). */
#define BACK_WIDTH 0.1


/* The ridge's width and centre, and the q_z = 0 peak (born/internal.h,
** with born/dcs.c's derivation), with the smallest screening pole of the
** channel (none without a ridge pole). */
static double ridge_width (const smp_chan *ch, const bl_kin *kn, double h0,
                           double hs, double r, double cs, double *qzs,
                           double *off) {
  return bl_ridge_width(kn, h0, hs, r, cs,
                        ch->hasridge_b ? ch->c.ridge_b : 0.0, qzs, off);
}

static int zpeak_at (const smp_chan *ch, const bl_kin *kn, const bl_polar *g,
                     double *hz, double *wh) {
  return bl_zpeak(kn, g->h0, g->s0, ch->hasridge_b ? ch->c.ridge_b : 0.0,
                  BACK_WIDTH, hz, wh);
}


/*
** h from t in [0, 1) by the sinh map around hm (width wh in h) over
** [lo, hi] in sigma: *h, and *dh = h - hm without cancellation near hm;
** returns dh/dt.
*/
static double sinh_map (const bl_kin *kn, double hm, double wh, double lo,
                        double hi, double t, double *h, double *dh) {
  double hc = kn->hc, sstar = log1p(hm / hc), w = wh / (hm + hc);
  double ua, ub, u, ds;
  if (!(w > 1e-300))
    w = 1e-300;
  ua = sstar > lo ? asinh((sstar - lo) / w) : 0.0;
  ub = hi > sstar ? asinh((hi - sstar) / w) : 0.0;
  u = -ua + t * (ua + ub);
  ds = w * sinh(u);
  if (fabs(ds) < 0.5) {
    *dh = (hm + hc) * expm1(ds);
    *h = hm + *dh;
  }
  else {
    *h = hc * expm1(sstar + ds);
    *dh = *h - hm;
  }
  if (*h > 2.0) {
    *dh += 2.0 - *h;
    *h = 2.0;
  }
  else if (*h < 0.0) {
    *dh -= *h;
    *h = 0.0;
  }
  return (ua + ub) * w * cosh(u) * (*h + hc);
}


/*
** h from t in [0, 1) by the sinh map around the ridge hs over [lo, hi] in
** sigma, centred at the minimum of q^2 (hs + off) where that lies in the
** range, else at hs; sets the ridge fields of g (dh = h - hs); returns
** dh/dt.
*/
static double ridge_map (const bl_kin *kn, bl_polar *g, double hs,
                         double off, double wh, double qzs, double r,
                         double lo, double hi, double t) {
  double hm = bl_ridge_centre(kn, hs, lo, hi, &off), h, dh, jac;
  jac = sinh_map(kn, hm, wh, lo, hi, t, &h, &dh);
  g->ridge = 1;
  g->hs = hs;
  g->ss = r;
  g->qzs = qzs;
  g->h = h;
  g->dh = dh + off;
  return jac;
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


/* The exact part of channel ch (SMP_EXACT) at pt: Z times the bound
** electron term's fully differential value at the same photon and the
** same projectile direction (the projectile's energy from conservation,
** not E0 - k: bl_smp_event); 0 from the end point on. */
static double exact_value (const smp_chan *ch, smp_point *pt) {
  double tk, tp, phib, v;
  pt->wel = 0.0;
  pt->we = 1.0;
  pt->warn = 0u;
  if (!(pt->kmev < ch->c.ekmax))
    return 0.0;
  beam_angles(pt, &tk, &tp, &phib);
  if (bl_ebrems_full(&ch->eb, pt->kmev, tk, tp, phib, &v) != BL_SUCCESS)
    return NAN;
  return ch->c.Z * v;
}


/* The value at pt, whose geometry, v and bracket are set. */
double bl_smp_value (const bl_sampler *s, const smp_chan *ch, smp_point *pt) {
  const bl_case *c = &ch->c;
  const bl_kin *kn = &pt->kn;
  double x, B, f;
  if (ch->kind == SMP_EXACT)
    return exact_value(ch, pt);
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


/*
** The largest photon angle (h0 = 1 - cos) at which a projectile of energy
** E1, momentum p1, mass M (units m_e) on a free electron at rest can emit
** k: the final pair's mass W^2 = s - 2 k (E1 + 1 - p1 cos) >= (M + 1)^2,
** s = M^2 + 1 + 2 E1, i.e. h0 <= (t0/k - 1 - (E1 - p1)) / p1, E1 - p1 =
** M^2 / (E1 + p1); in [0, 2].
*/
static double exact_h0max (const smp_chan *ch, double kmev) {
  return fmin(fmax(bl_eb_hkmax(&ch->eb, kmev / BL_ME_MEV), 0.0), 2.0);
}


/*
** One end of the exact part's pair-frame polar variable: h from t in [0,
** 1), uniform in ln(1 + h/a) over [0, 1] (a the scale of the smallest
** recoils at that end); returns dh/dt.
*/
static double pair_end (double a, double t, double *h) {
  double L = log1p(1.0 / a);
  *h = a * expm1(t * L);
  return L * (*h + a);
}


/* A weight-0 point of the exact part at its kinematic edge, whose event
** (weighted mode) must still balance: the struck electron at rest, the
** projectile taking p0 - k and E0 - k (on its mass shell at the edge). */
static double edge_point (const smp_chan *ch, smp_point *pt) {
  int d;
  for (d = 0; d < 4; d++)
    pt->pe[1][d] = d == 0 ? BL_ME_MEV : 0.0;
  pt->pe[0][0] = ch->c.T + ch->c.particle.mass - pt->kmev;
  pt->pe[0][1] = -pt->kmev * pt->g.s0;
  pt->pe[0][2] = 0.0;
  pt->pe[0][3] = ch->c.particle.mass * pt->kn.p0
                 - pt->kmev * (1.0 - pt->g.h0);
  return 0.0;
}


/*
** The exact part (SMP_EXACT) at photon energy pt->kmev and direction
** pt->g (h0, s0): the projectile's direction drawn in the rest frame of
** the final projectile and electron, where the value is smooth (the lab
** density has an integrable edge at the largest lab angle): y2 -> h_s =
** 1 - cos(theta_s), split at 1, each half uniform in ln(1 + h/a) from its
** end (0: the electron slow in the lab, 2: the projectile slow; a =
** max(T_min, b^2/2) / (gamma beta p*) in m_e, T_min the lab kinetic
** energy there, linear in h_s with slope gamma beta p*, b the smallest
** screening momentum of the binding), y3 -> phi_s uniform.  Returns Z
** d5sigma/(dk dOmega_k dOmega_s) (mb/(MeV sr^2)) times the Jacobians of
** y2, y3; the lab four-momenta (MeV, photon at azimuth 0) go to pt->pe.
*/
static double exact_pair (const smp_chan *ch, const double y[4],
                          smp_point *pt) {
  const bl_ebrems *e = &ch->eb;
  bl_ebframe f;
  bl_ebpoint x;
  double tb = HUGE_VAL, hs, hs2, jac, sl, st, phs = 2.0 * BL_PI * y[3];
  int i, d;
  pt->wel = 0.0;
  pt->we = 1.0;
  pt->warn = 0u;
  if (bl_eb_frame_set(e, pt->kmev / BL_ME_MEV, pt->g.h0, pt->g.s0, &f) != 0
      && bl_eb_frame_set(e, pt->kmev / BL_ME_MEV, pt->g.h0 * (1.0 - 1e-9),
                         pt->g.s0, &f) != 0)
    return edge_point(ch, pt);   /* beyond the edge by rounding only */
  for (i = 0; i < e->inc.n; i++)
    tb = fmin(tb, 0.5 * e->inc.b[i] * e->inc.b[i]);
  if (e->Z == 0)
    tb = 0.0;   /* a free electron */
  sl = f.gb * f.ps;
  if (!(sl > 0.0))
    return edge_point(ch, pt);   /* the pair at rest: at the end point */
  if (y[2] < 0.5) {
    jac = 2.0 * pair_end(fmax(fmax(f.t4min, tb) / sl, 1e-300), 2.0 * y[2],
                         &hs);
    hs2 = 2.0 - hs;
  }
  else {
    jac = 2.0 * pair_end(fmax(fmax(f.t3min, tb) / sl, 1e-300),
                         2.0 * y[2] - 1.0, &hs2);
    hs = 2.0 - hs2;
  }
  st = sqrt(fmax(hs * hs2, 0.0));
  bl_eb_point_at(e, &f, hs, hs2, st * cos(phs), st * sin(phs), &x);
  for (d = 0; d < 4; d++) {
    pt->pe[0][d] = x.p[2][d] * BL_ME_MEV;
    pt->pe[1][d] = x.p[3][d] * BL_ME_MEV;
  }
  return ch->c.Z * bl_eb_d5(e, &x) * bl_eb_unit() * jac * 2.0 * BL_PI;
}


double bl_smp_weight (const bl_sampler *s, const smp_chan *ch, const double y[4],
                   smp_point *pt) {
  const bl_case *c = &ch->c;
  bl_kin *kn = &pt->kn;
  bl_polar *g = &pt->g;
  double k = s->kmin * exp(y[0] * ch->lnk), jac = k * ch->lnk;
  double smax0, sg0, r, smax, m, b, f, hz, wz;
  pt->kmev = k;
  if (!(k < c->T))
    return 0.0;
  bl_kin_set(kn, c->t0, k / c->particle.mass, c->particle.spin);
  if (!(kn->p > 0.0))
    return 0.0;
  /* photon angle (the exact part: where a free electron can take the
  ** recoil, h0 <= exact_h0max) */
  smax0 = log1p((ch->kind == SMP_EXACT ? exact_h0max(ch, k) : 2.0)
                / kn->hc0);
  sg0 = y[1] * smax0;
  g->h0 = kn->hc0 * expm1(sg0);
  if (g->h0 > 2.0)
    g->h0 = 2.0;
  g->s0 = sqrt(g->h0 * (2.0 - g->h0));
  jac *= smax0 * (g->h0 + kn->hc0);
  if (ch->kind == SMP_EXACT)   /* the overall azimuth: 2 pi */
    return exact_pair(ch, y, pt) * jac * 2.0 * BL_PI * ch->atoms;
  /* particle angle */
  smax = log1p(2.0 / kn->hc);
  r = kn->p0 * g->s0 / kn->p;
  if (r < 1.0) {
    double cs = sqrt((1.0 - r) * (1.0 + r));
    double hs = r * r / (1.0 + cs), hb = 1.0 + cs, qzs, qzb = 0.0;
    double os, ob = 0.0;
    double wh = ridge_width(ch, kn, g->h0, hs, r, cs, &qzs, &os);
    double wb = hb < 2.0 ? ridge_width(ch, kn, g->h0, hb, r, cs, &qzb, &ob)
                         : 1.0;
    if (hb < 2.0 && wb < BACK_WIDTH) {
      double sm = log1p(1.0 / kn->hc);   /* theta = pi/2 */
      if (y[2] < 0.5)
        jac *= 2.0 * ridge_map(kn, g, hs, os, wh, qzs, r, 0.0, sm,
                               2.0 * y[2]);
      else
        jac *= 2.0 * ridge_map(kn, g, hb, ob, wb, qzb, r, sm, smax,
                               2.0 * y[2] - 1.0);
    }
    else
      jac *= ridge_map(kn, g, hs, os, wh, qzs, r, 0.0, smax, y[2]);
  }
  else if (zpeak_at(ch, kn, g, &hz, &wz)) {
    double dh;
    g->ridge = 0;
    jac *= sinh_map(kn, hz, wz, 0.0, smax, y[2], &g->h, &dh);
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
** An event of the exact part (SMP_EXACT): the photon at the overall
** azimuth A, the projectile (for e- the faster electron) as drawn in
** exact_pair turned by A, q = p0 - k - p the struck electron's momentum
** (binding neglected in the kinematics: E0 + m_e = k_E + p_E + q_E); the
** photon-frame h and phi of p measured as bl_smp_event's.
*/
static void exact_event (const smp_chan *ch, const smp_point *pt,
                         double u_az, bl_event *ev) {
  const bl_case *c = &ch->c;
  double m = c->particle.mass, A = 2.0 * BL_PI * u_az, ca = cos(A);
  double sa = sin(A), s0 = pt->g.s0, c0 = 1.0 - pt->g.h0, kh[3], pu[3];
  double e1[3], a1 = 0.0, a2 = 0.0, d2 = 0.0, pm = 0.0;
  int d, b = ch->eb.m == 1.0 && pt->pe[1][0] > pt->pe[0][0];
  kh[0] = s0 * ca;
  kh[1] = s0 * sa;
  kh[2] = c0;
  e1[0] = -c0 * ca;
  e1[1] = -c0 * sa;
  e1[2] = s0;
  ev->p0[0] = c->T + m;
  ev->p0[1] = ev->p0[2] = 0.0;
  ev->p0[3] = sqrt(c->T * (c->T + 2.0 * m));
  ev->k[0] = pt->kmev;
  ev->p[0] = pt->pe[b][0];
  ev->p[1] = ca * pt->pe[b][1] - sa * pt->pe[b][2];
  ev->p[2] = sa * pt->pe[b][1] + ca * pt->pe[b][2];
  ev->p[3] = pt->pe[b][3];
  for (d = 0; d < 3; d++) {
    ev->k[d + 1] = pt->kmev * kh[d];
    ev->q[d] = ev->p0[d + 1] - ev->k[d + 1] - ev->p[d + 1];
    pm += ev->p[d + 1] * ev->p[d + 1];
  }
  pm = sqrt(pm);
  for (d = 0; d < 3; d++) {
    pu[d] = pm > 0.0 ? ev->p[d + 1] / pm : 0.0;
    d2 += (pu[d] - kh[d]) * (pu[d] - kh[d]);
    a1 += pu[d] * e1[d];
  }
  a2 = pu[0] * sa - pu[1] * ca;   /* e2 = (sin A, -cos A, 0) */
  ev->Z = c->Z;
  ev->hit = BL_HIT_ELECTRON;
  ev->recoil = 1;
  ev->kk = pt->kmev;
  ev->h0 = pt->g.h0;
  ev->h = fmin(0.5 * d2, 2.0);
  ev->phi = atan2(a2, a1);
  if (ev->phi < 0.0)
    ev->phi += 2.0 * BL_PI;
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
  if (ch->kind == SMP_EXACT) {
    exact_event(ch, pt, u_az, ev);
    return;
  }
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
  ev->recoil = 0;

  ev->kk = kmev;
  ev->h0 = g->h0;
  ev->h = g->h;
  ev->phi = atan2(sphi, cphi);
  if (ev->phi < 0.0)
    ev->phi += 2.0 * BL_PI;
}
