--[[
  tungsten_converter.lua -- electrons and positrons on a tungsten converter:
  the first Born approximation against the distorted waves

  Scenario (our own): a compact source turns 6, 10 and 18 MeV beams into
  photons in a 0.2 mm tungsten foil, and the part of the yield above 7 MeV
  (photonuclear thresholds of many nuclei lie there) decides whether the
  design works.  The same foil serves electron and positron beams.  The
  scan runs over particle, beam energy and method: "born" (the first Born
  approximation, no correction), "auto" (the default: at these energies
  the distorted waves) and "distorted" (Sommerfeld-Maue waves, README
  "Distorted waves").  Each point gives the
  spectrum at fixed fractions y = k/T and the thin-foil photon yield above
  7 MeV.  Printed: the yields per method and their ratios, and the
  positron/electron ratio of the yield, which the first Born approximation
  puts at exactly 1.
  Writes tungsten-converter.csv and tungsten-converter.png.

  Usage: build/brakelight lua/recipes/tungsten_converter.lua [outdir]
         (BRAKELIGHT_SMALL=1: 10 MeV only, 3 fractions, loose tolerance)
]]

local bl = require "brakelight"
local scan = require "brakelight.scan"
local plot = require "brakelight.plot"
local recipe = require "brakelight.recipe"
local tabular = require "brakelight.tabular"

local small = recipe.small()
local THICK = 0.02 * 19.3                     -- 0.2 mm of tungsten, g/cm^2
local KMIN = 7.0                              -- MeV
local Ts = small and { 10 } or { 6, 10, 18 }
local methods = small and { "born", "distorted" }
                      or { "born", "auto", "distorted" }
local Y = small and { 0.2, 0.6, 0.95 } or
          { 0.05, 0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9, 0.95, 0.99 }

local records = scan.run{
  title = "electrons and positrons on a 0.2 mm tungsten converter",
  axes = { { "particle", { "electron", "positron" } }, { "T", Ts },
           { "method", methods } },
  fixed = { target = "W", rtol = small and 1e-2 or 1e-3 },
  units = { T = "MeV", k = "MeV", dsdk = "mb/MeV", err = "mb/MeV",
            above7 = "photons per particle", above7_err = "photons per particle" },
  columns = { "y", "k", "dsdk", "err", "above7", "above7_err" },
  output = recipe.path("tungsten-converter.csv"),
  each = function(pt)
    local s = bl.spectrum{ particle = pt.particle, target = pt.target,
                           T = pt.T, y = Y, method = pt.method,
                           rtol = pt.rtol }
    local n, e = 0, 0
    if pt.T > KMIN then
      local py = bl.photon_yield{ particle = pt.particle, target = pt.target,
                                  T = pt.T, thickness = THICK, kmin = KMIN,
                                  kmax = pt.T * (1 - 1e-9),
                                  method = pt.method, rtol = pt.rtol }
      n, e = py.total, py.err[1]
    end
    return { y = s.y, k = s.k, dsdk = s.dsdk, err = s.err,
             above7 = n, above7_err = e }
  end,
}

-- the yields, one row per beam
local yield = {}
for _, r in ipairs(records) do
  local key = r.particle .. " " .. r.T
  yield[key] = yield[key] or {}
  yield[key][r.method] = r.above7
end
local rows = {}
for _, p in ipairs{ "electron", "positron" } do
  for _, T in ipairs(Ts) do
    local y = yield[p .. " " .. T]
    local row = { p, T }
    for _, m in ipairs(methods) do row[#row + 1] = y[m] end
    row[#row + 1] = y.born > 0 and y.distorted / y.born or 0
    rows[#rows + 1] = row
  end
end
local cols = { { title = "particle", fmt = "%s" },
               { title = "T", unit = "MeV", fmt = "%g" } }
for _, m in ipairs(methods) do
  cols[#cols + 1] = { title = "k>7 " .. m, unit = "per particle", fmt = "%.4e" }
end
cols[#cols + 1] = { title = "distorted/born", unit = "1", fmt = "%.3f" }
io.write(tabular.format(cols, rows))
for _, T in ipairs(Ts) do
  local e, p = yield["electron " .. T], yield["positron " .. T]
  if e.born > 0 then
    io.write(string.format("T = %g MeV: positron/electron yield above 7 MeV: "
                           .. "born %.3f, distorted %.3f\n", T,
                           p.born / e.born, p.distorted / e.distorted))
  end
end

plot{ output = recipe.path("tungsten-converter.png"),
      title = "0.2 mm W: dsigma/dk by method",
      records = records, x = { column = "y", label = "y = k/T" },
      y = { column = "dsdk", label = "dsigma/dk" }, by = "method" }
