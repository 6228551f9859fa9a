/*
** bench_kernel.c -- calls per second of the closed-form azimuthal integral
** bl_bracket_azimuth alone (the hot kernel of the Born integrals)
** See Copyright Notice in LICENSE
**
** Built and run by scripts/bench.sh (`make bench`) twice: against this
** tree and against BENCH_BASE, each with its own headers (-Isrc/core of
** that tree), so the ratio of the two is measured in one run; not a test.
**
**   bench_kernel     one line per case: "name npole nterm calls/s checksum"
**
** Each case is a real target factor (Hartree-Fock screening with the
** atomic electrons and the uniform nucleus, the defaults) at y = 0.5 and
** brackets on a grid of 64 x 64 polar angles (log-spaced h0, h from the
** forward peak to 2, both ways of the ridge), evaluated repeatedly for
** about 0.2 s; the checksum (sum of all values) lets the two builds'
** values be compared (they agree to rounding).  Where the tree has the
** panel kernel (BL_NODE_MAX, bl_bracket_azimuth_n: the one the Born
** integrals call since issue 14's lanes) that is what is timed, on
** panels of 21 consecutive brackets; calls/s counts brackets.
*/

#include <math.h>
#include <stdio.h>
#include <time.h>

#include "born/internal.h"

#include "bench_util.h"

#define NG 64
#define SPAN_S 0.2



static bl_bracket br[NG * NG];
#ifdef BL_WPOLES
static bl_wpoles wp;
#endif
#ifdef BL_NODE_MAX   /* the kernel as the integrator calls it: panels */
#define PANEL 21
#define NPANEL ((NG * NG + PANEL - 1) / PANEL)
static bl_brackets bb[NPANEL];
static double out[BL_NODE_MAX];
#endif


static void run (const char *name, const char *particle, int Z, double T) {
  bl_case c;
  bl_kin kn;
  double single[BL_POLE_MAX], sum = 0.0, t0, t;
  long reps = 0, n;
  int i, j;
  if (bl_case_setup(&c, bl_particle_find(particle), Z,
                    bl_model_find("hartree-fock"), NULL, T,
                    &bl_opts_default) != BL_SUCCESS) {
    printf("%s: setup failed\n", name);
    return;
  }
  bl_kin_set(&kn, c.t0, 0.5 * c.t0, c.particle.spin);
  for (i = 0; i < c.npole; i++)
    single[i] = c.single_el[i] + c.single_e[i];
  for (i = 0; i < NG; i++)
    for (j = 0; j < NG; j++) {
      bl_polar g = {0};
      g.h0 = kn.hc0 * expm1(log1p(2.0 / kn.hc0) * (i + 0.5) / NG);
      g.h = kn.hc * expm1(log1p(2.0 / kn.hc) * (j + 0.5) / NG);
      g.s0 = sqrt(g.h0 * (2.0 - g.h0));
      g.s = sqrt(g.h * (2.0 - g.h));
      bl_bracket_set(&kn, &g, &br[i * NG + j]);
    }
#ifdef BL_WPOLES   /* the target factor sorted once (set-up, not timed) */
  bl_wpoles_set(&wp, c.npole, c.pole, single, c.nterm, c.term);
#endif
#ifdef BL_NODE_MAX   /* 21 brackets a panel (the last one repeated) */
  for (n = 0; n < NPANEL * BL_NODE_MAX; n++) {
    long p = n / BL_NODE_MAX, l = n % BL_NODE_MAX, m = p * PANEL + l;
    const bl_bracket *b1 = &br[m < NG * NG && l < PANEL ? m : NG * NG - 1];
    bb[p].L0[l] = b1->L0;
    bb[p].L1[l] = b1->L1;
    bb[p].M0[l] = b1->M0;
    bb[p].M1[l] = b1->M1;
    bb[p].Q0[l] = b1->Q0;
    bb[p].b[l] = b1->b;
  }
#endif
  t0 = now();
  do {
#ifdef BL_NODE_MAX
    for (n = 0; n < NPANEL; n++) {
      int l, np = n + 1 < NPANEL ? PANEL : NG * NG - (NPANEL - 1) * PANEL;
      bl_bracket_azimuth_n(&bb[n], np, &wp, out);
      for (l = 0; l < np; l++)
        sum += out[l];
    }
#else
    for (n = 0; n < NG * NG; n++)
#ifdef BL_WPOLES
      sum += bl_bracket_azimuth(&br[n], &wp);
#else
      sum += bl_bracket_azimuth(&br[n], c.npole, c.pole, single, c.nterm,
                                c.term);
#endif
#endif
    reps++;
    t = now() - t0;
  } while (t < SPAN_S);
  printf("%-12s %3d %4d %12.4g %.17g\n", name, c.npole, c.nterm,
         reps * NG * NG / t, sum / reps);
}


int main (void) {
  printf("# case        npole nterm    calls/s   checksum\n");
  run("e-Pb-10MeV", "electron", 82, 10.0);
  run("e-Pb-10GeV", "electron", 82, 1e4);
  run("e-C-10GeV", "electron", 6, 1e4);
  run("mu-Pb-10GeV", "muon", 82, 1e4);
  run("pi-Cu-1GeV", "pion+", 29, 1e3);
  return 0;
}
