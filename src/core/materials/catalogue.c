/*
** catalogue.c -- the material catalogue: short lowercase keys with
** aliases, each with its composition, density and their source
** See Copyright Notice in LICENSE
**
** Where the data come from.  Most entries take their mass fractions at
** run time from xraylib's compound list (the NIST material composition
** data), by the record's own label, which stays in this file: users see
** our keys, descriptions and sources only.  Their densities are copied
** here from the same records (tests/test_materials.c checks every copy
** and every label against the installed xraylib).  An entry with a
** formula takes its composition from the formula (tests/test_materials.c
** checks it against the record's mass fractions to 1e-4).  The entries
** of our own (detector and shielding materials) name their source;
** "from memory" marks values recalled rather than read from the table
** named, "common practice" a convention without a single source.
**
** Formula unit: an entry with a formula has its molecule ("bgo" is one
** Bi4Ge3O12, as the formula "Bi4Ge3O12"); an entry given by mass has one
** average atom, as a mixture (src/core/materials/fill.c).
**
** Effective element.  "standard_rock" is the muon-physics convention
** Z = 11, A = 22: one component with Z = 11 and A = 22 g/mol in place
** of sodium's 22.99.  The atom (screening, atomic electrons, nuclear
** charge and size) is sodium's; A enters the per-gram factor N_A / A,
** Z / A of the suppression, and the radiation length (Tsai:
** 26.55 g/cm^2).  Mixtures keep such an A (fill.c).
**
** The table is constant: no state, nothing to lock.
*/

#include <ctype.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include <xraylib.h>

#include "brakelight/bl_errno.h"
#include "materials/internal.h"


/* The public entry and what only this file needs. */
typedef struct Entry {
  bl_catalogue_entry pub;
  const char *xrl;      /* label of xraylib's record with the fractions */
  const char *bymass;   /* "Fe 0.695 Cr 0.19 ...": symbols, mass fractions */
  double A;             /* effective atomic weight (one element); 0: none */
} Entry;


#define XRL_COMP "by mass: the NIST material composition data (xraylib's " \
  "compound list)"
#define SRC_XRL "composition and density: NIST material composition " \
  "data, as distributed in xraylib's compound list"
#define SRC_XRLF "composition: the formula; density: NIST material " \
  "composition data, as distributed in xraylib's compound list"


/* Sorted by key (tests/test_materials.c checks the order). */
static const Entry table[] = {
  {{"a150_plastic", {"a150"},
    "A-150 tissue-equivalent plastic",
    NULL, XRL_COMP,
    1.127, SRC_XRL, 0},
   "A-150 Tissue-Equivalent Plastic", NULL, 0},
  {{"acetone", {NULL},
    "acetone",
    NULL, XRL_COMP,
    0.7899, SRC_XRL, 0},
   "Acetone", NULL, 0},
  {{"acetylene", {NULL},
    "acetylene gas",
    NULL, XRL_COMP,
    0.001097, SRC_XRL, 0},
   "Acetylene", NULL, 0},
  {{"adenine", {NULL},
    "adenine",
    NULL, XRL_COMP,
    1.35, SRC_XRL, 0},
   "Adenine", NULL, 0},
  {{"adipose_tissue", {"adipose"},
    "adipose tissue (ICRP composition)",
    NULL, XRL_COMP,
    0.92, SRC_XRL, 0},
   "Adipose Tissue (ICRP)", NULL, 0},
  {{"air", {"dry_air"},
    "dry air near sea level",
    NULL, XRL_COMP,
    0.001205, SRC_XRL, 0},
   "Air, Dry (near sea level)", NULL, 0},
  {{"alanine", {NULL},
    "alanine",
    NULL, XRL_COMP,
    1.42, SRC_XRL, 0},
   "Alanine", NULL, 0},
  {{"alumina", {"aluminium_oxide", "aluminum_oxide"},
    "aluminium oxide",
    "Al2O3", "Al2O3",
    3.97, SRC_XRLF, 0},
   "Aluminum Oxide", NULL, 0},
  {{"amber", {NULL},
    "amber",
    NULL, XRL_COMP,
    1.1, SRC_XRL, 0},
   "Amber", NULL, 0},
  {{"ammonia", {NULL},
    "ammonia gas",
    NULL, XRL_COMP,
    0.000826, SRC_XRL, 0},
   "Ammonia", NULL, 0},
  {{"aniline", {NULL},
    "aniline",
    NULL, XRL_COMP,
    1.0235, SRC_XRL, 0},
   "Aniline", NULL, 0},
  {{"anthracene", {NULL},
    "anthracene",
    NULL, XRL_COMP,
    1.283, SRC_XRL, 0},
   "Anthracene", NULL, 0},
  {{"b100_plastic", {"b100"},
    "B-100 bone-equivalent plastic",
    NULL, XRL_COMP,
    1.45, SRC_XRL, 0},
   "B-100 Bone-Equivalent Plastic", NULL, 0},
  {{"bakelite", {NULL},
    "bakelite",
    NULL, XRL_COMP,
    1.25, SRC_XRL, 0},
   "Bakelite", NULL, 0},
  {{"barium_fluoride", {"baf2"},
    "barium fluoride crystal",
    "BaF2", "BaF2",
    4.89, SRC_XRLF, BL_CATALOGUE_CRYSTAL},
   "Barium Fluoride", NULL, 0},
  {{"barium_sulfate", {"barite"},
    "barium sulfate",
    "BaSO4", "BaSO4",
    4.5, SRC_XRLF, 0},
   "Barium Sulfate", NULL, 0},
  {{"benzene", {NULL},
    "benzene",
    NULL, XRL_COMP,
    0.87865, SRC_XRL, 0},
   "Benzene", NULL, 0},
  {{"beryllia", {"beryllium_oxide"},
    "beryllium oxide",
    "BeO", "BeO",
    3.01, SRC_XRLF, 0},
   "Beryllium oxide", NULL, 0},
  {{"bgo", {"bismuth_germanate"},
    "bismuth germanate crystal",
    "Bi4Ge3O12", "Bi4Ge3O12",
    7.13, SRC_XRLF, BL_CATALOGUE_CRYSTAL},
   "Bismuth Germanium oxide", NULL, 0},
  {{"blood", {NULL},
    "blood (ICRP composition)",
    NULL, XRL_COMP,
    1.06, SRC_XRL, 0},
   "Blood (ICRP)", NULL, 0},
  {{"bone_compact", {NULL},
    "compact bone (ICRU composition)",
    NULL, XRL_COMP,
    1.85, SRC_XRL, 0},
   "Bone, Compact (ICRU)", NULL, 0},
  {{"bone_cortical", {NULL},
    "cortical bone (ICRP composition)",
    NULL, XRL_COMP,
    1.85, SRC_XRL, 0},
   "Bone, Cortical (ICRP)", NULL, 0},
  {{"borated_polyethylene", {"bpe", "boron_polyethylene"},
    "polyethylene with 5 % boron by mass",
    NULL, "by mass: H 0.136525 B 0.05 C 0.813475",
    1.0, "composition: polyethylene (CH2)n with 5 % natural boron by mass, the "
      "usual shielding grade (common practice); density: 1.00 g/cm^3 (from "
      "memory; commercial sheets span about 0.95-1.05)", 0},
   NULL, "H 0.136525 B 0.05 C 0.813475", 0},
  {{"boron_carbide", {NULL},
    "boron carbide",
    "B4C", "B4C",
    2.52, SRC_XRLF, 0},
   "Boron Carbide", NULL, 0},
  {{"boron_oxide", {NULL},
    "boron oxide",
    "B2O3", "B2O3",
    1.812, SRC_XRLF, 0},
   "Boron Oxide", NULL, 0},
  {{"borosilicate_glass", {"pyrex"},
    "borosilicate glass",
    NULL, XRL_COMP,
    2.23, SRC_XRL, 0},
   "Glass, Pyrex", NULL, 0},
  {{"brain", {NULL},
    "brain (ICRP composition)",
    NULL, XRL_COMP,
    1.03, SRC_XRL, 0},
   "Brain (ICRP)", NULL, 0},
  {{"brass", {"cartridge_brass"},
    "cartridge brass, 70 % Cu, 30 % Zn",
    NULL, "by mass: Cu 0.70 Zn 0.30",
    8.53, "composition and density: cartridge brass, UNS C26000, nominal values "
      "(from memory)", 0},
   NULL, "Cu 0.70 Zn 0.30", 0},
  {{"butane", {NULL},
    "butane gas",
    NULL, XRL_COMP,
    0.002493, SRC_XRL, 0},
   "Butane", NULL, 0},
  {{"butanol", {"n_butanol", "butyl_alcohol"},
    "n-butyl alcohol",
    NULL, XRL_COMP,
    0.8098, SRC_XRL, 0},
   "N-Butyl Alcohol", NULL, 0},
  {{"butyl_rubber", {NULL},
    "butyl rubber",
    NULL, XRL_COMP,
    0.92, SRC_XRL, 0},
   "Rubber, Butyl", NULL, 0},
  {{"c552_plastic", {"c552"},
    "C-552 air-equivalent plastic",
    NULL, XRL_COMP,
    1.76, SRC_XRL, 0},
   "C-552 Air-Equivalent Plastic", NULL, 0},
  {{"cadmium_telluride", {"cdte"},
    "cadmium telluride crystal",
    "CdTe", "CdTe",
    6.2, SRC_XRLF, BL_CATALOGUE_CRYSTAL},
   "Cadmium Telluride", NULL, 0},
  {{"cadmium_tungstate", {"cwo", "cdwo4"},
    "cadmium tungstate crystal",
    "CdWO4", "CdWO4",
    7.9, SRC_XRLF, BL_CATALOGUE_CRYSTAL},
   "Cadmium Tungstate", NULL, 0},
  {{"caesium_fluoride", {"cesium_fluoride", "csf"},
    "caesium fluoride crystal",
    "CsF", "CsF",
    4.115, SRC_XRLF, BL_CATALOGUE_CRYSTAL},
   "Cesium Fluoride", NULL, 0},
  {{"calcium_carbonate", {NULL},
    "calcium carbonate",
    "CaCO3", "CaCO3",
    2.8, SRC_XRLF, 0},
   "Calcium Carbonate", NULL, 0},
  {{"calcium_fluoride", {"caf2"},
    "calcium fluoride crystal",
    "CaF2", "CaF2",
    3.18, SRC_XRLF, BL_CATALOGUE_CRYSTAL},
   "Calcium Fluoride", NULL, 0},
  {{"calcium_oxide", {NULL},
    "calcium oxide",
    "CaO", "CaO",
    3.3, SRC_XRLF, 0},
   "Calcium Oxide", NULL, 0},
  {{"calcium_sulfate", {NULL},
    "calcium sulfate",
    "CaSO4", "CaSO4",
    2.96, SRC_XRLF, 0},
   "Calcium Sulfate", NULL, 0},
  {{"calcium_tungstate", {"cawo4"},
    "calcium tungstate crystal",
    "CaWO4", "CaWO4",
    6.062, SRC_XRLF, BL_CATALOGUE_CRYSTAL},
   "Calcium Tungstate", NULL, 0},
  {{"carbon_dioxide", {NULL},
    "carbon dioxide gas",
    NULL, XRL_COMP,
    0.001842, SRC_XRL, 0},
   "Carbon Dioxide", NULL, 0},
  {{"carbon_tetrachloride", {NULL},
    "carbon tetrachloride",
    NULL, XRL_COMP,
    1.594, SRC_XRL, 0},
   "Carbon Tetrachloride", NULL, 0},
  {{"cellophane", {"cellulose_acetate"},
    "cellulose acetate (cellophane)",
    NULL, XRL_COMP,
    1.42, SRC_XRL, 0},
   "Cellulose Acetate, Cellophane", NULL, 0},
  {{"cellulose_acetate_butyrate", {NULL},
    "cellulose acetate butyrate",
    NULL, XRL_COMP,
    1.2, SRC_XRL, 0},
   "Cellulose Acetate Butyrate", NULL, 0},
  {{"cellulose_nitrate", {NULL},
    "cellulose nitrate",
    NULL, XRL_COMP,
    1.49, SRC_XRL, 0},
   "Cellulose Nitrate", NULL, 0},
  {{"ceric_sulfate_dosimeter", {NULL},
    "ceric sulfate dosimeter solution",
    NULL, XRL_COMP,
    1.03, SRC_XRL, 0},
   "Ceric Sulfate Dosimeter Solution", NULL, 0},
  {{"chlorobenzene", {NULL},
    "chlorobenzene",
    NULL, XRL_COMP,
    1.1058, SRC_XRL, 0},
   "Chlorobenzene", NULL, 0},
  {{"chloroform", {NULL},
    "chloroform",
    NULL, XRL_COMP,
    1.4832, SRC_XRL, 0},
   "Chloroform", NULL, 0},
  {{"concrete", {"portland_concrete", "concrete_portland"},
    "Portland concrete",
    NULL, XRL_COMP,
    2.3, SRC_XRL, 0},
   "Concrete, Portland", NULL, 0},
  {{"concrete_barite", {"barite_concrete", "heavy_concrete"},
    "barite (heavy) concrete, type BA",
    NULL, "by mass: H 0.003585 O 0.311622 Mg 0.001195 Al 0.004183 Si 0.010457 S 0.107858 Ca 0.050194 Fe 0.047505 Ba 0.4634",
    3.35, "composition and density: Compendium of Material Composition Data, "
      "PNNL-15870 Rev. 1, 'Concrete, Barite (Type BA)' (from memory; the "
      "fractions sum to 1 within 1e-6)", 0},
   NULL, "H 0.003585 O 0.311622 Mg 0.001195 Al 0.004183 Si 0.010457 S 0.107858 Ca 0.050194 Fe 0.047505 Ba 0.4634", 0},
  {{"concrete_nbs04", {"concrete_ordinary", "ordinary_concrete"},
    "ordinary concrete (NBS 04)",
    NULL, "by mass: H 0.005558 O 0.498076 Na 0.017101 Mg 0.002565 Al 0.045746 Si 0.315092 S 0.001283 K 0.019239 Ca 0.082941 Fe 0.012398",
    2.35, "composition and density: Compendium of Material Composition Data, "
      "PNNL-15870 Rev. 1, 'Concrete, Ordinary (NBS 04)' (from memory; the "
      "fractions sum to 1 within 1e-6)", 0},
   NULL, "H 0.005558 O 0.498076 Na 0.017101 Mg 0.002565 Al 0.045746 Si 0.315092 S 0.001283 K 0.019239 Ca 0.082941 Fe 0.012398", 0},
  {{"csi", {"caesium_iodide", "cesium_iodide"},
    "caesium iodide crystal",
    "CsI", "CsI",
    4.51, SRC_XRLF, BL_CATALOGUE_CRYSTAL},
   "Cesium Iodide", NULL, 0},
  {{"cyclohexane", {NULL},
    "cyclohexane",
    NULL, XRL_COMP,
    0.779, SRC_XRL, 0},
   "Cyclohexane", NULL, 0},
  {{"dichlorobenzene", {"o_dichlorobenzene"},
    "1,2-dichlorobenzene",
    NULL, XRL_COMP,
    1.3048, SRC_XRL, 0},
   "1,2-Ddihlorobenzene", NULL, 0},
  {{"dichlorodiethyl_ether", {NULL},
    "dichlorodiethyl ether",
    NULL, XRL_COMP,
    1.2199, SRC_XRL, 0},
   "Dichlorodiethyl Ether", NULL, 0},
  {{"dichloroethane", {NULL},
    "1,2-dichloroethane",
    NULL, XRL_COMP,
    1.2351, SRC_XRL, 0},
   "1,2-Dichloroethane", NULL, 0},
  {{"diethyl_ether", {"ether"},
    "diethyl ether",
    NULL, XRL_COMP,
    0.71378, SRC_XRL, 0},
   "Diethyl Ether", NULL, 0},
  {{"dimethyl_sulfoxide", {"dmso"},
    "dimethyl sulfoxide",
    NULL, XRL_COMP,
    1.1014, SRC_XRL, 0},
   "Dimethyl Sulfoxide", NULL, 0},
  {{"dimethylformamide", {"dmf"},
    "N,N-dimethylformamide",
    NULL, XRL_COMP,
    0.9487, SRC_XRL, 0},
   "N,N-Dimethyl Formamide", NULL, 0},
  {{"emulsion_gel", {NULL},
    "gelatine of photographic emulsion",
    NULL, XRL_COMP,
    1.2914, SRC_XRL, 0},
   "Gel in Photographic Emulsion", NULL, 0},
  {{"emulsion_silver_halides", {NULL},
    "silver halides of photographic emulsion",
    NULL, XRL_COMP,
    6.47, SRC_XRL, 0},
   "Silver Halides in Photographic Emulsion", NULL, 0},
  {{"ethane", {NULL},
    "ethane gas",
    NULL, XRL_COMP,
    0.001253, SRC_XRL, 0},
   "Ethane", NULL, 0},
  {{"ethanol", {"ethyl_alcohol"},
    "ethanol",
    NULL, XRL_COMP,
    0.7893, SRC_XRL, 0},
   "Ethyl Alcohol", NULL, 0},
  {{"ethyl_cellulose", {NULL},
    "ethyl cellulose",
    NULL, XRL_COMP,
    1.13, SRC_XRL, 0},
   "Ethyl Cellulose", NULL, 0},
  {{"ethylene", {NULL},
    "ethylene gas",
    NULL, XRL_COMP,
    0.001175, SRC_XRL, 0},
   "Ethylene", NULL, 0},
  {{"eye_lens", {NULL},
    "eye lens (ICRP composition)",
    NULL, XRL_COMP,
    1.1, SRC_XRL, 0},
   "Eye Lens (ICRP)", NULL, 0},
  {{"ferric_oxide", {NULL},
    "iron(III) oxide",
    "Fe2O3", "Fe2O3",
    5.2, SRC_XRLF, 0},
   "Ferric Oxide", NULL, 0},
  {{"ferroboride", {NULL},
    "iron boride",
    "FeB", "FeB",
    7.15, SRC_XRLF, 0},
   "Ferroboride", NULL, 0},
  {{"ferrous_oxide", {NULL},
    "iron(II) oxide",
    "FeO", "FeO",
    5.7, SRC_XRLF, 0},
   "Ferrous Oxide", NULL, 0},
  {{"ferrous_sulfate_dosimeter", {"fricke"},
    "ferrous sulfate (Fricke) dosimeter solution",
    NULL, XRL_COMP,
    1.024, SRC_XRL, 0},
   "Ferrous Sulfate Dosimeter Solution", NULL, 0},
  {{"fluoroelastomer", {"viton"},
    "fluoroelastomer",
    NULL, XRL_COMP,
    1.8, SRC_XRL, 0},
   "Viton Fluoroelastomer", NULL, 0},
  {{"freon12", {"r12"},
    "dichlorodifluoromethane (R-12)",
    NULL, XRL_COMP,
    1.12, SRC_XRL, 0},
   "Freon-12", NULL, 0},
  {{"freon12b2", {NULL},
    "dibromodifluoromethane (R-12B2)",
    NULL, XRL_COMP,
    1.8, SRC_XRL, 0},
   "Freon-12B2", NULL, 0},
  {{"freon13", {"r13"},
    "chlorotrifluoromethane (R-13)",
    NULL, XRL_COMP,
    0.95, SRC_XRL, 0},
   "Freon-13", NULL, 0},
  {{"freon13b1", {NULL},
    "bromotrifluoromethane (R-13B1)",
    NULL, XRL_COMP,
    1.5, SRC_XRL, 0},
   "Freon-13B1", NULL, 0},
  {{"freon13i1", {NULL},
    "trifluoroiodomethane (R-13I1)",
    NULL, XRL_COMP,
    1.8, SRC_XRL, 0},
   "Freon-13I1", NULL, 0},
  {{"gadolinium_oxysulfide", {"gos"},
    "gadolinium oxysulfide",
    "Gd2O2S", "Gd2O2S",
    7.44, SRC_XRLF, BL_CATALOGUE_CRYSTAL},
   "Gadolinium Oxysulfide", NULL, 0},
  {{"gallium_arsenide", {"gaas"},
    "gallium arsenide crystal",
    "GaAs", "GaAs",
    5.31, SRC_XRLF, BL_CATALOGUE_CRYSTAL},
   "Gallium Arsenide", NULL, 0},
  {{"glucose", {NULL},
    "glucose",
    NULL, XRL_COMP,
    1.54, SRC_XRL, 0},
   "Glucose", NULL, 0},
  {{"glutamine", {NULL},
    "glutamine",
    NULL, XRL_COMP,
    1.46, SRC_XRL, 0},
   "Glutamine", NULL, 0},
  {{"glycerol", {"glycerine"},
    "glycerol",
    NULL, XRL_COMP,
    1.2613, SRC_XRL, 0},
   "Glycerol", NULL, 0},
  {{"guanine", {NULL},
    "guanine",
    NULL, XRL_COMP,
    1.58, SRC_XRL, 0},
   "Guanine", NULL, 0},
  {{"gypsum", {"plaster"},
    "gypsum (plaster of Paris)",
    NULL, XRL_COMP,
    2.32, SRC_XRL, 0},
   "Gypsum, Plaster of Paris", NULL, 0},
  {{"heptane", {"n_heptane"},
    "n-heptane",
    NULL, XRL_COMP,
    0.68376, SRC_XRL, 0},
   "N-Heptane", NULL, 0},
  {{"hexane", {"n_hexane"},
    "n-hexane",
    NULL, XRL_COMP,
    0.6603, SRC_XRL, 0},
   "N-Hexane", NULL, 0},
  {{"lanthanum_oxybromide", {NULL},
    "lanthanum oxybromide",
    "LaOBr", "LaOBr",
    6.28, SRC_XRLF, 0},
   "Lanthanum Oxybromide", NULL, 0},
  {{"lanthanum_oxysulfide", {NULL},
    "lanthanum oxysulfide",
    "La2O2S", "La2O2S",
    5.86, SRC_XRLF, 0},
   "Lanthanum Oxysulfide", NULL, 0},
  {{"lead_glass", {"glass_lead"},
    "lead glass (heavy flint, 75 % Pb by mass)",
    NULL, XRL_COMP,
    6.22, SRC_XRL, 0},
   "Glass, Lead", NULL, 0},
  {{"lead_oxide", {"litharge"},
    "lead(II) oxide",
    "PbO", "PbO",
    9.53, SRC_XRLF, 0},
   "Lead Oxide", NULL, 0},
  {{"liquid_argon", {"lar", "argon_liquid"},
    "liquid argon at its boiling point (87 K)",
    "Ar", "Ar",
    1.396, "density: Review of Particle Physics, atomic and nuclear properties of "
      "materials, liquid argon at 87 K (1.396 g/cm^3; from memory)", 0},
   NULL, NULL, 0},
  {{"liquid_propane", {NULL},
    "liquid propane",
    NULL, XRL_COMP,
    0.43, SRC_XRL, 0},
   "Propane, Liquid", NULL, 0},
  {{"liquid_xenon", {"lxe", "xenon_liquid"},
    "liquid xenon at its boiling point (165 K)",
    "Xe", "Xe",
    2.953, "density: Review of Particle Physics, atomic and nuclear properties of "
      "materials, liquid xenon at 165 K (2.953 g/cm^3; from memory)", 0},
   NULL, NULL, 0},
  {{"lithium_amide", {NULL},
    "lithium amide",
    NULL, XRL_COMP,
    1.178, SRC_XRL, 0},
   "Lithium Amide", NULL, 0},
  {{"lithium_carbonate", {NULL},
    "lithium carbonate",
    "Li2CO3", "Li2CO3",
    2.11, SRC_XRLF, 0},
   "Lithium Carbonate", NULL, 0},
  {{"lithium_fluoride", {"lif"},
    "lithium fluoride crystal",
    "LiF", "LiF",
    2.635, SRC_XRLF, BL_CATALOGUE_CRYSTAL},
   "Lithium Fluoride", NULL, 0},
  {{"lithium_hydride", {NULL},
    "lithium hydride",
    "LiH", "LiH",
    0.82, SRC_XRLF, 0},
   "Lithium Hydride", NULL, 0},
  {{"lithium_iodide", {"lii"},
    "lithium iodide crystal",
    "LiI", "LiI",
    3.494, SRC_XRLF, BL_CATALOGUE_CRYSTAL},
   "Lithium Iodide", NULL, 0},
  {{"lithium_oxide", {NULL},
    "lithium oxide",
    "Li2O", "Li2O",
    2.013, SRC_XRLF, 0},
   "Lithium Oxide", NULL, 0},
  {{"lithium_tetraborate", {NULL},
    "lithium tetraborate",
    "Li2B4O7", "Li2B4O7",
    2.44, SRC_XRLF, 0},
   "Lithium Tetraborate", NULL, 0},
  {{"lso", {"lutetium_oxyorthosilicate"},
    "lutetium oxyorthosilicate crystal",
    "Lu2SiO5", "Lu2SiO5",
    7.4, "composition: the formula, cerium dopant neglected; density: Review of "
      "Particle Physics, table of inorganic scintillator properties "
      "(7.40 g/cm^3; from memory)", BL_CATALOGUE_CRYSTAL},
   NULL, NULL, 0},
  {{"lung", {NULL},
    "lung (ICRP composition)",
    NULL, XRL_COMP,
    1.05, SRC_XRL, 0},
   "Lung (ICRP)", NULL, 0},
  {{"lyso", {"lutetium_yttrium_oxyorthosilicate"},
    "lutetium-yttrium oxyorthosilicate crystal (10 % Y)",
    "(Lu1.8Y0.2)SiO5", "(Lu1.8Y0.2)SiO5",
    7.1, "composition: Lu(2-x)Y(x)SiO5 with x = 0.2, the usual commercial crystal "
      "(common practice), cerium dopant neglected; density: manufacturers' data "
      "sheets, 7.1 g/cm^3 (from memory)", BL_CATALOGUE_CRYSTAL},
   NULL, NULL, 0},
  {{"m3_wax", {NULL},
    "M3 wax",
    NULL, XRL_COMP,
    1.05, SRC_XRL, 0},
   "M3 Wax", NULL, 0},
  {{"magnesia", {"magnesium_oxide"},
    "magnesium oxide",
    "MgO", "MgO",
    3.58, SRC_XRLF, 0},
   "Magnesium Oxide", NULL, 0},
  {{"magnesium_carbonate", {NULL},
    "magnesium carbonate",
    "MgCO3", "MgCO3",
    2.958, SRC_XRLF, 0},
   "Magnesium Carbonate", NULL, 0},
  {{"magnesium_fluoride", {NULL},
    "magnesium fluoride",
    "MgF2", "MgF2",
    3.0, SRC_XRLF, 0},
   "Magnesium Fluoride", NULL, 0},
  {{"magnesium_tetraborate", {NULL},
    "magnesium tetraborate",
    NULL, XRL_COMP,
    2.53, SRC_XRL, 0},
   "Magnesium Tetraborate", NULL, 0},
  {{"mercuric_iodide", {NULL},
    "mercury(II) iodide crystal",
    "HgI2", "HgI2",
    6.36, SRC_XRLF, BL_CATALOGUE_CRYSTAL},
   "Mercuric Iodide", NULL, 0},
  {{"methane", {NULL},
    "methane gas",
    NULL, XRL_COMP,
    0.000667, SRC_XRL, 0},
   "Methane", NULL, 0},
  {{"methanol", {"methyl_alcohol"},
    "methanol",
    NULL, XRL_COMP,
    0.7914, SRC_XRL, 0},
   "Methanol", NULL, 0},
  {{"mix_d_wax", {NULL},
    "Mix D wax",
    NULL, XRL_COMP,
    0.99, SRC_XRL, 0},
   "Mix D Wax", NULL, 0},
  {{"ms20_tissue", {NULL},
    "MS20 tissue substitute",
    NULL, XRL_COMP,
    1.0, SRC_XRL, 0},
   "MS20 Tissue Substitute", NULL, 0},
  {{"muscle_liquid", {NULL},
    "muscle-equivalent liquid without sucrose",
    NULL, XRL_COMP,
    1.07, SRC_XRL, 0},
   "Muscle-Equivalent Liquid, without Sucrose", NULL, 0},
  {{"muscle_liquid_sucrose", {NULL},
    "muscle-equivalent liquid with sucrose",
    NULL, XRL_COMP,
    1.11, SRC_XRL, 0},
   "Muscle-Equivalent Liquid, with Sucrose", NULL, 0},
  {{"muscle_skeletal", {"muscle"},
    "skeletal muscle (ICRP composition)",
    NULL, XRL_COMP,
    1.04, SRC_XRL, 0},
   "Muscle, Skeletal", NULL, 0},
  {{"muscle_striated", {NULL},
    "striated muscle (ICRU composition)",
    NULL, XRL_COMP,
    1.04, SRC_XRL, 0},
   "Muscle, Striated", NULL, 0},
  {{"nai", {"sodium_iodide"},
    "sodium iodide crystal",
    "NaI", "NaI",
    3.667, SRC_XRLF, BL_CATALOGUE_CRYSTAL},
   "Sodium Iodide", NULL, 0},
  {{"naphthalene", {NULL},
    "naphthalene",
    NULL, XRL_COMP,
    1.145, SRC_XRL, 0},
   "Naphthalene", NULL, 0},
  {{"natural_rubber", {"rubber"},
    "natural rubber",
    NULL, XRL_COMP,
    0.92, SRC_XRL, 0},
   "Rubber, Natural", NULL, 0},
  {{"neoprene", {NULL},
    "neoprene rubber",
    NULL, XRL_COMP,
    1.23, SRC_XRL, 0},
   "Rubber, Neoprene", NULL, 0},
  {{"nitrobenzene", {NULL},
    "nitrobenzene",
    NULL, XRL_COMP,
    1.19867, SRC_XRL, 0},
   "Nitrobenzene", NULL, 0},
  {{"nitrous_oxide", {NULL},
    "nitrous oxide gas",
    NULL, XRL_COMP,
    0.001831, SRC_XRL, 0},
   "Nitrous Oxide", NULL, 0},
  {{"nylon", {"nylon6", "nylon66"},
    "nylon, types 6 and 6/6",
    NULL, XRL_COMP,
    1.14, SRC_XRL, 0},
   "Nylon, type 6 and type 6/6", NULL, 0},
  {{"nylon11", {NULL},
    "nylon, type 11",
    NULL, XRL_COMP,
    1.425, SRC_XRL, 0},
   "Nylon, type 11 (Rilsan)", NULL, 0},
  {{"nylon610", {NULL},
    "nylon, type 6/10",
    NULL, XRL_COMP,
    1.14, SRC_XRL, 0},
   "Nylon, type 6/10", NULL, 0},
  {{"nylon_8062", {NULL},
    "nylon, type 8062",
    NULL, XRL_COMP,
    1.08, SRC_XRL, 0},
   "Nylon, Du Pont ELVAmide 8062", NULL, 0},
  {{"octane", {"n_octane"},
    "liquid n-octane",
    NULL, XRL_COMP,
    0.7026, SRC_XRL, 0},
   "Octane, Liquid", NULL, 0},
  {{"paraffin", {"paraffin_wax"},
    "paraffin wax",
    NULL, XRL_COMP,
    0.93, SRC_XRL, 0},
   "Paraffin Wax", NULL, 0},
  {{"pctfe", {"polychlorotrifluoroethylene"},
    "polychlorotrifluoroethylene",
    NULL, XRL_COMP,
    2.1, SRC_XRL, 0},
   "Polytrifluorochloroethylene", NULL, 0},
  {{"pentane", {"n_pentane"},
    "n-pentane",
    NULL, XRL_COMP,
    0.6262, SRC_XRL, 0},
   "N-Pentane", NULL, 0},
  {{"pet", {"mylar", "polyethylene_terephthalate"},
    "polyethylene terephthalate",
    NULL, XRL_COMP,
    1.4, SRC_XRL, 0},
   "Polyethylene Terephthalate (Mylar)", NULL, 0},
  {{"photographic_emulsion", {"emulsion"},
    "photographic emulsion",
    NULL, XRL_COMP,
    3.815, SRC_XRL, 0},
   "Photographic Emulsion", NULL, 0},
  {{"plate_glass", {"glass", "soda_lime_glass"},
    "plate (soda-lime) glass",
    NULL, XRL_COMP,
    2.4, SRC_XRL, 0},
   "Glass, Plate", NULL, 0},
  {{"plutonium_dioxide", {NULL},
    "plutonium dioxide",
    "PuO2", "PuO2",
    11.46, SRC_XRLF, 0},
   "Plutonium Dioxide", NULL, 0},
  {{"pmma", {"acrylic", "perspex", "lucite", "plexiglas", "polymethyl_methacrylate"},
    "polymethyl methacrylate",
    NULL, XRL_COMP,
    1.19, SRC_XRL, 0},
   "Polymethyl Methacralate (Lucite, Perspex)", NULL, 0},
  {{"polyacrylonitrile", {"pan"},
    "polyacrylonitrile",
    NULL, XRL_COMP,
    1.17, SRC_XRL, 0},
   "Polyacrylonitrile", NULL, 0},
  {{"polycarbonate", {NULL},
    "polycarbonate",
    NULL, XRL_COMP,
    1.2, SRC_XRL, 0},
   "Polycarbonate (Makrolon, Lexan)", NULL, 0},
  {{"polychlorostyrene", {NULL},
    "polychlorostyrene",
    NULL, XRL_COMP,
    1.3, SRC_XRL, 0},
   "Polychlorostyrene", NULL, 0},
  {{"polyethylene", {"pe"},
    "polyethylene",
    NULL, XRL_COMP,
    0.94, SRC_XRL, 0},
   "Polyethylene", NULL, 0},
  {{"polyimide", {"kapton"},
    "polyimide film",
    NULL, XRL_COMP,
    1.42, SRC_XRL, 0},
   "Kapton Polyimide Film", NULL, 0},
  {{"polyoxymethylene", {"pom"},
    "polyoxymethylene",
    NULL, XRL_COMP,
    1.425, SRC_XRL, 0},
   "Polyoxymethylene", NULL, 0},
  {{"polypropylene", {NULL},
    "polypropylene",
    NULL, XRL_COMP,
    0.9, SRC_XRL, 0},
   "Polypropylene", NULL, 0},
  {{"polystyrene", {"polystyrene_scintillator"},
    "polystyrene (also the base of polystyrene scintillators)",
    NULL, XRL_COMP,
    1.06, SRC_XRL, 0},
   "Polystyrene", NULL, 0},
  {{"polyvinyl_acetate", {"pvac"},
    "polyvinyl acetate",
    NULL, XRL_COMP,
    1.19, SRC_XRL, 0},
   "Polyvinyl Acetate", NULL, 0},
  {{"polyvinyl_alcohol", {"pva"},
    "polyvinyl alcohol",
    NULL, XRL_COMP,
    1.3, SRC_XRL, 0},
   "Polyvinyl Alcohol", NULL, 0},
  {{"polyvinyl_butyral", {NULL},
    "polyvinyl butyral",
    NULL, XRL_COMP,
    1.12, SRC_XRL, 0},
   "Polyvinyl Butyral", NULL, 0},
  {{"polyvinyl_pyrrolidone", {NULL},
    "polyvinyl pyrrolidone",
    NULL, XRL_COMP,
    1.25, SRC_XRL, 0},
   "Polyvinyl Pyrrolidone", NULL, 0},
  {{"potassium_iodide", {NULL},
    "potassium iodide crystal",
    "KI", "KI",
    3.13, SRC_XRLF, BL_CATALOGUE_CRYSTAL},
   "Potassium Iodide", NULL, 0},
  {{"potassium_oxide", {NULL},
    "potassium oxide",
    "K2O", "K2O",
    2.32, SRC_XRLF, 0},
   "Potassium Oxide", NULL, 0},
  {{"propane", {NULL},
    "propane gas",
    NULL, XRL_COMP,
    0.001879, SRC_XRL, 0},
   "Propane", NULL, 0},
  {{"propanol", {"n_propanol", "propyl_alcohol"},
    "n-propyl alcohol",
    NULL, XRL_COMP,
    0.8035, SRC_XRL, 0},
   "N-Propyl Alcohol", NULL, 0},
  {{"ptfe", {"teflon", "polytetrafluoroethylene"},
    "polytetrafluoroethylene",
    NULL, XRL_COMP,
    2.2, SRC_XRL, 0},
   "Polytetrafluoroethylene (Teflon)", NULL, 0},
  {{"pvc", {"polyvinyl_chloride"},
    "polyvinyl chloride",
    NULL, XRL_COMP,
    1.3, SRC_XRL, 0},
   "Polyvinyl Chloride", NULL, 0},
  {{"pvdc", {"polyvinylidene_chloride", "saran"},
    "polyvinylidene chloride",
    NULL, XRL_COMP,
    1.7, SRC_XRL, 0},
   "Polyvinylidene Chloride, Saran", NULL, 0},
  {{"pvdf", {"polyvinylidene_fluoride"},
    "polyvinylidene fluoride",
    NULL, XRL_COMP,
    1.76, SRC_XRL, 0},
   "Polyvinylidene Fluoride", NULL, 0},
  {{"pvt", {"polyvinyltoluene", "plastic_scintillator"},
    "plastic scintillator, vinyltoluene based",
    NULL, XRL_COMP,
    1.032, SRC_XRL, 0},
   "Plastic Scintillator (Vinyltoluene based)", NULL, 0},
  {{"pwo", {"lead_tungstate", "pbwo4"},
    "lead tungstate crystal",
    "PbWO4", "PbWO4",
    8.3, "composition: the formula; density: Review of Particle Physics, table of "
      "inorganic scintillator properties (8.30 g/cm^3; from memory)", BL_CATALOGUE_CRYSTAL},
   NULL, NULL, 0},
  {{"pyridine", {NULL},
    "pyridine",
    NULL, XRL_COMP,
    0.9819, SRC_XRL, 0},
   "Pyridine", NULL, 0},
  {{"silica", {"silicon_dioxide"},
    "silicon dioxide",
    "SiO2", "SiO2",
    2.32, SRC_XRLF, 0},
   "Silicon Dioxide", NULL, 0},
  {{"silver_bromide", {NULL},
    "silver bromide crystal",
    "AgBr", "AgBr",
    6.473, SRC_XRLF, BL_CATALOGUE_CRYSTAL},
   "Silver Bromide", NULL, 0},
  {{"silver_chloride", {NULL},
    "silver chloride crystal",
    "AgCl", "AgCl",
    5.56, SRC_XRLF, BL_CATALOGUE_CRYSTAL},
   "Silver Chloride", NULL, 0},
  {{"silver_iodide", {NULL},
    "silver iodide crystal",
    "AgI", "AgI",
    6.01, SRC_XRLF, BL_CATALOGUE_CRYSTAL},
   "Silver Iodide", NULL, 0},
  {{"skin", {NULL},
    "skin (ICRP composition)",
    NULL, XRL_COMP,
    1.1, SRC_XRL, 0},
   "Skin (ICRP)", NULL, 0},
  {{"sodium_carbonate", {NULL},
    "sodium carbonate",
    "Na2CO3", "Na2CO3",
    2.532, SRC_XRLF, 0},
   "Sodium Carbonate", NULL, 0},
  {{"sodium_nitrate", {NULL},
    "sodium nitrate",
    "NaNO3", "NaNO3",
    2.261, SRC_XRLF, 0},
   "Sodium Nitrate", NULL, 0},
  {{"sodium_oxide", {NULL},
    "sodium oxide",
    "Na2O", "Na2O",
    2.27, SRC_XRLF, 0},
   "Sodium Monoxide", NULL, 0},
  {{"soft_tissue", {"tissue"},
    "soft tissue (ICRP composition)",
    NULL, XRL_COMP,
    1.0, SRC_XRL, 0},
   "Tissue, Soft (ICRP)", NULL, 0},
  {{"soft_tissue_4", {"soft_tissue_icru"},
    "soft tissue, ICRU four-component composition",
    NULL, XRL_COMP,
    1.0, SRC_XRL, 0},
   "Tissue, Soft (ICRU four-component)", NULL, 0},
  {{"stainless_steel", {"steel_304", "ss304", "inox"},
    "stainless steel, type 304",
    NULL, "by mass: Cr 0.19 Mn 0.02 Fe 0.695 Ni 0.095",
    8.0, "composition: AISI 304, middle of its limits (Cr 18-20 %, Ni 8-10.5 %, "
      "Mn <= 2 %; from memory), Si and C neglected; density: 8.00 g/cm^3 "
      "(from memory)", 0},
   NULL, "Cr 0.19 Mn 0.02 Fe 0.695 Ni 0.095", 0},
  {{"standard_rock", {"rock"},
    "standard rock: an effective element Z = 11, A = 22",
    "Na", "effective element: Z = 11 (the atom of sodium), A = 22 g/mol",
    2.65, "common practice: the standard rock of muon physics, Z = 11, A = 22 g/mol, "
      "2.65 g/cm^3 (as used in the muon tables of the Review of Particle "
      "Physics; from memory)", BL_CATALOGUE_EFFECTIVE},
   NULL, NULL, 22.0},
  {{"steel", {"carbon_steel"},
    "plain carbon steel (0.2 % C, 0.45 % Mn)",
    NULL, "by mass: C 0.002 Mn 0.0045 Fe 0.9935",
    7.87, "composition: AISI 1020 carbon steel, middle of its limits (C 0.18-0.23 %, "
      "Mn 0.30-0.60 %; from memory); density: 7.87 g/cm^3 (common practice)", 0},
   NULL, "C 0.002 Mn 0.0045 Fe 0.9935", 0},
  {{"stilbene", {NULL},
    "stilbene crystal",
    NULL, XRL_COMP,
    0.9707, SRC_XRL, 0},
   "Stilbene", NULL, 0},
  {{"sucrose", {"sugar"},
    "sucrose",
    NULL, XRL_COMP,
    1.5805, SRC_XRL, 0},
   "Sucrose", NULL, 0},
  {{"te_gas_methane", {NULL},
    "tissue-equivalent gas, methane based",
    NULL, XRL_COMP,
    0.001064, SRC_XRL, 0},
   "Tissue-Equivalent GAS (Methane based)", NULL, 0},
  {{"te_gas_propane", {NULL},
    "tissue-equivalent gas, propane based",
    NULL, XRL_COMP,
    0.001826, SRC_XRL, 0},
   "Tissue-Equivalent GAS (Propane based)", NULL, 0},
  {{"terphenyl", {NULL},
    "terphenyl",
    NULL, XRL_COMP,
    1.234, SRC_XRL, 0},
   "Terphenyl", NULL, 0},
  {{"testis", {"testes"},
    "testis (ICRP composition)",
    NULL, XRL_COMP,
    1.04, SRC_XRL, 0},
   "Testes (ICRP)", NULL, 0},
  {{"tetrachloroethylene", {NULL},
    "tetrachloroethylene",
    NULL, XRL_COMP,
    1.625, SRC_XRL, 0},
   "Tetrachloroethylene", NULL, 0},
  {{"thallium_chloride", {NULL},
    "thallium chloride crystal",
    "TlCl", "TlCl",
    7.004, SRC_XRLF, BL_CATALOGUE_CRYSTAL},
   "Thallium Chloride", NULL, 0},
  {{"titania", {"titanium_dioxide"},
    "titanium dioxide",
    "TiO2", "TiO2",
    4.26, SRC_XRLF, 0},
   "Titanium Dioxide", NULL, 0},
  {{"toluene", {NULL},
    "toluene",
    NULL, XRL_COMP,
    0.8669, SRC_XRL, 0},
   "Toluene", NULL, 0},
  {{"trichloroethylene", {NULL},
    "trichloroethylene",
    NULL, XRL_COMP,
    1.46, SRC_XRL, 0},
   "Trichloroethylene", NULL, 0},
  {{"triethyl_phosphate", {NULL},
    "triethyl phosphate",
    NULL, XRL_COMP,
    1.07, SRC_XRL, 0},
   "Triethyl Phosphate", NULL, 0},
  {{"tungsten_alloy_90", {"tungsten_alloy", "heavy_alloy"},
    "tungsten heavy alloy, 90 % W with Ni and Fe",
    NULL, "by mass: Fe 0.04 Ni 0.06 W 0.90",
    17.0, "composition and density: ASTM B777 class 1 (90 % W, 16.85-17.25 "
      "g/cm^3; from memory); the Ni:Fe ratio 6:4 is common practice", 0},
   NULL, "Fe 0.04 Ni 0.06 W 0.90", 0},
  {{"tungsten_alloy_95", {"heavy_alloy_95"},
    "tungsten heavy alloy, 95 % W with Ni and Fe",
    NULL, "by mass: Fe 0.015 Ni 0.035 W 0.95",
    18.0, "composition and density: ASTM B777 class 3 (95 % W, 17.75-18.35 "
      "g/cm^3; from memory); the Ni:Fe ratio 7:3 is common practice", 0},
   NULL, "Fe 0.015 Ni 0.035 W 0.95", 0},
  {{"tungsten_hexafluoride", {NULL},
    "tungsten hexafluoride",
    "WF6", "WF6",
    2.4, SRC_XRLF, 0},
   "Tungsten Hexafluoride", NULL, 0},
  {{"uranium_carbide", {"uranium_monocarbide"},
    "uranium monocarbide",
    "UC", "UC",
    13.63, SRC_XRLF, 0},
   "Uranium Monocarbide", NULL, 0},
  {{"uranium_dicarbide", {NULL},
    "uranium dicarbide",
    "UC2", "UC2",
    11.28, SRC_XRLF, 0},
   "Uranium Dicarbide", NULL, 0},
  {{"uranium_dioxide", {"uranium_oxide"},
    "uranium dioxide",
    "UO2", "UO2",
    10.96, SRC_XRLF, 0},
   "Uranium Oxide", NULL, 0},
  {{"urea", {NULL},
    "urea",
    NULL, XRL_COMP,
    1.323, SRC_XRL, 0},
   "Urea", NULL, 0},
  {{"valine", {NULL},
    "valine",
    NULL, XRL_COMP,
    1.23, SRC_XRL, 0},
   "Valine", NULL, 0},
  {{"water", {"liquid_water"},
    "liquid water",
    NULL, XRL_COMP,
    1.0, SRC_XRL, 0},
   "Water, Liquid", NULL, 0},
  {{"water_vapour", {"water_vapor", "steam"},
    "water vapour",
    NULL, XRL_COMP,
    0.000756, SRC_XRL, 0},
   "Water Vapor", NULL, 0},
  {{"xylene", {NULL},
    "xylene",
    NULL, XRL_COMP,
    0.87, SRC_XRL, 0},
   "Xylene", NULL, 0},
};

#define NENTRY ((int)(sizeof table / sizeof table[0]))


int bl_material_catalogue_count (void) {
  return NENTRY;
}


const bl_catalogue_entry *bl_material_catalogue_entry (int i) {
  return (i >= 0 && i < NENTRY) ? &table[i].pub : NULL;
}


const char *bl_mat_catalogue_label (int i) {
  return (i >= 0 && i < NENTRY) ? table[i].xrl : NULL;
}


/* Next significant character of *s (lowercase), skipping ' ', '-', '_';
** '\0' at the end. */
static int nextsig (const char **s) {
  while (**s == ' ' || **s == '-' || **s == '_')
    (*s)++;
  if (**s == '\0')
    return '\0';
  return tolower((unsigned char)*(*s)++);
}


int bl_mat_namecmp (const char *a, const char *b) {
  int ca, cb;
  do {
    ca = nextsig(&a);
    cb = nextsig(&b);
    if (ca != cb)
      return ca < cb ? -1 : 1;
  } while (ca != '\0');
  return 0;
}


int bl_material_catalogue_find (const char *name) {
  int i, j;
  if (name == NULL)
    return -1;
  for (i = 0; i < NENTRY; i++) {
    const bl_catalogue_entry *e = &table[i].pub;
    if (bl_mat_namecmp(name, e->key) == 0)
      return i;
    for (j = 0; j < BL_CATALOGUE_MAXALIAS && e->aliases[j] != NULL; j++)
      if (bl_mat_namecmp(name, e->aliases[j]) == 0)
        return i;
  }
  return -1;
}


/*
** Mass fractions w_Z as atoms per average atom: (w_Z / A_Z) / sum (w_Z /
** A_Z).  bl_mat_fill recomputes the mass fractions from these, which
** gives back w_Z / sum w whatever the atomic weights.
*/
static int frombymass (double atoms[BL_ZMAX + 1], const char *s) {
  double total = 0;
  int Z;
  for (;;) {
    char sym[4];
    size_t n = 0;
    char *end;
    double w;
    while (*s == ' ')
      s++;
    if (*s == '\0')
      break;
    while (n < 3 && isalpha((unsigned char)s[n]))
      n++;
    if (n == 0 || n > 2)
      return BL_EUNKNOWN;
    memcpy(sym, s, n);
    sym[n] = '\0';
    Z = bl_element_find(sym);
    w = strtod(s + n, &end);
    if (Z == 0 || end == s + n || !(w > 0 && w <= 1))
      return BL_EUNKNOWN;
    atoms[Z] += w / bl_element_mass(Z);
    s = end;
  }
  for (Z = 1; Z <= BL_ZMAX; Z++)
    total += atoms[Z];
  if (!(total > 0))
    return BL_EUNKNOWN;
  for (Z = 1; Z <= BL_ZMAX; Z++)
    atoms[Z] /= total;
  return BL_SUCCESS;
}


/* The same from xraylib's record: its mass fractions, normalized.  xraylib
** is always called with an error object, freed here: it never prints. */
static int fromxraylib (double atoms[BL_ZMAX + 1], const char *label) {
  struct compoundDataNIST *c;
  xrl_error *e = NULL;
  double total = 0;
  int i, Z, st = BL_SUCCESS;
  c = GetCompoundDataNISTByName(label, &e);
  if (e != NULL)
    xrl_error_free(e);
  if (c == NULL)
    return BL_EUNKNOWN;
  for (i = 0; i < c->nElements && st == BL_SUCCESS; i++) {
    double w = c->massFractions[i];
    Z = c->Elements[i];
    if (Z < 1 || Z > BL_ZMAX || !(w >= 0))
      st = BL_EUNKNOWN;  /* a record we cannot represent */
    else if (w > 0)
      atoms[Z] += w / bl_element_mass(Z);
  }
  FreeCompoundDataNIST(c);
  for (Z = 1; Z <= BL_ZMAX; Z++)
    total += atoms[Z];
  if (st != BL_SUCCESS || !(total > 0))
    return BL_EUNKNOWN;
  for (Z = 1; Z <= BL_ZMAX; Z++)
    atoms[Z] /= total;
  return st;
}


int bl_material_catalogue (bl_material *m, const char *name) {
  double atoms[BL_ZMAX + 1] = {0};
  const Entry *e;
  int i, st;
  if (m == NULL)
    return BL_EDOMAIN;
  memset(m, 0, sizeof *m);
  if ((i = bl_material_catalogue_find(name)) < 0)
    return BL_EUNKNOWN;
  e = &table[i];
  if (e->pub.formula != NULL)
    st = bl_material_formula(m, e->pub.formula, NULL);
  else {
    st = e->bymass != NULL ? frombymass(atoms, e->bymass)
                           : fromxraylib(atoms, e->xrl);
    if (st == BL_SUCCESS)
      st = bl_mat_fill(m, atoms, e->pub.key);
  }
  if (st == BL_SUCCESS && e->A > 0) {
    if (m->n != 1)
      st = BL_EUNKNOWN;  /* an effective element has one component */
    else
      bl_mat_setA(m, m->comp[0].Z, e->A);
  }
  if (st != BL_SUCCESS) {
    memset(m, 0, sizeof *m);
    return BL_EUNKNOWN;
  }
  bl_mat_setname(m->name, e->pub.key);
  m->density = e->pub.density;
  m->entry = &e->pub;
  return BL_SUCCESS;
}


/*
** The crystal entry with the composition of *m (atoms per formula unit
** equal to 1e-12 relative, element by element), or NULL.
*/
const bl_catalogue_entry *bl_mat_crystal (const bl_material *m) {
  int i, j;
  for (i = 0; i < NENTRY; i++) {
    const bl_catalogue_entry *e = &table[i].pub;
    bl_material c;
    int same;
    if (!(e->flags & BL_CATALOGUE_CRYSTAL) || e->formula == NULL
        || bl_material_formula(&c, e->formula, NULL) != BL_SUCCESS
        || c.n != m->n)
      continue;
    for (same = 1, j = 0; j < c.n && same; j++)
      same = c.comp[j].Z == m->comp[j].Z
             && fabs(c.comp[j].atoms - m->comp[j].atoms)
                <= 1e-12 * c.comp[j].atoms;
    if (same)
      return e;
  }
  return NULL;
}
