/*
** errno.c -- messages for status codes and warning bits
** See Copyright Notice in LICENSE
*/

#include <gsl/gsl_errno.h>

#include "brakelight/bl_errno.h"
#include "brakelight/bl_result.h"


const char *bl_strerror (int status) {
  switch (status) {
    case BL_SUCCESS:  return "success";
    case BL_EDOMAIN:  return "argument outside its allowed range";
    case BL_EUNKNOWN: return "unknown name";
    case BL_ENOMEM:   return "out of memory";
    case BL_EMODEL:   return "the model cannot serve this request";
    case BL_ENOTCONV: return "integral did not reach the requested tolerance";
    case BL_ENONFINITE: return "non-finite result";
    case BL_EAMBIGUOUS: return "ambiguous name";
    case BL_EINTR: return "interrupted (stop flag set)";
    default:          return gsl_strerror(status);
  }
}


const char *bl_warn_text (unsigned bit) {
  switch (bit) {
    case BL_WARN_TOLERANCE:
      return "requested tolerance not reached; the error estimate says how far";
    case BL_WARN_POINTLIKE:
      return "composite projectile treated as a point charge (no form factor)";
    case BL_WARN_BORN:
      return "first Born approximation: it leaves out Coulomb effects above 1 % of the value";
    case BL_WARN_COULOMB:
      return "Coulomb correction applied outside its validity (high energy, "
             "light projectile)";
    case BL_WARN_ELWERT:
      return "Elwert factor applied outside its validity (low energy)";
    case BL_WARN_STATIC_E:
      return "atomic electrons treated as static charges (no recoil): their "
             "share is overestimated for heavy projectiles";
    case BL_WARN_CLAMPED:
      return "the Coulomb correction exceeds the Born value, or the "
             "high-energy form went below zero far outside its range; "
             "result set to 0";
    case BL_WARN_METHOD:
      return "the high-energy (small-angle) or complete-screening form is used "
             "where it does not hold";
    case BL_WARN_SUPPRESS:
      return "LPM and dielectric suppression follow Migdal's approximate "
             "treatment";
    case BL_WARN_DISTORTED:
      return "distorted waves (Sommerfeld-Maue): the estimated model "
             "uncertainty exceeds 1 % of the value";
    case BL_WARN_EHELD:
      return "the bound electron term of the muon below its table's first "
             "node is held at its value there: too low";
    case BL_WARN_ERANGE:
      return "the bound electron term is held at the edge of its table "
             "(above T = 10 TeV; in the event sampler, projectile mass or "
             "energy outside it)";
    case BL_WARN_ESHAPE:
      return "the atomic-electron part of this angular or fully "
             "differential value has the static term's angular shape, "
             "scaled to the bound electron term's dsigma/dk";
    case BL_WARN_NINCOH:
      return "the nucleus's incoherent part is the closure sum of its "
             "protons as free point charges (no Pauli blocking, no "
             "excitation energy, no proton size): an upper bound";
    case BL_WARN_EBORN:
      return "method 'partial': exact partial waves for the nucleus and "
             "the screened field, but the atomic electrons' own part "
             "(their recoil, the bound electron term) is added as the "
             "Born room gives it";
    case BL_WARN_PWSOFT:
      return "method 'partial' at photon energies below 0.02 T: the Born "
             "value of the nucleus and screened field times their "
             "partial-wave/Born ratio at k = 0.02 T";
    case BL_WARN_SOFT:
      return "distorted waves at photon energies below 1e-9 T: the Born value "
             "times the distorted/Born ratio at k = 1e-9 T";
    default:
      return NULL;
  }
}


int bl_status_soft (int status) {
  return status == GSL_EMAXITER || status == GSL_EROUND || status == GSL_ESING
      || status == GSL_ETOL || status == GSL_EDIVERGE
      || status == BL_ENOTCONV;
}
