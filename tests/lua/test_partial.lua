--[[
  test_partial.lua -- method "partial" (the exact partial waves) through
  the Lua module: a dsdk point and a 3-point spectrum (the same values,
  bit for bit), its electron-part warning and echo, the refusals (a muon,
  T above 3 MeV, angles) with messages that name the parameter, its value
  and the range.  The partial waves are slow: 10 keV on C and Cu only
  (0.05-0.1 s a point).  The wiring against bl_pw_dsdk is checked in C
  (tests/test_methods.c, suite partial_method).
  Run: build/brakelight tests/lua/test_partial.lua
]]

local bl = require "brakelight"

local numcheck = dofile((arg[0]:match("^(.*[/\\])") or "./")
                       .. "lib/numcheck.lua")
local rel, check = numcheck.rel, numcheck.check
local check_error = dofile((arg[0]:match("^(.*[/\\])") or "./")
                           .. "lib/errcheck.lua")
local nchecks = 0
local T = 0.01

-- 1. one point: e+ on C at y = 0.5 with the atomic electrons (Born part
-- flagged, with its share), the echo of the method
local v, e, w, info
do
  v, e, w, info = bl.dsdk{ particle = "positron", target = "C", T = T,
                           y = 0.5, method = "partial" }
  check(v > 0 and e > 0 and e <= 1e-4 * v, "value %g +- %g", v, e)
  check(info.settings.method == "partial"
        and info.settings.method_requested == "partial",
        "echo: %s / %s", tostring(info.settings.method),
        tostring(info.settings.method_requested))
  local found
  for _, x in ipairs(w) do
    if x:find("method 'partial'", 1, true) then found = x end
  end
  check(found and found:find("Born with the electrons minus Born", 1, true)
        and found:match("carries up to [%d.]+ %%"), "electron-part warning: %s",
        tostring(found))
  -- the share it names: measured 9.2 % (C test electron_part_as_distorted
  -- checks the part itself); a value in (1 %, 50 %)
  local share = tonumber(found:match("carries up to ([%d.]+) %%"))
  check(share > 1 and share < 50, "share %s %%", tostring(share))
  local v0, _, w0 = bl.dsdk{ particle = "positron", target = "C", T = T,
                             y = 0.5, method = "partial", electrons = false }
  check(#w0 == 0, "no electrons, no warning: %s", tostring(w0[1]))
  -- the electron part it names is what was added
  check(math.abs((v - v0) / v - share / 100) < 2e-3, "share %g vs %g",
        (v - v0) / v, share / 100)
  nchecks = nchecks + 6
end

-- 2. a spectrum of 3 points: method per point, the dsdk values bit for bit
do
  local s = bl.spectrum{ particle = "positron", target = "C", T = T,
                         y = { 0.2, 0.5, 0.8 }, method = "partial",
                         threads = 2 }
  check(#s.dsdk == 3, "three points")
  for i = 1, 3 do
    check(s.method[i] == "partial", "method[%d] %s", i, tostring(s.method[i]))
    check(s.dsdk[i] > 0 and s.err[i] >= 0, "point %d", i)
  end
  check(s.dsdk[2] == v, "spectrum %.17g dsdk %.17g", s.dsdk[2], v)
  check(s.settings.method == "partial", "settings.method")
  -- against the distorted waves for e- on C (accurate there: Z alpha =
  -- 0.044; a consistency check, measured 0.5-1.2 %), within 5 %
  local p = bl.spectrum{ particle = "electron", target = "C", T = T,
                         y = { 0.2, 0.5, 0.8 }, method = "partial" }
  local d = bl.spectrum{ particle = "electron", target = "C", T = T,
                         y = { 0.2, 0.5, 0.8 }, method = "distorted" }
  for i = 1, 3 do
    check(math.abs(rel(p.dsdk[i], d.dsdk[i])) < 0.05, "y %g: %g vs %g",
          p.y[i], p.dsdk[i], d.dsdk[i])
  end
  nchecks = nchecks + 12
end

-- 3. refusals: the message names the parameter, its value and the range
check_error("dsdk", bl.dsdk, { particle = "muon", target = "C", T = T,
                               y = 0.5, method = "partial" },
            { "field 'method' is 'partial'", "particle 'muon'",
              "mass 105.6583755 MeV", "within 1e-06 MeV of 0.51099895" })
check_error("spectrum", bl.spectrum, { particle = "electron", target = "Cu",
                                       T = 5, y = { 0.5 },
                                       method = "partial" },
            { "field 'method' is 'partial'", "T = 5 MeV", "(0, 3] MeV" })
check_error("energy_loss", bl.energy_loss,
            { particle = bl.particle{ mass = 0.51099895, charge = -1,
                                      spin = 0 },
              target = "C", T = T, method = "partial" },
            { "field 'method' is 'partial'", "spin 0", "spin-1/2" })
check_error("angular", bl.angular, { particle = "electron", target = "C",
                                     T = T, k = 0.005, theta = { 0.1 },
                                     method = "partial" },
            { "field 'method' is 'partial'", "dsigma/dk, spectra and "
              .. "integrals over k", "'distorted'" })
check_error("dsdk", bl.dsdk, { particle = "electron", target = "C", T = T,
                               y = 0.5, method = "partial",
                               nucleus = "uniform+incoherent" },
            { "field 'method' is 'partial'", "'uniform+incoherent'",
              "'uniform' or 'point'" })
check_error("dsdk", bl.dsdk, { particle = "electron", target = "C", T = T,
                               y = 0.5, method = "fast" },
            { "unknown method 'fast'", "'partial'", "'auto' (default)" })
nchecks = nchecks + 6

-- 4. the registry
do
  local m = bl.methods()
  check(m[6] == "partial", "methods()[6] = %s", tostring(m[6]))
  nchecks = nchecks + 1
end

print(string.format("test_partial: %d checks passed", nchecks))
