/*
** references.c -- the literature the models and checks rest on
** See Copyright Notice in LICENSE
*/

#include "models/internal.h"

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

/* DOIs of the four below recalled, not yet checked against the publisher. */
const bl_ref bl_ref_Moliere1947 = {
  "Moliere1947",
  "G. Moliere, Z. Naturforsch. A 2 (1947) 133",
  "10.1515/zna-1947-0302"
};

const bl_ref bl_ref_Tsai1974 = {
  "Tsai1974",
  "Y.-S. Tsai, Rev. Mod. Phys. 46 (1974) 815",
  "10.1103/RevModPhys.46.815"
};

const bl_ref bl_ref_Hubbell1975 = {
  "Hubbell1975",
  "J. H. Hubbell, Wm. J. Veigele, E. A. Briggs, R. T. Brown, D. T. Cromer "
  "and R. J. Howerton, J. Phys. Chem. Ref. Data 4 (1975) 471",
  "10.1063/1.555523"
};

const bl_ref bl_ref_Schoonjans2011 = {
  "Schoonjans2011",
  "T. Schoonjans, A. Brunetti, B. Golosio, M. Sanchez del Rio, V. A. Sole, "
  "C. Ferrero and L. Vincze, Spectrochim. Acta B 66 (2011) 776 (xraylib)",
  "10.1016/j.sab.2011.09.011"
};
