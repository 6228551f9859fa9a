/*
** ebref.h -- independent references for electron-target bremsstrahlung
** (tests only; nothing here calls the library)
** See Copyright Notice in LICENSE
**
** Units m_e = 1 (hbar = c = 1), metric (+, -, -, -).  Process
** a(p1) + e-(p2) -> a(p3) + e-(p4) [+ photon(k)].  kind: 0 a projectile
** distinguishable from the electron (mass m, charge z, spin2 = 0 or 1),
** 1 an electron, 2 a positron (then m = 1, z = -1 / +1, spin2 = 1).
**
** ebref_msq: the spin- and polarisation-summed |M|^2 of the bremsstrahlung
** process, e^6 included, by a route of its own: Dirac traces of the
** projectors p/ +- m (no spinors), the chiral representation of the gamma
** matrices, and the polarisation sum -g_{rho sigma} (no transverse
** vectors).  The Feynman rules are those written in DEVELOPERS.md
** ("Electron-target bremsstrahlung"); the code shares none of the core's.
**
** The elastic references are the textbook closed forms (spin-averaged
** |M|^2 over 64 pi^2 s: dsigma/dOmega in the centre-of-mass frame, units
** lambda_e^2 = (hbar/(m_e c))^2 per sr, the full |M|^2, without the 1/2
** of identical particles):
**   ebref_moller  Moller (e- e-): Berestetskii, Lifshitz & Pitaevskii, QED,
**                 §81 (the massive invariant form; transcribed here from
**                 the trace of the t, u and interference terms);
**   ebref_bhabha  Bhabha (e+ e-): the same by crossing s <-> u (BLP §81);
**   ebref_dirac   a spin-1/2 projectile of mass m, charge z on an
**                 electron, one-photon exchange (the e- mu- form of Peskin
**                 & Schroeder §5.4 with both masses kept);
**   ebref_scalar  a spin-0 projectile (scalar QED vertex (p + p')^mu) on
**                 an electron: the trace of the electron line (Peskin &
**                 Schroeder §9.1 for the scalar vertex; the trace as §5.1).
** Each takes the invariants s, t (u = 2 m^2 + 2 - s - t).
*/
#ifndef EBREF_H
#define EBREF_H

double ebref_msq (int kind, double m, double z, int spin2,
                  const double p[5][4]);

double ebref_moller (double s, double t);
double ebref_bhabha (double s, double t);
double ebref_dirac (double m, double z, double s, double t);
double ebref_scalar (double m, double z, double s, double t);

/* Low (1958): the classical soft-photon factor -J.J summed over the two
** polarisations, J = sum_i eta_i Q_i p_i / (p_i . k) (eta = +1 outgoing,
** -1 incoming), for charges z (projectile) and -1 (electron), momenta
** p[0..3] as above and photon k.  d5sigma/(dk dOmega_k dOmega_s) ->
** alpha k / (4 pi^2) * soft * dsigma_el/dOmega as k -> 0. */
double ebref_soft (double z, const double p[5][4]);

#endif
