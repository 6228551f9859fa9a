// read_hepmc3.cc -- read a HepMC3 ASCII file of brakelight events back with
// the HepMC3 library itself (Debian libhepmc3-dev) and check it: the number
// of events, one vertex and five particles per event (beam and atom with
// status 4, photon, projectile and atom with status 1; six where an atomic
// electron recoils: photon, projectile, electron and ion), PDG codes, the
// units, momentum balance at the vertex to rounding (the atom takes q; the
// energy balance holds with the atom's energy at rest, static field), and
// the cross-section record against the expected value.
// See Copyright Notice in LICENSE
//
//   read_hepmc3 FILE EVENTS SIGMA_PB PDG     exit 0 when every check holds

#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <string>

#include "HepMC3/GenCrossSection.h"
#include "HepMC3/GenEvent.h"
#include "HepMC3/GenParticle.h"
#include "HepMC3/GenVertex.h"
#include "HepMC3/ReaderAscii.h"

static int fails = 0;

static void check(bool ok, const char *what, long ev) {
  if (!ok) {
    if (fails < 20)
      std::fprintf(stderr, "read_hepmc3: event %ld: %s\n", ev, what);
    fails++;
  }
}

int main(int argc, char **argv) {
  if (argc != 5) {
    std::fprintf(stderr, "usage: read_hepmc3 FILE EVENTS SIGMA_PB PDG\n");
    return 2;
  }
  long want = std::atol(argv[2]);
  double sigma = std::atof(argv[3]);
  int pdg = std::atoi(argv[4]);
  HepMC3::ReaderAscii in(argv[1]);
  long n = 0;
  double sumw = 0.0;
  for (;;) {
    HepMC3::GenEvent ev;
    if (!in.read_event(ev) || in.failed())
      break;
    check(ev.momentum_unit() == HepMC3::Units::MEV, "unit MEV", n);
    check(ev.vertices().size() == 1, "one vertex", n);
    const size_t np = ev.particles().size();
    check(np == 5 || np == 6, "five particles (six with the struck "
          "electron's recoil)", n);
    if (np == 5 || np == 6) {
      const auto &p = ev.particles();
      double bal[4] = {0, 0, 0, 0}, scale = p[0]->momentum().e();
      for (size_t i = 0; i < np; i++) {
        int st = p[i]->status(), sign = i < 2 ? 1 : -1;
        check(st == (i < 2 ? 4 : 1), "status", n);
        bal[0] += sign * p[i]->momentum().px();
        bal[1] += sign * p[i]->momentum().py();
        bal[2] += sign * p[i]->momentum().pz();
        bal[3] += sign * p[i]->momentum().e();
      }
      check(p[0]->pid() == pdg && p[3]->pid() == pdg, "projectile PDG", n);
      check(p[2]->pid() == 22, "photon PDG 22", n);
      check(p[1]->pid() == p[np - 1]->pid() && p[1]->pid() > 1000000000,
            "nucleus PDG", n);
      if (np == 6) {
        double q2 = p[4]->momentum().p3mod2(), e = p[4]->momentum().e();
        check(p[4]->pid() == 11, "struck electron PDG 11", n);
        check(std::fabs(e * e - q2 - 0.51099895 * 0.51099895)
              <= 1e-9 * e * e, "struck electron on its mass shell", n);
        check(p[5]->momentum().p3mod2() == 0.0, "ion at rest", n);
      }
      check(p[2]->momentum().e() > 0.0, "photon energy", n);
      for (int j = 0; j < 4; j++)
        check(std::fabs(bal[j]) <= 1e-12 * scale, "four-momentum balance", n);
      check(p[0]->production_vertex() == nullptr ||
            p[0]->production_vertex()->id() == 0, "beam has no parent", n);
      check(p[2]->production_vertex() && p[2]->production_vertex()->id() == -1,
            "photon from vertex -1", n);
    }
    auto xs = ev.cross_section();
    check(xs != nullptr, "cross-section record", n);
    if (xs)
      check(std::fabs(xs->xsec() - sigma) <= 1e-6 * sigma, "cross section", n);
    if (!ev.weights().empty())
      sumw += ev.weights()[0];
    n++;
  }
  in.close();
  check(n == want, "event count", n);
  std::printf("read_hepmc3: %ld events, sum of weights %.6g pb, %d failures\n",
              n, sumw, fails);
  return fails == 0 ? 0 : 1;
}
