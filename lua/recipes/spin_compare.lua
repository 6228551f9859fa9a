--[[
  spin_compare.lua -- a hypothetical heavy charged scalar against a muon
  of the same Lorentz factor

  Scenario (our own): a search for a long-lived charged particle of mass
  800 MeV needs its photon spectrum in a copper absorber.  Its spin is
  unknown, so both spin 0 ("scalar") and spin 1/2 ("fermion") are computed, next to a muon with
  the same Lorentz factor gamma = 40 (muon T = 4.12 GeV, heavy particle
  T = 31.2 GeV).  The scan axis is the projectile; each point returns the
  spectrum at the same fractions y = k/T.  Printed per y: the two
  spins' ratio, and m^2 y dsigma/dy of the heavy particles over the
  muon's (1 if the cross section simply scales as 1/m^2 at equal gamma).
  Writes spin-compare.csv and spin-compare.png.

  Usage: build/brakelight lua/recipes/spin_compare.lua [outdir]
         (BRAKELIGHT_SMALL=1: 3 fractions, loose tolerance)
]]

local bl = require "brakelight"
local scan = require "brakelight.scan"
local plot = require "brakelight.plot"
local recipe = require "brakelight.recipe"
local tabular = require "brakelight.tabular"

local small = recipe.small()
local GAMMA = 40
local MX = 800.0                                -- MeV, hypothetical
local mu = bl.particle("muon")
local beams = {
  mu,
  bl.particle{ name = "scalar", mass = MX, charge = 1, spin = 0 },
  bl.particle{ name = "fermion", mass = MX, charge = 1, spin = 0.5 },
}
local Y = small and { 0.1, 0.5, 0.9 } or
          { 0.02, 0.05, 0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9, 0.95, 0.98 }

local records = scan.run{
  title = "spin 0 and spin 1/2 at gamma = 40 on copper",
  axes = { { "particle", beams } },
  fixed = { target = "Cu", gamma = GAMMA, rtol = small and 1e-2 or 1e-4 },
  units = { mass = "MeV", scaled = "mb MeV^2" },
  columns = { "mass", "T", "y", "k", "dsdk", "err", "scaled" },
  output = recipe.path("spin-compare.csv"),
  each = function(pt)
    local m = pt.particle.mass
    local T = (pt.gamma - 1) * m
    local s = bl.spectrum{ particle = pt.particle, target = pt.target, T = T,
                           y = Y, rtol = pt.rtol }
    local scaled = {}   -- m^2 y dsigma/dy = m^2 k dsigma/dk
    for i = 1, #s.k do scaled[i] = m * m * s.k[i] * s.dsdk[i] end
    return { mass = m, T = T, y = s.y, k = s.k, dsdk = s.dsdk, err = s.err,
             scaled = scaled }
  end,
}

local by = {}
for _, r in ipairs(records) do
  by[r.particle] = by[r.particle] or {}
  table.insert(by[r.particle], r)
end
local rows = {}
for i, y in ipairs(Y) do
  local x0, xh, m = by["scalar"][i], by["fermion"][i], by[mu.name][i]
  rows[i] = { y, x0.dsdk / xh.dsdk, x0.scaled / m.scaled, xh.scaled / m.scaled }
end
io.write(tabular.format({
  { title = "y", unit = "1", fmt = "%.2f" },
  { title = "spin0/spin1/2", unit = "1", fmt = "%.4f" },
  { title = "scalar vs mu, m^2 scaled", unit = "1", fmt = "%.4f" },
  { title = "fermion vs mu, m^2 scaled", unit = "1", fmt = "%.4f" } }, rows))

plot{ output = recipe.path("spin-compare.png"),
      title = string.format("Same gamma = %g on Cu: m^2 y dsigma/dy", GAMMA),
      records = records, x = { column = "y", label = "y = k/T" },
      y = { column = "scaled", label = "m^2 y dsigma/dy" }, by = "particle",
      units = { scaled = "mb MeV^2" } }
