--[[
  test_bindsafety.lua -- the binding reads every option once into C and
  never trusts a Lua value twice: option tables answered by __index
  functions (fresh strings and tables, a collection, re-entrant calls of
  the module with another tolerance) give exactly the plain table's
  results; strings with NUL bytes, arrays with holes, absurd masses and
  charges and self-containing materials are refused with the field named.
]]

local bl = require "brakelight"
local dir = (arg and arg[0] or ""):match("^(.-)[^/\\]*$")
local expect_error = dofile(dir .. "lib/errcheck.lua")
local check = {}
function check.fails (f, opts, want)
  local fname = f == bl.particle and "particle"
                or f == bl.spectrum and "spectrum"
                or f == bl.angular and "angular" or "dsdk"
  return expect_error(fname, f, opts, { want })
end

-- BL_TEST_LIGHT (set by scripts/valgrind-lua.sh): the cheap Born method
-- instead of the default distorted waves (100 times slower): what is
-- checked here, the binding reading each option once, is the same for
-- every method, and the default's core runs under AddressSanitizer
local light = (os.getenv("BL_TEST_LIGHT") or "") ~= ""
local method = light and "born" or nil

local plain = { particle = { mass = 0.51099895, charge = -1, spin = 0.5,
                             name = "probe electron" },
                target = "Cu", T = 20, y = { 0.1, 0.5, 0.9 }, rtol = 1e-7,
                method = method }

-- A proxy that answers each key with a fresh copy (strings rebuilt, tables
-- new), collects garbage and calls the module with another tolerance first.
local nested = 0
local function proxy (t)
  return setmetatable({}, { __index = function (_, key)
    nested = nested + 1
    bl.dsdk{ particle = "muon", target = "C", T = 50, k = 20, rtol = 0.4 }
    collectgarbage()
    local v = t[key]
    if type(v) == "string" then return (v .. "x"):sub(1, -2) end
    if type(v) == "table" then
      local c = {}
      for k2, v2 in pairs(v) do
        c[k2] = type(v2) == "string" and (v2 .. "x"):sub(1, -2) or v2
      end
      return c
    end
    return v
  end })
end

local want = bl.spectrum(plain)
local got = bl.spectrum(proxy(plain))
assert(nested > 0, "the proxy was not consulted")
for i = 1, 3 do
  assert(got.dsdk[i] == want.dsdk[i] and got.err[i] == want.err[i],
         ("point %d: %.17g +- %.17g, want %.17g +- %.17g"):format(i,
         got.dsdk[i], got.err[i], want.dsdk[i], want.err[i]))
end
assert(got.settings.particle.name == "probe electron")
assert(got.settings.rtol == 1e-7)

local a = bl.angular{ particle = "electron", target = "Al", T = 5, k = 2,
                      theta = { 0.01, 0.1 }, rtol = 1e-6, method = method }
local b = bl.angular(proxy{ particle = "electron", target = "Al", T = 5,
                            k = 2, theta = { 0.01, 0.1 }, rtol = 1e-6,
                            method = method })
assert(a.d2sigma[1] == b.d2sigma[1] and a.err[2] == b.err[2])

-- refused, naming the field and the value
local base = { particle = "electron", target = "Pb", T = 10, k = 5 }
local function with (extra)
  local o = {}
  for k, v in pairs(base) do o[k] = v end
  for k, v in pairs(extra) do o[k] = v end
  return o
end
check.fails(bl.dsdk, with{ target = "Pb\0junk" },
            "field 'target': material name 'Pb' contains a NUL byte at byte 3")
check.fails(bl.dsdk, with{ particle = "electron\0x" },
            "field 'particle' contains a NUL byte at byte 9")
check.fails(bl.dsdk, with{ method = "born\0x" },
            "field 'method' contains a NUL byte at byte 5")
check.fails(bl.dsdk, with{ screening = "none\0" },
            "field 'screening' contains a NUL byte")
check.fails(bl.dsdk, with{ coulomb = "auto\0" },
            "field 'coulomb' contains a NUL byte")
check.fails(bl.dsdk, with{ particle = { mass = 1, charge = 1, spin = 0,
                                        name = "a\0b" } },
            "field 'particle.name' contains a NUL byte at byte 2")
check.fails(bl.particle, "muon\0", "the particle name contains a NUL byte")
check.fails(bl.dsdk, with{ target = { { "Cu", 0.5 }, { "Zn", 0.5 },
                                      by = "mass\0" } },
            "field 'by' contains a NUL byte")
check.fails(bl.spectrum, { particle = "electron", target = "Pb", T = 10,
                           y = { [1] = 0.5, [3] = 0.5 } },
            "field 'y' must be an array (keys 1..1 without holes), got key 3")
check.fails(bl.spectrum, { particle = "electron", target = "Pb", T = 10,
                           k = { 1, 2, x = 3 } },
            "field 'k' must be an array (keys 1..2 without holes), got key 'x'")
check.fails(bl.angular, { particle = "electron", target = "Pb", T = 10, k = 1,
                          theta = { [2] = 0.1 } },
            "field 'theta' must be a non-empty array")
check.fails(bl.dsdk, with{ particle = { mass = 1e300, charge = -1,
                                        spin = 0.5 } },
            "field 'particle' (custom, mass 1e+300 MeV, charge -1) gives "
            .. "the cross-section scale")
check.fails(bl.dsdk, with{ particle = { mass = 1, charge = 1e300,
                                        spin = 0.5 }, k = 0.5 },
            "field 'particle' (custom, mass 1 MeV, charge 1e+300)")
local m = { by = "mass" }
m[1] = { m, 1 }
check.fails(bl.dsdk, with{ target = m }, "the table contains itself")
local n, inner = { by = "atoms" }, { by = "mass" }
inner[1] = { n, 1 }
n[1] = { inner, 1 }
check.fails(bl.dsdk, with{ target = n }, "the table contains itself")
print("test_bindsafety: ok")
