/*
** kkp.h -- the Kelner-Kokoulin-Petrukhin cross section of muon
** bremsstrahlung on the nucleus and on the atomic electrons; for the tests
** only
** See Copyright Notice in LICENSE
**
** Sources: S. R. Kelner, R. P. Kokoulin and A. A. Petrukhin, "About cross
** section for high-energy muon bremsstrahlung", preprint MEPhI 024-95
** (Moscow, 1995), and Phys. At. Nucl. 60 (1997) 576 (the electron term);
** as collected in D. E. Groom, N. V. Mokhov and S. I. Striganov, At. Data
** Nucl. Data Tables (2001), "Muon stopping power and range tables".  The
** formula and its constants (B = 183, B' = 1429, D_n = 1.54 A^0.27) are
** FROM MEMORY, not read from the papers: a test using them says so, and its
** tolerance counts that.  Z >= 2 only (hydrogen has constants of its own,
** not recalled).
*/
#ifndef KKP_H
#define KKP_H

/* Which terms: the nucleus (Z^2 Phi_n), the electrons (Z Phi_e), both. */
enum { KKP_NUCLEUS = 1, KKP_ELECTRONS = 2, KKP_BOTH = 3 };

/* d sigma / dv in cm^2/g of a muon of total energy e_mev (MeV) giving the
** fraction v of its energy to the photon, in an element of atomic number
** Z (>= 2) and atomic mass a (g/mol):
**   (16/3) alpha N_A (m_e r_e / m_mu)^2 Z (Z Phi_n + Phi_e)
**     (1 - v + 3 v^2 / 4) / (v a),
**   Phi_n = ln[B Z^-1/3 (m_mu + delta (D' sqrt e - 2))
**            / (D' (m_e + delta sqrt e B Z^-1/3))],  D' = D_n^(1 - 1/Z),
**   Phi_e = ln[B' Z^-2/3 m_mu / ((1 + delta m_mu / (m_e^2 sqrt e))
**            (m_e + delta sqrt e B' Z^-2/3))],
**   delta = m_mu^2 v / (2 E (1 - v)),
** each Phi set to 0 where negative, Phi_e also for v at or above the
** muon-electron end point 1 / (1 + m_mu^2 / (2 m_e E)).  NaN outside
** 0 < v < 1 - m_mu/E, Z < 2, a <= 0. */
double kkp_dsdv (double Z, double a, double e_mev, double v, int terms);

/* b_brems = int_0^{v_max} v d sigma/dv dv (cm^2/g), v_max = 1 - m_mu/E:
** the energy-scaled radiative loss, -dE/dx = b E. */
double kkp_b (double Z, double a, double e_mev, int terms);

#endif
