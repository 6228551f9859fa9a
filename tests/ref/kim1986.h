/*
** kim1986.h -- the ratio of positron to electron radiative stopping power,
** parametrized by Kim, Pratt, Seltzer & Berger; for the tests only
** See Copyright Notice in LICENSE
**
** Source: L. Kim, R. H. Pratt, S. M. Seltzer and M. J. Berger, Phys. Rev. A
** 33 (1986) 3002 (a fit to partial-wave results for the radiative stopping
** powers of positrons and electrons).  The coefficients in kim1986.c are
** FROM MEMORY, not read from the paper: a test using them allows +-10 %.
*/
#ifndef KIM1986_H
#define KIM1986_H

/* The ratio S_rad(e+)/S_rad(e-) for kinetic energy t_mev (MeV, > 0) in the
** field of an atom of atomic number Z (> 0):
**   ratio = 1 - exp(sum_{i=1..7} a_i tau^i),
**   tau = ln(1 + 10^6 T/(Z^2 m_e c^2)).
** NaN for t_mev <= 0 or Z <= 0 (or not finite). */
double kim1986_ratio (double Z, double t_mev);

/* The variable tau of the fit (same arguments; NaN outside the domain). */
double kim1986_tau (double Z, double t_mev);

#endif
