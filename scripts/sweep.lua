-- sweep.lua -- numerical health of dsdk over the whole parameter space
--
--   build/brakelight scripts/sweep.lua [options]
--     --points N      points in the whole sweep (default 100000)
--     --seed S        integer seed (default 6)
--     --part I/N      evaluate only points I, I+N, I+2N, ... (default 1/1)
--     --out FILE      worst cases (default build/sweep/worst.txt)
--     --merge F...    combine the --out files of the parts into --out
--
-- Point i of the sweep draws, from its own generator seeded with (S, i) so
-- that it is the same whatever --part says: spin 0 or 1/2, charge +-1, mass
-- log-uniform in [m_e, 1 TeV], Z uniform in 1..100, T log-uniform in
-- [1 keV, 1 PeV], y = k/T log-uniform in [1e-6, 1/2] or 1 - y so (each half
-- of the points), every screening model and every method with equal
-- chance, the electrons/nucleus/coulomb/elwert switches at random, and
-- rtol 1e-3 or 1e-4.  Checks per point:
--   no Lua error; value and error finite; value >= 0 and error >= 0;
--   error <= rtol * value, unless a warning says that the tolerance was
--   not reached or that the value was clamped to 0.
-- The worst points (largest error / (rtol * value), slowest, and every
-- failure) go to the --out file as tab-separated lines that can be pasted
-- into a dsdk call; the exit status is 1 if any point failed a check.

local bl = require "brakelight"

local ME = 0.51099895000           -- electron mass, MeV (CODATA 2018)
local NWORST = 40                  -- lines per list in the output

local function usage (msg)
  io.stderr:write("sweep.lua: ", msg, "\n")
  os.exit(2)
end

-- options
local opt = {points = 100000, seed = 6, part = 1, parts = 1,
             out = "build/sweep/worst.txt", merge = nil}
do
  local i = 1
  while i <= #arg do
    local a, v = arg[i], arg[i + 1]
    if a == "--points" then opt.points = math.tointeger(tonumber(v))
    elseif a == "--seed" then opt.seed = math.tointeger(tonumber(v))
    elseif a == "--out" then opt.out = v
    elseif a == "--part" then
      local p, n = (v or ""):match("^(%d+)/(%d+)$")
      opt.part, opt.parts = tonumber(p), tonumber(n)
      if not p or opt.part < 1 or opt.part > opt.parts then
        usage("--part wants I/N with 1 <= I <= N, got " .. tostring(v))
      end
    elseif a == "--merge" then
      opt.merge = {}
      for j = i + 1, #arg do opt.merge[#opt.merge + 1] = arg[j] end
      break
    else usage("unknown option " .. tostring(a)) end
    if v == nil then usage(a .. " needs a value") end
    i = i + 2
  end
  if not opt.points or opt.points < 1 then usage("--points wants an integer >= 1") end
  if not opt.seed then usage("--seed wants an integer") end
end

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
local switches = {true, false, "auto"}

local function loguniform (a, b)
  return math.exp(math.log(a) + math.random() * (math.log(b) - math.log(a)))
end

local function choice (t) return t[math.random(#t)] end

-- The options of point i (a pure function of seed and i).
local function drawpoint (i)
  math.randomseed(opt.seed, i)
  local p = {
    particle = {mass = loguniform(ME, 1e6), charge = choice{-1, 1},
                spin = choice{0, 0.5}, name = "sweep"},
    target = math.random(1, 100),
    T = loguniform(1e-3, 1e9),
    screening = choice(models),
    electrons = choice{true, false},
    nucleus = choice{"uniform", "point"},
    coulomb = choice(switches),
    elwert = choice(switches),
    rtol = choice{1e-3, 1e-4},
  }
  local y = loguniform(1e-6, 0.5)
  if math.random() < 0.5 then y = 1 - y end
  p.y = y
  p.k = y * p.T
  if bl.methods then
    p.method = choice(methods)
    if p.method == "complete" and p.screening == "none" then
      -- refused by design (no complete-screening limit without screening;
      -- tests/lua/test_integrated.lua checks the message): screen it
      p.screening = choice{"exponential", "thomas-fermi", "hartree-fock"}
    end
  end
  return p
end

-- Text of one point, one line: the option values in a fixed order.
local FIELDS = {"T", "k", "y", "target", "screening", "method", "electrons",
                "nucleus", "coulomb", "elwert", "rtol"}
local function describe (p)
  local t = {string.format("mass=%.17g", p.particle.mass),
             string.format("charge=%g", p.particle.charge),
             string.format("spin=%g", p.particle.spin)}
  for _, f in ipairs(FIELDS) do
    local v = p[f]
    if v ~= nil then
      t[#t + 1] = f .. "=" .. (type(v) == "number" and string.format("%.17g", v)
                               or tostring(v))
    end
  end
  return table.concat(t, " ")
end

local clock = os.clock
local session = package.loaded["brakelight.session"]
if session and session.clock then clock = session.clock end

-- Evaluate one point; returns a record {i, score, seconds, verdict, text}.
local function evaluate (i)
  local p = drawpoint(i)
  local args = {}
  for k, v in pairs(p) do if k ~= "y" then args[k] = v end end
  local t0 = clock()
  local ok, val, err, warnings = pcall(bl.dsdk, args)
  local dt = clock() - t0
  local rec = {i = i, seconds = dt, score = 0, text = describe(p)}
  if not ok then
    rec.verdict = "ERROR " .. tostring(val):gsub("[\t\n]", " ")
    return rec
  end
  local tolwarn, clamped = false, false
  for _, w in ipairs(warnings) do
    if w:find("tolerance not reached", 1, true) then tolwarn = true end
    if w:find("result set to 0", 1, true) then clamped = true end
  end
  rec.val, rec.err = val, err
  if val ~= val or err ~= err or math.abs(val) == math.huge
     or math.abs(err) == math.huge then
    rec.verdict = "NONFINITE"
  elseif val < 0 or err < 0 then
    rec.verdict = "NEGATIVE"
  else
    -- a value clamped to 0 has no relative error: rank it last
    rec.score = clamped and 0 or val > 0 and err / (p.rtol * val)
                or (err > 0 and math.huge or 0)
    if rec.score > 1 and not tolwarn and not clamped then
      rec.verdict = "UNFLAGGED"   -- error above rtol without a warning
    else
      rec.verdict = tolwarn and "ok(tolerance warning)"
                    or clamped and "ok(clamped)" or "ok"
    end
  end
  return rec
end

local function isfailure (rec) return rec.verdict:sub(1, 2) ~= "ok" end

local function line (rec)
  return string.format("%d\t%s\t%.3g\t%.3g\t%s\t%s\t%s", rec.i, rec.verdict,
                       rec.score, rec.seconds, tostring(rec.val),
                       tostring(rec.err), rec.text)
end

local HEADER = "# point\tverdict\terr/(rtol*val)\tseconds\tdsdk\terr\toptions"

-- Keep the n largest by key in list (insertion, n small).
local function keep (list, rec, key, n)
  if #list == n and list[n][key] >= rec[key] then return end
  if #list == n then list[n] = nil end
  local j = #list + 1
  while j > 1 and list[j - 1][key] < rec[key] do
    list[j] = list[j - 1]; j = j - 1
  end
  list[j] = rec
end

local function ensuredir (path)
  local dir = path:match("^(.*)/[^/]*$")
  if dir then os.execute("mkdir -p '" .. dir:gsub("'", "'\\''") .. "'") end
end

local function write (summary, failures, byscore, bytime)
  ensuredir(opt.out)
  local f = assert(io.open(opt.out .. ".tmp", "w"))
  f:write("# brakelight sweep: ", summary, "\n", HEADER, "\n")
  f:write("## failures (", #failures, ")\n")
  for _, r in ipairs(failures) do f:write(line(r), "\n") end
  f:write("## largest err/(rtol*val)\n")
  for _, r in ipairs(byscore) do f:write(line(r), "\n") end
  f:write("## slowest\n")
  for _, r in ipairs(bytime) do f:write(line(r), "\n") end
  f:close()
  assert(os.rename(opt.out .. ".tmp", opt.out))
end

-- a number as line() wrote it (%.3g writes inf)
local function num (s)
  return tonumber(s) or (s:find("inf", 1, true) and math.huge) or 0
end

-- read a part file back (for --merge)
local function readpart (name, failures, byscore, bytime, totals)
  local f = assert(io.open(name))
  local section
  for l in f:lines() do
    local n, bad, s = l:match("^# brakelight sweep: (%d+) points, (%d+) failed, ([%d.]+) s")
    if n then
      totals.n, totals.bad = totals.n + tonumber(n), totals.bad + tonumber(bad)
      totals.secs = totals.secs + tonumber(s)
    elseif l:match("^## ") then section = l
    elseif not l:match("^#") then
      local i, verdict, score, secs, val, err, text =
        l:match("^(%d+)\t([^\t]*)\t([^\t]*)\t([^\t]*)\t([^\t]*)\t([^\t]*)\t(.*)$")
      local rec = {i = tonumber(i), verdict = verdict, score = num(score),
                   seconds = num(secs), val = val, err = err, text = text}
      if section:find("failures") then failures[#failures + 1] = rec
      elseif section:find("largest") then keep(byscore, rec, "score", NWORST)
      else keep(bytime, rec, "seconds", NWORST) end
    end
  end
  f:close()
end

if opt.merge then
  local failures, byscore, bytime = {}, {}, {}
  local totals = {n = 0, bad = 0, secs = 0}
  for _, name in ipairs(opt.merge) do
    readpart(name, failures, byscore, bytime, totals)
  end
  local summary = string.format("%d points, %d failed, %.1f s (seed %d)",
                                totals.n, totals.bad, totals.secs, opt.seed)
  write(summary, failures, byscore, bytime)
  print("sweep: " .. summary .. "; worst cases in " .. opt.out)
  os.exit(totals.bad == 0 and 0 or 1)
end

local failures, byscore, bytime = {}, {}, {}
local n, bad, start = 0, 0, clock()
local counts = {}
for i = opt.part, opt.points, opt.parts do
  local rec = evaluate(i)
  n = n + 1
  local v = rec.verdict:match("^%S+")
  counts[v] = (counts[v] or 0) + 1
  if isfailure(rec) then
    bad = bad + 1
    if #failures < 1000 then failures[#failures + 1] = rec end
  end
  keep(byscore, rec, "score", NWORST)
  keep(bytime, rec, "seconds", NWORST)
end
local elapsed = clock() - start
local summary = string.format("%d points, %d failed, %.1f s (seed %d, part %d/%d)",
                              n, bad, elapsed, opt.seed, opt.part, opt.parts)
write(summary, failures, byscore, bytime)
local parts = {}
for k, c in pairs(counts) do parts[#parts + 1] = k .. " " .. c end
table.sort(parts)
print("sweep: " .. summary .. "; " .. table.concat(parts, ", "))
print("sweep: worst cases in " .. opt.out)
os.exit(bad == 0 and 0 or 1)
