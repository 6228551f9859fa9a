--[[
  radiator_spectrum.lua -- photons from a thin radiator foil

  Scenario (our own): a 2 GeV electron beam crosses a 50 um foil of
  tungsten or copper.  For a foil much thinner than a radiation length
  each electron radiates, per MeV of photon energy,

      dN/dk = (rho t) (N_A / A) dsigma/dk   (rho t in g/cm^2; the
                                             spectrum's per_gram factor),

  one atom at a time (no showering, no multiple scattering, no dense-
  medium suppression).  The scan runs over the foil material; each point
  returns the whole spectrum (arrays, so one record per photon energy).
  Writes radiator-spectrum.csv and radiator-spectrum.png (k dN/dk
  against k) into the output directory, then the photons per electron
  above 10 % of the beam energy from brakelight.photon_yield.

  Usage: build/brakelight lua/recipes/radiator_spectrum.lua [outdir]
         (BRAKELIGHT_SMALL=1: few energies, loose tolerance)
]]

local bl = require "brakelight"
local scan = require "brakelight.scan"
local plot = require "brakelight.plot"
local recipe = require "brakelight.recipe"

local small = recipe.small()
local T = 2000.0                 -- beam kinetic energy, MeV
local THICK = 50e-4              -- foil thickness, cm (50 um)

local y = {}
local n = small and 5 or 40
for i = 1, n do y[i] = 0.01 * (99) ^ ((i - 1) / (n - 1)) end  -- 0.01 .. 0.99

local records = scan.run{
  title = "photons per electron from a 50 um foil, 2 GeV electrons",
  axes = { { "target", small and { "W" } or { "W", "Cu" } } },
  fixed = { particle = "electron", T = T, rtol = small and 1e-2 or 1e-4,
            thickness_cm = THICK },
  units = { dNdk = "1/MeV", kdNdk = "1", err = "mb/MeV", thickness_cm = "cm" },
  columns = { "k", "y", "dsdk", "err", "dNdk", "kdNdk" },
  output = recipe.path("radiator-spectrum.csv"),
  each = function(pt)
    local s = bl.spectrum{ particle = pt.particle, target = pt.target,
                           T = pt.T, y = y, rtol = pt.rtol }
    local rho = bl.material(pt.target).density   -- g/cm^3
    local nt = rho * pt.thickness_cm * s.per_gram  -- per mb
    local dN, kdN = {}, {}
    for i = 1, #s.k do
      dN[i] = nt * s.dsdk[i]
      kdN[i] = s.k[i] * dN[i]
    end
    return { k = s.k, y = s.y, dsdk = s.dsdk, err = s.err, dNdk = dN,
             kdNdk = kdN }
  end,
}

plot{ output = recipe.path("radiator-spectrum.png"),
      title = "Thin-foil radiator, 2 GeV electrons, 50 um",
      records = records, x = { column = "k", label = "photon energy k" },
      y = { column = "kdNdk", label = "k dN/dk" }, by = "target",
      units = { kdNdk = "photons per electron" } }

-- photons per electron above 10 % of the beam energy
for _, target in ipairs(small and { "W" } or { "W", "Cu" }) do
  local yield = bl.photon_yield{ particle = "electron", target = target,
                                 T = T, kmin = 0.1 * T,
                                 thickness = bl.material(target).density
                                             * THICK,
                                 rtol = small and 1e-2 or 1e-4 }
  print(string.format("%-3s photons per electron with k > %.0f MeV: %.4g "
                      .. "(%.3g X0)", target, 0.1 * T, yield.total,
                      yield.thickness_X0))
end
