--[[
  test_limits.lua -- issue 6: a request that would run for hours is refused
  up front, naming the field, its number of points, the rtol and how many
  points are allowed; ordinary requests pass; the T/m limit of the core is
  stated.  (Ctrl-C in a scan keeps the points already computed:
  tests/lua/test_scan_resume.lua, HOW=int.)
]]

local bl = require "brakelight"
local expect_error = dofile((arg[0]):match("^(.-)[^/\\]*$")
                            .. "lib/errcheck.lua")

local function fractions (n, lo, hi)
  local t = {}
  for i = 1, n do t[i] = lo + (hi - lo) * i / (n + 1) end
  return t
end

-- the issue's example: 1e6 points at rtol 1e-12
local y = fractions(1000000, 0, 1)
local msg = expect_error("spectrum", bl.spectrum,
  {particle = "electron", target = "W", T = 20, y = y, rtol = 1e-12},
  {"field 'y' has 1000000 points", "rtol = 1e-12", "allowed: at most",
   "brakelight.scan"})
local allowed = tonumber(msg:match("at most (%d+) points"))
assert(allowed and allowed > 1000 and allowed < 1000000, msg)

-- the same as photon energies, and a looser rtol allows more points
local k = fractions(1000000, 0, 20)
local msg2 = expect_error("spectrum", bl.spectrum,
  {particle = "electron", target = "W", T = 20, k = k, rtol = 1e-4},
  {"field 'k' has 1000000 points", "rtol = 0.0001"})
local allowed2 = tonumber(msg2:match("at most (%d+) points"))
assert(allowed2 > allowed, msg2)

-- a compound: the limit counts every element
local msg3 = expect_error("spectrum", bl.spectrum,
  {particle = "electron", target = "H2O", T = 20, k = fractions(allowed, 0, 20),
   rtol = 1e-12},
  {"on 2 element(s)"})
assert(tonumber(msg3:match("at most (%d+) points")) < allowed, msg3)

-- angular points are cheaper, but not free (32 elements, 2e5 angles)
local many = "HLiBeBCNOFNaMgAlSiPSClKCaTiVCrMnFeCoNiCuZnGaGeAsSeBrRb"
expect_error("angular", bl.angular,
  {particle = "electron", target = many, T = 20, k = 5, rtol = 1e-12,
   theta = fractions(200000, 0, math.pi)},
  {"field 'theta' has 200000 points", "on 32 element(s)", "allowed: at most"})

-- photon yields and angular windows integrate over k for every bin or
-- angle: each costs dozens of points (issue 4)
expect_error("photon_yield", bl.photon_yield,
  {particle = "electron", target = "Pb", T = 100, thickness = 1, kmin = 1,
   bins = 100000, rtol = 1e-8},
  {"field 'bins' has 100000 points", "allowed: at most"})
expect_error("angular", bl.angular,
  {particle = "electron", target = "W", T = 20, kmin = 1, rtol = 1e-12,
   theta = fractions(300000, 0, math.pi)},
  {"field 'theta' has 300000 points", "allowed: at most"})

-- ordinary requests are not refused
local s = bl.spectrum{particle = "electron", target = "W", T = 20,
                      y = {0.2, 0.8}, rtol = 1e-6}
assert(#s.dsdk == 2 and s.dsdk[1] > 0)
local a = bl.angular{particle = "electron", target = "W", T = 20, k = 5,
                     theta = {0, 0.05}}
assert(#a.d2sigma == 2 and a.d2sigma[1] > 0)

-- T/m above the core's limit (1e15) is refused with the allowed value
expect_error("dsdk", bl.dsdk,
  {particle = "electron", target = "Pb", T = 1e15, k = 1},
  {"field 'T' must be at most 1e+15 times the particle mass", "electron",
   "got 1e+15"})

-- issue 16: every integral has a limit, stated with the parameter and the
-- range it allows: 32 elements at rtol 1e-12 ran for minutes before
local els = {"H", "He", "Li", "Be", "B", "C", "N", "O", "F", "Ne", "Na", "Mg",
             "Al", "Si", "P", "S", "Cl", "Ar", "K", "Ca", "Sc", "Ti", "V", "Cr",
             "Mn", "Fe", "Co", "Ni", "Cu", "Zn", "Ga", "Ge"}
local mix = {by = "atoms"}
for i, e in ipairs(els) do mix[i] = {e, 1 / #els} end
for _, f in ipairs({"energy_loss", "cross_section"}) do
  local a = {particle = "electron", target = mix, T = 100, rtol = 1e-12}
  if f == "cross_section" then a.kmin, a.kmax = 1, 50 end
  local m = expect_error(f, bl[f], a,
    {"field 'rtol' = 1e-12 on 32 element(s)", "integrand calls",
     "allowed for this target: rtol in ["})
  local lo = tonumber(m:match("rtol in %[([^,]+),"))
  assert(lo and lo > 1e-12 and lo < 1e-6, m)
end
-- photon_yield bins at that tolerance: at most so many
expect_error("photon_yield", bl.photon_yield,
  {particle = "electron", target = mix, T = 100, thickness = 0.1, kmin = 1,
   kmax = 50, bins = 1000, rtol = 1e-10},
  {"field 'bins' has 1000 points", "allowed: at most"})
-- nested mixtures: a part used n times counts n times (256^n before)
local inner = {by = "atoms"}
for i = 1, 200 do inner[i] = {"Pb", 1 / 200} end
local mid = {by = "atoms"}
for i = 1, 200 do mid[i] = {inner, 1 / 200} end
local outer = {by = "atoms"}
for i = 1, 200 do outer[i] = {mid, 1 / 200} end
expect_error("material", bl.material, outer,
  {"more than 4096 parts in all", "allowed: at most 4096"})

print("test_limits: ok")
