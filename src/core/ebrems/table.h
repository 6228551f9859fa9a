/*
** table.h -- the bound electron term of electrons, positrons and muons as
** a ratio to the static-charge electron term: grid, generated tables
** (eb_table.c, make eb-table; eb_table_mu.c, make eb-table-mu) and their
** interpolation (table.c)
** See Copyright Notice in LICENSE
*/
#ifndef BL_EBREMS_TABLE_H
#define BL_EBREMS_TABLE_H

#include "brakelight/bl_dcs.h"   /* BL_EBT_ROW */
#include "brakelight/bl_ebrems.h"   /* BL_EBREMS_T_MAX */

/* Grid: Z nodes bl_ebt_z (linear in ln Z), ln T = EBT_LT0 + EBT_DLT i
** (T in MeV, 1 keV ... 1 GeV, three nodes a decade; held below, blended
** to the high-energy limit above: table.c), u = y / y_max nodes
** bl_ebt_u (the ratio is 0 at u = 1). */
#define EBT_NZ  5
#define EBT_NT  19
#define EBT_NU  13
#define EBT_LT0 (-6.907755278982137)   /* ln 1e-3 */
#define EBT_DLT 0.7675283643313486     /* ln 10 / 3 */
#define EBT_TIPW 5.0                   /* width of the last stretch: table.c */
#define EBT_LBLEND 4.605170185988091   /* ln 100: the blend above the top */

extern const int bl_ebt_z[EBT_NZ];
extern const double bl_ebt_u[EBT_NU];
extern const double bl_ebt_r[2][EBT_NZ][EBT_NT][EBT_NU];

/* The muon table (eb_table_mu.c, make eb-table-mu): mu- and mu+ on the same
** Z nodes, ln T = EBM_LT0 + EBM_DLT i (1 MeV ... 10 TeV, three nodes a
** decade; held below; above, blended linearly in ln T to 1 over
** EBM_LBLEND), u nodes bl_ebm_u, interpolated in ln(u / (1 - u)) (the
** struck electron's radiation makes ln R steep at small u); beyond the last
** node the power law of the last two nodes (table.c). */
#define EBM_NT  22
#define EBM_NU  16
#define EBM_LT0 0.0                    /* ln 1 (MeV) */
#define EBM_DLT 0.7675283643313486     /* ln 10 / 3 */
#define EBM_LBLEND 2.302585092994046   /* ln 10: the blend above the top */

extern const double bl_ebm_u[EBM_NU];
extern const double bl_ebm_r[2][EBT_NZ][EBM_NT][EBM_NU];

/* The table of other projectiles (eb_table_h.c, make eb-table-h): any
** mass M from EBH_LM0 up, any charge z, spin 0 or 1/2.  At each node the
** three parts of R at z = +1 (DEVELOPERS.md, "Other projectiles"): the
** projectile's radiation R_P (~ z^4 like the static term), the
** interference R_I (~ z^3) and the struck electron's radiation R_E
** (~ z^2), so that R(z) = R_P + R_I / z + R_E / z^2, [spin][M node][Z
** node][tau node][u node][part], tau = T / M = EBH_LT0 + EBH_DLT i in ln,
** ln M = EBH_LM0 + EBH_DLM j; Z nodes bl_ebh_z; u nodes bl_ebh_u.  A node
** whose T = M tau exceeds BL_EBREMS_T_MAX holds the values at
** T = BL_EBREMS_T_MAX. */
#define EBH_NS  2
#define EBH_NM  5
#define EBH_NZ  3
#define EBH_NT  22
#define EBH_NU  14
#define EBH_LM0 4.605170185988091      /* ln 100 (MeV) */
#define EBH_DLM 1.151292546497023      /* ln 10 / 2 */
#define EBH_LT0 (-4.605170185988091)   /* ln 0.01 */
#define EBH_DLT 0.7675283643313486     /* ln 10 / 3 */
#define EBH_M0  938.272                /* the mass the scaled parts refer to */

extern const int bl_ebh_z[EBH_NZ];
extern const double bl_ebh_u[EBH_NU];
extern const double bl_ebh_r[EBH_NS][EBH_NM][EBH_NZ][EBH_NT][EBH_NU][3];

/* Table kinds (bl_ebt_rows): electron, positron, muon, antimuon. */
enum { BL_EBT_ELECTRON = 0, BL_EBT_POSITRON, BL_EBT_MUON, BL_EBT_ANTIMUON,
       BL_EBT_NKIND, BL_EBT_OTHER = BL_EBT_NKIND };

/* The ratio R (table.c) for kind BL_EBT_* (e-, e+, mu-, mu+) on element
** Z at kinetic energy T (MeV) and u = k / k_max (k_max the end point on a
** free electron at rest, bl_ebrems_kmax), in two steps: once per case the
** rows of ln R at the u nodes of the two Z nodes around Z (interpolated
** in ln T), the Z weight and the blend weight above the table
** (bl_ebt_rows); then per k (bl_ebt_eval): 0 for u >= 1, never below 0. */
void bl_ebt_rows (int kind, int Z, double T, double rows[2][BL_EBT_ROW],
                  double *wz, double *wb);
double bl_ebt_eval (int kind, const double rows[2][BL_EBT_ROW], double wz,
                    double wb, double T, double u);

/* Other projectiles (kind BL_EBT_OTHER; eb_table_h.c): once per case the
** three parts at the u nodes for twice the spin spin2, mass M (MeV), Z
** and T (bl_ebh_rows: held outside the table's mass, tau and Z ranges;
** above BL_EBREMS_T_MAX at that T); then per k the ratio of charge z at
** u = k / k_max (bl_ebh_eval): 0 for u >= 1, never below 0; continuous. */
void bl_ebh_rows (int spin2, double M, int Z, double T,
                  double rows[3][BL_EBT_ROW]);
double bl_ebh_eval (const double rows[3][BL_EBT_ROW], double z, double u);

/* The last u node of kind's table: the kink where the last stretch begins
** (a breakpoint for the k integrals, with the end point). */
double bl_ebt_ulast (int kind);

#endif
