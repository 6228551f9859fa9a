--[[
  screening_compare.lua -- how much the choice of screening model matters

  Scenario (our own): before choosing a screening model for a 1 GeV
  electron beam on aluminium and lead, compare every model the module
  knows (brakelight.models(): models added later show up here without
  a change) with the bare nucleus, as the ratio of dsigma/dk to the
  "none" model's at the same photon energy.  Screening matters most for
  soft photons at high energy, so the spectrum is sampled on a
  logarithmic grid in y = k/T.  Writes screening-compare.csv and
  screening-compare.png; prints the ratios.

  Usage: build/brakelight lua/recipes/screening_compare.lua [outdir]
         (BRAKELIGHT_SMALL=1: one target, 3 fractions)
]]

local bl = require "brakelight"
local scan = require "brakelight.scan"
local plot = require "brakelight.plot"
local recipe = require "brakelight.recipe"
local tabular = require "brakelight.tabular"

local small = recipe.small()
local models = {}
for _, m in ipairs(bl.models()) do models[#models + 1] = m.name end
local n = small and 3 or 12
local Y = {}
for i = 1, n do Y[i] = 1e-3 * (0.95 / 1e-3) ^ ((i - 1) / (n - 1)) end

local records = scan.run{
  title = "screening models against the bare nucleus, 1 GeV electrons",
  axes = { { "target", small and { "Pb" } or { "Al", "Pb" } },
           { "screening", models } },
  fixed = { particle = "electron", T = 1000, rtol = small and 1e-2 or 1e-4 },
  columns = { "y", "k", "dsdk", "err" },
  output = recipe.path("screening-compare.csv"),
  each = function(pt)
    local s = bl.spectrum(pt:with{ y = Y })
    return { y = s.y, k = s.k, dsdk = s.dsdk, err = s.err }
  end,
}

-- ratio to the bare nucleus, per target and model
local none = {}
for _, r in ipairs(records) do
  if r.screening == "none" then none[r.target .. "|" .. r.y] = r.dsdk end
end
local rows, series = {}, {}
for _, r in ipairs(records) do
  local ratio = r.dsdk / none[r.target .. "|" .. r.y]
  r.ratio = ratio
  if r.screening ~= "none" then
    rows[#rows + 1] = { r.target, r.screening, r.y, ratio }
  end
end
io.write(tabular.format({ { title = "target" }, { title = "screening" },
                          { title = "y", unit = "1", fmt = "%.4f" },
                          { title = "model/none", unit = "1", fmt = "%.4f" } },
                        rows))
for _, r in ipairs(records) do
  if r.screening ~= "none" then series[#series + 1] = r end
end
plot{ output = recipe.path("screening-compare.png"),
      title = "Screening models over the bare nucleus, 1 GeV electrons",
      records = series, x = { column = "y", label = "y = k/T" },
      y = { column = "ratio", label = "dsigma/dk over the bare nucleus" }, by = { "target", "screening" },
      units = { ratio = "1" } }
