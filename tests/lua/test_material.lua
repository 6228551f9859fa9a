--[[
  test_material.lua -- material objects, brakelight.materials and
  brakelight.radiation_length: fields, tostring, values, and every bad
  input as an error naming the parameter, the value and what is allowed.
  Run: build/brakelight tests/lua/test_material.lua   (exits non-zero on
  the first failure)
]]

local bl = require "brakelight"

local find = string.find
local nchecks = 0

for _, name in ipairs{ "material", "materials", "radiation_length" } do
  assert(type(bl[name]) == "function", "missing brakelight." .. name ..
         " (is lbl_material_open called from luaopen_brakelight?)")
end

local function close(a, b, rel)
  return math.abs(a - b) <= rel * math.max(math.abs(a), math.abs(b))
end

local function check(cond, msg)
  assert(cond, msg)
  nchecks = nchecks + 1
end

local check_error = dofile((arg[0]:match("^(.*[/\\])") or "./")
                           .. "lib/errcheck.lua")

-- f(arg) must fail with a well-formed message (lib/errcheck.lua)
local function expect_error(fname, f, arg, want)
  local msg = check_error(fname, f, arg, want)
  nchecks = nchecks + 1
  return msg
end

local function mat_err(arg, want)
  return expect_error("material", bl.material, arg, want)
end

-- what every "unknown material" message says is allowed
local ALLOWED = { "allowed: an element symbol (H..Fm) or name",
                  "catalogue key or alias", "chemical formula",
                  "brakelight.materials()", "integer Z in 1..100" }
local function with_allowed(t)
  local r = {}
  for _, s in ipairs(t) do r[#r + 1] = s end
  for _, s in ipairs(ALLOWED) do r[#r + 1] = s end
  return r
end

local NA = 6.02214076e23

-- {{{ fields and tostring

do  -- a formula: per molecule, no density
  local m = bl.material("H2O")
  check(m.name == "H2O", "name " .. tostring(m.name))
  check(m.density == nil, "a formula has no density")
  check(close(m.molar_mass, 2 * 1.008 + 15.999, 1e-14), "molar mass")
  local c = m.components
  check(#c == 2 and c[1].Z == 1 and c[1].symbol == "H" and c[1].atoms == 2
        and c[2].Z == 8 and c[2].symbol == "O" and c[2].atoms == 1,
        "components of H2O")
  check(close(c[1].A, 1.008, 1e-14) and close(c[2].A, 15.999, 1e-14), "A")
  check(close(c[1].mass_fraction + c[2].mass_fraction, 1, 1e-14), "sum w")
  check(close(c[1].mass_fraction, 2 * 1.008 / m.molar_mass, 1e-14), "w(H)")
  check(close(m.per_gram, NA / m.molar_mass * 1e-27, 1e-14), "per_gram")
  check(m.radiation_length > 36 and m.radiation_length < 36.2, "X0 water")
  check(m.radiation_length_cm == nil, "no cm without density")
  local s = tostring(m)
  check(s == "brakelight.Material: H2O (H 2, O 1 per formula unit; " ..
             "18.015 g/mol; density unknown)", "tostring: " .. s)
  check(getmetatable(m) ~= nil, "metatable")
end

do  -- with density and name
  local m = bl.material{ "H2O", density = 1.0, name = "water" }
  check(m.name == "water" and m.density == 1.0, "name and density")
  check(close(m.radiation_length_cm, m.radiation_length, 1e-14), "cm")
  local s = tostring(m)
  check(find(s, "brakelight.Material: water (H 2, O 1", 1, true) == 1
        and find(s, "1 g/cm^3)", 1, true), "tostring: " .. s)
end

do  -- elements: symbol, name, Z; xraylib's density
  local a, b, c = bl.material("Pb"), bl.material("lead"), bl.material(82)
  for _, m in ipairs{ a, b, c } do
    check(m.name == "Pb" and #m.components == 1
          and m.components[1].Z == 82 and m.components[1].atoms == 1,
          "element Pb")
    check(m.density > 11 and m.density < 11.5, "Pb density")
  end
  check(bl.material(82.0).name == "Pb", "82.0 is an integer")
  check(bl.material("Co").components[1].Z == 27, "Co is cobalt")
  check(#bl.material("C1O1").components == 2, "C1O1 is carbon monoxide")
  check(bl.material("ALUMINUM").name == "Al", "aluminum, any case")
  check(bl.material("Pb").key == nil, "an element is no catalogue entry")
  check(find(bl.material("Pb").description, "xraylib's element density", 1,
             true), "element density named")
end

do  -- catalogue entries: key, aliases in any case; average atom by mass
  local w = bl.material("water")
  check(w.name == "water" and w.density == 1 and w.key == "water", "water")
  local sum = 0
  for _, c in ipairs(w.components) do sum = sum + c.atoms end
  check(close(sum, 1, 1e-13), "one average atom")
  check(bl.material("Liquid Water").name == "water", "alias, any case")
  local air = bl.material("air")
  check(air.density > 1.1e-3 and air.density < 1.3e-3, "air density")
  check(bl.material{ "water", density = 0.998 }.density == 0.998,
        "own density")
  check(find(bl.material{ "water", density = 0.998 }.description,
             "as given (the catalogue has 1)", 1, true), "own density said")
  local g = bl.material("BGO")
  check(g.name == "bgo" and g.density == 7.13
        and #g.components == 3 and g.components[3].atoms == 4, "BGO")
  check(bl.material("standard rock").components[1].A == 22, "rock A = 22")
  check(bl.material("lead glass").key == "lead_glass", "lead glass")
  check(bl.material("PWO").name == "pwo", "PWO: lead tungstate")
end

do  -- a formula of a catalogue crystal: its density, said in the description
  local m = bl.material("PbWO4")
  check(m.name == "PbWO4" and m.density == 8.3 and m.key == "pwo", "PbWO4")
  check(find(m.description, "formula PbWO4 with the density of the "
             .. "catalogue entry 'pwo'", 1, true), m.description)
  check(bl.material("Bi4Ge3O12").density == 7.13, "Bi4Ge3O12")
  check(bl.material("H2O").density == nil, "water as a formula: none")
  local d = bl.spectrum{ particle = "electron", target = "PbWO4", T = 10,
                         k = { 5 } }
  check(find(d.settings.target.description, "'pwo'", 1, true)
        and d.settings.target.density == 8.3, "result's description")
end

do  -- case-ambiguous names: an error offering both readings (on main,
    -- "PB" silently became phosphorus + boron)
  for _, s in ipairs{ "PB", "CU", "NI", "SN", "co", "pb" } do
    local ok, msg = pcall(bl.material, s)
    check(not ok and find(msg, "ambiguous material name '" .. s .. "'", 1, true)
          and find(msg, "did you mean", 1, true), s .. ": " .. tostring(msg))
  end
  mat_err("PB", { "ambiguous material name 'PB': did you mean Pb (lead) or "
                  .. "P + B?",
                  "write 'Pb' for the element or 'P1B1' for the formula" })
  mat_err("co", { "did you mean Co (cobalt) or C + O?", "'C1O1'" })
  local ok, msg = pcall(bl.dsdk, { particle = "electron", target = "PB",
                                   T = 10, k = 5 })
  check(not ok and find(msg, "field 'target'", 1, true)
        and find(msg, "ambiguous", 1, true), "target = 'PB': " .. msg)
  check(#bl.material("P1B1").components == 2, "P1B1 is P + B")
end

do  -- a material object comes back as it is; a table renames it
  local m = bl.material("Cu")
  check(bl.material(m) == m, "same object")
  local n = bl.material{ m, name = "copper" }
  check(n.name == "copper" and m.name == "Cu", "renamed copy")
end

do  -- mixtures: brass by mass and by atoms; compounds as parts
  local a = bl.material{ { "Cu", 0.7 }, { "Zn", 0.3 }, by = "mass" }
  check(a.name == "0.7 Cu + 0.3 Zn by mass", "default name " .. a.name)
  local s = 0.7 / 63.546 + 0.3 / 65.38
  local x1, x2 = 0.7 / 63.546 / s, 0.3 / 65.38 / s
  local b = bl.material{ { "Cu", x1 }, { bl.material("Zn"), x2 },
                         by = "atoms", name = "brass", density = 8.5 }
  check(b.name == "brass" and b.density == 8.5, "name, density")
  for i = 1, 2 do
    local ca, cb = a.components[i], b.components[i]
    check(ca.Z == cb.Z and close(ca.atoms, cb.atoms, 1e-12)
          and close(ca.mass_fraction, cb.mass_fraction, 1e-12),
          "brass component " .. i)
  end
  check(close(a.components[1].mass_fraction, 0.7, 1e-12), "w(Cu)")
  check(close(a.radiation_length, b.radiation_length, 1e-12), "X0")
  local wet = bl.material{ { "H2O", 0.9 }, { "C2H5OH", 0.1 }, by = "mass" }
  check(#wet.components == 3, "water + ethanol: H, C, O")
  local wC = 0.1 * 2 * 12.011 / (2 * 12.011 + 6 * 1.008 + 15.999)
  check(close(wet.components[2].mass_fraction, wC, 1e-12), "w(C)")
  local n = bl.material{ { "Cu", 7 }, { "Zn", 3 }, by = "mass",
                         normalize = true }
  check(close(n.components[1].mass_fraction, 0.7, 1e-12), "normalize")
  local nested = bl.material{ { { { "Cu", 0.5 }, { "Zn", 0.5 },
                                  by = "atoms" }, 0.5 },
                              { "Sn", 0.5 }, by = "atoms" }
  check(#nested.components == 3
        and close(nested.components[3].atoms, 0.5, 1e-14), "nested mixture")
  check(nested.name == "0.5 (0.5 Cu + 0.5 Zn by atoms) + 0.5 Sn by atoms",
        "nested name " .. nested.name)
end

-- }}}

-- {{{ materials() and radiation_length()

do
  local list = bl.materials()
  check(type(list) == "table" and #list > 190, "materials()")
  local seen = {}
  for i, e in ipairs(list) do
    assert(type(e.key) == "string" and e.key:match("^[a-z0-9_]+$"), e.key)
    assert(type(e.aliases) == "table" and type(e.description) == "string"
           and type(e.composition) == "string" and e.density > 0
           and type(e.source) == "string", e.key)
    assert(i == 1 or list[i - 1].key < e.key, "sorted by key")
    seen[e.key] = e
  end
  for _, k in ipairs{ "water", "air", "concrete", "bgo", "pwo", "csi", "nai",
                      "lyso", "lead_glass", "standard_rock", "steel",
                      "brass", "tungsten_alloy_90", "polystyrene", "pvt",
                      "liquid_argon", "liquid_xenon",
                      "borated_polyethylene" } do
    check(seen[k], "catalogue has " .. k)
  end
  check(seen.bgo.formula == "Bi4Ge3O12" and seen.bgo.crystal, "bgo")
  check(seen.standard_rock.effective
        and find(seen.standard_rock.source, "common practice", 1, true),
        "standard rock: common practice")
  check(seen.water.aliases[1] == "liquid_water", "aliases")
  for i = 1, #list, 17 do  -- every 17th entry makes a material
    local m = bl.material(list[i].key)
    check(m.name == list[i].key and m.density == list[i].density, list[i].key)
    for _, a in ipairs(list[i].aliases) do
      check(bl.material(a).name == list[i].key, a)
    end
  end
end

do
  -- Review of Particle Physics, atomic and nuclear properties table:
  -- X0(Pb) = 6.37 g/cm^2, water 36.08 g/cm^2 (from memory, 0.3 %)
  local r = bl.radiation_length("Pb")
  check(close(r.value, 6.37, 3e-3), "X0(Pb) " .. r.value)
  check(close(r.cm, r.value / bl.material("Pb").density, 1e-14), "Pb cm")
  check(r.units.value == "g/cm^2" and r.units.cm == "cm", "units")
  check(r.target == "Pb" and r.formula == "Tsai", "target, formula")
  local f = bl.radiation_length("H2O")
  check(close(f.value, 36.08, 3e-3) and f.cm == nil, "water, no density")
  check(f.target == "H2O", "target name")
  local w = bl.radiation_length{ "H2O", density = 1 }
  check(close(w.cm, w.value, 1e-14), "water with density: cm")
  local o = bl.radiation_length{ target = bl.material("water") }
  check(close(o.value, 36.08, 3e-3) and close(o.cm, o.value, 1e-14),
        "option-table form, catalogue water")
  check(bl.radiation_length(82).value == r.value, "Z = 82")
  local m = bl.material{ "Pb", density = 11.35 }
  check(m.radiation_length == r.value
        and close(m.radiation_length_cm, r.value / 11.35, 1e-14),
        "object fields")
end

-- }}}

-- {{{ errors

-- the argument itself
mat_err(nil, with_allowed{ "material expected, got nil" })
mat_err(true, with_allowed{ "material expected, got true" })
mat_err(print, with_allowed{ "material expected, got function" })
mat_err({}, with_allowed{ "empty material table" })
mat_err("", with_allowed{ "material name is empty" })

-- strings: why each reading failed, where the formula broke
mat_err("Xx3", with_allowed{ "unknown material 'Xx3'",
                             "not an element symbol or name",
                             "nor a catalogue key or alias",
                             "unknown element symbol", "at byte 1 ('Xx3')" })
mat_err("H2O)", with_allowed{ "unknown material 'H2O)'",
                              "closing bracket without an opening one",
                              "at byte 4 (')')" })
mat_err("H-1", with_allowed{ "unknown material 'H-1'",
                             "unexpected character", "at byte 2 ('-1')" })
mat_err("H0", { "unknown material 'H0'", "count must be > 0",
                "at byte 2 ('0')" })
mat_err("(H2O", { "bracket never closed", "at byte 1" })
mat_err("H2O.", { "nothing after the hydrate separator",
                  "at byte 5 (the end)" })
mat_err("pbb", { "unknown material 'pbb'",
                 "element symbols start with a capital letter" })
mat_err("Watr", { "unknown material 'Watr'", "did you mean",
                  "'water'", "'water_vapour'" })
-- elements first in suggestions; old labels lead to the new key
mat_err("tungstem", { "did you mean 'tungsten' (element W)" })
mat_err("Alumnium", { "did you mean 'aluminium' (element Al)" })
mat_err("w", { "did you mean 'W' (tungsten)" })
mat_err("ZN", { "did you mean 'Zn' (zinc)" })
mat_err("Water, Liquid", { "unknown material 'Water, Liquid'",
                           "did you mean 'water'" })
mat_err("Polymethyl Methacralate (Lucite, Perspex)",
        { "did you mean 'pmma'" })

-- numbers: Z in 1..100
mat_err(0, { "atomic number must be an integer Z in 1..100, got 0" })
mat_err(101, { "integer Z in 1..100", "got 101" })
mat_err(82.5, { "integer Z in 1..100", "got 82.5" })

-- density and name
mat_err({ "H2O", density = 0 },
        { "field 'density' must be > 0 g/cm^3 and finite, got 0" })
mat_err({ "H2O", density = -1 }, { "field 'density'", "got -1" })
mat_err({ "H2O", density = 1 / 0 }, { "field 'density'", "got inf" })
mat_err({ "H2O", density = 0 / 0 }, { "field 'density'", "nan" })
mat_err({ "H2O", density = "1" },
        { "field 'density' must be a number > 0 (g/cm^3), got '1'" })
mat_err({ "H2O", name = 5 }, { "field 'name' must be a string, got 5" })
mat_err({ "H2O", name = string.rep("x", 96) },
        { "field 'name' must be a string of 1 to 95 bytes", "96 bytes" })
mat_err({ "H2O", name = "" }, { "field 'name'", "0 bytes" })
mat_err({ "H2O", dens = 1 },
        { "unexpected key 'dens' in a material table",
          "allowed: {spec, density =, name =}" })
mat_err({ "H2O", "O2" }, { "unexpected key 2" })
mat_err({ "Xx", density = 1 }, { "unknown material 'Xx'" })

-- mixtures
local brass = function(t)
  local r = { { "Cu", 0.7 }, { "Zn", 0.3 }, by = "mass" }
  for k, v in pairs(t) do
    if v == "<nil>" then r[k] = nil else r[k] = v end
  end
  return r
end
mat_err(brass{ by = "<nil>" },
        { "missing field 'by' of a mixture", "allowed: 'mass'", "'atoms'" })
mat_err(brass{ by = "volume" },
        { "field 'by' must be 'mass' or 'atoms', got 'volume'" })
mat_err(brass{ by = 1 }, { "field 'by' must be 'mass' or 'atoms', got 1" })
mat_err(brass{ normalize = "yes" },
        { "field 'normalize' must be a boolean, got 'yes'" })
mat_err(brass{ [2] = { "Zn", 0.2 } },
        { "fractions of the mixture sum to 0.9",
          "allowed: a sum within 1e-06 of 1, or normalize = true" })
mat_err(brass{ [2] = { "Zn", 0 } },
        { "part #2 of the mixture: fraction (element 2) must be > 0 and " ..
          "finite, got 0" })
mat_err(brass{ [2] = { "Zn", -0.3 } }, { "part #2", "got -0.3" })
mat_err(brass{ [2] = { "Zn", 0 / 0 } }, { "part #2", "nan" })
mat_err(brass{ [2] = { "Zn", 1 / 0 } }, { "part #2", "got inf" })
mat_err(brass{ [2] = { "Zn", "0.3" } },
        { "part #2 of the mixture: fraction (element 2) must be a number",
          "got '0.3'" })
mat_err(brass{ [2] = { "Zn" } }, { "part #2", "got nil" })
mat_err(brass{ [2] = "Zn" },
        { "part #2 of the mixture: must be a table {spec, fraction}, " ..
          "got 'Zn'" })
mat_err(brass{ [2] = { "Zn", 0.3, 1 } },
        { "part #2 of the mixture: unexpected key 3 in a mixture part",
          "a part is {spec, fraction}" })
mat_err(brass{ [2] = { "Xx", 0.3 } },
        { "part #2 of the mixture: unknown material 'Xx'" })
mat_err(brass{ [2] = { 0, 0.3 } },
        { "part #2 of the mixture: atomic number must be an integer Z " ..
          "in 1..100, got 0" })
mat_err(brass{ density = -2 }, { "field 'density'", "got -2" })
mat_err(brass{ colour = "yellow" },
        { "unexpected key 'colour' in a mixture table",
          "allowed in a mixture: parts [1..n] as {spec, fraction}, by, " ..
          "normalize, density, name" })
do
  local parts = {}  -- 33 different elements
  for Z = 1, 33 do parts[Z] = { Z, 1 } end
  parts.by = "atoms"
  parts.normalize = true
  mat_err(parts, { "part #33 of the mixture brings it to more than 32 " ..
                   "different elements (allowed: at most 32)" })
  local t = { by = "mass" }  -- a table that contains itself
  t[1] = { t, 1 }
  mat_err(t, { "material tables nested too deep (at most 8 levels" })
end

-- material objects: read-only, no other fields
do
  local m = bl.material("Cu")
  local ok, msg = pcall(function() return m.colour end)
  check(not ok and find(msg, "brakelight.Material has no field 'colour'; " ..
                        "fields: name, density, molar_mass", 1, true), msg)
  ok, msg = pcall(function() m.density = 9 end)
  check(not ok and find(msg, "brakelight.Material objects are read-only " ..
                        "(field 'density')", 1, true), msg)
end

-- radiation_length: same reader; option-table form names the field
local function x0_err(arg, want)
  return expect_error("radiation_length", bl.radiation_length, arg, want)
end
x0_err(nil, with_allowed{ "material expected, got nil" })
x0_err("Xx3", { "unknown material 'Xx3'" })
x0_err({ target = "Xx3" }, { "field 'target': unknown material 'Xx3'" })
x0_err({ target = 0 }, { "field 'target': atomic number", "got 0" })
x0_err({ target = "Pb", rtol = 1 },
       { "unexpected key 'rtol' in the option table", "allowed: target" })
x0_err({ "H2O", density = -1 }, { "field 'density'", "got -1" })

-- }}}

print(string.format("test_material: %d checks passed", nchecks))
