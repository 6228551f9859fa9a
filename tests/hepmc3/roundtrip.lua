--[[
  roundtrip.lua -- make test-hepmc3: HepMC3 files written by
  brakelight.events for an element and a compound, both modes and three
  projectiles, each read back by the HepMC3 library (tests/hepmc3/
  read_hepmc3.cc: counts, statuses, PDG codes, four-momentum balance,
  the cross-section record).
    build/brakelight tests/hepmc3/roundtrip.lua READER DIR
]]

local bl = require "brakelight"
local events = require "brakelight.events"
local compat = require "brakelight.compat"
local reader, dir = arg[1], arg[2]
assert(reader and dir, "usage: roundtrip.lua READER DIR")

local cases = {
  { particle = "electron", target = "W", T = 8000, kmin = 80, mode = "unweighted", pdg = 11 },
  { particle = "muon", target = "water", T = 1e4, kmin = 100, mode = "weighted", pdg = 13 },
  { particle = "pion+", target = "Cu", T = 1000, kmin = 10, mode = "unweighted", pdg = 211 },
}
local bad = 0
for i, c in ipairs(cases) do
  local s = bl.sampler{ particle = c.particle, target = c.target, T = c.T,
                        kmin = c.kmin, mode = c.mode, seed = 100 + i,
                        events = 3000 }
  local path = string.format("%s/roundtrip-%d.hepmc", dir, i)
  local w = events.write{ sampler = s, output = path, format = "hepmc3" }
  local cmd = string.format("%s %s %d %.9g %d", reader, w.path, 3000,
                            s:info().sigma * 1e9, c.pdg)
  local ok = compat.execute(cmd)
  print(string.format("%s on %s (%s): %s", c.particle, c.target, c.mode,
                      ok and "read back" or "FAILED"))
  if not ok then bad = bad + 1 end
  os.remove(w.path)
end
os.exit(bad == 0 and 0 or 1)
