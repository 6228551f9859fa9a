--[[
  test_module.lua -- shapes of what the Lua module returns: particle
  objects, settings with defaults filled in, units, warnings, models.
  Run: build/brakelight tests/lua/test_module.lua
]]

local bl = require "brakelight"
local compat = require "brakelight.compat"  -- math.type before 5.3

local function close(a, b, rel)
  return math.abs(a - b) <= rel * math.max(math.abs(a), math.abs(b))
end

local function isarray(t, n)
  if type(t) ~= "table" or #t ~= n then return false end
  for i = 1, n do
    if type(t[i]) ~= "number" or t[i] ~= t[i] then return false end
  end
  return true
end

-- module table
assert(type(bl._VERSION) == "string" and bl._VERSION:match("^%d+%.%d+%.%d+"),
       "bad _VERSION: " .. tostring(bl._VERSION))
assert(package.loaded.brakelight == bl)
for _, name in ipairs{ "angular", "differential", "dsdk", "models",
                       "particle", "spectrum" } do
  assert(type(bl[name]) == "function", "missing brakelight." .. name)
end

-- particle presets: fields, composite flag
local presets = {
  electron = { -1, 0.5, false }, positron = { 1, 0.5, false },
  muon = { -1, 0.5, false }, antimuon = { 1, 0.5, false },
  ["pion+"] = { 1, 0, true }, ["pion-"] = { -1, 0, true },
  ["kaon+"] = { 1, 0, true }, ["kaon-"] = { -1, 0, true },
  proton = { 1, 0.5, true },
}
for name, want in pairs(presets) do
  local p = bl.particle(name)
  assert(p.name == name, name)
  assert(p.charge == want[1], name .. " charge " .. tostring(p.charge))
  assert(p.spin == want[2], name .. " spin " .. tostring(p.spin))
  assert(p.composite == want[3], name .. " composite")
  assert(p.mass > 0)
  assert(tostring(p):find(name, 1, true))
end
-- masses: CODATA 2018 electron, PDG muon (as in include/brakelight/bl_const.h)
assert(close(bl.particle("electron").mass, 0.51099895, 1e-9))
assert(close(bl.particle("muon").mass, 105.6583755, 1e-9))
assert(bl.particle("electron") == bl.particle("electron"))
assert(bl.particle("electron") ~= bl.particle("positron"))

-- a custom particle; name defaults to "custom"
do
  local x = bl.particle{ mass = 7.5, charge = 2, spin = 0 }
  assert(x.name == "custom" and x.mass == 7.5 and x.charge == 2 and
         x.spin == 0 and x.composite == false)
  local y = bl.particle{ mass = 7.5, charge = -1, spin = 0.5, name = "Y" }
  assert(y.name == "Y" and y.spin == 0.5)
  assert(y.nosuchfield == nil)
  collectgarbage()  -- the name must survive collection of its source
  assert(y.name == "Y")
end

-- dsdk: three returns; preset name, object and table give the same number
local base = { particle = "muon", target = "Cu", T = 500, k = 100,
               rtol = 1e-3 }
local v1, e1, w1 = bl.dsdk(base)
assert(type(v1) == "number" and v1 > 0 and v1 < math.huge)
assert(type(e1) == "number" and e1 >= 0 and e1 < math.huge)
assert(type(w1) == "table")
do
  local t = {}
  for key, v in pairs(base) do t[key] = v end
  t.particle = bl.particle("muon")
  assert(bl.dsdk(t) == v1, "particle object differs from preset name")
  local mu = bl.particle("muon")
  t.particle = { name = "muon-like", mass = mu.mass, charge = mu.charge,
                 spin = mu.spin }
  assert(bl.dsdk(t) == v1, "particle table differs from preset name")
  t.particle = "muon"
  t.target = 29
  assert(bl.dsdk(t) == v1, "Z = 29 differs from 'Cu'")
  t.target = 29.0
  assert(bl.dsdk(t) == v1, "Z = 29.0 differs from 'Cu'")
  t.screening = "hartree-fock"
  assert(bl.dsdk(t) == v1, "default screening is not hartree-fock")
  t.screening = "none"
  assert(bl.dsdk(t) ~= v1, "screening 'none' changes nothing")
end

-- spectrum: shape, units, settings with defaults
do
  local s = bl.spectrum{ particle = "electron", target = 82, T = 10,
                         k = { 1, 5, 9 } }
  assert(isarray(s.k, 3) and isarray(s.y, 3) and isarray(s.dsdk, 3) and
         isarray(s.err, 3), "spectrum arrays")
  assert(s.k[2] == 5 and close(s.y[2], 0.5, 1e-15))
  for i = 1, 3 do assert(s.dsdk[i] > 0 and s.err[i] >= 0) end
  local u = s.units
  assert(u.k == "MeV" and u.y == "1" and u.dsdk == "mb/MeV" and
         u.err == "mb/MeV", "units")
  local st = s.settings
  assert(st.particle.name == "electron" and
         close(st.particle.mass, 0.51099895, 1e-9) and
         st.particle.charge == -1 and st.particle.spin == 0.5)
  assert(st.target.symbol == "Pb" and st.target.Z == 82)
  assert(st.T == 10)
  assert(st.screening == "hartree-fock", "default screening")
  assert(st.rtol == 1e-4, "default rtol")
  assert(st.nucleus == "uniform" and st.electrons == true)
  assert(st.coulomb == "auto" and st.elwert == "auto")
  assert(s.per_gram > 0 and st.target.per_gram == s.per_gram)
  assert(st.method == "distorted", st.method)
  assert(type(s.warnings) == "table")
  -- electron on lead: the distorted waves' model uncertainty, with numbers
  local dw
  for _, w in ipairs(s.warnings) do
    if w:find("distorted waves", 1, true) then dw = w end
  end
  assert(dw, "no distorted-wave warning for an electron on lead")
  assert(dw:find("Pb", 1, true) and dw:find("= 0.358", 1, true), dw)
  -- the Born method says where Born is poor: 2 pi Z alpha = 3.8
  local sb = bl.spectrum{ particle = "electron", target = 82, T = 10,
                          k = { 1, 5, 9 }, method = "born" }
  local born
  for _, w in ipairs(sb.warnings) do
    if w:find("Born", 1, true) then born = w end
  end
  assert(born, "no Born warning for an electron on lead")
  assert(born:find("Z = 82", 1, true) and born:find("2 pi", 1, true), born)
  -- warnings are deduplicated
  local seen = {}
  for _, w in ipairs(s.warnings) do
    assert(not seen[w], "duplicate warning " .. w)
    seen[w] = true
  end
end

-- warnings: none for an electron on carbon; for hadrons at 2 GeV on carbon
-- the point charge, with the size of the form factor they leave out
-- (above 1 % here: test_physics.lua 10 checks the size)
do
  local s = bl.spectrum{ particle = "electron", target = "C", T = 10,
                         y = { 0.1, 0.5, 0.9 }, rtol = 1e-3 }
  assert(#s.warnings == 0, "electron on carbon: " ..
         table.concat(s.warnings, "; "))
  assert(s.settings.target.symbol == "C" and s.settings.rtol == 1e-3)
  local v, _, w = bl.dsdk{ particle = "electron", target = "C", T = 10,
                           k = 5, rtol = 1e-3 }
  assert(v > 0 and #w == 0)
  for _, name in ipairs{ "proton", "pion+", "kaon-" } do
    local sp = bl.spectrum{ particle = name, target = "C", T = 2000,
                            y = { 0.3 }, rtol = 1e-3 }
    local found
    for _, msg in ipairs(sp.warnings) do
      if msg:find("treated as a point charge", 1, true) and
         msg:find(name, 1, true) and msg:find("changes by -", 1, true) then
        found = true
      end
    end
    assert(found, name .. ": no point-like warning: " ..
           table.concat(sp.warnings, "; "))
    local _, _, dw = bl.dsdk{ particle = name, target = "C", T = 2000,
                              k = 600, rtol = 1e-3 }
    assert(#dw >= 1 and dw[1]:find("point charge", 1, true))
    local _, aw = bl.differential{ particle = name, target = "C", T = 2000,
                                   k = 600, theta_k = 0.01, theta_p = 0.01,
                                   phi = 0 }
    assert(#aw >= 1 and aw[1]:find("point charge", 1, true))
  end
end

-- angular: shape and units
do
  local a = bl.angular{ particle = "positron", target = "Al", T = 5, k = 2,
                        theta = { 0, 0.1, 1, math.pi }, rtol = 1e-3 }
  assert(a.k == 2 and close(a.y, 0.4, 1e-15))
  assert(isarray(a.theta, 4) and isarray(a.d2sigma, 4) and
         isarray(a.err, 4))
  assert(a.theta[4] == math.pi)
  for i = 1, 4 do assert(a.d2sigma[i] >= 0 and a.err[i] >= 0) end
  assert(a.units.theta == "rad" and a.units.d2sigma == "mb/(MeV sr)" and
         a.units.err == "mb/(MeV sr)" and a.units.k == "MeV")
  assert(a.settings.particle.name == "positron" and
         a.settings.target.Z == 13 and a.settings.method == "distorted")
  assert(type(a.warnings) == "table")
end

-- models: registry as data
do
  local ms = bl.models()
  local byname = {}
  for i, m in ipairs(ms) do
    assert(type(m.name) == "string" and m.name == m.name:lower())
    assert(type(m.description) == "string" and #m.description > 0)
    assert(compat.mtype(m.id) == "integer")
    assert(not byname[m.name], "duplicate model " .. m.name)
    byname[m.name] = m
    assert(#m.references >= 1, m.name .. " has no reference")
    for _, r in ipairs(m.references) do
      assert(type(r.key) == "string" and type(r.citation) == "string")
      assert(r.doi == nil or type(r.doi) == "string")
    end
    assert(type(m.parameters) == "table")
    for _, p in ipairs(m.parameters) do
      assert(type(p.name) == "string" and type(p.default) == "number" and
             type(p.unit) == "string" and type(p.description) == "string")
    end
    if i > 1 then assert(m.id > ms[i - 1].id, "registry not in id order") end
  end
  assert(byname.none and byname.exponential, "missing screening models")
end

-- nucleus = "uniform+incoherent": echoed, adds to the value, warned with
-- its size where it counts (a muon on rock), not for electrons
do
  local vu = bl.dsdk{particle = "muon", target = "rock", T = 1e4, y = 0.5}
  local v, e, w, info = bl.dsdk{particle = "muon", target = "rock", T = 1e4,
                                y = 0.5, nucleus = "uniform+incoherent"}
  assert(info.settings.nucleus == "uniform+incoherent", info.settings.nucleus)
  assert(v > vu * 1.01 and v < vu * 1.06, v / vu)
  local found
  for _, x in ipairs(w) do
    if x:find("incoherent part", 1, true) then found = x end
  end
  assert(found and found:find("by %+3%.%d+ %%"), found)
  local _, _, we = bl.dsdk{particle = "electron", target = "Pb", T = 10,
                           y = 0.5, nucleus = "uniform+incoherent"}
  for _, x in ipairs(we) do
    assert(not x:find("incoherent part", 1, true), x)
  end
end

print("test_module: ok")
