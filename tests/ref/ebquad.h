/*
** ebquad.h -- a quadruple-precision reference for electron-target
** bremsstrahlung at high energy (tests only; nothing here calls the
** library)
** See Copyright Notice in LICENSE
**
** ebquad_point builds the point of bl_ebrems_point's parametrisation from
** its parameters, in __float128: the projectile (mass m, kinetic energy
** t0, units m_e) along +z on an electron at rest, the photon of energy k
** at h_k = 1 - cos theta_k (azimuth 0), and the final pair in its rest
** frame (polar axis along p1 + p2 - k, x axis towards the photon) with
** the projectile at h_s = 1 - cos theta_s, azimuth phi (hs2 = 2 - h_s,
** given separately, is used for h_s > 1: the exchange pole h_s = 2).  It then takes the
** spin- and polarisation-summed |M|^2 (e^6 included, units m_e^-2) by the
** trace route of ebref.c (ebref_tr.h), all in __float128, with the
** momenta of the lab (frame = 0) or of the pair's rest frame (frame = 1):
** |M|^2 is invariant, so the two agree to the reference's own rounding.
** kind, m, z, spin2 as ebref_msq.  mom (may be NULL): the momenta used,
** rounded to double.  0, or -1 beyond the end point.
*/
#ifndef EBQUAD_H
#define EBQUAD_H

int ebquad_point (int kind, double m, double z, int spin2, double t0,
                  double k, double hk, double hs, double hs2, double phi,
                  int frame, double *msq, double mom[5][4]);

#endif
