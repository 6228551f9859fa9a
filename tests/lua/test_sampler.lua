--[[
  test_sampler.lua -- issue 15: brakelight.sampler and brakelight.events.
  Events as tables and by the iterator (the same events), refusals with
  clear messages, the files: an LHE reader checking the structure of the
  Les Houches Event file format (version 3.0: one <init> with its two
  record lines, <event> blocks of NUP particle lines of 13 fields, status
  codes, momentum balance of every event in GeV), a HepMC3 ASCII reader
  checking the Asciiv3 layout (E/U/W/A/P/V lines, 5 particles, statuses 4
  and 1, the cross-section record), CSV; shards written apart and merged
  equal the unsharded file event for event; no OUTPUT.part left; a failed
  run leaves no OUTPUT; merge refuses a gap and a file of another run; the
  runner's -j 2 (build/brakelight, started by this test) merges its
  workers' shard files into the file one process writes; SIGINT in the
  middle of a write leaves no OUTPUT and a .part of whole events.  Runs in
  any Lua host; the part about the runner (-j 2, a Slurm task, SIGINT),
  which starts build/brakelight and so is the same in every host, only
  when this file runs in the runner itself (make test-lua, make
  test-lua-asan), to keep make test-lua-hosts short.
]]

local root = (arg[0]):match("^(.-)tests[/\\]lua[/\\][^/\\]+%.lua$") or "./"
package.path = root .. "lua/?.lua;" .. package.path
local bl = require "brakelight"
local events = require "brakelight.events"

local tmp = os.tmpname()
os.remove(tmp)

local function spec(extra)
  -- a light setup (1.3e4 evaluations): these tests check the interface and
  -- the files, not the proposal, and run under valgrind too
  local t = { particle = "electron", target = "W", T = 8000, kmin = 80,
              seed = 42, events = 600,
              setup = { iterations = 2, points = 2000, cellpoints = 8 } }
  for k, v in pairs(extra or {}) do t[k] = v end
  return t
end

-- tables and the iterator give the same events
local a = bl.sampler(spec()):events(600)
local b, n = {}, 0
for e in bl.sampler(spec()):iter() do n = n + 1; b[n] = e end
assert(#a == 600 and n == 600, "counts " .. #a .. " " .. n)
for i = 1, 600 do
  assert(a[i].id == i - 1 and a[i].k[1] == b[i].k[1] and a[i].p[4] == b[i].p[4])
  assert(a[i].hit == "nucleus" or a[i].hit == "electron")
end
-- another seed, other events; threads change nothing
local c = bl.sampler(spec{ seed = 43 }):events(10)
assert(c[1].k[1] ~= a[1].k[1])
local d = bl.sampler(spec{ threads = 2 }):events(600)
for i = 1, 600 do assert(d[i].k[2] == a[i].k[2]) end

-- refusals
local function refuses(s, text)
  local ok, msg = pcall(bl.sampler, s)
  assert(not ok and msg:find(text, 1, true), tostring(msg))
end
refuses({ particle = "electron", target = "W", T = 10, kmin = 1, events = 5 },
        "field 'seed'")
refuses({ particle = "electron", target = "W", T = 10, kmin = 1, seed = 1 },
        "field 'events'")
refuses(spec{ kmin = 0 }, "kmin")
refuses(spec{ mode = "lazy" }, "field 'mode' must be 'unweighted' or 'weighted'")
refuses(spec{ coulomb = true }, "field 'coulomb'")
refuses(spec{ shard = { 3, 2 } }, "field 'shard'")
local s = bl.sampler(spec())
s:close()
assert(not pcall(s.events, s, 1))

-- the approximations are in the warnings: the static field always, the
-- missing Coulomb correction where the options ask for it (8 GeV on W)
local function has(list, text)
  for _, w in ipairs(list) do if w:find(text, 1, true) then return true end end
  return false
end
local wi = bl.sampler(spec()):info().warnings
assert(has(wi, "static field") and has(wi, "no Coulomb correction"))
wi = bl.sampler(spec{ coulomb = false }):info().warnings
assert(has(wi, "static field") and not has(wi, "no Coulomb correction"))
-- coulomb_factor: the correction as a factor of k, sigma lower by ~7 %
local cf = bl.sampler(spec{ coulomb_factor = true })
assert(cf:info().coulomb_factor == true)
assert(has(cf:info().warnings, "is a factor of k on the nuclear part"))
local ref = bl.cross_section{ particle = "electron", target = "W", T = 8000,
                              kmin = 80 }
assert(math.abs(cf:info().sigma / ref.sigma - 1) < 5 * cf:info().err / ref.sigma,
       cf:info().sigma .. " " .. ref.sigma)
refuses(spec{ coulomb_factor = true, coulomb = false }, "'coulomb' is false")
refuses(spec{ coulomb_factor = 1 }, "field 'coulomb_factor' must be true or false")
-- setup settings: lighter setups take fewer evaluations; bad ones refused
local light = bl.sampler(spec{ setup = { iterations = 2, points = 1000,
  cells = { 4, 4, 4, 2 }, cellpoints = 8, safety = 1.5 } }):info()
-- two channels for W: the nucleus and the atomic electrons' exact part
assert(light.setup_evaluations == 2 * (2 * 1000 + 128 * 8),
       light.setup_evaluations)
refuses(spec{ setup = { cells = { 1, 2 } } }, "field 'setup.cells' must be 4 integers")
refuses(spec{ setup = { pts = 1 } }, "unknown setup 'pts'")
refuses(spec{ setup = { safety = 0.5 } }, "setup.safety")
refuses(spec{ setup = 3 }, "field 'setup' must be a table")

-- info and stats
local info = bl.sampler(spec()):info()
assert(info.sigma > 0 and info.err > 0 and info.err < 0.01 * info.sigma)
assert(info.efficiency > 0.1 and info.efficiency <= 1)
assert(info.elements[1].symbol == "W" and info.elements[1].A == 184)

-- LHE structure
local function read_lhe(path)
  local f = assert(io.open(path))
  local text = f:read("*a")
  f:close()
  assert(text:find('^<LesHouchesEvents version="3.0">\n'), "LHE opening tag")
  assert(text:find("\n</LesHouchesEvents>\n$"), "LHE closing tag")
  local init = text:match("<init>\n(.-)\n</init>")
  assert(init, "no <init>")
  local l1, l2 = init:match("^([^\n]+)\n([^\n]+)$")
  local f1, f2 = {}, {}
  for x in l1:gmatch("%S+") do f1[#f1 + 1] = tonumber(x) end
  for x in l2:gmatch("%S+") do f2[#f2 + 1] = tonumber(x) end
  assert(#f1 == 10 and #f2 == 4, "init lines")
  assert(f1[1] == 11 and f1[9] == 3 and f1[10] == 1)
  local nev = 0
  for body in text:gmatch("<event>\n(.-)\n</event>") do
    nev = nev + 1
    local lines = {}
    for l in body:gmatch("[^\n]+") do lines[#lines + 1] = l end
    local h = {}
    for x in lines[1]:gmatch("%S+") do h[#h + 1] = tonumber(x) end
    assert(#h == 6 and (h[1] == 5 or h[1] == 6), "event header")
    local sum = { 0, 0, 0, 0 }
    for i = 2, 1 + h[1] do
      local p = {}
      for x in lines[i]:gmatch("%S+") do p[#p + 1] = tonumber(x) end
      assert(#p == 13, "particle line of 13 fields")
      assert(p[2] == -1 or p[2] == 1, "status")
      if p[2] == 1 then assert(p[3] == 1 and p[4] == 2, "mothers") end
      for j = 1, 4 do sum[j] = sum[j] + (p[2] == -1 and p[6 + j] or -p[6 + j]) end
    end
    for j = 1, 4 do assert(math.abs(sum[j]) < 1e-8 * 8, "balance " .. sum[j]) end
  end
  return nev, f2
end

-- HepMC3 structure
local function read_hepmc3(path)
  local nev, np, cur, want = 0, 0, nil, 5
  local f = assert(io.open(path))
  local first = f:read("*l")
  assert(first:find("^HepMC::Version 3"), "version line")
  assert(f:read("*l") == "HepMC::Asciiv3-START_EVENT_LISTING")
  local last
  for l in f:lines() do
    last = l
    local tag = l:sub(1, 2)
    if tag == "E " then
      if cur then assert(cur == want, "particles " .. cur) end
      nev, cur = nev + 1, 0
      local id, nv, npart = l:match("^E (%d+) (%d+) (%d+)$")
      assert(id and nv == "1" and (npart == "5" or npart == "6"), l)
      want = tonumber(npart)
    elseif tag == "P " then
      cur = cur + 1
      local f_ = {}
      for x in l:gmatch("%S+") do f_[#f_ + 1] = x end
      assert(#f_ == 10, "P fields")
      local st = tonumber(f_[10])
      assert((cur <= 2 and st == 4) or (cur > 2 and st == 1), "status")
    elseif tag == "A " then
      if l:find("GenCrossSection", 1, true) then
        local xs, xe = l:match("GenCrossSection (%S+) (%S+)")
        assert(tonumber(xs) > 0 and tonumber(xe) > 0)
      end
    else
      assert(tag == "U " or tag == "W " or tag == "V " or tag == "T " or
             l == "HepMC::Asciiv3-END_EVENT_LISTING", "line " .. l)
    end
  end
  f:close()
  assert(last == "HepMC::Asciiv3-END_EVENT_LISTING")
  return nev
end

local r = events.write{ sampler = bl.sampler(spec()), output = tmp .. ".lhe",
                        format = "lhe", chunk = 100 }
assert(r.events == 600)
local nev, xs = read_lhe(tmp .. ".lhe")
assert(nev == 600, nev)
assert(math.abs(xs[1] - info.sigma * 1e9) < 1e-6 * xs[1])
assert(io.open(tmp .. ".lhe.part") == nil, "part file left")
assert(read_hepmc3(events.write{ sampler = bl.sampler(spec()),
  output = tmp .. ".hepmc", format = "hepmc3" }.path) == 600)
events.write{ sampler = bl.sampler(spec()), output = tmp .. ".csv", format = "csv" }

-- shards: written apart, merged, equal the whole run
local files = {}
for i = 1, 3 do
  local w = events.write{ sampler = bl.sampler(spec{ shard = { i, 3 } }),
                          output = tmp .. ".hepmc", format = "hepmc3" }
  files[i] = w.path
  assert(w.path:find("shard-" .. i .. "-of-3", 1, true))
end
assert(events.merge{ output = tmp .. ".merged.hepmc", inputs = files,
                     format = "hepmc3" } == 600)
local function evlines(path)
  local t, f = {}, assert(io.open(path))
  for l in f:lines() do if l:sub(1, 2) == "P " then t[#t + 1] = l end end
  f:close()
  return t
end
local whole, merged = evlines(tmp .. ".hepmc"), evlines(tmp .. ".merged.hepmc")
-- five particle lines an event, six where an atomic electron recoils
assert(#whole >= 3000 and #whole <= 3600 and #merged == #whole)
for i = 1, #whole do assert(whole[i] == merged[i], "event line " .. i) end

-- a failing run: no OUTPUT, the .part keeps whole events only
local bad = bl.sampler(spec())
local calls = 0
local real = getmetatable(bad).__index.events
local proxy = setmetatable({}, { __index = function(_, k)
  if k == "events" then
    return function(_, m)
      calls = calls + 1
      if calls == 3 then error("stopped") end
      return real(bad, m)
    end
  end
  local v = bad[k]
  return type(v) == "function" and function(_, ...) return v(bad, ...) end or v
end })
local ok = pcall(events.write, { sampler = proxy, output = tmp .. ".x.lhe",
                                 format = "lhe", chunk = 100 })
assert(not ok and io.open(tmp .. ".x.lhe") == nil)
local f = assert(io.open(tmp .. ".x.lhe.part"))
local text = f:read("*a")
f:close()
local nb = 0
for _ in text:gmatch("<event>\n") do nb = nb + 1 end
local ne = 0
for _ in text:gmatch("</event>\n") do ne = ne + 1 end
assert(nb == 200 and ne == 200, nb .. " " .. ne)

-- merge refuses a gap (a shard missing) and a file of another run
local ok2, msg2 = pcall(events.merge, { output = tmp .. ".bad.hepmc",
  inputs = { files[1], files[3] }, format = "hepmc3" })
assert(not ok2 and msg2:find("lost or doubled", 1, true), tostring(msg2))
assert(io.open(tmp .. ".bad.hepmc") == nil and io.open(tmp .. ".bad.hepmc.part") == nil)
local other = events.write{ sampler = bl.sampler(spec{ seed = 9, shard = { 2, 3 } }),
                            output = tmp .. ".o.hepmc", format = "hepmc3" }
ok2, msg2 = pcall(events.merge, { output = tmp .. ".bad.hepmc",
  inputs = { files[1], other.path }, format = "hepmc3" })
assert(not ok2 and msg2:find("not a shard of the same run", 1, true), tostring(msg2))
os.remove(other.path)

-- the runner (build/brakelight): -j 2 writes shard files in its workers and
-- its final pass merges them; the file equals the one of a single process.
-- Only in the runner (its session module is loaded): in a stock host the
-- same runner would be started and tested again.
if package.loaded["brakelight.session"] == nil then
  for _, x in ipairs{ ".lhe", ".hepmc", ".csv", ".merged.hepmc", ".x.lhe.part" } do
    os.remove(tmp .. x)
  end
  for _, x in ipairs(files) do os.remove(x) end
  print("test_sampler: ok (the runner's part runs in the runner only)")
  os.exit(0)
end
local runner = (os.getenv("BL_BUILD_DIR") or (root .. "build")) .. "/brakelight"
local script = tmp .. ".run.lua"
local sf = assert(io.open(script, "w"))
sf:write(string.format([[
package.path = %q .. "lua/?.lua;" .. package.path
local bl = require "brakelight"
local events = require "brakelight.events"
local s = bl.sampler{ particle = "muon", target = "water", T = 5000, kmin = 50,
                      seed = 3, events = 1500 }
events.write{ sampler = s, output = arg[1], format = "lhe" }
]], root))
sf:close()
local function sh(cmd) return os.execute(cmd .. " >/dev/null 2>&1") end
sh(string.format("%q -q -j 2 %q %q", runner, script, tmp .. ".j.lhe"))
sh(string.format("%q -q %q %q", runner, script, tmp .. ".one.lhe"))
local function lhe_events(path)
  local h = io.open(path)
  assert(h, "no file " .. path)
  local t = h:read("*a")
  h:close()
  return t:match("</init>\n(.*)\n</event>\n")
end
local je, oe = lhe_events(tmp .. ".j.lhe"), lhe_events(tmp .. ".one.lhe")
assert(je and je == oe, "-j 2 differs from one process")
for i = 1, 2 do
  assert(io.open(tmp .. ".j.shard-" .. i .. "-of-2.lhe") == nil, "shard file left")
end
-- a Slurm array task (task 2 with the shard count given, as the runner
-- requires: BRAKELIGHT_SHARDS=2) writes the same shard file as --shard 2/2
sh(string.format("SLURM_ARRAY_TASK_ID=2 BRAKELIGHT_SHARDS=2 "
  .. "%q -q %q %q", runner, script, tmp .. ".s.lhe"))
sh(string.format("%q -q --shard 2/2 %q %q", runner, script, tmp .. ".g.lhe"))
local se = lhe_events(tmp .. ".s.shard-2-of-2.lhe")
assert(se and se == lhe_events(tmp .. ".g.shard-2-of-2.lhe"), "Slurm task")
assert(oe:find(se, 1, true), "shard 2 is not part of the whole run")
os.remove(tmp .. ".s.shard-2-of-2.lhe")
os.remove(tmp .. ".g.shard-2-of-2.lhe")
for _, x in ipairs{ ".j.lhe", ".one.lhe" } do os.remove(tmp .. x) end

-- SIGINT to the runner in the middle of a long write (1e6 events, ~20 s):
-- it stops with an error, no OUTPUT, and OUTPUT.part ends on a whole event.
-- The signal is sent once the .part holds a whole event (polled every
-- 0.1 s, at most 120 s): a fixed delay failed on a loaded machine under
-- AddressSanitizer, before the runner had written anything
sf = assert(io.open(script, "w"))
sf:write(string.format([[
package.path = %q .. "lua/?.lua;" .. package.path
local bl = require "brakelight"
local events = require "brakelight.events"
local s = bl.sampler{ particle = "electron", target = "W", T = 10, kmin = 0.1,
                      seed = 3, events = 1000000 }
events.write{ sampler = s, output = arg[1], format = "lhe", chunk = 1000 }
]], root))
sf:close()
local sig = os.execute(string.format("%q -q %q %q >/dev/null 2>&1 & p=$!; "
  .. "i=0; until grep -q '</event>' %q 2>/dev/null || [ $i -ge 1200 ]; do "
  .. "sleep 0.1; i=$((i + 1)); done; "
  .. "kill -INT $p; wait $p; test $? -ne 0", runner, script,
  tmp .. ".sig.lhe", tmp .. ".sig.lhe.part"))
assert(sig == true or sig == 0, "the interrupted run did not fail")
assert(io.open(tmp .. ".sig.lhe") == nil, "an interrupted run left OUTPUT")
local ph = assert(io.open(tmp .. ".sig.lhe.part"))
local ptext = ph:read("*a")
ph:close()
local n1, n2 = 0, 0
for _ in ptext:gmatch("<event>\n") do n1 = n1 + 1 end
for _ in ptext:gmatch("</event>\n") do n2 = n2 + 1 end
assert(n1 > 0 and n1 == n2 and n1 % 1000 == 0, n1 .. " " .. n2)
assert(ptext:sub(-9) == "</event>\n", "the .part does not end on an event")
os.remove(tmp .. ".sig.lhe.part")
os.remove(script)

for _, x in ipairs{ ".lhe", ".hepmc", ".csv", ".merged.hepmc", ".x.lhe.part" } do
  os.remove(tmp .. x)
end
for _, x in ipairs(files) do os.remove(x) end
-- events on atomic electrons carry the struck electron's recoil: q is its
-- momentum and E0 + m_e = k_E + p_E + E_e (internal consistency)
do
  local s = bl.sampler(spec{ particle = "muon", target = "water", T = 1e4,
                             kmin = 10, events = 3000 })
  local me, nrec = bl.particle("electron").mass, 0
  for _, e in ipairs(s:events(3000)) do
    assert(type(e.recoil) == "boolean")
    if e.recoil then
      nrec = nrec + 1
      assert(e.hit == "electron")
      local q = e.q
      local ee = math.sqrt(q[1] ^ 2 + q[2] ^ 2 + q[3] ^ 2 + me * me)
      local e0 = 1e4 + bl.particle("muon").mass
      assert(math.abs(e0 + me - e.k[1] - e.p[1] - ee) < 1e-9 * e0,
             "energy with recoil")
    else
      assert(e.hit == "nucleus")
    end
  end
  assert(nrec > 0, "no event with recoil")
  local found
  for _, w in ipairs(s:info().warnings) do
    if w:find("recoil = true", 1, true) then found = true end
  end
  assert(found, "recoil note")
end

print("test_sampler: ok")
