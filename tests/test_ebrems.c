/*
** test_ebrems.c -- the ebrems room: bremsstrahlung of a projectile on a free
** electron at rest (tree-level QED, all diagrams)
** See Copyright Notice in LICENSE
**
** Suites: ebamp (gauge invariance, the independent trace route of
** tests/ref/ebref.c), eblow (Low's soft-photon theorem against the elastic
** closed forms), ebend (the kinematic end point), ebdk (integrals, input),
** ebbind (binding), ebwire (the bound electron term in the methods).
*/

#include <math.h>
#include <stdio.h>
#include <stdlib.h>

#include <criterion/criterion.h>
#include <gsl/gsl_errno.h>
#include <gsl/gsl_integration.h>

#include "brakelight.h"
#include "testutil.h"
#include "ebref.h"
#include "ebquad.h"
#include "ebrems/internal.h"

/* the projectiles of every kind: e-, e+, spin 1/2 of both signs, spin 0 of
** both signs, and a user-made spin-0 particle of charge +2 */
static const bl_particle alpha2 = {"he-like", 3727.379, 2.0, 0.0, 0};
static const char *const kinds[] = {"electron", "positron", "muon", "antimuon",
                                    "pion+", "pion-", "proton", "kaon-"};
#define NKIND 9

static const bl_particle *kind_at (int i) {
  return i < NKIND - 1 ? bl_particle_find(kinds[i]) : &alpha2;
}

/* A random allowed point (k, photon direction, pair-frame direction);
** rand_r keeps the suites reproducible. */
static int random_point (const bl_ebrems *c, unsigned *seed, bl_ebpoint *x) {
  int tries;
  for (tries = 0; tries < 100; tries++) {
    double u1 = rand_r(seed) / (RAND_MAX + 1.0), u2 = rand_r(seed) / (RAND_MAX + 1.0);
    double u3 = rand_r(seed) / (RAND_MAX + 1.0), u4 = rand_r(seed) / (RAND_MAX + 1.0);
    double k = (0.001 + 0.998 * u1) * c->ymax * c->t0;
    double hmax = fmin(2.0, (c->t0 / k - 1.0 / c->ymax) / c->p0);
    double hk = hmax * u2, hs = 2.0 * u3, phi = 2.0 * BL_PI * u4;
    if (bl_eb_point_set(c, k, hk, sqrt(hk * (2.0 - hk)), hs,
                        sqrt(hs * (2.0 - hs)), phi, x) == 0)
      return 0;
  }
  return -1;
}

/* ================================================================== */
TestSuite(ebamp, .init = setup);

/* Gauge invariance (the Ward identity of QED): eps -> k / k^0 (components
** of order 1, as a unit polarisation's) gives zero, measured against the
** largest amplitude of the physical polarisations at the same point. */
Test(ebamp, gauge_invariance_every_kind) {
  static const double Ts[] = {0.01, 1.0, 100.0};
  unsigned seed = 11;
  int ik, it, n;
  for (ik = 0; ik < NKIND; ik++)
    for (it = 0; it < 3; it++) {
      bl_ebrems c;
      cr_assert_eq(bl_ebrems_init(&c, kind_at(ik), Ts[it]), BL_SUCCESS);
      for (n = 0; n < 20; n++) {
        bl_ebpoint x;
        double ek[2][4], ep[2][4], worst = 0.0, big = 0.0;
        double complex Mk[2][BL_EB_NAMP], Mp[2][BL_EB_NAMP];
        int pol, s, i;
        cr_assert_eq(random_point(&c, &seed, &x), 0);
        for (i = 0; i < 4; i++)
          ek[0][i] = ek[1][i] = x.p[4][i] / x.p[4][0];
        bl_eb_polarisations(x.p[4], ep);
        bl_eb_amplitudes(&c, (const double (*)[4])x.p,
                         (const double (*)[4])ek, Mk);
        bl_eb_amplitudes(&c, (const double (*)[4])x.p,
                         (const double (*)[4])ep, Mp);
        for (pol = 0; pol < 2; pol++)
          for (s = 0; s < BL_EB_NAMP; s++) {
            worst = fmax(worst, cabs(Mk[pol][s]));
            big = fmax(big, cabs(Mp[pol][s]));
          }
        cr_expect(big > 0.0 && worst <= 1e-12 * big,
                  "%s T=%g: |M(eps=k)| %.3e vs |M| %.3e (%.2e)",
                  kind_at(ik)->name, Ts[it], worst, big, worst / big);
      }
    }
}

/* The diagnostic one-line subsets (bl_ebrems.radiate: the projectile's
** radiation only, the struck electron's only) are gauge invariant each,
** and their amplitudes add to the full one (muon, proton at 1 MeV and
** 100 MeV). */
Test(ebamp, one_line_subsets_gauge_invariant) {
  static const double Ts[] = {1.0, 100.0};
  static const char *const ps[] = {"muon", "proton"};
  unsigned seed = 13;
  int ip, it, n;
  for (ip = 0; ip < 2; ip++)
    for (it = 0; it < 2; it++) {
      bl_ebrems c[3];
      int r;
      for (r = 0; r < 3; r++) {
        cr_assert_eq(bl_ebrems_init(&c[r], bl_particle_find(ps[ip]), Ts[it]),
                     BL_SUCCESS);
        cr_expect_eq(c[r].radiate, BL_EBREMS_RAD_BOTH);
      }
      c[1].radiate = BL_EBREMS_RAD_PROJECTILE;
      c[2].radiate = BL_EBREMS_RAD_ELECTRON;
      for (n = 0; n < 10; n++) {
        bl_ebpoint x;
        double ek[2][4], ep[2][4], worst = 0.0, big = 0.0, sum = 0.0;
        double full = 0.0;
        double complex Mk[2][BL_EB_NAMP], Mp[3][2][BL_EB_NAMP];
        int pol, s, i;
        cr_assert_eq(random_point(&c[0], &seed, &x), 0);
        for (i = 0; i < 4; i++)
          ek[0][i] = ek[1][i] = x.p[4][i] / x.p[4][0];
        bl_eb_polarisations(x.p[4], ep);
        for (r = 0; r < 3; r++)
          bl_eb_amplitudes(&c[r], (const double (*)[4])x.p,
                           (const double (*)[4])ep, Mp[r]);
        for (r = 1; r < 3; r++) {
          bl_eb_amplitudes(&c[r], (const double (*)[4])x.p,
                           (const double (*)[4])ek, Mk);
          for (pol = 0; pol < 2; pol++)
            for (s = 0; s < BL_EB_NAMP; s++) {
              worst = fmax(worst, cabs(Mk[pol][s]));
              big = fmax(big, cabs(Mp[r][pol][s]));
            }
        }
        for (pol = 0; pol < 2; pol++)
          for (s = 0; s < BL_EB_NAMP; s++) {
            sum = fmax(sum, cabs(Mp[1][pol][s] + Mp[2][pol][s]
                                 - Mp[0][pol][s]));
            full = fmax(full, cabs(Mp[0][pol][s]));
          }
        sum /= full;
        cr_expect(big > 0.0 && worst <= 1e-12 * big,
                  "%s T=%g: |M(eps=k)| %.3e vs |M| %.3e", ps[ip], Ts[it],
                  worst, big);
        cr_expect(sum <= 1e-12, "%s T=%g: the subsets add up to %.2e",
                  ps[ip], Ts[it], sum);
      }
    }
}

/* The transverse polarisation pair is arbitrary: a rotated pair gives the
** same sum (a check that the sum is over a complete transverse basis). */
Test(ebamp, polarisation_basis_free) {
  unsigned seed = 5;
  bl_ebrems c;
  int n;
  cr_assert_eq(bl_ebrems_init(&c, bl_particle_find("electron"), 2.0), 0);
  for (n = 0; n < 20; n++) {
    bl_ebpoint x;
    double e[2][4], r[2][4], a = 0.0, b = 0.0;
    double complex M[2][BL_EB_NAMP];
    int i, pol, s;
    cr_assert_eq(random_point(&c, &seed, &x), 0);
    bl_eb_polarisations(x.p[4], e);
    for (i = 0; i < 4; i++) {
      r[0][i] = 0.6 * e[0][i] + 0.8 * e[1][i];
      r[1][i] = -0.8 * e[0][i] + 0.6 * e[1][i];
    }
    bl_eb_amplitudes(&c, (const double (*)[4])x.p, (const double (*)[4])r,
                     M);
    for (pol = 0; pol < 2; pol++)
      for (s = 0; s < BL_EB_NAMP; s++)
        b += pow(cabs(M[pol][s]), 2);
    a = bl_eb_msq(&c, (const double (*)[4])x.p);
    EXPECT_REL(b, a, 1e-13, "rotated polarisations, point %d", n);
  }
}

/* The independent route of tests/ref/ebref.c (traces of p/ +- m in the
** chiral representation, polarisation sum -g): 1e-10 at random points.
** At 10 keV the two routes part by up to 3e-10 (e-) and 6e-9 (proton)
** (measured): the dipole radiation cancels there between the diagrams
** (e- e-: no dipole moment; a slow heavy line radiates ~ beta), and both
** routes carry that cancellation differently; checked there at 1e-8. */
Test(ebamp, trace_route_agrees) {
  static const double Ts[] = {0.01, 0.3, 3.0, 100.0};
  unsigned seed = 7;
  int ik, it, n;
  for (ik = 0; ik < NKIND; ik++)
    for (it = 0; it < 4; it++) {
      bl_ebrems c;
      double tol = Ts[it] < 0.1 ? 1e-8 : 1e-10, worst = 0.0;
      cr_assert_eq(bl_ebrems_init(&c, kind_at(ik), Ts[it]), BL_SUCCESS);
      for (n = 0; n < 12; n++) {
        bl_ebpoint x;
        double a, b;
        cr_assert_eq(random_point(&c, &seed, &x), 0);
        a = bl_eb_msq(&c, (const double (*)[4])x.p);
        b = ebref_msq(c.kind, c.m, c.z, c.spin2, (const double (*)[4])x.p);
        worst = fmax(worst, fabs(a / b - 1.0));
      }
      cr_expect(worst <= tol, "%s T=%g: worst relative difference %.3e > %.0e",
                kind_at(ik)->name, Ts[it], worst, tol);
    }
}

/* High energy: |M|^2 as the integrals evaluate it (pair frame, the struck
** line's transfers given exactly, bl_eb_d5) against the trace route in
** __float128 with its own kinematics (tests/ref/ebquad.c), and gauge
** invariance there (eps -> k / k^0), for e- and e+ at 10 GeV, 100 GeV and
** 1 TeV and mu- at 10 TeV: y = 0.01 and 0.5 of y_max, the photon along the
** beam and at the projectile's cone h_k = m^2 / (p0 (E0 + p0)), the
** projectile at the struck electron's pole (h_s = a0 and 10 a0, a0 =
** T4min / (gamma beta p*)), for e- also at the exchange pole (2 - h_s =
** a0), and at h_s = 0.3.  Measured worst of these points: 2.8e-10
** (10 GeV), 7.0e-9 (100 GeV), 2.1e-5 (1 TeV), 6.4e-11 (muon 10 TeV);
** |M(eps=k)| / |M| <= 1.9e-11.  With the plain form of the struck current
** (before the axial one of amp.c) a 60-point scan gave 2e-6 (10 GeV),
** 1.5e-5 (100 GeV), 3e-4 (1 TeV), so these bounds can fail. */
Test(ebamp, high_energy_quad_route) {
  static const struct { const char *name; double T, tol; } cs[] = {
    {"electron", 1e4, 1e-8}, {"electron", 1e5, 1e-7}, {"electron", 1e6, 1e-4},
    {"positron", 1e5, 1e-7}, {"positron", 1e6, 1e-4}, {"muon", 1e7, 1e-9}};
  static const double ys[] = {0.01, 0.5};
  size_t ic;
  for (ic = 0; ic < sizeof cs / sizeof cs[0]; ic++) {
    bl_ebrems c;
    double worst = 0.0, wg = 0.0;
    int iy, ih, is;
    cr_assert_eq(bl_ebrems_init(&c, bl_particle_find(cs[ic].name), cs[ic].T),
                 BL_SUCCESS);
    for (iy = 0; iy < 2; iy++)
      for (ih = 0; ih < 2; ih++)
        for (is = 0; is < 4; is++) {
          bl_ebframe f;
          bl_ebpoint x;
          double k = ys[iy] * c.ymax * c.t0, a0, hs, hs2, ss, phi = 0.7, ref;
          double hk = ih == 0 ? 0.0 : c.m * c.m / (c.p0 * (c.e0 + c.p0));
          double ek[2][4], ep[2][4], big = 0.0, wk = 0.0, v;
          double complex Mk[2][BL_EB_NAMP], Mp[2][BL_EB_NAMP];
          int pol, s, i;
          cr_assert_eq(bl_eb_frame_set(&c, k, hk, sqrt(hk * (2.0 - hk)), &f),
                       0);
          a0 = f.t4min / (f.gb * f.ps);
          if (is == 3 && c.kind != BL_EBREMS_ELECTRON)
            continue;
          hs = is == 0 ? a0 : is == 1 ? 10.0 * a0 : is == 2 ? 0.3 : 2.0 - a0;
          hs2 = is == 3 ? a0 : 2.0 - hs;
          ss = sqrt(is == 3 ? a0 * hs : hs * hs2);
          bl_eb_point_at(&c, &f, hs, hs2, ss * cos(phi), ss * sin(phi), &x);
          v = bl_eb_msq_q(&c, (const double (*)[4])x.f, &x.q);
          cr_assert_eq(ebquad_point(c.kind, c.m, c.z, c.spin2, c.t0, k, hk,
                                    hs, hs2, phi, 1, &ref, NULL), 0);
          worst = fmax(worst, fabs(v / ref - 1.0));
          for (i = 0; i < 4; i++)
            ek[0][i] = ek[1][i] = x.f[4][i] / x.f[4][0];
          bl_eb_polarisations(x.f[4], ep);
          bl_eb_amplitudes_q(&c, (const double (*)[4])x.f,
                             (const double (*)[4])ek, &x.q, Mk);
          bl_eb_amplitudes_q(&c, (const double (*)[4])x.f,
                             (const double (*)[4])ep, &x.q, Mp);
          for (pol = 0; pol < 2; pol++)
            for (s = 0; s < BL_EB_NAMP; s++) {
              wk = fmax(wk, cabs(Mk[pol][s]));
              big = fmax(big, cabs(Mp[pol][s]));
            }
          wg = fmax(wg, wk / big);
        }
    cr_expect(worst <= cs[ic].tol, "%s T=%g: worst |M|^2 vs __float128 "
              "traces %.3e > %.0e", cs[ic].name, cs[ic].T, worst, cs[ic].tol);
    cr_expect(wg <= 1e-9, "%s T=%g: |M(eps=k)| / |M| %.3e", cs[ic].name,
              cs[ic].T, wg);
  }
}

/* The public |M|^2 is the same number. */
Test(ebamp, public_msq) {
  unsigned seed = 3;
  bl_ebrems c;
  bl_ebpoint x;
  double v, bad[4] = {NAN, 0, 0, 0};
  cr_assert_eq(bl_ebrems_init(&c, bl_particle_find("muon"), 50.0), 0);
  cr_assert_eq(random_point(&c, &seed, &x), 0);
  cr_assert_eq(bl_ebrems_msq(&c, x.p[2], x.p[3], x.p[4], &v), BL_SUCCESS);
  cr_expect_eq(v, bl_eb_msq(&c, (const double (*)[4])x.p));
  cr_expect_eq(bl_ebrems_msq(&c, bad, x.p[3], x.p[4], &v), BL_EDOMAIN);
}

/* ================================================================== */
TestSuite(eblow, .init = setup);

/* Elastic momenta at the pair-frame angles (theta_s, phi_s) (the k -> 0
** limit of the point: the pair frame becomes the centre-of-mass frame),
** built here independently of the core. */
static void elastic (const bl_ebrems *c, double ths, double phs, double thk,
                     double k, double p[5][4], double *s, double *t) {
  double m = c->m, W, pc, g, gb, e3, e4, n[3], d[4];
  int i;
  *s = m * m + 1.0 + 2.0 * c->e0;
  W = sqrt(*s);
  pc = c->p0 / W;
  g = (c->e0 + 1.0) / W;
  gb = c->p0 / W;
  e3 = sqrt(pc * pc + m * m);
  e4 = sqrt(pc * pc + 1.0);
  n[0] = sin(ths) * cos(phs); n[1] = sin(ths) * sin(phs); n[2] = cos(ths);
  p[0][0] = c->e0; p[0][1] = 0; p[0][2] = 0; p[0][3] = c->p0;
  p[1][0] = 1; p[1][1] = 0; p[1][2] = 0; p[1][3] = 0;
  p[2][0] = g * e3 + gb * pc * n[2]; p[2][1] = pc * n[0]; p[2][2] = pc * n[1];
  p[2][3] = gb * e3 + g * pc * n[2];
  p[3][0] = g * e4 - gb * pc * n[2]; p[3][1] = -pc * n[0];
  p[3][2] = -pc * n[1]; p[3][3] = gb * e4 - g * pc * n[2];
  p[4][0] = k; p[4][1] = k * sin(thk); p[4][2] = 0; p[4][3] = k * cos(thk);
  for (i = 0; i < 4; i++)
    d[i] = p[0][i] - p[2][i];
  *t = d[0] * d[0] - d[1] * d[1] - d[2] * d[2] - d[3] * d[3];
}

/* Low (1958, Phys. Rev. 110, 974): as k -> 0 the fully differential cross
** section tends to alpha k / (4 pi^2) (-J.J) dsigma_el/dOmega, J the
** classical current of the four charges, with the elastic cross sections:
** Moller (e- e-; with the 1/2 of identical particles that the full
** Omega_s carries) and Bhabha (e+ e-), Berestetskii, Lifshitz &
** Pitaevskii, QED, §81; a spin-1/2 heavy projectile, Peskin & Schroeder
** §5.4 (e- mu-) with both masses; a spin-0 projectile, scalar QED (Peskin
** & Schroeder §9.1 vertex, the electron trace as §5.1; the section
** numbers from memory, the formulas rederived); transcribed in
** tests/ref/ebref.c.  The remainder is O(k): measured up to 5.3e-4 of the
** ratio at k = 1e-4 k_max (the antimuon at 100 MeV), ten times less at
** 1e-5 k_max, as a first-order remainder must be.  Both
** spins of the projectile (muon, pion, the charge-2 spin-0 particle). */
Test(eblow, soft_photon_limit_every_kind) {
  static const double Ts[] = {0.01, 0.1, 1.0, 100.0};
  static const double th[3][3] = {{1.1, 0.7, 0.3}, {2.4, 2.0, 0.1},
                                  {0.4, 3.0, 0.5}};
  int ik, it, ia;
  for (ik = 0; ik < NKIND; ik++)
    for (it = 0; it < 4; it++)
      for (ia = 0; ia < 3; ia++) {
        bl_ebrems c;
        double r[2];
        int j;
        cr_assert_eq(bl_ebrems_init(&c, kind_at(ik), Ts[it]), BL_SUCCESS);
        for (j = 0; j < 2; j++) {
          double f = j == 0 ? 1e-4 : 1e-5, k = f * c.ymax * c.t0;
          double thk = th[ia][2] / sqrt(c.e0 / c.m), p[5][4], s, t, el, low;
          bl_ebpoint x;
          cr_assert_eq(bl_eb_point_set(&c, k, 2.0 * pow(sin(0.5 * thk), 2),
                                       sin(thk),
                                       2.0 * pow(sin(0.5 * th[ia][0]), 2),
                                       sin(th[ia][0]), th[ia][1], &x), 0);
          elastic(&c, th[ia][0], th[ia][1], thk, k, p, &s, &t);
          if (c.kind == BL_EBREMS_ELECTRON)
            el = 0.5 * ebref_moller(s, t);
          else if (c.kind == BL_EBREMS_POSITRON)
            el = ebref_bhabha(s, t);
          else if (c.spin2 == 1)
            el = ebref_dirac(c.m, c.z, s, t);
          else
            el = ebref_scalar(c.m, c.z, s, t);
          low = BL_ALPHA * k / (4.0 * BL_PI * BL_PI)
                * ebref_soft(c.z, (const double (*)[4])p) * el;
          r[j] = bl_eb_d5(&c, &x) / low - 1.0;
        }
        cr_expect(fabs(r[0]) < 1e-3 && fabs(r[1]) < 1e-4
                  && fabs(r[1]) < 0.2 * fabs(r[0]) + 1e-9,
                  "%s T=%g angles %d: ratio - 1 = %.3e (1e-4 k_max), %.3e "
                  "(1e-5 k_max)", kind_at(ik)->name, Ts[it], ia, r[0], r[1]);
      }
}

/* ================================================================== */
TestSuite(ebend, .init = setup);

/* The end point y_max = m_e / (m_e + E0 - p0) (the pair at rest in its
** frame, photon along the beam): the values of issue 13, 0.55, 0.65, 0.85
** at 10 keV, 100 keV, 1 MeV (computed from the same formula: checks the
** transcription), dsigma/dk exactly 0 above and positive just below. */
Test(ebend, end_point_electron) {
  static const double Ts[] = {0.01, 0.1, 1.0}, want[] = {0.55, 0.65, 0.85};
  bl_quad *q = bl_quad_alloc(100);
  int i;
  cr_assert_not_null(q);
  cr_assert_eq(bl_quad_set_rtol(q, 1e-2), BL_SUCCESS);
  for (i = 0; i < 3; i++) {
    bl_ebrems c;
    bl_result r;
    double km, e0, p0, y;
    cr_assert_eq(bl_ebrems_init(&c, bl_particle_find("electron"), Ts[i]), 0);
    e0 = Ts[i] + BL_ME_MEV;
    p0 = sqrt(Ts[i] * (Ts[i] + 2.0 * BL_ME_MEV));
    y = BL_ME_MEV / (BL_ME_MEV + e0 - p0);
    EXPECT_REL(c.ymax, y, 1e-12, "y_max at T = %g", Ts[i]);
    cr_expect(fabs(c.ymax - want[i]) < 0.005, "y_max %g vs %g", c.ymax,
              want[i]);
    km = bl_ebrems_kmax(&c);
    cr_expect_eq(bl_ebrems_dk_e(&c, km * (1.0 + 1e-12), q, &r), BL_SUCCESS);
    cr_expect(r.val == 0.0 && r.err == 0.0, "above k_max: %g", r.val);
    cr_expect_eq(bl_ebrems_dk_e(&c, km * 1.5, q, &r), BL_SUCCESS);
    cr_expect(r.val == 0.0, "at 1.5 k_max: %g", r.val);
    cr_expect_eq(bl_ebrems_dk_e(&c, km * (1.0 - 1e-3), q, &r), BL_SUCCESS);
    cr_expect(r.val > 0.0 && isfinite(r.val), "just below k_max: %g", r.val);
    /* the photon along the beam is the last direction to close */
    cr_expect_eq(bl_ebrems_angular_e(&c, km * (1.0 - 1e-3), 0.0, q, &r), 0);
    cr_expect(r.val > 0.0, "forward, just below k_max: %g", r.val);
    cr_expect_eq(bl_ebrems_angular_e(&c, km * (1.0 - 1e-3), 0.5, q, &r), 0);
    cr_expect(r.val == 0.0, "at 0.5 rad, just below k_max: %g", r.val);
  }
  bl_quad_free(q);
}

/* For any mass the same formula: a muon at 10 GeV, y_max = 1 / (1 +
** m_mu^2 / (2 m_e E)) to O(m/E) (the muon-electron limit quoted in issue
** 13 for the Kelner-Kokoulin-Petrukhin electron term). */
Test(ebend, end_point_muon) {
  bl_ebrems c;
  double E = 1e4 + BL_MMU_MEV, v;
  cr_assert_eq(bl_ebrems_init(&c, bl_particle_find("muon"), 1e4), 0);
  v = 1.0 / (1.0 + BL_MMU_MEV * BL_MMU_MEV / (2.0 * BL_ME_MEV * E));
  EXPECT_REL(c.ymax, v, 2e-3, "muon y_max at 10 GeV");
}

/* ================================================================== */
TestSuite(ebdk, .init = setup);

/* Non-relativistic e- e- bremsstrahlung has no dipole term: at 10 keV the
** e- e- spectrum is far below the e+ e- one (which radiates as a dipole)
** (e.g. Berestetskii, Lifshitz & Pitaevskii §92, the dipole
** approximation; the ratio bound is common practice: ~ beta^2). */
Test(ebdk, no_dipole_for_identical) {
  bl_quad *q = bl_quad_alloc(100);
  bl_ebrems a, b;
  bl_result ra, rb;
  cr_assert_not_null(q);
  cr_assert_eq(bl_quad_set_rtol(q, 1e-2), 0);
  cr_assert_eq(bl_ebrems_init(&a, bl_particle_find("electron"), 0.01), 0);
  cr_assert_eq(bl_ebrems_init(&b, bl_particle_find("positron"), 0.01), 0);
  cr_assert_eq(bl_ebrems_dk_e(&a, 0.002, q, &ra), BL_SUCCESS);
  cr_assert_eq(bl_ebrems_dk_e(&b, 0.002, q, &rb), BL_SUCCESS);
  cr_expect(ra.val > 0.0 && ra.val < 0.2 * rb.val, "e-e- %g, e+e- %g",
            ra.val, rb.val);
  bl_quad_free(q);
}

/* The estimate is honest: rtol 1e-2 against rtol 1e-5 of the same point
** (electron, 300 keV, y = 0.3), the true error within the estimate and
** the tolerance. */
Test(ebdk, tolerance_met) {
  bl_quad *q = bl_quad_alloc(200);
  bl_ebrems c;
  bl_result lo, hi;
  double k;
  cr_assert_not_null(q);
  cr_assert_eq(bl_ebrems_init(&c, bl_particle_find("electron"), 0.3), 0);
  k = 0.3 * bl_ebrems_kmax(&c);
  cr_assert_eq(bl_quad_set_rtol(q, 1e-5), 0);
  cr_assert_eq(bl_ebrems_dk_e(&c, k, q, &hi), BL_SUCCESS);
  cr_assert_eq(bl_quad_set_rtol(q, 1e-2), 0);
  cr_assert_eq(bl_ebrems_dk_e(&c, k, q, &lo), BL_SUCCESS);
  cr_expect(fabs(lo.val - hi.val) <= 1e-2 * hi.val, "%g vs %g", lo.val,
            hi.val);
  cr_expect(hi.err <= 1e-5 * hi.val, "estimate %g", hi.err / hi.val);
  bl_quad_free(q);
}

/* Bad input is refused with BL_EDOMAIN, never NaN. */
Test(ebdk, bad_input) {
  bl_quad *q = bl_quad_alloc(50);
  bl_ebrems c;
  bl_result r;
  double v;
  bl_particle nomass = {"x", 0.0, 1.0, 0.5, 0};
  cr_assert_not_null(q);
  cr_expect_eq(bl_ebrems_init(&c, bl_particle_find("electron"), 0.0),
               BL_EDOMAIN);
  cr_expect_eq(bl_ebrems_init(&c, bl_particle_find("electron"), NAN),
               BL_EDOMAIN);
  cr_expect_eq(bl_ebrems_init(&c, bl_particle_find("electron"),
                              2.0 * BL_EBREMS_T_MAX_E), BL_EDOMAIN);
  cr_expect_eq(bl_ebrems_init(&c, bl_particle_find("muon"),
                              2.0 * BL_EBREMS_T_MAX), BL_EDOMAIN);
  cr_expect_eq(bl_ebrems_init(&c, &nomass, 1.0), BL_EDOMAIN);
  cr_assert_eq(bl_ebrems_init(&c, bl_particle_find("electron"), 1.0), 0);
  cr_expect_eq(bl_ebrems_dk_e(&c, -1.0, q, &r), BL_EDOMAIN);
  cr_expect_eq(bl_ebrems_dk_e(&c, NAN, q, &r), BL_EDOMAIN);
  cr_expect_eq(bl_ebrems_angular_e(&c, 0.1, 4.0, q, &r), BL_EDOMAIN);
  cr_expect_eq(bl_ebrems_point(&c, 0.1, 0.1, -1.0, 0.0, &v), BL_EDOMAIN);
  cr_expect_eq(v, 0.0);
  cr_expect_eq(bl_ebrems_point(&c, 0.1, 0.01, 1.0, 0.3, &v), BL_SUCCESS);
  cr_expect(v > 0.0 && isfinite(v), "point %g", v);
  bl_quad_free(q);
}

/* The photon angular distribution integrates to the spectrum: the test's
** own quadrature (GSL QAG, 21 points, in sigma = ln(1 + h_k / h_c), h_c =
** m^2 / (p0 (E0 + p0)), up to the kinematic edge h_max) over
** bl_ebrems_angular_e against bl_ebrems_dk_e, both at rtol 1e-6: within
** 1e-4.  A check of the outer level of dsigma/dk (its map, the edge, the
** 2 pi of the azimuth about the beam). */
typedef struct angpar {
  const bl_ebrems *c;
  bl_quad *q;
  double k, hc;
  int bad;
} angpar;

static double ang_sigma (double sg, void *vp) {
  angpar *a = vp;
  bl_result r;
  double h = a->hc * expm1(sg);
  if (h > 2.0)
    h = 2.0;
  if (bl_ebrems_angular_e(a->c, a->k, 2.0 * asin(sqrt(0.5 * h)), a->q, &r)
      != BL_SUCCESS)
    a->bad++;
  return 2.0 * BL_PI * (h + a->hc) * r.val;
}

Test(ebdk, angular_integrates_to_dk) {
  static const struct { const char *name; double T; } pts[] = {
    {"electron", 0.01}, {"electron", 1.0}, {"muon", 1000.0}};
  gsl_integration_workspace *w = gsl_integration_workspace_alloc(200);
  bl_quad *q = bl_quad_alloc(200);
  size_t i;
  cr_assert_not_null(w);
  cr_assert_not_null(q);
  cr_assert_eq(bl_quad_set_rtol(q, 1e-6), 0);
  gsl_set_error_handler_off();
  for (i = 0; i < sizeof pts / sizeof pts[0]; i++) {
    bl_ebrems c;
    bl_result r;
    angpar a;
    gsl_function F;
    double hmax, v, e;
    cr_assert_eq(bl_ebrems_init(&c, bl_particle_find(pts[i].name), pts[i].T),
                 0);
    a.c = &c; a.q = q; a.bad = 0;
    a.k = 0.4 * bl_ebrems_kmax(&c);
    a.hc = c.m * c.m / (c.p0 * (c.e0 + c.p0));
    hmax = fmin(2.0, (c.t0 / (a.k / BL_ME_MEV) - 1.0 / c.ymax) / c.p0);
    F.function = ang_sigma;
    F.params = &a;
    cr_expect_eq(gsl_integration_qag(&F, 0.0, log1p(hmax / a.hc), 0.0, 2e-5,
                                     200, GSL_INTEG_GAUSS21, w, &v, &e), 0,
                 "%s T=%g: QAG estimate %.2e", pts[i].name, pts[i].T,
                 e / v);
    cr_assert_eq(bl_ebrems_dk_e(&c, a.k, q, &r), BL_SUCCESS);
    cr_expect_eq(a.bad, 0, "%s T=%g: an angular point missed its tolerance",
                 pts[i].name, pts[i].T);
    EXPECT_REL(v, r.val, 1e-4, "%s T=%g: int dOmega_k of the angular "
               "distribution vs dsigma/dk", pts[i].name, pts[i].T);
  }
  bl_quad_free(q);
  gsl_integration_workspace_free(w);
}

/* High energy: rtol 1e-3 converges (no BL_ENOTCONV) and agrees with rtol
** 1e-5 of the same point within 1e-3 (the full grid, 100 MeV - 1 GeV e-
** and e+, muons 1 - 100 GeV, y = 0.1, 0.5, 0.9 against rtol 1e-6, is in
** DEVELOPERS.md: measured differences <= 7e-5; too slow for this suite). */
Test(ebdk, high_energy_converges) {
  static const struct { const char *name; double T, y; } pts[] = {
    {"electron", 100.0, 0.9}, {"positron", 1000.0, 0.9},
    {"muon", 1e5, 0.5}};
  bl_quad *q = bl_quad_alloc(400);
  size_t i;
  cr_assert_not_null(q);
  for (i = 0; i < sizeof pts / sizeof pts[0]; i++) {
    bl_ebrems c;
    bl_result lo, hi;
    double k;
    cr_assert_eq(bl_ebrems_init(&c, bl_particle_find(pts[i].name), pts[i].T),
                 0);
    k = pts[i].y * bl_ebrems_kmax(&c);
    cr_assert_eq(bl_quad_set_rtol(q, 1e-3), 0);
    cr_expect_eq(bl_ebrems_dk_e(&c, k, q, &lo), BL_SUCCESS, "%s T=%g y=%g",
                 pts[i].name, pts[i].T, pts[i].y);
    cr_assert_eq(bl_quad_set_rtol(q, 1e-5), 0);
    cr_expect_eq(bl_ebrems_dk_e(&c, k, q, &hi), BL_SUCCESS);
    EXPECT_REL(lo.val, hi.val, 1e-3, "%s T=%g y=%g: rtol 1e-3 vs 1e-5",
               pts[i].name, pts[i].T, pts[i].y);
  }
  bl_quad_free(q);
}

/* ================================================================== */
/*
** The fully differential value in the lab's variables (bl_ebrems_full:
** the projectile's direction, its energy and the struck electron's
** momentum from conservation, both boost branches, for e- the faster
** electron) integrates over the projectile's direction to the photon
** angular distribution (bl_ebrems_angular_e, a different route: the pair
** frame's angles).  Measured at 1e-6: 1e-7 to 5e-7 (e- 1 MeV, e+ 10 MeV,
** mu 100 MeV and 10 GeV, e- 100 MeV); here at 1e-5, so 1e-4.  For e- a
** value counting either electron at theta_p integrates to twice, one
** without the faster rule's doubling to half; a muon's second branch
** (zeta > 1) left out loses 14 % of the 10 GeV point (both mutants fail).
*/
typedef struct { const bl_ebrems *e; double k, tk, tp;
                 gsl_integration_cquad_workspace *w; } fullint;

static double full_phi (double phi, void *par) {
  fullint *f = par;
  double v;
  int st = bl_ebrems_full(f->e, f->k, f->tk, f->tp, phi, &v);
  cr_assert_eq(st, 0, "status %d at theta_p %.17g phi %.17g", st, f->tp, phi);
  return v;
}

static double full_theta (double x, void *par) {   /* theta_p = x^2 */
  fullint *f = par;
  gsl_function F = {full_phi, f};
  double r, err;
  size_t n;
  f->tp = fmin(x * x, BL_PI);
  gsl_integration_cquad(&F, 0.0, BL_PI, 0.0, 1e-6, f->w, &r, &err, &n);
  return 2.0 * r * sin(f->tp) * 2.0 * x;   /* even in phi */
}

Test(ebdk, full_integrates_to_angular, .timeout = 240) {
  static const struct { const char *p; double T, k, tk; } cs[] = {
    {"electron", 1.0, 0.1, 0.3}, {"positron", 10.0, 3.0, 0.05},
    {"muon", 1e4, 1e3, 1e-3}};
  gsl_integration_cquad_workspace *w1, *w2;
  bl_quad *q = bl_quad_alloc(400);
  size_t i;
  w1 = gsl_integration_cquad_workspace_alloc(200);
  w2 = gsl_integration_cquad_workspace_alloc(200);
  cr_assert(q != NULL && w1 != NULL && w2 != NULL);
  bl_quad_set_rtol(q, 1e-6);
  for (i = 0; i < sizeof cs / sizeof cs[0]; i++) {
    bl_ebrems e;
    bl_result r;
    fullint f;
    gsl_function F;
    double v, err;
    size_t n;
    cr_assert_eq(bl_ebrems_init(&e, bl_particle_find(cs[i].p), cs[i].T), 0);
    cr_assert_eq(bl_ebrems_set_binding(&e, 6, bl_model_find("hartree-fock"),
                                       NULL), 0);
    cr_assert_eq(bl_ebrems_angular_e(&e, cs[i].k, cs[i].tk, q, &r), 0);
    f.e = &e; f.k = cs[i].k; f.tk = cs[i].tk; f.w = w2;
    F.function = full_theta;
    F.params = &f;
    gsl_integration_cquad(&F, 0.0, sqrt(BL_PI), 0.0, 1e-5, w1, &v, &err, &n);
    EXPECT_REL(v, r.val, 1e-4, "%s T %g k %g theta_k %g", cs[i].p, cs[i].T,
               cs[i].k, cs[i].tk);
  }
  gsl_integration_cquad_workspace_free(w1);
  gsl_integration_cquad_workspace_free(w2);
  bl_quad_free(q);
}

/* Its contract: bad angles refused, 0 beyond the end point. */
Test(ebdk, full_contract) {
  bl_ebrems e;
  double v = 1.0;
  cr_assert_eq(bl_ebrems_init(&e, bl_particle_find("muon"), 1e3), 0);
  cr_expect_eq(bl_ebrems_full(&e, -1.0, 0.1, 0.1, 0.0, &v), BL_EDOMAIN);
  cr_expect_eq(v, 0.0);
  cr_expect_eq(bl_ebrems_full(&e, 1.0, 4.0, 0.1, 0.0, &v), BL_EDOMAIN);
  cr_expect_eq(bl_ebrems_full(&e, 1.0, 0.1, -0.1, 0.0, &v), BL_EDOMAIN);
  cr_expect_eq(bl_ebrems_full(&e, 1.0, 0.1, 0.1, NAN, &v), BL_EDOMAIN);
  cr_expect_eq(bl_ebrems_full(&e, 1.2 * bl_ebrems_kmax(&e), 0.0, 0.0, 0.0,
                              &v), BL_SUCCESS);
  cr_expect_eq(v, 0.0);
  /* a muon cannot go backwards off an electron at rest, nor beyond its
  ** largest angle ~ m_e / m_mu */
  cr_expect_eq(bl_ebrems_full(&e, 1.0, 0.01, 2.0, 0.0, &v), BL_SUCCESS);
  cr_expect_eq(v, 0.0);
  cr_expect_eq(bl_ebrems_full(&e, 1.0, 0.01, 0.05, 0.0, &v), BL_SUCCESS);
  cr_expect_eq(v, 0.0);
}


TestSuite(ebbind, .init = setup);

/* A model whose S(q)/Z is 1 at every q (one Yukawa term, b = 0): binding
** by it must leave every value unchanged, bit for bit. */
static int unit_incoherent (int Z, const double *p, bl_yukawa *out) {
  (void)Z;
  (void)p;
  out->n = 1;
  out->alpha[0] = 1.0;
  out->b[0] = 0.0;
  return BL_SUCCESS;
}

static const bl_model unit_model = {
  999, "unit", "S(q) = Z (test only)", {NULL, NULL, NULL, NULL}, 0, NULL,
  NULL, NULL, unit_incoherent
};

/* Binding off for S -> Z gives the free result exactly (the weight is
** S/Z = q^2 / q^2 = 1; the map scales are unchanged): dsigma/dk, the
** angular distribution and the fully differential value, e- at 1 MeV and
** 1 GeV, mu at 10 GeV, e+ at 10 MeV; and clearing the binding (Z = 0)
** gives the free result back. */
Test(ebbind, unit_s_is_free) {
  static const struct { const char *name; double T; } pts[] = {
    {"electron", 1.0}, {"electron", 1000.0}, {"muon", 1e4}, {"positron", 10.0}};
  bl_quad *q = bl_quad_alloc(200);
  size_t i;
  cr_assert_not_null(q);
  cr_assert_eq(bl_quad_set_rtol(q, 1e-2), 0);
  for (i = 0; i < sizeof pts / sizeof pts[0]; i++) {
    bl_ebrems f, b;
    bl_result rf, rb;
    double k, vf, vb;
    const bl_particle *p = bl_particle_find(pts[i].name);
    cr_assert_eq(bl_ebrems_init(&f, p, pts[i].T), 0);
    cr_assert_eq(bl_ebrems_init(&b, p, pts[i].T), 0);
    cr_assert_eq(bl_ebrems_set_binding(&b, 26, &unit_model, NULL), 0);
    k = 0.4 * bl_ebrems_kmax(&f);
    cr_assert_eq(bl_ebrems_dk_e(&f, k, q, &rf), BL_SUCCESS);
    cr_assert_eq(bl_ebrems_dk_e(&b, k, q, &rb), BL_SUCCESS);
    cr_expect(rf.val == rb.val && rf.err == rb.err,
              "%s T=%g: dsigma/dk free %.17g, S = Z %.17g", pts[i].name,
              pts[i].T, rf.val, rb.val);
    cr_assert_eq(bl_ebrems_angular_e(&f, k, 0.01, q, &rf), BL_SUCCESS);
    cr_assert_eq(bl_ebrems_angular_e(&b, k, 0.01, q, &rb), BL_SUCCESS);
    cr_expect(rf.val == rb.val, "%s T=%g: angular %.17g vs %.17g",
              pts[i].name, pts[i].T, rf.val, rb.val);
    cr_assert_eq(bl_ebrems_point(&f, k, 0.01, 0.3, 0.5, &vf), BL_SUCCESS);
    cr_assert_eq(bl_ebrems_point(&b, k, 0.01, 0.3, 0.5, &vb), BL_SUCCESS);
    cr_expect(vf == vb && vf > 0.0, "%s T=%g: point %.17g vs %.17g",
              pts[i].name, pts[i].T, vf, vb);
    /* a real model, then off again */
    cr_assert_eq(bl_ebrems_set_binding(&b, 26, bl_model_find("thomas-fermi"),
                                       NULL), 0);
    cr_assert_eq(bl_ebrems_point(&b, k, 0.01, 0.3, 0.5, &vb), BL_SUCCESS);
    cr_expect(vb < vf, "%s T=%g: bound point %g not below free %g",
              pts[i].name, pts[i].T, vb, vf);
    cr_assert_eq(bl_ebrems_set_binding(&b, 0, NULL, NULL), 0);
    cr_assert_eq(bl_ebrems_dk_e(&b, k, q, &rb), BL_SUCCESS);
    cr_assert_eq(bl_ebrems_dk_e(&f, k, q, &rf), BL_SUCCESS);
    cr_expect(rf.val == rb.val, "%s T=%g: cleared %.17g vs free %.17g",
              pts[i].name, pts[i].T, rb.val, rf.val);
  }
  bl_quad_free(q);
}

/* The weight itself: S(q)/Z of the model at the struck electron's lab
** momentum |p4| (for e- e- the slower electron's), against the model's
** Yukawa form evaluated here from the lab momenta of the point. */
Test(ebbind, weight_is_s_over_z) {
  static const char *const names[] = {"electron", "muon", "positron"};
  const bl_model *tf = bl_model_find("thomas-fermi");
  unsigned seed = 23;
  size_t i;
  for (i = 0; i < 3; i++) {
    bl_ebrems c;
    bl_yukawa y;
    double p[8];
    int n, j;
    cr_assert_eq(bl_ebrems_init(&c, bl_particle_find(names[i]), 0.5), 0);
    cr_assert_eq(bl_ebrems_set_binding(&c, 13, tf, NULL), 0);
    bl_model_defaults(tf, p);
    cr_assert_eq(tf->incoherent(13, p, &y), BL_SUCCESS);
    for (n = 0; n < 20; n++) {
      bl_ebpoint x;
      double q4, q3, qq, w = 0.0;
      cr_assert_eq(random_point(&c, &seed, &x), 0);
      q4 = sqrt(x.p[3][1] * x.p[3][1] + x.p[3][2] * x.p[3][2]
                + x.p[3][3] * x.p[3][3]);
      q3 = sqrt(x.p[2][1] * x.p[2][1] + x.p[2][2] * x.p[2][2]
                + x.p[2][3] * x.p[2][3]);
      qq = (c.kind == BL_EBREMS_ELECTRON ? fmin(q3, q4) : q4) * BL_ME_MEV;
      for (j = 0; j < y.n; j++)
        w += y.alpha[j] * qq * qq / (y.b[j] * y.b[j] + qq * qq);
      EXPECT_REL(bl_eb_binding(&c, &x), w, 1e-9, "%s point %d (q = %g MeV)",
                 names[i], n, qq);
    }
  }
}

/* The end point is unchanged by binding: hydrogen (Hartree-Fock S) at
** 10 keV, 100 keV, 1 MeV: the same k_max, exactly 0 above, positive just
** below (the forward photon) and no more than 1.001 times the free value
** there (S/Z <= 1; the fit may overshoot by its own error). */
Test(ebbind, end_point_unchanged) {
  static const double Ts[] = {0.01, 0.1, 1.0};
  bl_quad *q = bl_quad_alloc(100);
  int i;
  cr_assert_not_null(q);
  cr_assert_eq(bl_quad_set_rtol(q, 1e-2), 0);
  for (i = 0; i < 3; i++) {
    bl_ebrems f, b;
    bl_result rf, rb;
    double km;
    cr_assert_eq(bl_ebrems_init(&f, bl_particle_find("electron"), Ts[i]), 0);
    b = f;
    cr_assert_eq(bl_ebrems_set_binding(&b, 1, bl_model_find("hartree-fock"),
                                       NULL), 0);
    cr_expect_eq(bl_ebrems_kmax(&b), bl_ebrems_kmax(&f));
    km = bl_ebrems_kmax(&b);
    cr_expect_eq(bl_ebrems_dk_e(&b, km * (1.0 + 1e-12), q, &rb), BL_SUCCESS);
    cr_expect(rb.val == 0.0 && rb.err == 0.0, "T=%g above k_max: %g", Ts[i],
              rb.val);
    cr_expect_eq(bl_ebrems_dk_e(&b, km * 1.5, q, &rb), BL_SUCCESS);
    cr_expect(rb.val == 0.0, "T=%g at 1.5 k_max: %g", Ts[i], rb.val);
    cr_expect_eq(bl_ebrems_dk_e(&b, km * (1.0 - 1e-3), q, &rb), BL_SUCCESS);
    cr_expect_eq(bl_ebrems_dk_e(&f, km * (1.0 - 1e-3), q, &rf), BL_SUCCESS);
    cr_expect(rb.val > 0.0 && rb.val <= 1.001 * rf.val,
              "T=%g just below k_max: bound %g, free %g", Ts[i], rb.val,
              rf.val);
    cr_expect_eq(bl_ebrems_angular_e(&b, km * (1.0 - 1e-3), 0.5, q, &rb), 0);
    cr_expect(rb.val == 0.0, "T=%g at 0.5 rad just below k_max: %g", Ts[i],
              rb.val);
  }
  bl_quad_free(q);
}

/* High-energy limit: e- at 100 GeV on the bound electrons of carbon and
** lead (Thomas-Fermi S, whose complete-screening constant is Tsai's
** L'_rad by construction, src/core/models/thomas_fermi.c), per electron,
** against the project's form of Tsai's complete-screening electron term
** (Tsai 1974, Rev. Mod. Phys. 46, 815, eq. (3.83): the Z L'_rad and Z/9
** parts; bl_complete_dk_e with electrons on minus off, over Z), y = 0.1
** and 0.5 of y_max (away from the end point).  Issue 13 asks for 1 %;
** measured: 2e-4 (C, y = 0.1), 5e-4 (C, y = 0.5), see DEVELOPERS.md. */
Test(ebbind, tsai_complete_screening_100gev) {
  static const struct { int Z; double y; } pts[] = {{6, 0.1}, {6, 0.5},
                                                   {82, 0.5}};
  const bl_particle *e = bl_particle_find("electron");
  const bl_model *tf = bl_model_find("thomas-fermi");
  bl_quad *q = bl_quad_alloc(400);
  size_t i;
  cr_assert_not_null(q);
  cr_assert_eq(bl_quad_set_rtol(q, 1e-3), 0);
  for (i = 0; i < sizeof pts / sizeof pts[0]; i++) {
    bl_ebrems c;
    bl_case on, off;
    bl_opts o1 = bl_opts_default, o0 = bl_opts_default;
    bl_result r, ra, rb;
    double k;
    o1.electrons = 1;
    o0.electrons = 0;
    cr_assert_eq(bl_ebrems_init(&c, e, 1e5), BL_SUCCESS);
    cr_assert_eq(bl_ebrems_set_binding(&c, pts[i].Z, tf, NULL), BL_SUCCESS);
    cr_assert_eq(bl_case_setup(&on, e, pts[i].Z, tf, NULL, 1e5, &o1), 0);
    cr_assert_eq(bl_case_setup(&off, e, pts[i].Z, tf, NULL, 1e5, &o0), 0);
    k = pts[i].y * bl_ebrems_kmax(&c);
    cr_assert_eq(bl_ebrems_dk_e(&c, k, q, &r), BL_SUCCESS);
    cr_assert_eq(bl_complete_dk_e(&on, k, &ra), BL_SUCCESS);
    cr_assert_eq(bl_complete_dk_e(&off, k, &rb), BL_SUCCESS);
    EXPECT_REL(r.val, (ra.val - rb.val) / pts[i].Z, 1e-2,
               "Z=%d y=%g: bound e- e- vs Tsai's electron term per electron",
               pts[i].Z, pts[i].y);
  }
  bl_quad_free(q);
}

/* Bad input: Z outside 0..BL_ZMAX, a model without S(q); c unchanged. */
Test(ebbind, bad_input) {
  bl_ebrems c, d;
  cr_assert_eq(bl_ebrems_init(&c, bl_particle_find("electron"), 1.0), 0);
  d = c;
  cr_expect_eq(bl_ebrems_set_binding(&c, -1, bl_model_find("thomas-fermi"),
                                     NULL), BL_EDOMAIN);
  cr_expect_eq(bl_ebrems_set_binding(&c, BL_ZMAX + 1,
                                     bl_model_find("thomas-fermi"), NULL),
               BL_EDOMAIN);
  cr_expect_eq(bl_ebrems_set_binding(&c, 6, bl_model_find("none"), NULL),
               BL_EMODEL);
  cr_expect_eq(bl_ebrems_set_binding(NULL, 6, bl_model_find("none"), NULL),
               BL_EDOMAIN);
  cr_expect(c.Z == d.Z && c.inc.n == d.inc.n, "c changed by a refused call");
}

/* ================================================================== */
/* ebwire: the bound electron term as electrons = true gives it for e-/e+
** in every method (bl_case_eratio, the table of src/core/ebrems/table.c,
** generated by scripts/fit-ebrems.c; DEVELOPERS.md, "Wired in"). */
TestSuite(ebwire, .init = setup);

/* The interpolation error between nodes: measured 4e-4 ... 1.5e-2 at these
** points; over 300 random points with R > 0.1, 90 % within 1 %, worst
** 4.4 % (DEVELOPERS.md, "Wired in"). */
#define EBW_TOL 2e-2

/* The ratio as the generator defines it, computed afresh: the bound
** electron term (Hartree-Fock S(q)/Z, per atomic electron) over the Born
** static electron term alone (elastic part removed), per atomic electron. */
static double fresh_ratio_r (const bl_particle *p, int Z, double T,
                             double u, int radiate, bl_quad *q) {
  const bl_model *hf = bl_model_find("hartree-fock");
  bl_ebrems e;
  bl_case ce;
  bl_opts o = bl_opts_default;
  bl_result re, rs;
  int t;
  o.coulomb = o.elwert = BL_APPLY_OFF;
  cr_assert_eq(bl_ebrems_init(&e, p, T), 0);
  cr_assert_eq(bl_ebrems_set_binding(&e, Z, hf, NULL), 0);
  e.radiate = radiate;
  cr_assert_eq(bl_case_setup(&ce, p, Z, hf, NULL, T, &o), 0);
  ce.ebt = 0;
  for (t = 0; t < ce.npole; t++)
    ce.single_el[t] = 0.0;
  for (t = 0; t < ce.nelastic; t++)
    ce.term[t].c = 0.0;
  cr_assert_eq(bl_ebrems_dk_e(&e, u * bl_ebrems_kmax(&e), q, &re), 0);
  cr_assert_eq(bl_dcs_dk_e(&ce, u * bl_ebrems_kmax(&e), q, &rs), 0);
  return re.val / (rs.val / Z);
}

static double fresh_ratio_p (const bl_particle *p, int Z, double T,
                             double u, bl_quad *q) {
  return fresh_ratio_r(p, Z, T, u, BL_EBREMS_RAD_BOTH, q);
}

static double fresh_ratio (const char *name, int Z, double T, double u,
                           bl_quad *q) {
  return fresh_ratio_p(bl_particle_find(name), Z, T, u, q);
}

static double table_ratio_p (const bl_particle *p, int Z, double T,
                             double u) {
  bl_case c;
  cr_assert_eq(bl_case_setup(&c, p, Z, bl_model_find("hartree-fock"), NULL,
                             T, &bl_opts_default), 0);
  cr_assert_neq(c.ebt, 0);
  return bl_case_eratio(&c, u * c.ekmax);
}

static double table_ratio (const char *name, int Z, double T, double u) {
  return table_ratio_p(bl_particle_find(name), Z, T, u);
}

/* Spot checks of the generated table against fresh integrals: a node
** (what the generator wrote, within the integrals' tolerance) and points
** between nodes in every direction (T, u, Z), e- and e+ (the
** interpolation error; DEVELOPERS.md states the measured worst). */
/* A table point against a fresh integral at rtol 1e-3, within tol. */
typedef struct { const char *name; int Z; double T, u, tol; } ebpoint;

static void spot_check (const ebpoint *pts, size_t n) {
  bl_quad *q = bl_quad_alloc(200);
  size_t i;
  cr_assert_not_null(q);
  cr_assert_eq(bl_quad_set_rtol(q, 1e-3), 0);
  for (i = 0; i < n; i++) {
    double want = fresh_ratio(pts[i].name, pts[i].Z, pts[i].T, pts[i].u, q);
    double got = table_ratio(pts[i].name, pts[i].Z, pts[i].T, pts[i].u);
    cr_expect(fabs(got - want) <= pts[i].tol * fabs(want),
              "%s Z=%d T=%g u=%g: table %.6g, fresh %.6g (%.2e)",
              pts[i].name, pts[i].Z, pts[i].T, pts[i].u, got, want,
              fabs(got - want) / fabs(want));
  }
  bl_quad_free(q);
}

Test(ebwire, table_against_fresh_integrals, .timeout = 120) {
  static const ebpoint pts[] = {
    {"electron", 8, 1.0, 0.45, 4e-3},      /* a node */
    {"electron", 8, 0.5, 0.4, EBW_TOL},
    {"positron", 29, 2.0, 0.7, EBW_TOL},
    {"electron", 1, 0.02, 0.25, EBW_TOL},
    {"electron", 82, 5.0, 0.92, EBW_TOL},
    {"electron", 6, 30.0, 0.1, EBW_TOL},
    {"positron", 8, 0.005, 0.55, EBW_TOL}};
  spot_check(pts, sizeof pts / sizeof pts[0]);
}

/* Continuity: no step at any node or edge of the table (Z nodes, T nodes,
** the top of the table and the end of the blend, the u nodes, the end
** point): the ratio on both sides of each, 1e-9 apart, within 1e-6. */
/* The ratio of `kind` either side of each (T, u) of Ts x us and each Z of
** Zs, a relative eps apart: within tol, absolute (rel = 0) or relative to
** the value, which must then be positive (rel = 1); and Z against Z + 1
** for Z = 1 ... 99 at (tz, uz) within 2 % (linear in ln Z between nodes). */
static void continuity_p (const bl_particle *p, const double *Ts,
                          size_t nt, const double *us, size_t nu,
                          double eps, double tol, int rel, double tz,
                          double uz) {
  static const int Zs[] = {1, 7, 8, 9, 81, 82, 83};
  size_t i, j, l;
  for (i = 0; i < nt; i++)
    for (j = 0; j < nu; j++)
      for (l = 0; l < sizeof Zs / sizeof Zs[0]; l++) {
        double a = table_ratio_p(p, Zs[l], Ts[i] * (1 - eps),
                                 us[j] * (1 - eps));
        double b = table_ratio_p(p, Zs[l], Ts[i] * (1 + eps),
                                 us[j] * (1 + eps));
        cr_expect((!rel || a > 0.0)
                  && fabs(a - b) <= tol * (rel ? fabs(a) : 1.0),
                  "%s Z=%d T=%g u=%g: %.9g vs %.9g", p->name, Zs[l], Ts[i],
                  us[j], a, b);
      }
  for (l = 1; l < 100; l++) {
    double a = table_ratio_p(p, (int)l, tz, uz);
    double b = table_ratio_p(p, (int)l + 1, tz, uz);
    cr_expect(fabs(a - b) <= 0.02 * a, "%s Z=%zu..%zu: %g vs %g", p->name,
              l, l + 1, a, b);
  }
}

static void continuity (const char *kind, const double *Ts, size_t nt,
                        const double *us, size_t nu, double eps, double tol,
                        int rel, double tz, double uz) {
  continuity_p(bl_particle_find(kind), Ts, nt, us, nu, eps, tol, rel, tz,
               uz);
}

Test(ebwire, continuous_everywhere) {
  static const double Ts[] = {1e-3, 0.1, 1.0, 1e3, 1e5, 3e3};
  static const double us[] = {0.02, 0.3, 0.87, 0.997, 0.999};
  continuity("electron", Ts, sizeof Ts / sizeof Ts[0], us,
             sizeof us / sizeof us[0], 1e-9, 1e-6, 0, 3.0, 0.5);
  continuity("positron", Ts, sizeof Ts / sizeof Ts[0], us,
             sizeof us / sizeof us[0], 1e-9, 1e-6, 0, 3.0, 0.5);
  /* the end point: 0 at and above k_max, positive just below */
  cr_expect(table_ratio("electron", 8, 1.0, 1.0) == 0.0);
  cr_expect(table_ratio("electron", 8, 1.0, 1.5) == 0.0);
  cr_expect(table_ratio("electron", 8, 10.0, 0.9999) > 0.0);
}

/* The end point in the methods for `name` on hydrogen at T (MeV):
** y_max = m_e / (m_e + E0 - p0), E0 - p0 = m^2 / (E0 + p0); above it the
** electron part is exactly 0 and dsigma/dk with electrons equals the
** nuclear part (electrons = false) to the integration tolerance, below it
** the electrons add; no static-charge warning. */
static void end_point_hydrogen (const char *name, double T, bl_quad *q) {
  static const double over[] = {0.1, 0.5, 0.9};
  const bl_particle *p = bl_particle_find(name);
  const bl_model *hf = bl_model_find("hartree-fock");
  bl_case on, off;
  bl_opts o0 = bl_opts_default;
  bl_result ron, roff;
  double M = p->mass, e0 = T + M, p0 = sqrt(T * (T + 2 * M));
  double ymax = BL_ME_MEV / (BL_ME_MEV + M * M / (e0 + p0));
  int j;
  o0.electrons = 0;
  cr_assert_eq(bl_case_setup(&on, p, 1, hf, NULL, T, &bl_opts_default), 0);
  cr_assert_eq(bl_case_setup(&off, p, 1, hf, NULL, T, &o0), 0);
  EXPECT_REL(on.ekmax / T, ymax, 1e-12, "%s T=%g: y_max", name, T);
  cr_expect(!(on.warn & BL_WARN_STATIC_E), "%s T=%g: no static warning",
            name, T);
  for (j = 0; j < 3; j++) {
    double k = (ymax + over[j] * (1.0 - ymax)) * T;
    cr_expect_eq(bl_case_eratio(&on, k), 0.0);
    cr_expect_eq(bl_dcs_dk_e(&on, k, q, &ron), BL_SUCCESS);
    cr_expect_eq(bl_dcs_dk_e(&off, k, q, &roff), BL_SUCCESS);
    EXPECT_REL(ron.val, roff.val, 1e-7, "%s T=%g y=%g above y_max", name, T,
               k / T);
  }
  cr_expect_eq(bl_dcs_dk_e(&on, 0.5 * ymax * T, q, &ron), 0);
  cr_expect_eq(bl_dcs_dk_e(&off, 0.5 * ymax * T, q, &roff), 0);
  cr_expect(ron.val > roff.val * 1.01, "%s T=%g below y_max: %g vs %g",
            name, T, ron.val, roff.val);
}

/* e- at 10 keV, 100 keV, 1 MeV (y_max 0.55, 0.65, 0.85). */
Test(ebwire, end_point_hydrogen_nuclear_unchanged) {
  static const double Ts[] = {0.01, 0.1, 1.0};
  bl_quad *q = bl_quad_alloc(400);
  int i;
  cr_assert_not_null(q);
  cr_assert_eq(bl_quad_set_rtol(q, 1e-8), 0);
  for (i = 0; i < 3; i++)
    end_point_hydrogen("electron", Ts[i], q);
  bl_quad_free(q);
}

/* Every method carries the same electron factor: high-energy against Born
** at 10 GeV and 30 GeV on carbon, the electron part alone
** (electrons on minus off), y = 0.3; and a muon keeps the static term
** with its warning. */
Test(ebwire, every_method_and_the_warning) {
  const bl_particle *e = bl_particle_find("electron");
  const bl_model *hf = bl_model_find("hartree-fock");
  static const double Ts[] = {1e4, 3e4};
  bl_quad *q = bl_quad_alloc(400);
  bl_case c;
  int i;
  cr_assert_not_null(q);
  cr_assert_eq(bl_quad_set_rtol(q, 1e-6), 0);
  for (i = 0; i < 2; i++) {
    bl_case on, off;
    bl_opts o1 = bl_opts_default, o0 = bl_opts_default;
    bl_he hon, hoff;
    bl_result bon, boff, hn, hf_;
    double k = 0.3 * Ts[i];
    o1.coulomb = o1.elwert = BL_APPLY_OFF;
    o1.nucleus = BL_NUCLEUS_POINT;
    o0 = o1;
    o0.electrons = 0;
    cr_assert_eq(bl_case_setup(&on, e, 6, hf, NULL, Ts[i], &o1), 0);
    cr_assert_eq(bl_case_setup(&off, e, 6, hf, NULL, Ts[i], &o0), 0);
    cr_assert_eq(bl_he_prepare(&on, q, &hon), 0);
    cr_assert_eq(bl_he_prepare(&off, q, &hoff), 0);
    cr_assert_eq(bl_dcs_dk_e(&on, k, q, &bon), 0);
    cr_assert_eq(bl_dcs_dk_e(&off, k, q, &boff), 0);
    cr_assert_eq(bl_he_dk_e(&on, &hon, k, &hn), 0);
    cr_assert_eq(bl_he_dk_e(&off, &hoff, k, &hf_), 0);
    /* the high-energy method holds to 1e-3 of the total (bl_method.h) */
    EXPECT_REL(hn.val - hf_.val, bon.val - boff.val, 1e-3 * bon.val
               / (bon.val - boff.val) + 1e-3,
               "T=%g: electron part, high-energy vs Born", Ts[i]);
    cr_expect(bl_case_eratio(&on, k) < 1.0 && bl_case_eratio(&on, k) > 0.98,
              "T=%g: ratio %g", Ts[i], bl_case_eratio(&on, k));
    bl_he_release(&hon);
    bl_he_release(&hoff);
  }
  /* hadrons have the table of other projectiles since (ebt 5; before:
  ** the static term with BL_WARN_STATIC_E, which is now kept for masses
  ** below its first node, 100 MeV, only): 0 above their end point, which
  ** for a 10 GeV proton is 125 MeV; muons have their table (test muon_*
  ** below) */
  cr_assert_eq(bl_case_setup(&c, bl_particle_find("proton"), 6, hf, NULL,
                             1e4, &bl_opts_default), 0);
  cr_expect(c.ebt == 5 && !(c.warn & BL_WARN_STATIC_E), "proton: table");
  cr_expect_eq(bl_case_eratio(&c, 5e3), 0.0);
  cr_expect(bl_case_eratio(&c, 0.5 * c.ekmax) > 0.0);
  cr_assert_eq(bl_case_setup(&c, bl_particle_find("pion-"), 6, hf, NULL,
                             1e4, &bl_opts_default), 0);
  cr_expect(c.ebt == 5 && !(c.warn & BL_WARN_STATIC_E), "pion-: table");
  {
    bl_particle light = {"x", 50.0, 1.0, 0.0, 0}, heavy = {"y", 2e4, 1.0,
                                                           0.0, 0};
    cr_assert_eq(bl_case_setup(&c, &light, 6, hf, NULL, 1e3,
                               &bl_opts_default), 0);
    cr_expect(c.ebt == 0 && (c.warn & BL_WARN_STATIC_E), "50 MeV: static");
    cr_assert_eq(bl_case_setup(&c, &heavy, 6, hf, NULL, 1e4,
                               &bl_opts_default), 0);
    cr_expect(c.ebt == 5 && c.ebexact && !(c.warn & BL_WARN_ERANGE),
              "20 GeV: outside the table, dsigma/dk exact");
    cr_assert_eq(bl_case_setup(&c, &heavy, 6, hf, NULL, 2e7,
                               &bl_opts_default), 0);
    cr_expect(c.ebt == 5 && !c.ebexact && (c.warn & BL_WARN_ERANGE),
              "20 GeV at 20 TeV: held, warned");
  }
  cr_assert_eq(bl_case_setup(&c, bl_particle_find("muon"), 6, hf, NULL, 1e4,
                             &bl_opts_default), 0);
  cr_expect(c.ebt == 3 && !(c.warn & BL_WARN_STATIC_E), "muon: the table");
  cr_assert_eq(bl_case_setup(&c, bl_particle_find("antimuon"), 6, hf, NULL,
                             1e4, &bl_opts_default), 0);
  cr_expect(c.ebt == 4 && !(c.warn & BL_WARN_STATIC_E), "antimuon");
  cr_assert_eq(bl_case_setup(&c, bl_particle_find("positron"), 6, hf, NULL,
                             1e4, &bl_opts_default), 0);
  cr_expect(c.ebt == 2 && !(c.warn & BL_WARN_STATIC_E), "positron");
  bl_quad_free(q);
}

/* ------------------------------------------------------------------ */
/* Muons: the table of eb_table_mu.c (scripts/fit-ebrems.c -u;
** DEVELOPERS.md, "Muons").  The interpolation error between nodes:
** measured 1e-4 ... 8e-3 at these points but 4.0e-2 at 30 MeV, u = 0.27
** (below 50 MeV ln R bends between the T nodes); over 160 random points
** median 2e-3, 90 % within 1 %, worst 4.4 % (DEVELOPERS.md). */
#define EBM_TOL 5e-2

Test(ebwire, muon_table_against_fresh_integrals, .timeout = 240) {
  static const ebpoint pts[] = {
    {"muon", 8, 100.0, 0.35, 5e-3},           /* a node */
    {"antimuon", 20, 1e4, 0.015, 5e-3},       /* a node */
    {"muon", 29, 30.0, 0.27, EBM_TOL},
    {"antimuon", 6, 300.0, 0.6, EBM_TOL},
    {"muon", 1, 3000.0, 0.02, EBM_TOL},
    {"antimuon", 82, 5.0, 0.9, EBM_TOL},
    {"muon", 50, 1.5e5, 0.45, EBM_TOL},
    {"muon", 13, 2e4, 0.003, EBM_TOL},
    {"antimuon", 3, 700.0, 0.97, EBM_TOL}};
  spot_check(pts, sizeof pts / sizeof pts[0]);
}

/* Continuity of the muon table: both sides of every kind of node and edge
** (the bottom 1 MeV, T nodes, the top 10 TeV and the end of the blend at
** 100 TeV, the first and last u nodes and the power-law stretch beyond,
** Z nodes), 1e-10 apart, within 1e-6 relative (R spans 1e-6 ... 3e4). */
/* Other projectiles (ebt 5): the table's three charge parts at charge +1,
** R = R_P + R_I/z + R_E/z^2, against fresh integrals of the particle
** itself (its own charge, all diagrams): presets between the mass nodes,
** an antiproton (z = -1) and a charge-2 spin-0 particle between nodes in
** mass, tau and Z (internal consistency with bl_ebrems; tolerance 5 %,
** as for muons: DEVELOPERS.md, "Other projectiles"). */
Test(ebwire, other_table_against_fresh_integrals, .timeout = 240) {
  bl_particle pbar = {"antiproton", 938.272, -1.0, 0.5, 0};
  bl_particle two = {"two", 2000.0, 2.0, 0.0, 0};
  struct { const bl_particle *p; int Z; double T, u; } pts[] = {
    {NULL, 6, 938.272, 0.1}, {NULL, 1, 13817.4, 0.5}, {NULL, 8, 500.0, 0.3},
    {&pbar, 6, 2000.0, 0.2}, {&two, 6, 3000.0, 0.3}, {&two, 30, 700.0, 0.6}};
  const char *names[3] = {"proton", "pion+", "kaon-"};
  bl_quad *q = bl_quad_alloc(200);
  size_t i;
  bl_quad_set_rtol(q, 1e-3);
  for (i = 0; i < sizeof pts / sizeof pts[0]; i++) {
    const bl_particle *p = i < 3 ? bl_particle_find(names[i]) : pts[i].p;
    bl_case c;
    double fresh = fresh_ratio_p(p, pts[i].Z, pts[i].T, pts[i].u, q), got;
    cr_assert_eq(bl_case_setup(&c, p, pts[i].Z, bl_model_find("hartree-fock"),
                               NULL, pts[i].T, &bl_opts_default), 0);
    cr_assert_eq(c.ebt, 5);
    got = bl_case_eratio(&c, pts[i].u * c.ekmax);
    cr_expect(fabs(got / fresh - 1.0) < 0.05, "%s Z=%d T=%g u=%g: table %g "
              "fresh %g", p->name, pts[i].Z, pts[i].T, pts[i].u, got, fresh);
  }
  bl_quad_free(q);
}

/*
** The top of the table of other projectiles: a mass row's first tau node
** whose T = M tau reaches 10 TeV holds the values at 10 TeV, so it stands
** at tau = 10 TeV / M in the interpolation (table.c, tau_stencil).  At the
** mass node 3.16 GeV (no mass interpolation), spin 0, O, u = 0.03, against
** fresh integrals (internal consistency with bl_ebrems): measured within
** 8e-4 at 3-9.9 TeV; with the node at its own tau (14.7 TeV) -3.1 %, +7 %,
** +14 %, +21 % at 5, 8, 9, 9.9 TeV.  Tolerance 1 %.
*/
Test(ebwire, other_table_top_node, .timeout = 120) {
  static const double Ts[] = {5e6, 8e6, 9.9e6};
  bl_particle p = {"probe", 3162.2776601683795, 1.0, 0.0, 0};
  bl_quad *q = bl_quad_alloc(200);
  size_t i;
  bl_quad_set_rtol(q, 1e-3);
  for (i = 0; i < sizeof Ts / sizeof Ts[0]; i++) {
    bl_case c;
    double fresh = fresh_ratio_p(&p, 8, Ts[i], 0.03, q), got;
    cr_assert_eq(bl_case_setup(&c, &p, 8, bl_model_find("hartree-fock"),
                               NULL, Ts[i], &bl_opts_default), 0);
    got = bl_case_eratio(&c, 0.03 * c.ekmax);
    cr_expect(fabs(got / fresh - 1.0) < 0.01, "T=%g: table %g fresh %g",
              Ts[i], got, fresh);
  }
  bl_quad_free(q);
}


/*
** The projectile's radiation alone (opts.eradiation = BL_ERAD_PROJECTILE,
** the muon-physics convention): muons take R_P of the table of other
** projectiles, at their mass, 5.7 % above its first mass node; against
** fresh integrals of the same subset (bl_ebrems.radiate = projectile).
** Measured (DEVELOPERS.md, "Muons: the projectile's radiation alone"): 0.12
** % at the median over Z = 1, 11, 26, 3 MeV - 10 TeV, u = 1e-4 - 0.99,
** worst 3.3 % (Fe at 3 MeV, between the Z nodes 8 and 82), so 4 %; below
** the first u node (1e-3) held, 2.3 % at worst.  The full R is 1.3-10^4
** times larger at these points, so a case that ignored the option fails.
** A proton's R_P comes from the same rows; e-/e+ are refused.
*/
Test(ebwire, projectile_radiation_alone, .timeout = 120) {
  static const struct { const char *name; int Z; double T, u; } pts[] = {
    {"muon", 1, 300.0, 0.1}, {"antimuon", 11, 1e4, 0.5},
    {"muon", 26, 1e5, 0.9}, {"muon", 26, 3.0, 0.01},
    {"muon", 11, 1e4, 1e-4}, {"muon", 6, 1e6, 0.3},
    {"proton", 6, 938.272, 0.1}, {"proton", 26, 3e4, 1e-4}};
  const bl_model *hf = bl_model_find("hartree-fock");
  bl_quad *q = bl_quad_alloc(200);
  bl_opts o = bl_opts_default;
  bl_case c;
  size_t i;
  o.eradiation = BL_ERAD_PROJECTILE;
  bl_quad_set_rtol(q, 1e-3);
  for (i = 0; i < sizeof pts / sizeof pts[0]; i++) {
    const bl_particle *p = bl_particle_find(pts[i].name);
    double fresh = fresh_ratio_r(p, pts[i].Z, pts[i].T, pts[i].u,
                                 BL_EBREMS_RAD_PROJECTILE, q), got;
    cr_assert_eq(bl_case_setup(&c, p, pts[i].Z, hf, NULL, pts[i].T, &o), 0);
    cr_assert_eq(c.ebt, 5);
    got = bl_case_eratio(&c, pts[i].u * c.ekmax);
    cr_expect(fabs(got / fresh - 1.0) < 0.04, "%s Z=%d T=%g u=%g: R_P %g, "
              "fresh %g", p->name, pts[i].Z, pts[i].T, pts[i].u, got, fresh);
    cr_expect_eq(bl_case_eheld_k(&c), 0.0, "%s: held flagged", p->name);
  }
  cr_expect_eq(bl_case_setup(&c, bl_particle_find("electron"), 6, hf, NULL,
                             10.0, &o), BL_EDOMAIN);
  cr_expect_eq(bl_case_setup(&c, bl_particle_find("positron"), 6, hf, NULL,
                             10.0, &o), BL_EDOMAIN);
  o.electrons = 0;   /* no electron term: nothing to separate */
  cr_expect_eq(bl_case_setup(&c, bl_particle_find("electron"), 6, hf, NULL,
                             10.0, &o), BL_SUCCESS);
  bl_quad_free(q);
}

/*
** Outside the table of other projectiles in mass (above 10 GeV) or T/m
** (below 0.01), dsigma/dk takes the exact term at each k: the value
** equals the nuclear part (electrons off) plus Z bl_ebrems_dk_e within
** the tolerance, and the held table's value is 7-49 % higher (measured on
** C: 1.07-1.13 at 30 GeV, 1.16-1.27 at 100 GeV, 1.32-1.49 at 1 TeV), so a
** dsigma/dk that kept it fails.
*/
Test(ebwire, held_table_replaced_by_exact_term, .timeout = 120) {
  static const struct { double M, T, u; } pts[] = {
    {1e5, 1e6, 0.5}, {1e6, 1e5, 0.1}, {3e4, 3e5, 0.9}, {2e3, 10.0, 0.3}};
  const bl_model *hf = bl_model_find("hartree-fock");
  bl_quad *q = bl_quad_alloc(400);
  size_t i;
  cr_assert_not_null(q);
  cr_assert_eq(bl_quad_set_rtol(q, 1e-4), 0);
  for (i = 0; i < sizeof pts / sizeof pts[0]; i++) {
    bl_particle p = {"heavy", pts[i].M, 1.0, 0.5, 0};
    bl_opts off = bl_opts_default;
    bl_case c, cn;
    bl_ebrems e;
    bl_result r, rn, re;
    double k;
    off.electrons = 0;
    cr_assert_eq(bl_case_setup(&c, &p, 6, hf, NULL, pts[i].T,
                               &bl_opts_default), 0);
    cr_assert_eq(bl_case_setup(&cn, &p, 6, hf, NULL, pts[i].T, &off), 0);
    cr_assert(c.ebexact, "M %g T %g: not outside the table", pts[i].M,
              pts[i].T);
    k = pts[i].u * c.ekmax;
    cr_assert_eq(bl_method_dk_e(&c, NULL, BL_METHOD_BORN, k, q, &r), 0);
    cr_assert_eq(bl_method_dk_e(&cn, NULL, BL_METHOD_BORN, k, q, &rn), 0);
    cr_assert_eq(bl_ebrems_init(&e, &p, pts[i].T), 0);
    cr_assert_eq(bl_ebrems_set_binding(&e, 6, hf, NULL), 0);
    cr_assert_eq(bl_ebrems_dk_e(&e, k, q, &re), 0);
    EXPECT_REL(r.val, rn.val + 6.0 * re.val, 3e-4, "M %g T %g u %g",
               pts[i].M, pts[i].T, pts[i].u);
  }
  bl_quad_free(q);
}

/* The end point of other projectiles on hydrogen: above k_max the
** electron part is exactly 0 and the value the nuclear part's (as
** muon_end_point_hydrogen_nuclear_unchanged). */
Test(ebwire, other_end_point_hydrogen_nuclear_unchanged, .timeout = 120) {
  static const double Ts[] = {1e3, 1e4};
  bl_quad *q = bl_quad_alloc(400);
  int i;
  bl_quad_set_rtol(q, 1e-8);
  for (i = 0; i < 2; i++) {
    end_point_hydrogen("proton", Ts[i], q);
    end_point_hydrogen("pion-", Ts[i], q);
  }
  bl_quad_free(q);
}

Test(ebwire, muon_continuous_everywhere) {
  static const double Ts[] = {1.0, 10.0, 1e3, 3e4, 1e5, 1e7, 1e8};
  static const double us[] = {1e-4, 0.005, 0.35, 0.88, 0.997, 0.999};
  continuity("muon", Ts, sizeof Ts / sizeof Ts[0], us,
             sizeof us / sizeof us[0], 1e-10, 1e-6, 1, 300.0, 0.5);
  continuity("antimuon", Ts, sizeof Ts / sizeof Ts[0], us,
             sizeof us / sizeof us[0], 1e-10, 1e-6, 1, 300.0, 0.5);
  /* the end point: 0 at and above k_max, positive just below */
  cr_expect(table_ratio("muon", 8, 1e3, 1.0) == 0.0);
  cr_expect(table_ratio("antimuon", 8, 1e3, 1.5) == 0.0);
  cr_expect(table_ratio("muon", 8, 1e3, 0.9999) > 0.0);
  cr_expect(table_ratio("antimuon", 8, 1e9, 0.9999) > 0.0);
}

/* mu- and mu+ at 100 MeV, 1 GeV, 10 GeV (y_max 0.017, 0.087, 0.48). */
Test(ebwire, muon_end_point_hydrogen_nuclear_unchanged, .timeout = 120) {
  static const double Ts[] = {100.0, 1e3, 1e4};
  bl_quad *q = bl_quad_alloc(400);
  int i;
  cr_assert_not_null(q);
  cr_assert_eq(bl_quad_set_rtol(q, 1e-8), 0);
  for (i = 0; i < 3; i++) {
    end_point_hydrogen("muon", Ts[i], q);
    end_point_hydrogen("antimuon", Ts[i], q);
  }
  bl_quad_free(q);
}


/*
** The muon table is held below its first u node, where the struck
** electron's radiation keeps rising (DEVELOPERS.md, "Muons"): such points
** and integrals reaching there carry BL_WARN_EHELD from 1 GeV (at 100 MeV
** binding stops the rise: no flag), others do not; e-/e+ are not
** flagged by this bit (their table's own hold below u = 0.005 is another
** matter, not measured here).
*/
Test(ebwire, muon_held_soft_end_warned, .timeout = 120) {
  const bl_model *hf = bl_model_find("hartree-fock");
  bl_material m;
  bl_target t;
  bl_tresult r;
  bl_case c;
  bl_quad *q = bl_quad_alloc(400);
  double kh;
  int failZ;
  cr_assert_not_null(q);
  cr_assert_eq(bl_quad_set_rtol(q, 1e-3), 0);
  cr_assert_eq(bl_case_setup(&c, bl_particle_find("muon"), 6, hf, NULL, 1e4,
                             &bl_opts_default), 0);
  kh = bl_case_eheld_k(&c);
  EXPECT_REL(kh, 1e-4 * c.ekmax, 1e-12, "threshold %g", kh);
  cr_expect(bl_case_eheld(&c, 0.5 * kh) && !bl_case_eheld(&c, 2.0 * kh));
  cr_assert_eq(bl_case_setup(&c, bl_particle_find("muon"), 6, hf, NULL, 1e2,
                             &bl_opts_default), 0);
  cr_expect(bl_case_eheld_k(&c) == 0.0, "100 MeV: the hold is right there");
  cr_assert_eq(bl_case_setup(&c, bl_particle_find("electron"), 6, hf, NULL,
                             1e4, &bl_opts_default), 0);
  cr_expect(bl_case_eheld_k(&c) == 0.0 && !bl_case_eheld(&c, 1e-9));
  cr_assert_eq(bl_material_lookup(&m, "C", NULL), 0);
  cr_assert_eq(bl_target_setup(&t, bl_particle_find("muon"), &m, hf, NULL,
                               1e4, &bl_opts_default, BL_METHOD_AUTO, NULL,
                               &failZ), 0);
  cr_assert_eq(bl_target_prepare(&t, q, &failZ), 0);
  cr_assert_eq(bl_target_dk_e(&t, 0.1 * kh, q, &r), 0);
  cr_expect(r.r.warn & BL_WARN_EHELD, "below: no warning");
  cr_assert_eq(bl_target_dk_e(&t, 3.0 * kh, q, &r), 0);
  cr_expect(!(r.r.warn & BL_WARN_EHELD), "above: warned");
  cr_expect(bl_target_cross_section_e(&t, 0.1 * kh, 0.5 * kh, q, &r, NULL)
            == 0 && (r.r.warn & BL_WARN_EHELD), "integral below: no warning");
  cr_expect(bl_target_cross_section_e(&t, 2.0 * kh, 4.0 * kh, q, &r, NULL)
            == 0 && !(r.r.warn & BL_WARN_EHELD), "integral above: warned");
  cr_expect(bl_warn_text(BL_WARN_EHELD) != NULL);
  bl_target_release(&t);
  bl_quad_free(q);
}

/*
** Other projectiles (ebt 5): no step at any node or edge of their table
** (internal consistency, no outside source).  T nodes of a proton
** (tau = T/M = 0.01 ... 1e3 a decade apart: every third node, and
** BL_EBH_TAU_MIN = 0.01 below which the lowest tau row is held) and the
** 10 TeV end (BL_EBREMS_T_MAX, held above), u nodes 1e-3 (held below),
** 0.015, 0.35, 0.997 (the power law above), 0.999, at the Z nodes and Z
** against Z + 1 (the helper continuity_p); then a charge-2 spin-0
** particle at the mass node 1 GeV.  Mass nodes 10^(2 + j/2) MeV and
** BL_EBH_M_MAX = 10 GeV (the scaled parts held above): a mass a relative
** 1e-10 either side, spin 0 and 1/2, z = 1, -1, 2, at fixed T.  The
** four-point Lagrange stencils meet at the nodes, so each step is the
** slope times 2e-10.  Measured: mass nodes at most 7.5e-10 relative; T,
** u and Z nodes below 1e-8 except at u = 0.997 and 0.999, where R falls
** as (1 - u)^p and the shift in u is 2e-7 (u = 0.999) of 1 - u: up to
** 5e-7.  Tolerance 1e-6, as for muons; the mutant power law anchored at
** the second last u node fails it (84 assertions).  Below BL_EBH_M_MIN = 100 MeV there is no table: the
** static term (ebt 0), a documented switch, checked as such.
*/
Test(ebwire, other_continuous_everywhere, .timeout = 120) {
  static const double taus[] = {0.01, 0.1, 1.0, 10.0, 1e3};
  static const double us[] = {1e-3, 0.015, 0.35, 0.997, 0.999};
  static const double Ms[] = {100.0, 316.22776601683796, 1e3,
                              3162.2776601683795, 1e4};
  static const double mtau[] = {0.01, 0.3, 30.0, 400.0};
  static const double mu_[] = {0.004, 0.2, 0.95};
  static const double zs[] = {1.0, -1.0, 2.0};
  const bl_particle *pr = bl_particle_find("proton");
  bl_particle two = {"two", 1e3, 2.0, 0.0, 0};
  double Ts[6], eps = 1e-10, worst = 0.0;
  size_t i, j, l, s, q;
  bl_case c;
  for (i = 0; i < 5; i++)
    Ts[i] = taus[i] * pr->mass;
  Ts[5] = BL_EBREMS_T_MAX;
  continuity_p(pr, Ts, 6, us, 5, eps, 1e-6, 1, 2000.0, 0.5);
  for (i = 0; i < 5; i++)
    Ts[i] = taus[i] * two.mass;
  continuity_p(&two, Ts, 6, us, 5, eps, 1e-6, 1, 2000.0, 0.5);
  for (i = 0; i < sizeof Ms / sizeof Ms[0]; i++)
    for (s = 0; s < 2; s++)
      for (q = 0; q < 3; q++)
        for (j = 0; j < sizeof mtau / sizeof mtau[0]; j++)
          for (l = 0; l < sizeof mu_ / sizeof mu_[0]; l++) {
            bl_particle lo = {"lo", Ms[i] * (1 - (i > 0) * eps), zs[q],
                              0.5 * s, 0};   /* none below the first */
            bl_particle hi = {"hi", Ms[i] * (1 + eps), zs[q], 0.5 * s, 0};
            double T = fmin(mtau[j] * Ms[i], BL_EBREMS_T_MAX);
            double a = table_ratio_p(&lo, 26, T, mu_[l]);
            double b = table_ratio_p(&hi, 26, T, mu_[l]);
            worst = fmax(worst, fabs(a - b) / a);
            cr_expect(a > 0.0 && fabs(a - b) <= 1e-6 * a, "M=%g spin %zu/2 "
                      "z=%g T=%g u=%g: %.12g vs %.12g", Ms[i], s, zs[q], T,
                      mu_[l], a, b);
          }
  cr_log_info("other projectiles, mass nodes: worst step %.2e", worst);
  /* below the first mass node: the static electron term, no table */
  two.mass = BL_EBH_M_MIN * (1 - eps);
  cr_assert_eq(bl_case_setup(&c, &two, 26, bl_model_find("hartree-fock"),
                             NULL, 100.0, &bl_opts_default), 0);
  cr_expect_eq(c.ebt, 0);
  cr_expect(c.warn & BL_WARN_STATIC_E);
  two.mass = BL_EBH_M_MIN;
  cr_expect_gt(table_ratio_p(&two, 26, 100.0, 0.3), 0.0);
  /* the end point: 0 at and above k_max, positive just below */
  cr_expect(table_ratio_p(pr, 8, 1e4, 1.0) == 0.0);
  cr_expect(table_ratio_p(pr, 8, 1e4, 1.5) == 0.0);
  cr_expect(table_ratio_p(pr, 8, 1e4, 0.9999) > 0.0);
}

/*
** Other projectiles at table nodes (the generator's own points, so only
** the integrals' tolerances separate table and fresh values: rtol 2e-3
** there, 1e-3 here): charges z = +1, -1, 2 against fresh all-diagram
** integrals of the particle itself (internal consistency with bl_ebrems,
** no outside source).  At the first node (spin 1/2, M = 1 GeV, Z = 8,
** tau = 1000, u = 0.5) R_P and R_E are of one size and R_I = 2 c_I
** sqrt(R_P R_E) is a tenth of R (DEVELOPERS.md, "Other projectiles", the
** table measured before the grid), so R(+1) - R(-1) = 2 R_I is checked
** on its own against the fresh difference: a table evaluation with the
** sign of c_I flipped gives the difference the wrong sign.  Measured:
** table against fresh within 5e-6 for R and 6e-6 for the difference (the
** adaptive rules land on the same points); tolerances from the
** generator's rtol 2e-3: R within 2e-3, the difference within 4e-3 R(+1)
** (2 % of it at the first node, 18 % at the second, where 2 R_I is 2.2 %
** of R).  Mutant: combine() with -2 c_I fails all six R checks and both
** differences (the first node's R by 19 %, z = 2 by 18 %).
*/
Test(ebwire, other_charges_at_nodes, .timeout = 240) {
  static const struct { double M, spin, tau, u; int Z; } nodes[] = {
    {1e3, 0.5, 1e3, 0.5, 8}, {316.22776601683796, 0.0, 10.0, 0.1, 82}};
  static const double zs[3] = {1.0, -1.0, 2.0};
  bl_quad *q = bl_quad_alloc(200);
  size_t i, j;
  cr_assert_not_null(q);
  cr_assert_eq(bl_quad_set_rtol(q, 1e-3), 0);
  for (i = 0; i < sizeof nodes / sizeof nodes[0]; i++) {
    double T = nodes[i].tau * nodes[i].M, got[3], fresh[3], dg, df;
    for (j = 0; j < 3; j++) {
      bl_particle p = {"node", nodes[i].M, zs[j], nodes[i].spin, 0};
      fresh[j] = fresh_ratio_p(&p, nodes[i].Z, T, nodes[i].u, q);
      got[j] = table_ratio_p(&p, nodes[i].Z, T, nodes[i].u);
      cr_log_info("node M=%g z=%g: table %.6g fresh %.6g (%.2e)",
                  nodes[i].M, zs[j], got[j], fresh[j],
                  got[j] / fresh[j] - 1.0);
      cr_expect(fabs(got[j] / fresh[j] - 1.0) < 2e-3, "M=%g spin %g Z=%d "
                "T=%g u=%g z=%g: table %.6g fresh %.6g", nodes[i].M,
                nodes[i].spin, nodes[i].Z, T, nodes[i].u, zs[j], got[j],
                fresh[j]);
    }
    dg = got[0] - got[1];
    df = fresh[0] - fresh[1];
    cr_log_info("node M=%g: 2 R_I table %.6g fresh %.6g (R %.6g)",
                nodes[i].M, dg, df, fresh[0]);
    cr_expect(df > 0.0 && fabs(dg - df) < 4e-3 * fresh[0], "M=%g: R(+1) "
              "- R(-1) table %.6g, fresh %.6g", nodes[i].M, dg, df);
  }
  bl_quad_free(q);
}
