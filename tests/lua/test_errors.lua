--[[
  test_errors.lua -- every bad input to the Lua module is a Lua error that
  names the parameter, the value given and what is allowed (issue 2, §4).
  Run: build/brakelight tests/lua/test_errors.lua   (exits non-zero on
  the first failure)
]]

local bl = require "brakelight"

local find = string.find
local nchecks = 0

-- base options: valid and cheap; each case changes one thing
local function opts(changes)
  local t = { particle = "electron", target = "C", T = 10, k = 5,
              rtol = 1e-3 }
  for key, v in pairs(changes or {}) do
    if v == "<nil>" then t[key] = nil else t[key] = v end
  end
  return t
end

local check_error = dofile((arg[0]:match("^(.*[/\\])") or "./")
                           .. "lib/errcheck.lua")

-- f(arg) must fail with a well-formed message (lib/errcheck.lua)
local function expect_error(fname, f, arg, want)
  local msg = check_error(fname, f, arg, want)
  nchecks = nchecks + 1
  return msg
end

local function dsdk_err(changes, want)
  return expect_error("dsdk", bl.dsdk, opts(changes), want)
end

-- the base case is valid
do
  local v, e, w = bl.dsdk(opts())
  assert(v > 0 and e >= 0 and type(w) == "table")
end

-- argument itself
expect_error("dsdk", bl.dsdk, 5, { "option table expected", "got 5" })
expect_error("dsdk", bl.dsdk, nil, { "option table expected", "got nil" })
expect_error("spectrum", bl.spectrum, "electron",
             { "option table expected", "got 'electron'" })

-- missing required fields
dsdk_err({ particle = "<nil>" }, { "missing required field 'particle'" })
dsdk_err({ target = "<nil>" }, { "missing required field 'target'" })
dsdk_err({ T = "<nil>" }, { "missing required field 'T'", "MeV" })
dsdk_err({ k = "<nil>" }, { "missing required field 'k'", "MeV" })

-- unknown option keys (typo protection) and positional values
dsdk_err({ scrrening = "none" },
         { "unknown option 'scrrening'", "allowed: particle, target, T, k",
           "screening" })
dsdk_err({ [1] = "electron" }, { "got key 1", "allowed:" })
-- y = k/T as in spectrum (issue 16): one of k and y, y in (0, 1)
dsdk_err({ y = 0.5 }, { "exactly one of fields 'k'", "'y'", "got both" })
dsdk_err({ k = "<nil>", y = 1 }, { "field 'y' must be in (0, 1)", "got 1" })
dsdk_err({ k = "<nil>", y = "half" }, { "'y'" })

-- particle
dsdk_err({ particle = "muon-" },
         { "unknown particle 'muon-'", "'particle'",
           "allowed: electron, positron, muon, antimuon, pion+, pion-, " ..
           "kaon+, kaon-, proton" })
dsdk_err({ particle = 7 }, { "field 'particle'", "got 7" })
dsdk_err({ particle = { mass = -1, charge = 1, spin = 0 } },
         { "'particle.mass'", "> 0 MeV", "got -1" })
dsdk_err({ particle = { mass = 1, charge = 0, spin = 0 } },
         { "'particle.charge'", "non-zero", "got 0" })
dsdk_err({ particle = { mass = 1, charge = 1, spin = 1 } },
         { "'particle.spin'", "0 or 0.5", "got 1" })
dsdk_err({ particle = { mass = 1, charge = 1 } },
         { "missing required field 'particle.spin'" })
dsdk_err({ particle = { masss = 1, charge = 1, spin = 0 } },
         { "unknown particle field 'masss'", "allowed: name, mass, charge, spin" })
expect_error("particle", bl.particle, "foo",
             { "unknown particle 'foo'", "allowed: electron" })
expect_error("particle", bl.particle, 5, { "got 5", "string", "table" })
expect_error("particle", bl.particle, { mass = 0, charge = 1, spin = 0 },
             { "field 'mass'", "> 0 MeV", "got 0" })
expect_error("particle", bl.particle, { mass = 1 / 0, charge = 1, spin = 0 },
             { "field 'mass'", "got inf" })
expect_error("particle", bl.particle, { mass = 1, charge = 1, spin = 1.5 },
             { "field 'spin'", "0 or 0.5", "got 1.5" })
expect_error("particle", bl.particle, { mass = 1, charge = 1, spin = 0,
                                        name = 3 },
             { "field 'name'", "string", "got 3" })
expect_error("particle", bl.particle, { mass = "1", charge = 1, spin = 0 },
             { "field 'mass'", "must be a number", "got '1'" })

-- particle objects are read-only
do
  local p = bl.particle("muon")
  local ok, msg = pcall(function() p.mass = 1 end)
  assert(not ok and find(msg, "read-only", 1, true) and
         find(msg, "mass", 1, true), tostring(msg))
  nchecks = nchecks + 1
end

-- target: unknown symbol, Z out of range or not an integer, wrong type
dsdk_err({ target = "Xx" },
         { "unknown material 'Xx'", "'target'", "H..Fm", "1..100",
           "did you mean" })
dsdk_err({ target = 0 }, { "'target'", "integer Z in 1..100", "got 0" })
dsdk_err({ target = 101 }, { "'target'", "integer Z in 1..100", "got 101" })
dsdk_err({ target = -3 }, { "'target'", "got -3" })
dsdk_err({ target = 82.5 }, { "'target'", "integer Z", "got 82.5" })
dsdk_err({ target = true }, { "'target'", "got true" })

-- T
dsdk_err({ T = 0 }, { "field 'T' must be > 0 MeV", "got 0" })
dsdk_err({ T = -1 }, { "field 'T' must be > 0 MeV", "got -1" })
dsdk_err({ T = 1 / 0 }, { "field 'T'", "finite", "got inf" })
dsdk_err({ T = 0 / 0 }, { "field 'T'", "nan" })
dsdk_err({ T = "20" }, { "field 'T' must be a number", "got '20'" })

-- k in (0, T)
dsdk_err({ k = 0 }, { "field 'k' must be in (0, T) = (0, 10) MeV", "got 0" })
dsdk_err({ k = 10 }, { "field 'k'", "(0, 10)", "got 10" })
dsdk_err({ k = 25 }, { "field 'k'", "(0, 10)", "got 25" })
dsdk_err({ k = -1 }, { "field 'k'", "got -1" })
dsdk_err({ k = 0 / 0 }, { "field 'k'", "nan" })
dsdk_err({ k = { 5 } }, { "field 'k' must be a number", "got table" })

-- rtol
dsdk_err({ rtol = 0 }, { "field 'rtol'", "[1e-12, 0.5]", "got 0" })
dsdk_err({ rtol = -1e-3 }, { "field 'rtol'", "got -0.001" })
dsdk_err({ rtol = 1 }, { "field 'rtol'", "[1e-12, 0.5]", "got 1" })
dsdk_err({ rtol = "tight" }, { "field 'rtol' must be a number" })

-- screening: the allowed list is the registry
do
  local names = {}
  for _, m in ipairs(bl.models()) do names[#names + 1] = m.name end
  local msg = dsdk_err({ screening = "schiff" },
                       { "unknown screening model 'schiff'", "'screening'",
                         "allowed: " .. table.concat(names, ", ") })
  assert(#names >= 2, "registry has fewer than two models")
  dsdk_err({ screening = 1 }, { "field 'screening' must be a string",
                                "got 1" })
  assert(msg)
end

-- nucleus, electrons and the corrections
dsdk_err({ nucleus = "sphere" },
         { "unknown nucleus model 'sphere'", "'nucleus'", "'uniform'",
           "'point'" })
dsdk_err({ coulomb = "yes" },
         { "'coulomb'", "true, false or 'auto'", "got 'yes'" })
dsdk_err({ elwert = 1 }, { "'elwert'", "true, false or 'auto'", "got 1" })
expect_error("angular", bl.angular,
             { particle = "electron", target = "C", T = 10, k = 5,
               theta = { 0.1 }, coulomb = true },
             { "'coulomb'", "dsigma/dk only", "false or 'auto'" })
dsdk_err({ electrons = "no" },
         { "'electrons'", "true (default), false or 'projectile'",
           "got 'no'" })
dsdk_err({ electrons = "projectile" },   -- the base particle is e-
         { "'electrons' = 'projectile'", "not defined for electron",
           "exchange", "allowed for e-/e+: true, false" })
dsdk_err({ particle = "positron", electrons = "projectile" },
         { "'electrons' = 'projectile'", "not defined for positron" })
do  -- the projectile's radiation alone: accepted for muons, said in the
    -- settings, and far below every diagram at a soft photon (the struck
    -- electron's radiation; DEVELOPERS.md, "Muons")
  local o = { particle = "muon", target = "C", T = 1e4, k = 10, rtol = 1e-3 }
  local all = bl.dsdk(o)
  o.electrons = "projectile"
  local v = bl.dsdk(o)
  o.electrons = false
  local nuc = bl.dsdk(o)
  assert(nuc < v and v < all, ("muon: %g %g %g"):format(nuc, v, all))
  o.electrons = "projectile"
  o.k = { 10, 100 }
  local s = bl.spectrum(o)
  assert(s.settings.electrons == "projectile",
         "settings.electrons = " .. tostring(s.settings.electrons))
  nchecks = nchecks + 1
end
do  -- the accepted values really are accepted
  for _, t in ipairs{ { nucleus = "point", electrons = false },
                      { nucleus = "uniform", electrons = true },
                      { coulomb = true, elwert = false },
                      { coulomb = "auto", elwert = "auto" } } do
    local v = bl.dsdk(opts(t))
    assert(v > 0)
  end
end

-- spectrum: exactly one of k and y; element checks
local function spec_err(changes, want)
  local t = opts(changes)
  return expect_error("spectrum", bl.spectrum, t, want)
end
spec_err({ k = { 1, 2 }, y = { 0.5 } },
         { "exactly one of fields 'k'", "'y'", "got both" })
spec_err({ k = "<nil>" }, { "exactly one of fields 'k'", "got neither" })
spec_err({ k = { 1, "a" } }, { "element #2 of 'k' is not a number",
                               "got 'a'" })
spec_err({ k = { 1, 2, 12 } },
         { "element #3 of 'k' must be in (0, T) = (0, 10) MeV", "got 12" })
spec_err({ k = 5 }, { "field 'k' must be an array", "got 5" })
spec_err({ k = {} }, { "field 'k'", "non-empty" })
spec_err({ k = "<nil>", y = { 0.5, 1.5 } },
         { "element #2 of 'y' must be in (0, 1)", "got 1.5" })
spec_err({ k = "<nil>", y = { 0 } }, { "element #1 of 'y'", "got 0" })
spec_err({ k = "<nil>", y = { 1 } }, { "element #1 of 'y'", "got 1" })
spec_err({ k = "<nil>", y = { 0.5, 0 / 0 } }, { "element #2 of 'y'", "nan" })
spec_err({ k = { 1 }, T = -2 }, { "field 'T'", "got -2" })

-- angular: theta in [0, pi]
local function ang_err(changes, want)
  return expect_error("angular", bl.angular, opts(changes), want)
end
ang_err({ theta = { 0, 4 } },
        { "element #2 of 'theta' must be in [0, pi] rad", "got 4" })
ang_err({ theta = { -0.1 } }, { "element #1 of 'theta'", "got -0.1" })
ang_err({ theta = { 0.1, false } },
        { "element #2 of 'theta' is not a number", "got false" })
ang_err({}, { "field 'theta' must be an array", "got nil" })
ang_err({ theta = { 0.1 }, k = "<nil>" }, { "field 'k'", "'kmin'", "neither" })
ang_err({ theta = { 0.1 }, kmin = 1 }, { "field 'k'", "'kmin'", "both" })
ang_err({ theta = { 0.1 }, k = "<nil>", kmin = 0 }, { "field 'kmin'", "(0, T)",
                                                   "got 0" })
ang_err({ theta = { 0.1 }, k = "<nil>", kmin = 1, kmax = 0.5 },
        { "field 'kmax'", "(kmin, T]", "got 0.5" })
ang_err({ theta = { 0.1 }, method = "high-energy" },
        { "field 'method'", "'high-energy'", "'born'" })
ang_err({ theta = { 0.1 }, k = 11 }, { "field 'k'", "got 11" })

-- differential: angles in [0, pi], phi any finite number, no rtol
local function diff_err(changes, want)
  local t = opts(changes)
  t.rtol = changes.rtol
  return expect_error("differential", bl.differential, t, want)
end
local angles = { theta_k = 0.1, theta_p = 0.2, phi = 1 }
local function with(t)
  local r = {}
  for key, v in pairs(angles) do r[key] = v end
  for key, v in pairs(t) do r[key] = v end
  return r
end
diff_err(with{ theta_k = 4 },
         { "field 'theta_k' must be in [0, pi] rad", "got 4" })
diff_err(with{ theta_p = -1 }, { "field 'theta_p'", "got -1" })
diff_err(with{ phi = 1 / 0 }, { "field 'phi'", "finite", "got inf" })
diff_err(with{ phi = 0 / 0 }, { "field 'phi'", "nan" })
diff_err(with{ phi = "<nil>" }, { "missing required field 'phi'" })
diff_err(with{ rtol = 1e-3 }, { "unknown option 'rtol'", "allowed:" })
diff_err(with{ k = 10 }, { "field 'k'", "(0, 10)", "got 10" })
do  -- any finite phi is fine, and the result is a number
  local t = opts(with{ phi = 7.5 })
  t.rtol = nil
  local v, w = bl.differential(t)
  assert(type(v) == "number" and v == v and v >= 0 and type(w) == "table")
end

-- the message is the same when the function is called by name
do
  local ok, msg = pcall(function() return bl.dsdk(opts{ T = -1 }) end)
  assert(not ok and find(msg, "bad argument #1 to 'dsdk' (field 'T' must " ..
                         "be > 0 MeV and finite, got -1)", 1, true), msg)
  nchecks = nchecks + 1
end

print(string.format("test_errors: %d error checks passed", nchecks))
