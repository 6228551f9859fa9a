/*
** bl_references.c -- the literature the models and checks rest on
** See Copyright Notice in LICENSE
*/

#include "bl_internal.h"

const bl_ref bl_ref_BetheHeitler1934 = {
  "BetheHeitler1934",
  "H. Bethe and W. Heitler, Proc. R. Soc. Lond. A 146 (1934) 83",
  "10.1098/rspa.1934.0140"
};

const bl_ref bl_ref_KochMotz1959 = {
  "KochMotz1959",
  "H. W. Koch and J. W. Motz, Rev. Mod. Phys. 31 (1959) 920",
  "10.1103/RevModPhys.31.920"
};

const bl_ref bl_ref_Schiff1951 = {
  "Schiff1951",
  "L. I. Schiff, Phys. Rev. 83 (1951) 252",
  "10.1103/PhysRev.83.252"
};

const bl_ref bl_ref_Low1958 = {
  "Low1958",
  "F. E. Low, Phys. Rev. 110 (1958) 974",
  "10.1103/PhysRev.110.974"
};
