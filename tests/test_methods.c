/*
** test_methods.c -- the methods room: the high-energy
** (screening-function) method against the exact Born integral, Tsai's
** complete-screening formula, the switch of method "auto", the cache;
** method "partial" (the partial waves wired in) against bl_pw_dsdk
** See Copyright Notice in LICENSE
**
** Suites: methods, partial_method (the k integrals and suppression tests that were here
** are in test_target.c, with the target room).
*/

#include <math.h>
#include <pthread.h>

#include <criterion/criterion.h>

#include "brakelight.h"
#include "methods/internal.h"   /* the nuclear-size table, spot-checked */
#include "partial/dsdk.h"       /* method "partial" against bl_pw_dsdk */
#include "testutil.h"

TestSuite(methods, .init = setup);
TestSuite(partial_method, .init = setup);

static const char *const models[] = {
  "none", "exponential", "thomas-fermi", "hartree-fock"
};

/* A spin-0 projectile with the electron's mass and charge (a point charge:
** the spin-0 partner of the electron, as a new-particle search uses). */
static const bl_particle scalar_e = {
  "scalar-e", BL_ME_MEV, -1.0, 0.0, 0u
};


/* Born and high-energy dsigma/dk of one case at y; returns he/born - 1. */
static double deviation (const bl_particle *p, int Z, const char *model,
                         double gamma0, double y, bl_quad *q) {
  bl_opts o = bl_opts_default;
  bl_case c;
  bl_he h;
  bl_result rb, rh;
  double T = (gamma0 - 1.0) * p->mass;
  int st;
  o.coulomb = BL_APPLY_OFF;   /* the same subtraction in both: left out */
  o.elwert = BL_APPLY_OFF;
  cr_assert_eq(bl_case_setup(&c, p, Z, bl_model_find(model), NULL, T, &o),
               BL_SUCCESS);
  cr_assert_eq(bl_he_prepare(&c, q, &h), BL_SUCCESS);
  st = bl_dcs_dk_e(&c, y * T, q, &rb);
  cr_assert_eq(st, BL_SUCCESS, "born %s Z=%d %s g0=%g y=%g: %d", p->name, Z,
               model, gamma0, y, st);
  cr_assert_eq(bl_he_dk_e(&c, &h, y * T, &rh), BL_SUCCESS);
  cr_assert_eq(rh.method, BL_METHOD_HIGH_ENERGY);
  return rh.val / rb.val - 1.0;
}


/* Case c prepared for "auto" into h; "auto" at y T into *ra; returns
** auto/born - 1 there. */
static double auto_vs_born (const bl_case *c, double y, bl_quad *q, bl_he *h,
                            bl_result *ra) {
  bl_result rb;
  cr_assert_eq(bl_method_prepare(c, BL_METHOD_AUTO, q, h), BL_SUCCESS);
  cr_assert_eq(bl_method_dk_e(c, h, BL_METHOD_AUTO, y * c->T, q, ra),
               BL_SUCCESS);
  cr_assert_eq(bl_method_dk_e(c, h, BL_METHOD_BORN, y * c->T, q, &rb),
               BL_SUCCESS);
  return ra->val / rb.val - 1.0;
}


/*
** Source: Tsai 1974 (Rev. Mod. Phys. 46, 815), section 3: the screening-function form is the small-angle limit of the
** Born integral.  Check of the issue: within 0.5 % for E >= 10^3 m, both
** spins, every screening model, y from 0.01 to 0.99.  E is the final
** energy (Tsai's notation: E0 before, E after emission), so the
** initial gamma is 10^3/(1 - y); uniform nucleus, atomic electrons.
*/
Test(methods, matches_born_above_1e3_m) {
  static const double ys[] = {0.01, 0.1, 0.5, 0.9, 0.99};
  const bl_particle *parts[] = {
    bl_particle_find("electron"), &scalar_e, bl_particle_find("muon"),
    bl_particle_find("pion+")
  };
  static const int Zs[] = {6, 82};
  bl_quad *q = bl_quad_alloc(1000);
  double worst = 0.0;
  size_t ip, im, iz, iy;
  cr_assert_eq(bl_quad_set_rtol(q, 1e-5), BL_SUCCESS);
  for (ip = 0; ip < 4; ip++)
    for (im = 0; im < 4; im++)
      for (iz = 0; iz < 2; iz++)
        for (iy = 0; iy < 5; iy++) {
          double d = deviation(parts[ip], Zs[iz], models[im],
                               1e3 / (1.0 - ys[iy]), ys[iy], q);
          cr_expect(fabs(d) < 5e-3, "%s Z=%d %s y=%g: he/born - 1 = %.3g",
                    parts[ip]->name, Zs[iz], models[im], ys[iy], d);
          worst = fmax(worst, fabs(d));
        }
  cr_log_info("high-energy vs born, final E >= 1e3 m: worst %.3g", worst);
  bl_quad_free(q);
}


/*
** The switch of "auto" (final gamma = 500, src/core/methods/): there the two methods
** agree within 1e-3 (the requirement), for e, mu and pi on light
** to the heaviest atoms, every model.  Source: internal consistency.
*/
Test(methods, auto_switch_agrees) {
  const bl_particle *parts[] = {
    bl_particle_find("electron"), bl_particle_find("muon"),
    bl_particle_find("pion+")
  };
  static const int Zs[] = {1, 29, 82, 100};
  static const double ys[] = {0.5, 0.99};
  bl_quad *q = bl_quad_alloc(1000);
  size_t ip, im, iz, iy;
  cr_assert_eq(bl_quad_set_rtol(q, 1e-5), BL_SUCCESS);
  for (ip = 0; ip < 3; ip++)
    for (im = 0; im < 4; im++)
      for (iz = 0; iz < 4; iz++)
        for (iy = 0; iy < 2; iy++) {
          /* final gamma just above 500 */
          double g0 = 500.0 * 1.0001 / (1.0 - ys[iy]) + 1.0;
          bl_case c;
          bl_opts o = bl_opts_default;
          double d = deviation(parts[ip], Zs[iz], models[im], g0, ys[iy], q);
          cr_expect(fabs(d) < 1e-3, "%s Z=%d %s y=%g: he/born - 1 = %.3g",
                    parts[ip]->name, Zs[iz], models[im], ys[iy], d);
          cr_assert_eq(bl_case_setup(&c, parts[ip], Zs[iz],
                                     bl_model_find(models[im]), NULL,
                                     (g0 - 1.0) * parts[ip]->mass, &o),
                       BL_SUCCESS);
          cr_expect(bl_he_valid(&c, ys[iy] * c.T), "auto takes it");
          cr_expect(!bl_he_valid(&c, (ys[iy] + 0.5 * (1 - ys[iy])) * c.T),
                    "below the switch auto takes born");
        }
  bl_quad_free(q);
}


/*
** Issue 14, item 3: "auto" right for every mass.  Internal consistency:
** at and above the switch (bl_he_gamma_min, which grows with m R for
** heavy projectiles: the nuclear-size correction is a gamma -> infinity
** calibration) the two methods agree within 1e-3, for m_e, m_mu, m_pi,
** 1, 10, 100 and 1000 GeV on Fe, Pb and U, spin 0 and 1/2, defaults
** (Hartree-Fock, electrons, uniform nucleus, corrections where valid);
** just below the switch "auto" takes born.  Before: -26 % and exactly 0
** for 500 GeV on Fe, 1.7 % at the switch for 10 GeV on Pb.  Measured now
** (rtol 1e-6, y = 0.01 ... 0.99, m_e ... 1 TeV, Z = 1 ... 100): at most
** 9.0e-4 (spin 0, y = 0.99, Z = 100), 6.5e-4 from 1 GeV up.
*/
/* Under AddressSanitizer (make test-asan) the two ends of the mass range
** only, m_e and 1 TeV (same points and thresholds otherwise): the same
** code paths, a third of the time (every mass took over 120 s there, the
** timeout, on a loaded machine); make test-c checks every mass. */
Test(methods, auto_agrees_every_mass, .timeout = 120) {
  static const double masses[] = {
#ifdef __SANITIZE_ADDRESS__
    BL_ME_MEV, 1e6
#else
    BL_ME_MEV, BL_MMU_MEV, BL_MPI_MEV, 1e3, 1e4, 1e5, 1e6
#endif
  };
  static const int Zs[] = {26, 82, 92};
  static const double ys[] = {0.1, 0.5, 0.9, 0.99};
  static const double above[] = {1.0001, 10.0};
  bl_quad *q = bl_quad_alloc(1000);
  double worst = 0.0;
  size_t im, iz, is, ia, iy;
  cr_assert_eq(bl_quad_set_rtol(q, 1e-6), BL_SUCCESS);
  for (im = 0; im < sizeof masses / sizeof masses[0]; im++)
    for (is = 0; is < 2; is++)
      for (iz = 0; iz < 3; iz++) {
        bl_particle p = {"probe", 0.0, -1.0, 0.0, 0u};
        bl_case c;
        double gmin;
        p.mass = masses[im];
        p.spin = 0.5 * is;
        cr_assert_eq(bl_case_setup(&c, &p, Zs[iz], bl_model_find(
                       "hartree-fock"), NULL, 1.0, &bl_opts_default),
                     BL_SUCCESS);
        gmin = bl_he_gamma_min(&c);
        cr_assert(gmin >= BL_HE_GAMMA_MIN && isfinite(gmin));
        for (ia = 0; ia < 2; ia++)
          for (iy = 0; iy < 4; iy++) {
            double E = gmin * above[ia], y = ys[iy], g0 = E / (1.0 - y), d;
            bl_he h;
            bl_result ra;
            cr_assert_eq(bl_case_setup(&c, &p, Zs[iz],
                                       bl_model_find("hartree-fock"), NULL,
                                       (g0 - 1.0) * p.mass, &bl_opts_default),
                         BL_SUCCESS);
            d = auto_vs_born(&c, y, q, &h, &ra);
            cr_expect_eq(ra.method, BL_METHOD_HIGH_ENERGY, "m=%g: auto takes "
                         "high-energy above the switch", p.mass);
            cr_expect(fabs(d) < 1e-3, "m=%g spin %g Z=%d gamma=%g y=%g: "
                      "auto/born - 1 = %.3g", p.mass, p.spin, Zs[iz], E, y, d);
            worst = fmax(worst, fabs(d));
            /* just below the switch: born */
            cr_assert_eq(bl_method_dk_e(&c, &h, BL_METHOD_AUTO,
                                        (g0 - 0.999 * gmin) * p.mass, q, &ra),
                         BL_SUCCESS);
            cr_expect_eq(ra.method, BL_METHOD_DISTORTED,
                         "m=%g below the switch", p.mass);
            bl_he_release(&h);
          }
      }
  cr_log_info("auto vs born at and above the switch: worst %.3g", worst);
  bl_quad_free(q);
}


/*
** The nucleus's incoherent part in the high-energy method: its
** nuclear-size correction scaled by 1 - 1/Z (nucsize.c) against the Born
** target factor's closure term (case.c), at and above the switch.  The
** issue's 1e-3 (issue 14, item 3), here with nucleus = INCOHERENT; spin 0
** and 1/2, muon to 100 GeV on Fe and U.  Internal consistency of two
** computations of one quantity, no outside source.
*/
Test(methods, auto_agrees_incoherent_nucleus, .timeout = 120) {
  static const double masses[] = {BL_MMU_MEV, BL_MPI_MEV, 1e3, 1e4, 1e5};
  static const int Zs[] = {26, 92};
  static const double ys[] = {0.1, 0.5, 0.9};
  bl_quad *q = bl_quad_alloc(1000);
  bl_opts o = bl_opts_default;
  double worst = 0.0;
  size_t im, iz, iy;
  int is;
  o.nucleus = BL_NUCLEUS_INCOHERENT;
  cr_assert_eq(bl_quad_set_rtol(q, 1e-6), BL_SUCCESS);
  for (im = 0; im < sizeof masses / sizeof masses[0]; im++)
    for (is = 0; is < 2; is++)
      for (iz = 0; iz < 2; iz++)
        for (iy = 0; iy < 3; iy++) {
          bl_particle p = {"probe", 0.0, -1.0, 0.0, 0u};
          bl_case c;
          bl_he h;
          bl_result ra;
          double y = ys[iy], g0, d;
          p.mass = masses[im];
          p.spin = 0.5 * is;
          cr_assert_eq(bl_case_setup(&c, &p, Zs[iz], bl_model_find(
                         "hartree-fock"), NULL, 1.0, &o), BL_SUCCESS);
          g0 = 1.0001 * bl_he_gamma_min(&c) / (1.0 - y);
          cr_assert_eq(bl_case_setup(&c, &p, Zs[iz],
                                     bl_model_find("hartree-fock"), NULL,
                                     (g0 - 1.0) * p.mass, &o), BL_SUCCESS);
          cr_expect(c.warn & BL_WARN_NINCOH, "m=%g: flagged", p.mass);
          d = auto_vs_born(&c, y, q, &h, &ra);
          cr_expect_eq(ra.method, BL_METHOD_HIGH_ENERGY);
          cr_expect(fabs(d) < 1e-3, "m=%g spin %g Z=%d y=%g: auto/born - 1 "
                    "= %.3g", p.mass, p.spin, Zs[iz], y, d);
          worst = fmax(worst, fabs(d));
          bl_he_release(&h);
        }
  cr_log_info("incoherent nucleus, auto vs born at the switch: worst %.3g",
              worst);
  bl_quad_free(q);
}


/*
** Masses of a few MeV (m R ~ 0.1 hbar c on heavy nuclei), between the
** electron and the muon of auto_agrees_every_mass: the nuclear-size table
** began its nodes in delta at 1e-3 q_N and kept N constant below, which
** for these masses is too high a delta: auto/born - 1 was 1.4e-3 (3 MeV)
** and 1.2e-3 (5 MeV) on Pb at high gamma and small y, with or without the
** Coulomb correction.  Now the first node is at most 1e-4.  Measured after:
** 6e-6 (3 MeV), 8e-6 (5 MeV) at gamma0 = 1e6.
*/
/* Under AddressSanitizer 3 MeV on Pb only: the same code paths. */
Test(methods, auto_agrees_mev_masses, .timeout = 120) {
#ifdef __SANITIZE_ADDRESS__
  static const double masses[] = {3.0};
  static const int Zs[] = {82};
#else
  static const double masses[] = {2.0, 3.0, 5.0};
  static const int Zs[] = {82, 92};
#endif
  static const double ys[] = {0.01, 0.1, 0.5};
  static const double g0s[] = {1e4, 1e6};
  bl_quad *q = bl_quad_alloc(1000);
  size_t im, iz, is, ig, iy;
  cr_assert_eq(bl_quad_set_rtol(q, 1e-6), BL_SUCCESS);
  for (im = 0; im < sizeof masses / sizeof masses[0]; im++)
    for (is = 0; is < 2; is++)
      for (iz = 0; iz < sizeof Zs / sizeof Zs[0]; iz++)
        for (ig = 0; ig < 2; ig++) {
          bl_particle p = {"probe", 0.0, -1.0, 0.0, 0u};
          bl_case c;
          bl_he h;
          p.mass = masses[im];
          p.spin = 0.5 * is;
          cr_assert_eq(bl_case_setup(&c, &p, Zs[iz],
                                     bl_model_find("hartree-fock"), NULL,
                                     g0s[ig] * p.mass, &bl_opts_default),
                       BL_SUCCESS);
          cr_assert_eq(bl_method_prepare(&c, BL_METHOD_AUTO, q, &h),
                       BL_SUCCESS);
          for (iy = 0; iy < 3; iy++) {
            bl_result ra, rb;
            double d;
            cr_assert_eq(bl_method_dk_e(&c, &h, BL_METHOD_AUTO, ys[iy] * c.T,
                                        q, &ra), BL_SUCCESS);
            cr_assert_eq(bl_method_dk_e(&c, &h, BL_METHOD_BORN, ys[iy] * c.T,
                                        q, &rb), BL_SUCCESS);
            cr_expect_eq(ra.method, BL_METHOD_HIGH_ENERGY);
            d = ra.val / rb.val - 1.0;
            cr_expect(fabs(d) < 1e-4, "m=%g spin %g Z=%d gamma0=%g y=%g: "
                      "auto/born - 1 = %.3g", p.mass, p.spin, Zs[iz],
                      g0s[ig], ys[iy], d);
          }
          bl_he_release(&h);
        }
  bl_quad_free(q);
}


/*
** The case of issue 14: 500 GeV spin 0 on Fe at gamma0 = 9,465 gave -26 %
** at y = 0.65 with an estimate of 1e-6 and exactly 0 from y = 0.7 on.
** Now "auto" takes born there (m R = 1.2e4: the switch is at gamma =
** 3.5e4), and the forced high-energy method warns that it does not hold;
** a value it clamps to 0 carries both warnings.
*/
Test(methods, heavy_scalar_on_iron) {
  static const double ys[] = {0.3, 0.65, 0.7, 0.9};
  bl_particle p = {"scalar", 5e5, -1.0, 0.0, 0u};
  bl_quad *q = bl_quad_alloc(1000);
  bl_case c;
  bl_he h;
  size_t i;
  cr_assert_eq(bl_case_setup(&c, &p, 26, bl_model_find("hartree-fock"), NULL,
                             9464.0 * p.mass, &bl_opts_default), BL_SUCCESS);
  cr_assert_eq(bl_he_prepare(&c, q, &h), BL_SUCCESS);
  for (i = 0; i < 4; i++) {
    bl_result ra, rb, rh;
    double k = ys[i] * c.T;
    cr_assert_eq(bl_method_dk_e(&c, &h, BL_METHOD_AUTO, k, q, &ra),
                 BL_SUCCESS);
    cr_assert_eq(bl_method_dk_e(&c, &h, BL_METHOD_BORN, k, q, &rb),
                 BL_SUCCESS);
    /* below the switch "auto" is the distorted waves; for so heavy a
    ** projectile the point-charge distortion is left out for the nuclear
    ** size and the Elwert factor is 1 + O(1e-8): Born */
    cr_expect_eq(ra.method, BL_METHOD_DISTORTED, "y=%g", ys[i]);
    cr_expect(fabs(ra.val / rb.val - 1.0) < 1e-6 && ra.val > 0.0,
              "y=%g: %g %g", ys[i], ra.val,
              rb.val);
    cr_assert_eq(bl_method_dk_e(&c, &h, BL_METHOD_HIGH_ENERGY, k, q, &rh),
                 BL_SUCCESS);
    cr_expect(rh.warn & BL_WARN_METHOD, "y=%g: forced high-energy warns",
              ys[i]);
    cr_expect(rh.val > 0.0 || (rh.warn & BL_WARN_CLAMPED), "y=%g", ys[i]);
  }
  bl_he_release(&h);
  bl_quad_free(q);
}


/* One node of the nuclear-size table recomputed from fresh Born
** integrals, as scripts/fit-nucsize.c makes it: d(v) = [Born_uniform -
** Born_point] k / norm on the bare A = NUC_A nucleus. */
static double nucdiff (const bl_particle *p, double delta, double v,
                       bl_quad *q) {
  bl_opts o = bl_opts_bare;
  bl_case cp, cu;
  bl_result rp, ru;
  double m = p->mass, gam = (1.0 - v) / (2.0 * delta), gam0 = gam / v;
  double k = (gam0 - gam) * m;
  o.A = NUC_A;
  cr_assert_eq(bl_case_setup(&cp, p, 50, bl_model_find("none"), NULL,
                             (gam0 - 1.0) * m, &o), BL_SUCCESS);
  o.nucleus = BL_NUCLEUS_UNIFORM;
  cr_assert_eq(bl_case_setup(&cu, p, 50, bl_model_find("none"), NULL,
                             (gam0 - 1.0) * m, &o), BL_SUCCESS);
  cr_assert_eq(bl_dcs_dk_e(&cp, k, q, &rp), BL_SUCCESS);
  cr_assert_eq(bl_dcs_dk_e(&cu, k, q, &ru), BL_SUCCESS);
  return (ru.val - rp.val) * k / cp.norm;
}


/*
** Issue 14, item 4: the generated table (src/core/methods/nuc_table.c,
** make nuc-table) spot-checked against fresh Born integrals at rtol 1e-7
** (internal consistency): nodes across the grid in m R (1e-3 ... 1.3e6
** hbar c: electrons on hydrogen to beyond 1 TeV on uranium) and along
** delta, both spins, within 1e-4 in phi (N is 0.1 ... 55 there).  Then
** every element with m_e ... 1 TeV prepares without a single integrand
** call (the calibration of 2.98e6 calls for a muon on Pb is gone).
*/
Test(methods, nuc_table_spot_check, .timeout = 120) {
  static const int ixs[] = {4, 28, 40, 56, 72, 84};
  static const double masses[] = {BL_ME_MEV, BL_MMU_MEV, BL_MPI_MEV, 1e3, 1e4,
                                  1e5, 1e6};
  bl_quad *q = bl_quad_alloc(1000);
  double worst = 0.0;
  size_t i;
  int Z, sp;
  cr_assert_eq(bl_quad_set_rtol(q, 1e-7), BL_SUCCESS);
  for (i = 0; i < 6; i++)
    for (sp = 0; sp < 2; sp++) {
      const bl_nuctab *t = &bl_nuc_table[sp][ixs[i]];
      double mR = exp(NUC_X0 + NUC_DX * ixs[i]);
      bl_particle p = {"probe", 0.0, -1.0, 0.0, 0u};
      int j = (int)((i * 7 + 3 * sp) % (size_t)t->n);  /* some node */
      double delta = exp(t->lnd0 + j * NUC_DLN), w1, w2, d, N;
      bl_opts o = bl_opts_bare;
      bl_case c;
      p.spin = 0.5 * sp;
      p.mass = 1.0;
      o.A = NUC_A;
      o.nucleus = BL_NUCLEUS_UNIFORM;
      cr_assert_eq(bl_case_setup(&c, &p, 50, bl_model_find("none"), NULL, 1.0,
                                 &o), BL_SUCCESS);
      p.mass = mR * BL_HBARC_MEVFM / c.R;   /* the probe of node ix */
      cr_assert(t->n >= 1 && t->n <= NUC_NODES);
      /* spin 0: d = w1 N1; spin 1/2 at v = 0.5: d = w1 N1 - w2 N2 */
      d = nucdiff(&p, delta, 0.5, q);
      bl_spin_weights(p.spin, 0.5, &w1, &w2);
      N = w1 * t->N1[j] - w2 * t->N2[j];
      cr_expect(fabs(d - N) < 1e-4, "spin %g m R = %.3g delta = %.3g: "
                "fresh %.8f, table %.8f", p.spin, mR, delta, d, N);
      worst = fmax(worst, fabs(d - N));
      cr_expect(t->err < 2e-3, "interpolation error %.3g", t->err);
    }
  for (Z = 1; Z <= 100; Z++)
    for (i = 0; i < 7; i++)
      for (sp = 0; sp < 2; sp++) {
        bl_particle p = {"probe", 0.0, -1.0, 0.0, 0u};
        bl_case c;
        bl_he h;
        bl_result r;
        p.mass = masses[i];
        p.spin = 0.5 * sp;
        cr_assert_eq(bl_case_setup(&c, &p, Z, bl_model_find("hartree-fock"),
                                   NULL, 3e7 * p.mass, &bl_opts_default),
                     BL_SUCCESS);
        bl_quad_reset_calls(q);
        cr_assert_eq(bl_he_prepare(&c, q, &h), BL_SUCCESS);
        cr_expect_eq(bl_quad_calls(q), 0, "Z=%d m=%g: no integral", Z,
                     p.mass);
        cr_expect(h.nnuc == 4 || (h.nnuc == 0 && c.R * p.mass
                                  / BL_HBARC_MEVFM < 1e-3),
                  "Z=%d m=%g: nnuc %d", Z, p.mass, h.nnuc);
        cr_assert_eq(bl_he_dk_e(&c, &h, 0.5 * c.T, &r), BL_SUCCESS);
        cr_expect(isfinite(r.val) && r.val > 0.0);
        bl_he_release(&h);
      }
  cr_expect(bl_he_gamma_min(NULL) == HUGE_VAL);
  cr_log_info("nuclear-size table against fresh Born: worst %.3g", worst);
  bl_quad_free(q);
}


/* Tsai (1974) eq. (3.83), written out here independently:
** complete screening with atomic electrons and f(Z), mb/MeV; the electron
** terms times re (the bound-electron factor of the core, 1 for Tsai's
** own form). */
static double tsai (int Z, double E0, double k, double mass, double re) {
  static const double lr[5] = {0, 5.31, 4.79, 4.74, 4.71};
  static const double lp[5] = {0, 6.144, 5.621, 5.805, 5.924};
  double a = Z * BL_ALPHA, a2 = a * a, y = k / E0, shift = log(mass / BL_ME_MEV);
  double f = a2 * (1 / (1 + a2) + 0.20206 - 0.0369 * a2 + 0.0083 * a2 * a2
                   - 0.002 * a2 * a2 * a2);
  double L = (Z <= 4 ? lr[Z] : log(184.15 * pow(Z, -1.0 / 3))) + shift;
  double Lp = (Z <= 4 ? lp[Z] : log(1194.0 * pow(Z, -2.0 / 3))) + shift;
  double r0 = BL_ALPHA * BL_HBARC_MEVFM / mass;   /* fm */
  double r2 = r0 * r0 / BL_FM2_PER_MB;
  return 4 * BL_ALPHA * r2 / k
         * ((4.0 / 3 - 4.0 / 3 * y + y * y) * (Z * Z * (L - f) + re * Z * Lp)
            + (1 - y) * (Z * Z + re * Z) / 9.0);
}


/* Source: Tsai 1974, Rev. Mod. Phys. 46, 815, eq. (3.83) (complete
** screening); the core's form must be the same function. */
Test(methods, complete_is_tsai) {
  static const int Zs[] = {1, 3, 6, 29, 82, 92};
  static const double ys[] = {0.001, 0.2, 0.5, 0.8, 0.999};
  bl_opts o = bl_opts_default;
  size_t iz, iy;
  o.coulomb = BL_APPLY_ON;
  for (iz = 0; iz < 6; iz++)
    for (iy = 0; iy < 5; iy++) {
      const bl_particle *e = bl_particle_find("electron");
      bl_case c;
      bl_result r;
      double T = 1e5, k = ys[iy] * T;
      cr_assert_eq(bl_case_setup(&c, e, Zs[iz], bl_model_find("hartree-fock"),
                                 NULL, T, &o), BL_SUCCESS);
      double re = bl_case_eratio(&c, k);
      cr_assert_eq(bl_complete_dk_e(&c, k, &r), BL_SUCCESS);
      /* the bound electron term (issue 13) is Tsai's at 100 GeV (factor
      ** exactly 1) except in the last 0.3 % before its end point
      ** y_max = 1 - 2.6e-6, which y = 0.999 is in */
      cr_expect(ys[iy] < 0.99 ? re == 1.0 : re > 0.98 && re < 1.0,
                "Z=%d y=%g: electron factor %.15g", Zs[iz], ys[iy], re);
      cr_expect(fabs(r.val / tsai(Zs[iz], T + e->mass, k, e->mass, re) - 1)
                < 1e-12, "Z=%d y=%g: %.15g vs %.15g", Zs[iz], ys[iy], r.val,
                tsai(Zs[iz], T + e->mass, k, e->mass, re));
    }
}


/*
** Source: Tsai 1974 (complete screening) and a measurement (Thomas-Fermi
** (Moliere) screening at T = 100 GeV, Pb: within 0.2 % of the complete-
** screening form); Moliere's L_rad is
** within 0.254 % of Tsai's).  The high-energy method with Thomas-Fermi
** screening, whose electron field is matched to Tsai's L'_rad, reaches the
** complete-screening limit at small Delta: within 0.5 % at 10 TeV.
*/
Test(methods, complete_screening_limit) {
  static const int Zs[] = {6, 29, 82};
  static const double ys[] = {0.01, 0.1, 0.5};
  bl_opts o = bl_opts_default;
  bl_quad *q = bl_quad_alloc(1000);
  size_t iz, iy;
  o.coulomb = BL_APPLY_ON;
  o.nucleus = BL_NUCLEUS_POINT;
  for (iz = 0; iz < 3; iz++)
    for (iy = 0; iy < 3; iy++) {
      bl_case c;
      bl_he h;
      bl_result r, t;
      double T = 1e7;
      cr_assert_eq(bl_case_setup(&c, bl_particle_find("electron"), Zs[iz],
                                 bl_model_find("thomas-fermi"), NULL, T, &o),
                   BL_SUCCESS);
      cr_assert_eq(bl_he_prepare(&c, q, &h), BL_SUCCESS);
      cr_assert_eq(bl_he_dk_e(&c, &h, ys[iy] * T, &r), BL_SUCCESS);
      cr_assert_eq(bl_complete_dk_e(&c, ys[iy] * T, &t), BL_SUCCESS);
      cr_expect(fabs(r.val / t.val - 1) < 5e-3, "Z=%d y=%g: he/complete - 1 "
                "= %.3g", Zs[iz], ys[iy], r.val / t.val - 1);
      cr_expect(!(t.warn & BL_WARN_METHOD), "complete screening holds here");
    }
  bl_quad_free(q);
}


/*
** Source: Koch & Motz 1959 (3BN(b)): unscreened, point
** nucleus, phi1 = phi2 = 4 ln(1/delta) - 2 for delta -> 0, so
** dsigma/dk = (norm/k) [(1 + v^2) - (2/3) v] (4 ln(1/delta) - 2).
*/
Test(methods, unscreened_limit) {
  bl_case c;
  bl_he h;
  bl_result r;
  double T = 1e6, y = 0.3, E0, E, k, delta, v, want;
  const bl_particle *e = bl_particle_find("electron");
  cr_assert_eq(bl_case_setup(&c, e, 29, bl_model_find("none"), NULL, T, NULL),
               BL_SUCCESS);
  cr_assert_eq(bl_he_prepare(&c, NULL, &h), BL_SUCCESS);
  k = y * T;
  E0 = (T + e->mass) / e->mass;
  E = E0 - k / e->mass;
  delta = (k / e->mass) / (2 * E0 * E);
  v = E / E0;
  cr_assert_eq(bl_he_dk_e(&c, &h, k, &r), BL_SUCCESS);
  want = c.norm / k * ((1 + v * v) - 2 * v / 3) * (4 * log(1 / delta) - 2);
  cr_expect(fabs(r.val / want - 1) < 1e-5, "%.10g vs %.10g", r.val, want);
}


/* The cached tables of every element: interpolation error measured at
** build time below 1e-6 in phi (which is 20-50 here), values finite and
** positive over the spectrum, and a second preparation gives the same
** numbers bit for bit. */
Test(methods, tables_cached_and_accurate) {
  bl_quad *q = bl_quad_alloc(1000);
  bl_case c;
  bl_he h1, h2;
  bl_result r1, r2;
  int Z;
  for (Z = 1; Z <= 100; Z++) {
    double y;
    cr_assert_eq(bl_case_setup(&c, bl_particle_find("electron"), Z,
                               bl_model_find("hartree-fock"), NULL, 1e5,
                               &bl_opts_default), BL_SUCCESS);
    cr_assert_eq(bl_he_prepare(&c, q, &h1), BL_SUCCESS);
    cr_assert_eq(bl_he_prepare(&c, q, &h2), BL_SUCCESS);
    for (y = 1e-6; y < 1; y *= 3) {
      cr_assert_eq(bl_he_dk_e(&c, &h1, y * c.T, &r1), BL_SUCCESS,
                   "Z=%d y=%g", Z, y);
      cr_expect(isfinite(r1.val) && r1.val > 0, "Z=%d y=%g: %g", Z, y,
                r1.val);
    }
    cr_expect(h1.maxerr < 1e-6, "Z=%d: table error %.3g", Z, h1.maxerr);
    cr_expect(h1.el == h2.el && h1.e == h2.e && h1.nuc[0] == h2.nuc[0],
              "the cache returns the same tables");
    bl_he_dk_e(&c, &h1, 3e4, &r1);
    bl_he_dk_e(&c, &h2, 3e4, &r2);
    cr_expect(r1.val == r2.val);
  }
  bl_quad_free(q);
}


/* Two threads preparing the same new element at once (the cache is built
** under its lock) get the same tables and the serial numbers. */
typedef struct job {
  int Z;
  double val;
  const void *el;
} job;

static void *prepjob (void *arg) {
  job *j = arg;
  bl_quad *q = bl_quad_alloc(1000);
  bl_case c;
  bl_he h;
  bl_result r;
  j->val = -1;
  if (q == NULL
      || bl_case_setup(&c, bl_particle_find("muon"), j->Z,
                       bl_model_find("thomas-fermi"), NULL, 1e6,
                       &bl_opts_default) != BL_SUCCESS
      || bl_he_prepare(&c, q, &h) != BL_SUCCESS
      || bl_he_dk_e(&c, &h, 2e5, &r) != BL_SUCCESS) {
    bl_quad_free(q);
    return NULL;
  }
  j->val = r.val;
  j->el = h.el;
  bl_quad_free(q);
  return NULL;
}

Test(methods, two_threads_one_cache) {
  pthread_t t1, t2;
  job a = {47, 0, NULL}, b = {47, 0, NULL}, s = {47, 0, NULL};
  cr_assert_eq(pthread_create(&t1, NULL, prepjob, &a), 0);
  cr_assert_eq(pthread_create(&t2, NULL, prepjob, &b), 0);
  pthread_join(t1, NULL);
  pthread_join(t2, NULL);
  prepjob(&s);
  cr_assert(a.val > 0 && b.val > 0);
  cr_expect(a.val == b.val && a.val == s.val, "%.17g %.17g %.17g", a.val,
            b.val, s.val);
  cr_expect(a.el == b.el && a.el == s.el, "one table for both");
}


/*
** Internal consistency: a scan over a model parameter (a new Yukawa
** representation, so a new elastic table, per value) that releases each
** bl_he keeps the cache within BL_METHOD_CACHE_IDLE entries (it grew by
** one per value, without bound: 129 here); a table in use survives bl_method_cache_clear,
** and after its release the clear empties the cache.
*/
Test(methods, cache_bounded_in_a_scan, .timeout = 120) {
  const bl_particle *e = bl_particle_find("electron");
  const bl_model *m = bl_model_find("exponential");
  bl_opts o = bl_opts_default;
  bl_quad *q = bl_quad_alloc(1000);
  bl_case c;
  bl_he h, keep;
  bl_result r0, r1;
  size_t most = 0;
  int i;
  o.nucleus = BL_NUCLEUS_POINT;   /* tables only */
  cr_assert(q != NULL);
  for (i = 0; i < 2 * BL_METHOD_CACHE_IDLE; i++) {
    double par = 100.0 + 0.25 * i;
    cr_assert_eq(bl_case_setup(&c, e, 29, m, &par, 1e5, &o), BL_SUCCESS);
    cr_assert_eq(bl_he_prepare(&c, q, &h), BL_SUCCESS);
    cr_assert(h.el != NULL && h.e != NULL);
    cr_assert_eq(bl_he_dk_e(&c, &h, 3e4, &r0), BL_SUCCESS);
    bl_he_release(&h);
    cr_expect(!h.ready && h.el == NULL, "released h is cleared");
    if (bl_method_cache_count() > most)
      most = bl_method_cache_count();
  }
  cr_expect(most <= BL_METHOD_CACHE_IDLE + 2, "cache held %zu entries", most);
  cr_assert_eq(bl_case_setup(&c, e, 29, m, NULL, 1e5, &o), BL_SUCCESS);
  cr_assert_eq(bl_he_prepare(&c, q, &keep), BL_SUCCESS);
  cr_assert_eq(bl_he_dk_e(&c, &keep, 3e4, &r0), BL_SUCCESS);
  bl_method_cache_clear();
  cr_expect_eq(bl_method_cache_count(), 2, "the two tables in use stay");
  cr_assert_eq(bl_he_dk_e(&c, &keep, 3e4, &r1), BL_SUCCESS);
  cr_expect(r0.val == r1.val && r0.err == r1.err);
  bl_he_release(&keep);
  bl_method_cache_clear();
  cr_expect_eq(bl_method_cache_count(), 0);
  bl_he_release(&keep);   /* twice: a no-op */
  bl_he_release(NULL);
  bl_quad_free(q);
}


/* Two threads scanning the same parameter values at once, each value
** prepared, used and released, while evictions run: the same numbers as
** serially, bit for bit (and no use after free under make test-asan). */
typedef struct scanjob {
  double val[3 * BL_METHOD_CACHE_IDLE];
  int ok;
} scanjob;

static void *scanrun (void *arg) {
  scanjob *j = arg;
  const bl_particle *e = bl_particle_find("electron");
  bl_opts o = bl_opts_default;
  bl_case c;
  bl_he h;
  bl_result r;
  int i;
  o.nucleus = BL_NUCLEUS_POINT;
  j->ok = 1;
  for (i = 0; i < 3 * BL_METHOD_CACHE_IDLE; i++) {
    double par = 80.0 + 0.5 * (i % (2 * BL_METHOD_CACHE_IDLE));
    if (bl_case_setup(&c, e, 13, bl_model_find("exponential"), &par, 1e5,
                      &o) != BL_SUCCESS
        || bl_he_prepare(&c, NULL, &h) != BL_SUCCESS
        || bl_he_dk_e(&c, &h, 2e4, &r) != BL_SUCCESS)
      j->ok = 0;
    j->val[i] = r.val;
    bl_he_release(&h);
  }
  return NULL;
}

Test(methods, cache_shared_by_threads, .timeout = 120) {
  static scanjob a, b, s;
  pthread_t t1, t2;
  int i;
  cr_assert_eq(pthread_create(&t1, NULL, scanrun, &a), 0);
  cr_assert_eq(pthread_create(&t2, NULL, scanrun, &b), 0);
  pthread_join(t1, NULL);
  pthread_join(t2, NULL);
  scanrun(&s);
  cr_assert(a.ok && b.ok && s.ok);
  for (i = 0; i < 3 * BL_METHOD_CACHE_IDLE; i++)
    cr_expect(a.val[i] == s.val[i] && b.val[i] == s.val[i], "value %d", i);
  cr_expect(bl_method_cache_count() <= BL_METHOD_CACHE_IDLE);
}


/* ------------------------------------------------------------------ */
/* Method "partial" (src/core/methods/partial.c).  The partial waves are
** slow (0.06-0.1 s a point at 10 keV on C and Cu): every case here is
** T = 10 keV on light-ish atoms. */

#define PW_T 0.01

/* Case of preset `particle` on Z at T with Hartree-Fock screening and
** the module's defaults, electrons as `electrons`, nucleus `nucleus`. */
static void pwcase (bl_case *c, const char *particle, int Z, double T,
                    int electrons, int nucleus) {
  bl_opts o = bl_opts_default;
  o.electrons = electrons;
  o.nucleus = nucleus;
  cr_assert_eq(bl_case_setup(c, bl_particle_find(particle), Z,
                             bl_model_find("hartree-fock"), NULL, T, &o),
               BL_SUCCESS, "%s Z=%d", particle, Z);
}

/* bl_pw_dsdk called directly in case c's field, built here from its
** pieces: zza = z Z alpha, the model's Yukawa form, the nucleus radius
** (0 for a point), the cut 1e-9 |zza| that method "partial" documents. */
static double pw_direct (const bl_case *c, double k, double rtol) {
  bl_yukawa y;
  bl_pwpot v;
  double zza = c->particle.charge * c->Z * BL_ALPHA, ds, err;
  cr_assert_eq(c->screening->yukawa(c->Z, c->params, &y), BL_SUCCESS);
  cr_assert_eq(bl_pwpot_init(&v, zza, &y, BL_ME_MEV,
                             c->opts.nucleus == BL_NUCLEUS_POINT ? 0.0 : c->R,
                             1e-9 * fabs(zza)), BL_SUCCESS);
  cr_assert_eq(bl_pw_dsdk(&v, BL_ME_MEV, c->particle.charge, c->T, k, rtol,
                          &ds, &err), BL_SUCCESS);
  return ds;
}

/* Born with the electrons minus Born without them (no Elwert factor, no
** Coulomb correction), at rtol: the electron part as the Born room has
** it, computed here from cases of our own. */
static double epart_direct (const bl_case *c, double k, double rtol) {
  bl_opts o = c->opts;
  bl_case ca, cn;
  bl_result ra, rn;
  bl_quad *q = bl_quad_alloc(1000);
  cr_assert(q != NULL);
  cr_assert_eq(bl_quad_set_rtol(q, rtol), BL_SUCCESS);
  o.elwert = o.coulomb = BL_APPLY_OFF;
  cr_assert_eq(bl_case_setup(&ca, &c->particle, c->Z, c->screening,
                             c->params, c->T, &o), BL_SUCCESS);
  o.electrons = 0;
  cr_assert_eq(bl_case_setup(&cn, &c->particle, c->Z, c->screening,
                             c->params, c->T, &o), BL_SUCCESS);
  cr_assert_eq(bl_dcs_dk_e(&ca, k, q, &ra), BL_SUCCESS);
  cr_assert_eq(bl_dcs_dk_e(&cn, k, q, &rn), BL_SUCCESS);
  bl_quad_free(q);
  return ra.val - rn.val;
}

/*
** The wiring: "partial" through bl_method_dk_e equals bl_pw_dsdk called
** directly in the same field within 1e-9 with the electrons off (uniform
** nucleus; and a point nucleus for e- on Cu), the same with a prepared
** bl_he and with h = NULL (bit for bit), no BL_WARN_EBORN; with the
** electrons on it equals that plus Born(electrons) - Born(none) asked at
** rtol/4 (the documented rule), within 1e-9, flagged BL_WARN_EBORN.  A
** consistency check of the code path, not of physics: the physics of
** bl_pw_dsdk is tested in test_pwdsdk.c and test_pwlimits.c.
*/
Test(partial_method, equals_pw_direct, .timeout = 60) {
  static const char *const parts[2] = {"electron", "positron"};
  static const int Zs[2] = {6, 29};
  const double rtol = 1e-4, y = 0.5, k = y * PW_T;
  bl_quad *q = bl_quad_alloc(1000);
  int ip, iz, el;
  cr_assert(q != NULL);
  cr_assert_eq(bl_quad_set_rtol(q, rtol), BL_SUCCESS);
  for (ip = 0; ip < 2; ip++)
    for (iz = 0; iz < 2; iz++) {
      double nuc = 0.0;
      for (el = 0; el < 2; el++) {
        bl_case c;
        bl_he h;
        bl_result r, r0;
        double want;
        pwcase(&c, parts[ip], Zs[iz], PW_T, el, BL_NUCLEUS_UNIFORM);
        cr_assert(c.R > 0.0);
        cr_assert_eq(bl_method_prepare(&c, BL_METHOD_PARTIAL, q, &h),
                     BL_SUCCESS);
        cr_expect(h.pwready, "prepared");
        cr_assert_eq(bl_method_dk_e(&c, &h, BL_METHOD_PARTIAL, k, q, &r),
                     BL_SUCCESS, "%s Z=%d el=%d", parts[ip], Zs[iz], el);
        cr_assert_eq(bl_method_dk_e(&c, NULL, BL_METHOD_PARTIAL, k, q, &r0),
                     BL_SUCCESS);
        cr_expect(r.val == r0.val && r.err == r0.err, "h and NULL: %.17g "
                  "%.17g", r.val, r0.val);
        cr_expect_eq(r.method, BL_METHOD_PARTIAL);
        cr_expect(r.err > 0.0 && r.err <= rtol * r.val, "err %g of %g",
                  r.err, r.val);
        if (el == 0) {
          nuc = pw_direct(&c, k, rtol);
          want = nuc;
          cr_expect(!(r.warn & BL_WARN_EBORN), "no electrons: no warning");
        }
        else {
          want = nuc + epart_direct(&c, k, 0.25 * rtol);
          cr_expect(r.warn & BL_WARN_EBORN, "electron part flagged");
          cr_expect(want > nuc, "an electron part");
        }
        EXPECT_REL(r.val, want, 1e-9, "%s Z=%d electrons %d", parts[ip],
                   Zs[iz], el);
        bl_he_release(&h);
      }
    }
  {   /* a point nucleus: R = 0 in the field */
    bl_case c;
    bl_result r;
    pwcase(&c, "electron", 29, PW_T, 0, BL_NUCLEUS_POINT);
    cr_assert_eq(bl_method_dk_e(&c, NULL, BL_METHOD_PARTIAL, k, q, &r),
                 BL_SUCCESS);
    EXPECT_REL(r.val, pw_direct(&c, k, rtol), 1e-9, "point nucleus");
  }
  bl_quad_free(q);
}

/*
** The electron part against the distorted-wave room's own addition of it
** (distorted/dcs.c, screened(): the same Born difference, asked there at
** the point's rtol 1e-4, here at rtol/4): partial(on) - partial(off)
** against distorted(on) - distorted(off), e+ on C and Cu at 10 keV,
** y = 0.5 (where the electron part is 7-9 % of the value), within 2e-4
** of the value (the two Born integrals' tolerance; measured below 1e-5).
*/
Test(partial_method, electron_part_as_distorted) {
  static const int Zs[2] = {6, 29};
  const double k = 0.5 * PW_T;
  bl_quad *q = bl_quad_alloc(1000);
  int iz;
  cr_assert(q != NULL);
  cr_assert_eq(bl_quad_set_rtol(q, 1e-4), BL_SUCCESS);
  for (iz = 0; iz < 2; iz++) {
    bl_case con, coff;
    bl_result pon, poff, don, doff;
    double dp, dd;
    pwcase(&con, "positron", Zs[iz], PW_T, 1, BL_NUCLEUS_UNIFORM);
    pwcase(&coff, "positron", Zs[iz], PW_T, 0, BL_NUCLEUS_UNIFORM);
    cr_assert_eq(bl_method_dk_e(&con, NULL, BL_METHOD_PARTIAL, k, q, &pon),
                 BL_SUCCESS);
    cr_assert_eq(bl_method_dk_e(&coff, NULL, BL_METHOD_PARTIAL, k, q, &poff),
                 BL_SUCCESS);
    cr_assert_eq(bl_method_dk_e(&con, NULL, BL_METHOD_DISTORTED, k, q, &don),
                 BL_SUCCESS);
    cr_assert_eq(bl_method_dk_e(&coff, NULL, BL_METHOD_DISTORTED, k, q,
                                &doff), BL_SUCCESS);
    dp = pon.val - poff.val;
    dd = don.val - doff.val;
    cr_expect(dp > 0.03 * pon.val, "Z=%d: electron part %g of %g", Zs[iz],
              dp, pon.val);
    cr_expect(fabs(dp - dd) <= 2e-4 * pon.val, "Z=%d: partial %.10g "
              "distorted %.10g (value %.10g)", Zs[iz], dp, dd, pon.val);
  }
  bl_quad_free(q);
}

/*
** Refused with BL_EDOMAIN, out cleared: a muon, a spin-0 particle of the
** electron mass, T = 5 MeV, the incoherent nucleus, a point nucleus with
** |z Z alpha| >= 1, k outside (0, T); angular and fully differential
** values and the event sampler.  bl_partial_check's messages name the
** parameter, its value and the allowed range.
*/
Test(partial_method, refused) {
  static const bl_particle scalar = {"scalar-e", BL_ME_MEV, -1.0, 0.0, 0u};
  static const bl_particle heavy_e = {"e2", BL_ME_MEV, -2.0, 0.5, 0u};
  bl_quad *q = bl_quad_alloc(1000);
  bl_opts o = bl_opts_default;
  bl_case c;
  bl_result r;
  bl_material m;
  bl_target t;
  bl_sampler *s = NULL;
  char msg[400];
  cr_assert(q != NULL);
  /* muon */
  cr_assert_eq(bl_case_setup(&c, bl_particle_find("muon"), 6,
                             bl_model_find("hartree-fock"), NULL, PW_T, &o),
               BL_SUCCESS);
  r.val = 1.0;
  cr_expect_eq(bl_method_dk_e(&c, NULL, BL_METHOD_PARTIAL, 0.5 * PW_T, q, &r),
               BL_EDOMAIN);
  cr_expect(r.val == 0.0 && r.method == BL_METHOD_PARTIAL, "cleared");
  cr_expect_eq(bl_partial_check(&c.particle, 6, PW_T, &o, msg, sizeof msg),
               BL_EDOMAIN);
  cr_expect(strstr(msg, "muon") && strstr(msg, "mass 105.6583755")
            && strstr(msg, "0.51099895"), "%s", msg);
  /* spin 0 */
  cr_assert_eq(bl_case_setup(&c, &scalar, 6, bl_model_find("hartree-fock"),
                             NULL, PW_T, &o), BL_SUCCESS);
  cr_expect_eq(bl_method_dk_e(&c, NULL, BL_METHOD_PARTIAL, 0.5 * PW_T, q, &r),
               BL_EDOMAIN);
  cr_expect_eq(bl_partial_check(&scalar, 6, PW_T, &o, msg, sizeof msg),
               BL_EDOMAIN);
  cr_expect(strstr(msg, "spin 0") && strstr(msg, "spin-1/2"), "%s", msg);
  /* T = 5 MeV */
  pwcase(&c, "electron", 6, 5.0, 1, BL_NUCLEUS_UNIFORM);
  cr_expect_eq(bl_method_dk_e(&c, NULL, BL_METHOD_PARTIAL, 2.5, q, &r),
               BL_EDOMAIN);
  cr_expect_eq(bl_partial_check(&c.particle, 6, 5.0, &c.opts, msg,
                                sizeof msg), BL_EDOMAIN);
  cr_expect(strstr(msg, "T = 5 MeV") && strstr(msg, "(0, 3] MeV"), "%s", msg);
  /* the incoherent nucleus */
  pwcase(&c, "electron", 6, PW_T, 1, BL_NUCLEUS_INCOHERENT);
  cr_expect_eq(bl_method_dk_e(&c, NULL, BL_METHOD_PARTIAL, 0.5 * PW_T, q, &r),
               BL_EDOMAIN);
  /* a point nucleus with |z Z alpha| >= 1: z = -2 on Z = 80 */
  o.nucleus = BL_NUCLEUS_POINT;
  cr_expect_eq(bl_partial_check(&heavy_e, 80, PW_T, &o, msg, sizeof msg),
               BL_EDOMAIN);
  cr_expect(strstr(msg, "|z Z alpha| = 1.16") && strstr(msg, "'uniform'"),
            "%s", msg);
  o.nucleus = BL_NUCLEUS_UNIFORM;
  cr_expect_eq(bl_partial_check(&heavy_e, 80, PW_T, &o, NULL, 0),
               BL_SUCCESS);
  /* k outside (0, T) */
  pwcase(&c, "electron", 6, PW_T, 1, BL_NUCLEUS_UNIFORM);
  cr_expect_eq(bl_method_dk_e(&c, NULL, BL_METHOD_PARTIAL, PW_T, q, &r),
               BL_EDOMAIN);
  cr_expect_eq(bl_method_dk_e(&c, NULL, BL_METHOD_PARTIAL, 0.0, q, &r),
               BL_EDOMAIN);
  cr_expect_eq(bl_method_dk_e(&c, NULL, BL_METHOD_PARTIAL, 0.5 * PW_T, NULL,
                              &r), BL_EDOMAIN);
  /* no angles */
  cr_expect_eq(bl_method_angular_e(&c, BL_METHOD_PARTIAL, 0.5 * PW_T, 0.3, q,
                                   &r), BL_EDOMAIN);
  cr_expect_eq(bl_method_angular_scaled_e(&c, BL_METHOD_PARTIAL, 0.5 * PW_T,
                                          0.3, q, &r), BL_EDOMAIN);
  cr_expect_eq(bl_method_full_e(&c, BL_METHOD_PARTIAL, 0.5 * PW_T, 0.3, 0.2,
                                0.1, &r), BL_EDOMAIN);
  cr_expect_eq(bl_method_full_scaled_e(&c, BL_METHOD_PARTIAL, 0.5 * PW_T, 0.3,
                                       0.2, 0.1, &r), BL_EDOMAIN);
  cr_assert_eq(bl_material_element(&m, 6), BL_SUCCESS);
  cr_assert_eq(bl_target_setup(&t, bl_particle_find("electron"), &m,
                               bl_model_find("hartree-fock"), NULL, PW_T,
                               &bl_opts_default, BL_METHOD_PARTIAL, NULL,
                               NULL), BL_SUCCESS);
  cr_assert_eq(bl_target_prepare(&t, q, NULL), BL_SUCCESS);
  cr_expect_eq(bl_sampler_new(&t, 0.1 * PW_T, PW_T, 1, NULL, &s), BL_EDOMAIN);
  cr_expect(s == NULL);
  bl_target_release(&t);
  bl_quad_free(q);
}

/*
** e- on C at 10 keV, the module's defaults: "partial" within 5 % of
** "distorted" at y = 0.1, 0.5, 0.9.  A consistency check, not a reference:
** for Z alpha = 0.044 the Sommerfeld-Maue waves of the distorted method
** are accurate (Elwert & Haug 1969, Phys. Rev. 183, 90: their neglected
** terms are of order (Z alpha)^2), and the screening rule they need is
** the one source of a difference.  Measured: partial/distorted = 0.9962
** at y = 0.5.
*/
Test(partial_method, near_distorted_light) {
  static const double ys[3] = {0.1, 0.5, 0.9};
  bl_quad *q = bl_quad_alloc(1000);
  bl_case c;
  int i;
  cr_assert(q != NULL);
  cr_assert_eq(bl_quad_set_rtol(q, 1e-4), BL_SUCCESS);
  pwcase(&c, "electron", 6, PW_T, 1, BL_NUCLEUS_UNIFORM);
  for (i = 0; i < 3; i++) {
    bl_result rp, rd;
    cr_assert_eq(bl_method_dk_e(&c, NULL, BL_METHOD_PARTIAL, ys[i] * PW_T, q,
                                &rp), BL_SUCCESS);
    cr_assert_eq(bl_method_dk_e(&c, NULL, BL_METHOD_DISTORTED, ys[i] * PW_T,
                                q, &rd), BL_SUCCESS);
    cr_log_info("e- C 10 keV y=%g: partial/distorted = %.5f", ys[i],
                rp.val / rd.val);
    EXPECT_REL(rp.val, rd.val, 0.05, "y=%g", ys[i]);
  }
  bl_quad_free(q);
}

/*
** The tolerance: the workspace's rtol clamped to the sums' range.  At
** rtol 1e-8 the value is bl_pw_dsdk's at 1e-6 (within 1e-9), flagged
** with the tolerance warning where its error exceeds 1e-8 of it; at 0.5
** the sums run at 0.1.
*/
Test(partial_method, rtol_clamped) {
  bl_quad *q = bl_quad_alloc(1000);
  bl_case c;
  bl_result r;
  int st;
  cr_assert(q != NULL);
  pwcase(&c, "electron", 6, PW_T, 0, BL_NUCLEUS_UNIFORM);
  cr_assert_eq(bl_quad_set_rtol(q, 1e-8), BL_SUCCESS);
  st = bl_method_dk_e(&c, NULL, BL_METHOD_PARTIAL, 0.5 * PW_T, q, &r);
  cr_assert(st == BL_SUCCESS || st == BL_ENOTCONV, "status %d", st);
  EXPECT_REL(r.val, pw_direct(&c, 0.5 * PW_T, 1e-6), 1e-9, "rtol 1e-8");
  cr_expect(r.err <= 1e-8 * r.val || (r.warn & BL_WARN_TOLERANCE),
            "err %g of %g without the warning", r.err, r.val);
  cr_assert_eq(bl_quad_set_rtol(q, 0.5), BL_SUCCESS);
  cr_assert_eq(bl_method_dk_e(&c, NULL, BL_METHOD_PARTIAL, 0.5 * PW_T, q, &r),
               BL_SUCCESS);
  EXPECT_REL(r.val, pw_direct(&c, 0.5 * PW_T, 0.1), 1e-9, "rtol 0.5");
  bl_quad_free(q);
}

/*
** Through the target room: a spectrum of 3 points of e+ on C (electrons
** on) on 2 threads equals the points one by one (bit for bit: no shared
** mutable state), its record names the method and gives the electron
** share (eborn: the Born part over the value); an integral of dsigma/dk
** over (T/2, T) at rtol 1e-2 is within 5 % of the distorted waves' for e-
** on C (consistency, as near_distorted_light).
*/
Test(partial_method, target_spectrum_and_integral, .timeout = 60) {
  static const double ks[3] = {0.001, 0.003, 0.005};   /* below the end
                                  ** point on a free electron, 5.5 keV */
  bl_quad *q = bl_quad_alloc(1000);
  bl_material m;
  bl_target t, td;
  bl_tresult res[3], r0, rd;
  int st[3], i;
  cr_assert(q != NULL);
  cr_assert_eq(bl_quad_set_rtol(q, 1e-4), BL_SUCCESS);
  cr_assert_eq(bl_material_element(&m, 6), BL_SUCCESS);
  cr_assert_eq(bl_target_setup(&t, bl_particle_find("positron"), &m,
                               bl_model_find("hartree-fock"), NULL, PW_T,
                               &bl_opts_default, BL_METHOD_PARTIAL, NULL,
                               NULL), BL_SUCCESS);
  cr_assert_eq(bl_target_prepare(&t, q, NULL), BL_SUCCESS);
  cr_assert_eq(bl_target_spectrum_e(&t, 3, ks, 2, q, res, st), BL_SUCCESS);
  for (i = 0; i < 3; i++) {
    bl_result one, re;
    cr_assert_eq(bl_method_dk_e(&t.c[0], &t.he[0], BL_METHOD_PARTIAL, ks[i],
                                q, &one), BL_SUCCESS);
    cr_expect(res[i].r.val == one.val && res[i].r.err == one.err,
              "k=%g: spectrum %.17g point %.17g", ks[i], res[i].r.val,
              one.val);
    cr_expect(res[i].used == 1u << BL_METHOD_PARTIAL);
    cr_assert_eq(bl_partial_epart_e(&t.c[0], ks[i], q, &re), BL_SUCCESS);
    EXPECT_REL(res[i].eborn, re.val / one.val, 1e-12, "eborn k=%g", ks[i]);
    cr_expect(res[i].eborn > 0.01 && res[i].eborn < 0.5, "share %g",
              res[i].eborn);
  }
  bl_target_release(&t);
#ifdef __SANITIZE_ADDRESS__
  /* under ASan the integral (12 s of its 17) is left to the -O2 suite */
  (void)td;
  (void)r0;
  (void)rd;
  bl_quad_free(q);
  return;
#endif
  cr_assert_eq(bl_target_setup(&t, bl_particle_find("electron"), &m,
                               bl_model_find("hartree-fock"), NULL, PW_T,
                               &bl_opts_default, BL_METHOD_PARTIAL, NULL,
                               NULL), BL_SUCCESS);
  cr_assert_eq(bl_target_setup(&td, bl_particle_find("electron"), &m,
                               bl_model_find("hartree-fock"), NULL, PW_T,
                               &bl_opts_default, BL_METHOD_DISTORTED, NULL,
                               NULL), BL_SUCCESS);
  cr_assert_eq(bl_target_prepare(&t, q, NULL), BL_SUCCESS);
  cr_assert_eq(bl_target_prepare(&td, q, NULL), BL_SUCCESS);
  cr_assert_eq(bl_quad_set_rtol(q, 1e-2), BL_SUCCESS);
  cr_assert_eq(bl_target_kintegral_e(&t, BL_TARGET_DK, 0.0, 0.5 * PW_T, PW_T,
                                     q, &r0, NULL), BL_SUCCESS);
  cr_assert_eq(bl_target_kintegral_e(&td, BL_TARGET_DK, 0.0, 0.5 * PW_T,
                                     PW_T, q, &rd, NULL), BL_SUCCESS);
  cr_log_info("sigma(T/2..T) e- C 10 keV: partial %g distorted %g", r0.r.val,
              rd.r.val);
  EXPECT_REL(r0.r.val, rd.r.val, 0.05, "integral");
  cr_expect(r0.used == 1u << BL_METHOD_PARTIAL);
  bl_target_release(&t);
  bl_target_release(&td);
  bl_quad_free(q);
}

/* Born of the elastic part of case c (electrons off, no Elwert factor or
** Coulomb correction) at k and rtol. */
static double bornel_direct (const bl_case *c, double k, double rtol) {
  bl_opts o = c->opts;
  bl_case cn;
  bl_result r;
  bl_quad *q = bl_quad_alloc(1000);
  cr_assert(q != NULL);
  cr_assert_eq(bl_quad_set_rtol(q, rtol), BL_SUCCESS);
  o.electrons = 0;
  o.elwert = o.coulomb = BL_APPLY_OFF;
  cr_assert_eq(bl_case_setup(&cn, &c->particle, c->Z, c->screening,
                             c->params, c->T, &o), BL_SUCCESS);
  cr_assert_eq(bl_dcs_dk_e(&cn, k, q, &r), BL_SUCCESS);
  bl_quad_free(q);
  return r.val;
}

/*
** Below k = BL_PARTIAL_SOFT_Y T (0.02 T) the value is the Born value of
** the elastic part times the partial-wave/Born ratio at 0.02 T (Low's
** theorem: the ratio tends to a constant as k -> 0; Low 1958, Phys. Rev.
** 110, 974).  e- on Cu at 10 keV, electrons off, rtol 1e-3 (the soft
** points' cost falls steeply with rtol: 7.8 s at 1e-4, 1.9 s at 1e-3): at
** y = 0.01 within its sys and within 1 % of bl_pw_dsdk called directly
** there (measured 4.8e-4 at rtol 1e-4, sys 4.2e-3), flagged
** BL_WARN_PWSOFT; at y = 1e-6 (out of reach of the partial waves:
** gigabytes) the same ratio to Born within 1e-12, sys larger than at 0.01.
*/
Test(partial_method, soft_photons, .timeout = 60) {
  bl_quad *q = bl_quad_alloc(1000);
  bl_case c;
  bl_result r1, r6;
  double k1 = 0.01 * PW_T, k6 = 1e-6 * PW_T, exact;
  cr_assert(q != NULL);
  cr_assert_eq(bl_quad_set_rtol(q, 1e-3), BL_SUCCESS);
  pwcase(&c, "electron", 29, PW_T, 0, BL_NUCLEUS_UNIFORM);
  cr_assert_eq(bl_method_dk_e(&c, NULL, BL_METHOD_PARTIAL, k6, q, &r6),
               BL_SUCCESS);
#ifdef __SANITIZE_ADDRESS__
  /* under ASan (30 s for the whole test) the y = 1e-6 point alone: the
  ** rule's code path; its values are checked by the -O2 suite */
  cr_expect((r6.warn & BL_WARN_PWSOFT) && r6.val > 0.0 && r6.sys > 0.0,
            "soft point");
  (void)k1;
  (void)r1;
  (void)exact;
  bl_quad_free(q);
  return;
#endif
  cr_assert_eq(bl_method_dk_e(&c, NULL, BL_METHOD_PARTIAL, k1, q, &r1),
               BL_SUCCESS);
  cr_expect((r1.warn & BL_WARN_PWSOFT) && (r6.warn & BL_WARN_PWSOFT),
            "flagged");
  exact = pw_direct(&c, k1, 1e-3);
  cr_log_info("e- Cu 10 keV y=0.01: rule/exact - 1 = %.3g, sys %.3g",
              r1.val / exact - 1.0, r1.sys / r1.val);
  cr_expect(fabs(r1.val - exact) <= r1.sys, "within sys: %.10g %.10g sys "
            "%g", r1.val, exact, r1.sys);
  EXPECT_REL(r1.val, exact, 1e-2, "y = 0.01");
  EXPECT_REL(r6.val / bornel_direct(&c, k6, 1e-3),
             r1.val / bornel_direct(&c, k1, 1e-3), 1e-12, "the same ratio");
  cr_expect(r6.sys / r6.val > r1.sys / r1.val, "sys grows");
  bl_quad_free(q);
}
