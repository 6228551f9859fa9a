--[[
  radiator_spectrum.lua -- photons from a thin radiator foil

  Scenario (our own): a 2 GeV electron beam crosses a 50 um foil of
  tungsten or copper.  For a foil much thinner than a radiation length
  each electron radiates, per MeV of photon energy,

      dN/dk = n t dsigma/dk,   n = rho N_A / A  (atoms per cm^3),

  one atom at a time (no showering, no multiple scattering, no dense-
  medium suppression).  The scan runs over the foil material; each point
  returns the whole spectrum (arrays, so one record per photon energy).
  Writes radiator-spectrum.csv and radiator-spectrum.png (k dN/dk
  against k) into the output directory.

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
local NA = 6.02214076e23         -- 1/mol, exact (SI 2019)
-- density (g/cm^3) and standard atomic weight: from memory, ~0.5 %
local FOIL = { W = { rho = 19.3, A = 183.84 }, Cu = { rho = 8.96, A = 63.546 } }

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
    local f = FOIL[pt.target]
    local s = bl.spectrum{ particle = pt.particle, target = pt.target,
                           T = pt.T, y = y, rtol = pt.rtol }
    local nt = f.rho * NA / f.A * pt.thickness_cm * 1e-27  -- per mb
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
      records = records, x = "k", y = "kdNdk", by = "target",
      units = { kdNdk = "photons per electron" } }

-- photons per electron above 10 % of the beam energy (trapezoid in k)
for _, target in ipairs(small and { "W" } or { "W", "Cu" }) do
  local sum, prev = 0, nil
  for _, r in ipairs(records) do
    if r.target == target and r.y >= 0.1 then
      if prev then sum = sum + 0.5 * (r.dNdk + prev.dNdk) * (r.k - prev.k) end
      prev = r
    end
  end
  print(string.format("%-3s photons per electron with k > %.0f MeV: %.4g",
                      target, 0.1 * T, sum))
end
