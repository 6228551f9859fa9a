/*
** bl_material.h -- targets: elements, chemical formulas, mixtures, the
** material catalogue; Tsai's radiation length
** See Copyright Notice in LICENSE
*/
#ifndef BL_MATERIAL_H
#define BL_MATERIAL_H

#include <stddef.h>

#ifdef __cplusplus
extern "C" {
#endif

#define BL_MATERIAL_MAXCOMP 32   /* distinct elements in one material */
#define BL_MATERIAL_NAMELEN 96

/* One element of a material. */
typedef struct bl_component {
  int Z;
  double A;              /* atomic weight, g/mol: the standard one, except
                         ** for an effective element of the catalogue
                         ** ("standard_rock": Z = 11, A = 22) */
  double atoms;          /* atoms of this element per formula unit */
  double mass_fraction;  /* share of the mass, sums to 1 over components */
} bl_component;

#define BL_CATALOGUE_MAXALIAS 6   /* aliases of one catalogue entry */

/* Flags of a catalogue entry. */
#define BL_CATALOGUE_CRYSTAL   1u   /* a formula target with this entry's
                                    ** composition gets its density */
#define BL_CATALOGUE_EFFECTIVE 2u   /* an effective element: its A is not
                                    ** the element's atomic weight */

/*
** One entry of the material catalogue (static storage, never changes).
** key: lowercase letters, digits and '_' ("water", "bgo", "lead_glass");
** aliases: other names, NULL-padded; description: what it is, in words;
** formula: its chemical formula when it has one ("Bi4Ge3O12"), else NULL;
** composition: how the composition is given (the formula, "by mass: ..."
** with element symbols and mass fractions, or the data set it comes
** from); density in g/cm^3 (> 0 for every entry); source: where the
** composition and the density come from ("from memory" and "common
** practice" mark values not read from the named table).
*/
typedef struct bl_catalogue_entry {
  const char *key;
  const char *aliases[BL_CATALOGUE_MAXALIAS];
  const char *description;
  const char *formula;
  const char *composition;
  double density;
  const char *source;
  unsigned flags;
} bl_catalogue_entry;

/*
** A target material: plain data, may be copied, nothing to free.
** Cross sections of a material are per formula unit ("molecule"): the sum
** over components of atoms * (cross section per atom).  For an element the
** formula unit is one atom; for a formula ("H2O") it is the molecule; for a
** mixture it is one average atom (sum of atoms = 1), so that mixtures given
** by mass and by atom fractions agree.
*/
typedef struct bl_material {
  char name[BL_MATERIAL_NAMELEN];
  int n;                                 /* components, ordered by Z */
  bl_component comp[BL_MATERIAL_MAXCOMP];
  double molar_mass;                     /* g/mol per formula unit */
  double density;                        /* g/cm^3; 0 when unknown */
  const bl_catalogue_entry *entry;       /* the catalogue entry the
                                         ** material, or for a formula its
                                         ** density, comes from; NULL */
} bl_material;

/* Where a parse failed: byte offset into the input and a short reason
** (static storage). */
typedef struct bl_parse_error {
  size_t pos;
  const char *reason;
} bl_parse_error;

/* One element by atomic number, named by its symbol, with xraylib's
** density (ElementDensity, g/cm^3; gases at room temperature and 1 atm;
** 0 where it has none).  BL_SUCCESS or BL_EDOMAIN (Z outside 1..BL_ZMAX). */
int bl_material_element (bl_material *m, int Z);

/* Atomic number of an element symbol ("Pb", case as in the periodic table,
** so that "CO" stays a formula) or English name in any case ("lead",
** "Aluminium", "aluminum"); 0 if none.  Also declared in bl_element.h. */
int bl_element_lookup (const char *name);

/*
** A chemical formula: element symbols (case as in the periodic table) with
** optional counts (integers or decimals, > 0), parentheses and brackets with
** counts, and hydrates joined by '.' or '*' with an optional leading count:
** "H2O", "C8H8", "CaCO3", "Ca(OH)2", "CuSO4(H2O)5", "CuSO4.5H2O".
** A '.' between digits is a decimal point inside brackets, after a zero
** integer part ("Fe0.5Ni0.5") or when no element or bracket follows the
** next number ("YBa2Cu3O6.5"); otherwise it separates a hydrate ("4.5H2O"):
** write "(Cu1.5)Se" for a decimal count before more elements.  No blanks.
** Limits: 32 elements, counts <= 1e9, 1e12 atoms per element, 16 levels
** of brackets.  The name is the formula; density 0 (unknown).
** BL_SUCCESS, or BL_EDOMAIN with *err filled (err may be NULL): err->pos
** is the 0-based byte offset of the offending character.
*/
int bl_material_formula (bl_material *m, const char *formula,
                         bl_parse_error *err);

/*
** A mixture of n parts given by fractions: by mass (by_mass = 1) or by
** numbers of formula units (by_mass = 0).  Each fraction must be finite and
** > 0; the fractions must sum to 1 within 1e-6 unless normalize is set, in
** which case they are scaled to sum 1.  The result has one average atom per
** formula unit.  BL_SUCCESS or BL_EDOMAIN; on failure *bad is the index of
** the offending part, or -1 for the sum (bad may be NULL).
*/
int bl_material_mixture (bl_material *m, int n, const bl_material *parts,
                         const double *fractions, int by_mass, int normalize,
                         int *bad);

/*
** The material catalogue: entries 0..bl_material_catalogue_count()-1 in
** the order of their keys; bl_material_catalogue_entry(i) is NULL outside.
** bl_material_catalogue_find gives the index of the entry whose key or
** alias is `name`, compared in any case and ignoring ' ', '-' and '_'
** ("Lead glass" and "lead_glass" find the same entry); -1 if none (also
** for NULL).
*/
int bl_material_catalogue_count (void);
const bl_catalogue_entry *bl_material_catalogue_entry (int i);
int bl_material_catalogue_find (const char *name);

/*
** The material of a catalogue entry, by key or alias as for _find: named
** by its key, with the entry's density, m->entry set.  Compositions given
** by mass (and those taken from xraylib's compound list, the NIST
** material composition data) have one average atom per formula unit, as
** mixtures; those given by a formula have its molecule.  BL_SUCCESS,
** BL_EUNKNOWN (also for a NULL name; *m emptied), or BL_EDOMAIN (NULL m).
*/
int bl_material_catalogue (bl_material *m, const char *name);

/*
** A material named by a string, trying in this order: element symbol (case
** as in the periodic table), element name (any case), catalogue key or
** alias (any case, as bl_material_catalogue_find), chemical formula.  A
** formula with the composition of a catalogue crystal (flag
** BL_CATALOGUE_CRYSTAL: "PbWO4", "Bi4(GeO4)3") gets the entry's density
** and m->entry; other formulas have density 0.  Elements carry xraylib's
** density (ElementDensity; 0 for Es and Fm).
** A two-letter string that is an element symbol in another case and
** also reads as symbols of two elements ("PB": Pb or P + B; "co": Co or
** C + O) is BL_EAMBIGUOUS: write "Pb" for the element, "P1B1" for the
** formula.  Otherwise BL_SUCCESS, or BL_EUNKNOWN with *err the formula
** parser's complaint (err may be NULL); BL_EDOMAIN if m or spec is NULL.
** On failure *m is emptied.
*/
int bl_material_lookup (bl_material *m, const char *spec,
                        bl_parse_error *err);

/*
** Up to nmax (at most 8) names close to a misspelt `name`, best first,
** written to out[] (static storage); returns the count.  Elements come
** first: a symbol equal to `name` in another case ("w": "W"), then the
** element names within a small edit distance (1 for names of up to 4
** letters, 2 above: "tungstem": "tungsten"); then catalogue keys, by the
** edit distance (on lowercase) from `name` to the best-matching piece of
** a key, alias or description, then to the whole of it.
*/
int bl_material_suggest (const char *name, const char **out, int nmax);

/* Radiation length in g/cm^2 (Tsai; 1/X0 = sum_i w_i / X0_i over mass
** fractions).  Returns 0 for an empty material. */
double bl_radiation_length (const bl_material *m);

/* The factor from mb per formula unit to cm^2/g: N_A / molar mass * 1e-27
** (0 for an empty material). */
double bl_material_per_gram (const bl_material *m);

#ifdef __cplusplus
}
#endif

#endif
