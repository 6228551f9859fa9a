-- compare-points.lua -- a fixed set of random calls of the module, recorded
-- exactly, to check that a restructuring leaves every result unchanged
--
--   build/brakelight scripts/compare-points.lua [options]
--     --points N      number of points (default 600)
--     --seed S        integer seed (default 1)
--     --out FILE      write the record to FILE (default: standard output)
--     --point I       evaluate point I only and print its line
--     --diff A B      compare two records; print the first differing points
--                     field by field and exit 1 if they differ
--     --label NAME    what B is called in the --diff verdict (default B)
--     --slowest K     list the K slowest points on standard error (timing
--                     never enters the record)
--
-- Point i (1..N) draws its call from its own generator, a splitmix64 stream
-- seeded with (S, i) and written here in Lua integers, so the points do not
-- depend on N, on the order of evaluation or on Lua's math.random.  A point
-- is one call of dsdk, spectrum, angular (a few theta at one k; rarely the
-- kmin/kmax window form), differential, cross_section, energy_loss,
-- photon_yield, material or radiation_length, with a particle (presets,
-- a spin-0 particle object, a plain table), a target (Z, symbol, name,
-- formula, mixture, standard composition, table with a density), T over
-- ten decades and the options drawn at random (screening models and
-- methods from the registry, nucleus, electrons, coulomb, elwert, rtol,
-- suppression, threads), plus a few deliberately bad calls.  Invalid
-- combinations are an outcome like any other: the error message is
-- recorded instead of the values.
--
-- Record format, one line per point, tab-separated (line 0: the registry):
--   I <TAB> call <TAB> key=value <TAB> key=value ...
-- "call" is the call in Lua syntax (paste it to redo the point); the
-- key=value fields are everything the call returned, flattened with dotted
-- keys in sorted order ("1" is the first returned value, "4.settings.T"
-- the settings table of dsdk's info): every number in %.17g (".0" marks a
-- float with an integral value, as Lua prints it), strings with control
-- characters and backslashes escaped, warnings and settings included.  A
-- failed call gives the one field error=<message>.  No timings, no
-- addresses: two runs of the same build give identical files.

local bl = require "brakelight"

local function usage (msg)
  io.stderr:write("compare-points.lua: ", msg, "\n")
  os.exit(2)
end

local opt = {points = 600, seed = 1, out = nil, point = nil, diff = nil,
             label = "B", slowest = 0}
do
  local i = 1
  while i <= #arg do
    local a, v = arg[i], arg[i + 1]
    if v == nil then usage(a .. " needs a value") end
    if a == "--points" then opt.points = math.tointeger(tonumber(v))
    elseif a == "--seed" then opt.seed = math.tointeger(tonumber(v))
    elseif a == "--out" then opt.out = v
    elseif a == "--point" then opt.point = math.tointeger(tonumber(v))
    elseif a == "--label" then opt.label = v
    elseif a == "--slowest" then opt.slowest = math.tointeger(tonumber(v)) or 0
    elseif a == "--diff" then
      if arg[i + 2] == nil then usage("--diff needs two files") end
      opt.diff = {v, arg[i + 2]}
      i = i + 1
    else usage("unknown option " .. tostring(a)) end
    i = i + 2
  end
  if not opt.points or opt.points < 1 then usage("--points wants an integer >= 1") end
  if not opt.seed then usage("--seed wants an integer") end
  if opt.point ~= nil and opt.point < 0 then usage("--point wants an integer >= 0") end
end


-- ---- generator: splitmix64 (Steele, Lea & Flood 2014) in Lua integers,
-- which wrap around modulo 2^64 in Lua 5.4 ----------------------------------

local GOLDEN = 0x9e3779b97f4a7c15

local function mix64 (z)
  z = (z ~ (z >> 30)) * 0xbf58476d1ce4e5b9
  z = (z ~ (z >> 27)) * 0x94d049bb133111eb
  return z ~ (z >> 31)
end

-- A generator for point i: uniform() in [0, 1) with 53 random bits.
local function generator (seed, i)
  local state = mix64(mix64(seed * GOLDEN + 1) + i * GOLDEN)
  local g = {}
  function g.uniform ()
    state = state + GOLDEN
    return (mix64(state) >> 11) * 0x1p-53
  end
  function g.int (a, b) return a + math.floor(g.uniform() * (b - a + 1)) end
  function g.choice (t) return t[g.int(1, #t)] end
  function g.chance (p) return g.uniform() < p end
  function g.loguniform (a, b)
    return math.exp(math.log(a) + g.uniform() * (math.log(b) - math.log(a)))
  end
  -- a table entry chosen by weight: list of {weight, value}
  function g.weighted (t)
    local total = 0
    for _, e in ipairs(t) do total = total + e[1] end
    local x = g.uniform() * total
    for _, e in ipairs(t) do
      x = x - e[1]
      if x < 0 then return e[2] end
    end
    return t[#t][2]
  end
  return g
end


-- ---- exact text of values -------------------------------------------------

local function fmtnum (x)
  if math.type(x) == "integer" then return string.format("%d", x) end
  local s = string.format("%.17g", x)
  if not s:find("[%.eEna]") then s = s .. ".0" end   -- 2.0, not 2; nan, inf
  return s
end

local function escape (s)
  return (s:gsub("[%c\\]", function (c)
    return string.format("\\%03d", c:byte())
  end))
end

-- Keys of a table in a fixed order: numbers ascending, then strings.
local function sortedkeys (t)
  local keys = {}
  for k in pairs(t) do keys[#keys + 1] = k end
  table.sort(keys, function (a, b)
    local ta, tb = type(a), type(b)
    if ta ~= tb then return ta < tb end
    if ta == "number" or ta == "string" then return a < b end
    return tostring(a) < tostring(b)
  end)
  return keys
end

-- Fields of the module's objects (userdata): their documented fields.
local OBJFIELDS = {
  ["brakelight.Particle"] = {"name", "mass", "charge", "spin", "composite"},
  ["brakelight.Material"] = {"name", "density", "molar_mass", "components",
                             "per_gram", "radiation_length",
                             "radiation_length_cm"},
}

local function objkind (u)
  return (tostring(u):match("^(brakelight%.%a+):"))
end

-- Flatten value v under key prefix into out (list of "key=value").
local function flatten (v, prefix, out)
  local tv = type(v)
  if tv == "table" then
    local keys = sortedkeys(v)
    if #keys == 0 then out[#out + 1] = prefix .. "={}" end
    for _, k in ipairs(keys) do
      local sk = type(k) == "number" and fmtnum(k) or escape(tostring(k))
      flatten(v[k], prefix == "" and sk or prefix .. "." .. sk, out)
    end
  elseif tv == "userdata" then
    local kind = objkind(v)
    out[#out + 1] = prefix .. "=" .. escape(kind and tostring(v) or "userdata")
    for _, f in ipairs(kind and OBJFIELDS[kind] or {}) do
      local ok, fv = pcall(function () return v[f] end)
      if ok then flatten(fv, prefix .. "." .. f, out)
      else out[#out + 1] = prefix .. "." .. f .. "=error: " .. escape(tostring(fv)) end
    end
  elseif tv == "number" then
    out[#out + 1] = prefix .. "=" .. fmtnum(v)
  elseif tv == "string" then
    out[#out + 1] = prefix .. "=" .. escape(v)
  else   -- boolean, nil
    out[#out + 1] = prefix .. "=" .. tostring(v)
  end
end

-- Lua constructor text of a call argument (specs hold plain data only; a
-- table with field __particle stands for bl.particle{...}).
local function luatext (v)
  local tv = type(v)
  if tv == "number" then
    if v ~= v or v == math.huge or v == -math.huge then
      return v ~= v and "0/0" or (v > 0 and "1/0" or "-1/0")
    end
    return fmtnum(v)
  elseif tv == "string" then
    return (string.format("%q", v):gsub("\\\n", "\\n"))
  elseif tv ~= "table" then
    return tostring(v)
  end
  local parts, n = {}, #v
  for j = 1, n do parts[#parts + 1] = luatext(v[j]) end
  for _, k in ipairs(sortedkeys(v)) do
    if not (math.type(k) == "integer" and k >= 1 and k <= n)
       and k ~= "__particle" then
      local key = type(k) == "string" and k:match("^[%a_][%w_]*$") and k
                  or "[" .. luatext(k) .. "]"
      parts[#parts + 1] = key .. "=" .. luatext(v[k])
    end
  end
  local s = "{" .. table.concat(parts, ",") .. "}"
  return v.__particle and "bl.particle" .. s or s
end

-- Text of the call f(spec).
local function calltext (f, spec)
  local a = luatext(spec)
  return type(spec) == "table" and f .. a or f .. "(" .. a .. ")"
end

-- The arguments of a spec: particle specs become particle objects.
local function realize (v)
  if type(v) ~= "table" then return v end
  if v.__particle then
    local p = {}
    for k, x in pairs(v) do if k ~= "__particle" then p[k] = x end end
    return bl.particle(p)
  end
  local t = {}
  for k, x in pairs(v) do t[k] = realize(x) end
  return t
end


-- ---- the points -------------------------------------------------------------

local ME = 0.51099895000           -- electron mass, MeV (CODATA 2018)

local models = {}
for _, m in ipairs(bl.models()) do models[#models + 1] = m.name end
local methods = bl.methods and bl.methods() or {"born"}
-- "partial" (the exact partial waves) is left out: 0.05 s to 30 s a point
-- (T up to 3 MeV, spin-1/2 projectiles of the electron mass only), so a
-- random draw would mostly be refused and the rest would dominate the run;
-- it is checked in tests/test_methods.c (partial_method) and
-- tests/lua/test_partial.lua.  Leaving it out keeps the draws of every
-- point what they were with the five other methods.
do
  local kept = {}
  for _, m in ipairs(methods) do
    if m ~= "partial" then kept[#kept + 1] = m end
  end
  methods = kept
end

local SYMBOLS = {"H", "He", "Be", "C", "N", "O", "Al", "Si", "Fe", "Cu",
                 "Ag", "W", "Pb", "U"}
local NAMES = {"lead", "aluminium", "aluminum", "Tungsten", "caesium"}
local FORMULAS = {"H2O", "CaCO3", "SiO2", "Ca(OH)2", "CuSO4.5H2O",
                  "Fe0.5Ni0.5", "C2H4", "PbWO4", "LiF", "Bi4Ge3O12"}
local STANDARD = {"water", "air", "lead_glass", "polyethylene"}

-- Particle masses scale the energies: heavier particles go higher.
local function drawparticle (g)
  return g.weighted{
    {30, "electron"}, {10, "positron"}, {12, "muon"}, {4, "antimuon"},
    {8, "pion+"}, {6, "pion-"},
    {20, {__particle = true, mass = g.loguniform(ME, 1e4),
          charge = g.choice{1, -1, 2}, spin = 0, name = "X0"}},
    {6, {mass = g.loguniform(ME, 1e4), charge = g.choice{1, -1},
         spin = g.choice{0, 0.5}}},
  }
end

local function mass (p)
  if type(p) == "table" then return p.mass end
  return ({electron = ME, positron = ME, muon = 105.6583755,
           antimuon = 105.6583755, ["pion+"] = 139.57039,
           ["pion-"] = 139.57039})[p]
end

-- dense = true: a target that has a density (for suppression)
local function drawtarget (g, dense)
  local kind = g.weighted{
    {dense and 0 or 25, "Z"}, {25, "symbol"}, {5, "name"},
    {dense and 0 or 15, "formula"}, {10, "mixture"}, {10, "standard"},
    {10, "withdensity"},
  }
  if kind == "Z" then return g.int(1, 100)
  elseif kind == "symbol" then return g.choice(SYMBOLS)
  elseif kind == "name" then return g.choice(NAMES)
  elseif kind == "formula" then return g.choice(FORMULAS)
  elseif kind == "standard" then return g.choice(STANDARD)
  elseif kind == "withdensity" then
    return {g.choice(FORMULAS), density = g.choice{0.9, 1, 2.5, 7.1}}
  end
  local m
  if g.chance(0.5) then
    local a = g.choice{0.5, 0.7, 0.9}
    m = {{"Cu", a}, {"Zn", 1 - a}, by = "mass"}
  else
    m = {{"H2O", 0.25}, {g.choice{"SiO2", "Pb", "C"}, 0.75}, by = "atoms"}
  end
  if dense or g.chance(0.5) then m.density = g.choice{1.2, 8.4} end
  return m
end

-- The options every computation takes (spec p gets them in place).
local function common (g, p, what)
  p.particle = drawparticle(g)
  local m = mass(p.particle)
  p.T = m * g.loguniform(1e-3, 1e7)       -- kinetic energy, T/m over decades
  if g.chance(0.8) then p.screening = g.choice(models) end
  if g.chance(0.5) then p.electrons = g.choice{true, false} end
  if g.chance(0.5) then p.nucleus = g.choice{"uniform", "point"} end
  local switches = {true, false, "auto"}
  if what.angles then switches = {false, "auto"} end
  if g.chance(0.5) then p.coulomb = g.chance(0.03) and true or g.choice(switches) end
  if g.chance(0.5) then p.elwert = g.choice{true, false, "auto"} end
  if what.angles then
    if g.chance(0.4) then p.method = g.chance(0.05) and "high-energy"
                                     or g.choice{"born", "auto"} end
  elseif g.chance(0.7) then
    p.method = g.choice(methods)
  end
  if p.method == "complete" and (p.screening == "none") and g.chance(0.8) then
    -- refused by design (no complete-screening limit); keep a few
    p.screening = g.choice{"exponential", "thomas-fermi", "hartree-fock"}
  end
  if what.suppression and g.chance(0.15) then
    p.suppression = g.choice{"lpm", "lpm+dielectric", "none"}
    if p.suppression ~= "none" and g.chance(0.9) then
      p.target = drawtarget(g, true)
    end
  end
  if p.target == nil then p.target = drawtarget(g, false) end
  if what.rtol then p.rtol = g.choice(what.rtol) end
end

local function drawy (g)
  local y = g.loguniform(1e-5, 0.5)
  if g.chance(0.5) then y = 1 - y end
  return y
end

local DRAW = {}

function DRAW.dsdk (g)
  local p = {}
  common(g, p, {suppression = true, rtol = {1e-3, 1e-4, 1e-4, 1e-5, 1e-6}})
  p.k = drawy(g) * p.T
  return p
end

function DRAW.spectrum (g)
  local p = {}
  common(g, p, {suppression = true, rtol = {1e-3, 1e-3, 1e-4}})
  local n, list = g.int(1, 4), {}
  for j = 1, n do list[j] = drawy(g) end
  if g.chance(0.5) then p.y = list
  else
    for j = 1, n do list[j] = list[j] * p.T end
    p.k = list
  end
  if g.chance(0.6) then p.threads = g.choice{0, 1, 2, 3} end
  return p
end

function DRAW.angular (g)
  local p = {}
  common(g, p, {angles = true, rtol = {1e-3, 1e-3, 1e-4}})
  local E = p.T + mass(p.particle)
  local scale = mass(p.particle) / E          -- the forward peak, ~ m/E
  local n, th = g.int(1, 3), {}
  for j = 1, n do
    th[j] = g.chance(0.15) and 0 or math.min(math.pi, scale * g.loguniform(1e-2, 1e2))
  end
  p.theta = th
  if g.chance(0.15) then
    -- the window form: an integral over k per angle (expensive)
    p.theta = {th[1]}
    p.rtol = 1e-3
    local a, b = drawy(g), drawy(g)
    if a > b then a, b = b, a end
    p.kmin = a * p.T
    if g.chance(0.5) then p.kmax = b * p.T end
  else
    p.k = drawy(g) * p.T
  end
  return p
end

function DRAW.differential (g)
  local p = {}
  common(g, p, {angles = true})
  local scale = mass(p.particle) / (p.T + mass(p.particle))
  p.k = drawy(g) * p.T
  p.theta_k = g.chance(0.1) and 0 or math.min(math.pi, scale * g.loguniform(1e-2, 1e2))
  p.theta_p = g.chance(0.1) and 0 or math.min(math.pi, scale * g.loguniform(1e-2, 1e2))
  p.phi = g.chance(0.2) and g.choice{0, math.pi} or 2 * math.pi * g.uniform()
  return p
end

function DRAW.cross_section (g)
  local p = {}
  common(g, p, {suppression = true, rtol = {1e-3, 1e-3, 1e-4}})
  local a, b = drawy(g), drawy(g)
  if a > b then a, b = b, a end
  p.kmin = a * p.T
  if g.chance(0.6) then p.kmax = b * p.T end
  return p
end

function DRAW.energy_loss (g)
  local p = {}
  common(g, p, {suppression = true, rtol = {1e-3, 1e-3, 1e-4}})
  return p
end

function DRAW.photon_yield (g)
  local p = {}
  common(g, p, {suppression = true, rtol = {1e-3}})
  p.thickness = g.loguniform(1e-4, 2)
  local a, b = drawy(g), drawy(g)
  if a > b then a, b = b, a end
  p.kmin = a * p.T
  if g.chance(0.5) then p.kmax = b * p.T end
  if g.chance(0.8) then p.bins = g.int(1, 4) end
  if g.chance(0.5) then p.spacing = g.choice{"linear", "log"} end
  return p
end

function DRAW.material (g)
  return drawtarget(g, false)
end

DRAW.radiation_length = DRAW.material

-- Deliberately bad calls: a valid dsdk or spectrum with one field broken.
local BREAK = {
  function (p) p.k = p.T * 1.5 end,
  function (p) p.T = -1 end,
  function (p) p.T = 0 / 0 end,
  function (p) p.screening = "slater" end,
  function (p) p.rtol = 0 end,
  function (p) p.rtol = 2 end,
  function (p) p.target = "Xx2O" end,
  function (p) p.target = 101 end,
  function (p) p.target = {{"Cu", 0.7}, {"Zn", 0.2}, by = "mass"} end,
  function (p) p.nucleus = "gaussian" end,
  function (p) p.electrons = "yes" end,
  function (p) p.coulomb = 1 end,
  function (p) p.method = "exact" end,
  function (p) p.suppression = "lpm"; p.target = "H2O" end,
  function (p) p.particle = "tauon" end,
  function (p) p.particle = {mass = -1, charge = 1, spin = 0} end,
  function (p) p.particle = {mass = 1, charge = 1, spin = 1} end,
  function (p) p.colour = "red" end,
  function (p) p.T = mass(p.particle) * 1e16 end,
}

local FUNCS = {
  {26, "dsdk"}, {15, "spectrum"}, {10, "angular"}, {9, "differential"},
  {10, "cross_section"}, {9, "energy_loss"}, {9, "photon_yield"},
  {3, "material"}, {3, "radiation_length"}, {6, "bad"},
}

-- The call of point i: function name and argument spec.
local function drawpoint (i)
  local g = generator(opt.seed, i)
  local f = g.weighted(FUNCS)
  if f == "bad" then
    f = g.choice{"dsdk", "spectrum"}
    local p = DRAW[f](g)
    g.choice(BREAK)(p)
    return f, p
  end
  return f, DRAW[f](g)
end

-- The call text of point i (for messages).
local function evaluate_desc (i)
  local f, spec = drawpoint(i)
  return i .. " " .. calltext(f, spec)
end

-- One point's line.
local function evaluate (i)
  local f, spec = drawpoint(i)
  local res = table.pack(pcall(bl[f], realize(spec)))
  local out = {}
  if res[1] then
    local vals = {}
    for j = 2, res.n do vals[j - 1] = res[j] end
    flatten(vals, "", out)
  else
    out[1] = "error=" .. escape(tostring(res[2]))
  end
  return string.format("%d\t%s\t%s", i, calltext(f, spec), table.concat(out, "\t"))
end

-- Line 0: the registry and the module's lists.
local function registry ()
  local out = {}
  flatten({models = bl.models(), methods = methods,
           materials = bl.materials and bl.materials() or {},
           particles = select(2, pcall(bl.particle, "?"))}, "", out)
  return "0\tregistry\t" .. table.concat(out, "\t")
end


-- ---- --diff ---------------------------------------------------------------

local function readrecord (path)
  local f, msg = io.open(path, "r")
  if not f then usage("cannot read " .. msg) end
  local rec, order = {}, {}
  for line in f:lines() do
    local idx, call, rest = line:match("^(%d+)\t([^\t]*)\t?(.*)$")
    if idx then
      local fields = {}
      for kv in (rest .. "\t"):gmatch("([^\t]*)\t") do
        local k, v = kv:match("^([^=]*)=(.*)$")
        fields[#fields + 1] = {k or kv, v or ""}
      end
      rec[idx] = {call = call, line = line, fields = fields}
      order[#order + 1] = idx
    end
  end
  f:close()
  return rec, order
end

local function short (s, n)
  n = n or 200
  return #s > n and s:sub(1, n) .. "..." or s
end

local function diff (pa, pb)
  local a, oa = readrecord(pa)
  local b, ob = readrecord(pb)
  local ndiff, shown, MAXSHOW = 0, 0, 5
  local seen = {}
  local function report (idx)
    ndiff = ndiff + 1
    if shown >= MAXSHOW then return end
    shown = shown + 1
    local ra, rb = a[idx], b[idx]
    print(string.format("point %s: %s", idx, short((ra or rb).call, 400)))
    if not ra or not rb then
      print("  only in " .. (ra and pa or pb))
      return
    end
    if ra.call ~= rb.call then print("  call differs: " .. short(rb.call, 400)) end
    local fa, fb = {}, {}
    for _, kv in ipairs(ra.fields) do fa[kv[1]] = kv[2] end
    for _, kv in ipairs(rb.fields) do fb[kv[1]] = kv[2] end
    local nf = 0
    for _, kv in ipairs(ra.fields) do
      if fb[kv[1]] ~= kv[2] and nf < 12 then
        nf = nf + 1
        print(string.format("  %s: %s -> %s", kv[1], short(kv[2]),
                            fb[kv[1]] and short(fb[kv[1]]) or "(missing)"))
      end
    end
    for _, kv in ipairs(rb.fields) do
      if fa[kv[1]] == nil and nf < 12 then
        nf = nf + 1
        print(string.format("  %s: (missing) -> %s", kv[1], short(kv[2])))
      end
    end
  end
  for _, idx in ipairs(oa) do
    seen[idx] = true
    if not b[idx] or b[idx].line ~= a[idx].line then report(idx) end
  end
  for _, idx in ipairs(ob) do
    if not seen[idx] then report(idx) end
  end
  local npoints = #oa - (a["0"] and 1 or 0)
  if ndiff > 0 then
    print(string.format("compare-points: %d of %d lines differ (%s -> %s)%s",
                        ndiff, #oa, pa, pb,
                        ndiff > shown and ", first " .. shown .. " shown" or ""))
    os.exit(1)
  end
  if npoints == 0 then
    print("compare-points: no points in " .. pa)
    os.exit(1)
  end
  print(string.format("compare-points: %d points identical to %s", npoints,
                      opt.label))
end


-- ---- main -----------------------------------------------------------------

if opt.diff then
  diff(opt.diff[1], opt.diff[2])
  return
end

if opt.point then
  print(opt.point == 0 and registry() or evaluate(opt.point))
  return
end

local f = io.stdout
if opt.out then f = assert(io.open(opt.out .. ".tmp", "w")) end
local session = package.loaded["brakelight.session"]
local clock = session and session.clock or os.clock
local times, t00 = {}, clock()
f:write(registry(), "\n")
for i = 1, opt.points do
  local t0 = clock()
  f:write(evaluate(i), "\n")
  times[i] = {i, clock() - t0}
end
if opt.slowest > 0 then
  table.sort(times, function (x, y) return x[2] > y[2] end)
  io.stderr:write(string.format("compare-points: %d points in %.1f s; slowest:\n",
                                opt.points, clock() - t00))
  for j = 1, math.min(opt.slowest, #times) do
    io.stderr:write(string.format("  %6.3f s  %s\n", times[j][2],
                                  short(select(1, evaluate_desc(times[j][1])), 300)))
  end
end
if opt.out then
  f:close()
  assert(os.rename(opt.out .. ".tmp", opt.out))
end
