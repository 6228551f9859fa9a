--[[
  test_scan_resume.lua -- issue 5: a run killed after some points resumes
  and completes with every point exactly once; bad axis values and
  unwritable outputs give errors naming them; existing results are never
  overwritten by a failed run; --quiet silences progress.
  Needs the runner: the scans that are stopped (exit, SIGKILL, SIGINT,
  error) and resumed run in build/brakelight (its signal handling and -q
  are tested); the checks of their files run in any Lua host.
]]

local root = (arg[0]):match("^(.-)tests[/\\]lua[/\\][^/\\]+%.lua$")
local U = dofile(root .. "tests/lua/lib/scanutil.lua")
package.path = U.root .. "lua/?.lua;" .. package.path
local scanfile = require "brakelight.scanfile"
local scan = require "brakelight.scan"

local dir = U.tmpdir()
-- a 3x3x2 scan; env STOP=N and HOW=exit|kill|int|error stop it when point
-- N is reached (before computing it; int: Ctrl-C, SIGINT to the runner);
-- every computed point is logged
local script = dir .. "/scan.lua"
U.write(script, [[
local bl = require "brakelight"
local scan = require "brakelight.scan"
local stop, how, log = tonumber(os.getenv("STOP")), os.getenv("HOW"), arg[2]
local _, info = scan.run{
  axes = { { "target", { "C", "Cu", "Pb" } }, { "T", { 10, 100, 1000 } },
           { "particle", { "electron", "muon" } } },
  fixed = { rtol = 1e-3 },
  output = arg[1],
  each = function(pt)
    if stop and pt:index() == stop then
      if how == "exit" then os.exit(3) end
      if how == "kill" then os.execute("kill -KILL $PPID") end
      if how == "int" then  -- as Ctrl-C: a signal while Lua code runs
        os.execute("(sleep 0.2; kill -INT $PPID) &")   -- system() ignores
        local t = os.time()                           -- SIGINT until then
        while os.time() - t < 10 do end
      end
      error("planned failure at point " .. pt:index())
    end
    local f = assert(io.open(log, "a"))
    f:write(pt:key(), "\n")
    f:close()
    local v, e = bl.dsdk(pt:with{ k = 0.5 * pt.T })
    return { dsdk = v, err = e }
  end,
}
print("computed " .. info.computed .. " reused " .. info.reused)
]])

local function lines(path)
  local t = {}
  for l in (U.read(path) or ""):gmatch("[^\n]+") do t[#t + 1] = l end
  return t
end

local ok, err = pcall(function()
  for _, how in ipairs({ "exit", "kill", "int", "error" }) do
    local out, log = dir .. "/r-" .. how .. ".csv", dir .. "/log-" .. how
    local args = U.q(out) .. " " .. U.q(log)
    local code, so, se = U.run("-q", script, args, "STOP=8 HOW=" .. how)
    U.check(code ~= 0, "%s: the stopped run exited with 0", how)
    if how == "error" then U.has(se, "planned failure at point 8", how) end
    if how == "int" then U.has(se, "interrupted by signal 2", how) end
    local part = assert(scanfile.read(out), how .. ": no output after the stop")
    U.check(#part.records >= 1 and #part.records <= 7,
            "%s: %d records after stopping at point 8", how, #part.records)
    if how == "error" or how == "int" then
      -- an error in a point, or Ctrl-C, saves every earlier point
      U.check(#part.records == 7, "error: %d records saved, expected 7",
              #part.records)
    end
    U.check(U.tmpfiles(dir) == "" or how == "kill",
            "%s: temporary file left behind: %s", how, U.tmpfiles(dir))
    -- resume: only the missing points are computed
    local log2 = log .. ".2"
    code, so, se = U.run("-q", script, U.q(out) .. " " .. U.q(log2))
    U.check(code == 0, "%s: resume failed: %s", how, se)
    local full = assert(scanfile.read(out))
    U.check(#full.records == 18, "%s: %d records after resume", how,
            #full.records)
    local seen = {}
    for _, r in ipairs(full.records) do
      local k = string.format("target=%s;T=%s;particle=%s", r.target, r.T,
                              r.particle)
      U.check(not seen[k], "%s: point %s twice in the output", how, k)
      seen[k] = true
    end
    U.has(so, "computed " .. (18 - #part.records) .. " reused " .. #part.records,
          how .. " resume counts")
    -- the resumed run computed exactly the points the stopped run had not
    -- saved, each once; every saved point had been computed by the first
    local saved, first, again = {}, {}, {}
    for _, r in ipairs(part.records) do
      saved[string.format("target=%s;T=%s;particle=%s", r.target, r.T,
                          r.particle)] = true
    end
    for _, k in ipairs(lines(log)) do first[k] = true end
    for _, k in ipairs(lines(log2)) do
      U.check(not again[k], "%s: point %s computed twice on resume", how, k)
      U.check(not saved[k], "%s: saved point %s computed again", how, k)
      again[k] = true
    end
    for k in pairs(seen) do
      U.check(saved[k] or again[k], "%s: point %s never computed", how, k)
    end
    for k in pairs(saved) do
      U.check(first[k], "%s: saved point %s was not computed", how, k)
    end
    -- a third run computes nothing and leaves the file as it is
    local before = U.read(out)
    code, so = U.run("-q", script, args)
    U.check(code == 0 and so:find("computed 0 reused 18", 1, true),
            "%s: third run: %s", how, so)
    U.check(U.read(out) == before, "%s: complete output rewritten", how)
  end

  -- an output from another scan is refused and left as it is
  local other = dir .. "/other.csv"
  U.write(dir .. "/other.lua", [[
local scan = require "brakelight.scan"
scan.run{ axes = { { "T", { 1, 2 } } }, fixed = { rtol = 1e-3 }, quiet = true,
          output = arg[1], each = function(pt) return { v = pt.T } end }]])
  local code, so, se = U.run("-q", dir .. "/other.lua", U.q(other))
  U.check(code == 0, "small scan failed: %s", se)
  local before = U.read(other)
  code, so, se = U.run("-q", script, U.q(other) .. " " .. U.q(dir .. "/log-x"))
  U.check(code ~= 0, "a different scan's output was accepted")
  U.has(se, "output '" .. other .. "' holds a different scan", "refusal")
  U.check(U.read(other) == before, "a failed run changed an existing output")
  -- a different fixed setting is a different scan too
  U.write(dir .. "/other2.lua", (U.read(dir .. "/other.lua"):gsub("1e%-3", "1e-2")))
  code, so, se = U.run("-q", dir .. "/other2.lua", U.q(other))
  U.check(code ~= 0, "a changed setting was accepted")
  U.has(se, "setting rtol = 0.001, here 0.01", "setting refusal")
  U.check(U.read(other) == before, "changed-setting run touched the output")
  -- a damaged output is refused, not replaced
  U.write(dir .. "/damaged.csv", "this is not a scan table\n")
  code, so, se = U.run("-q", dir .. "/other.lua", U.q(dir .. "/damaged.csv"))
  U.check(code ~= 0, "a damaged output was accepted")
  U.has(se, "cannot resume from output '" .. dir .. "/damaged.csv'", "damaged")
  U.check(U.read(dir .. "/damaged.csv") == "this is not a scan table\n",
          "damaged output replaced")

  -- an unwritable output: the error names it, before any point is computed
  local bad = dir .. "/no/such/dir/out.csv"
  code, so, se = U.run("-q", script, U.q(bad) .. " " .. U.q(dir .. "/log-u"))
  U.check(code ~= 0, "unwritable output accepted")
  U.has(se, "cannot write output '" .. bad .. "'", "unwritable")
  U.check(U.read(dir .. "/log-u") == nil, "points computed before the check")

  -- progress: lines on a non-terminal stderr, nothing with --quiet
  local p = dir .. "/p.csv"
  code, so, se = U.run("", dir .. "/other.lua", U.q(p))
  U.check(code == 0, "progress run failed")
  -- other.lua sets quiet = true itself; use a scan without it
  U.write(dir .. "/loud.lua", (U.read(dir .. "/other.lua"):gsub("quiet = true,", "")))
  code, so, se = U.run("", dir .. "/loud.lua", U.q(dir .. "/loud.csv"))
  U.check(code == 0, "loud run failed")
  U.has(se, "scan: 2/2 points (100.0 %)", "progress lines")
  os.remove(dir .. "/loud.csv")
  code, so, se = U.run("--quiet", dir .. "/loud.lua", U.q(dir .. "/loud.csv"))
  U.check(code == 0 and se == "", "--quiet still wrote: %q", se)
end)

-- bad axis values: errors naming the axis and the value (in this process)
local function expect(spec, want)
  spec.each = spec.each or function() return 1 end
  spec.quiet = true
  local ok2, msg = pcall(scan.run, spec)
  U.check(not ok2, "accepted: %s", want)
  U.has(msg, want, "axis error")
  U.has(msg, "bad argument #1 to 'scan.run'", "axis error prefix")
end
local ok3, err3 = pcall(function()
  expect({ axes = { { "T", { 1, 0 / 0 } } } }, "axis 'T': value #2 (nan) is not allowed: NaN")
  expect({ axes = { { "T", { 1, math.huge } } } }, "axis 'T': value #2 (inf) is not allowed: infinite")
  expect({ axes = { { "T", {} } } }, "axis 'T' has no values")
  expect({ axes = { { "target", { "Pb", "C", "Pb" } } } },
         "axis 'target': values #1 and #3 have the same label 'Pb'")
  expect({ axes = { { "k", { 1, print } } } }, "axis 'k': value #2")
  expect({ axes = { { "k", { 1, nil, 3, n = 3 } } } }, "axis 'k': value #2 is nil")
  expect({ axes = { { "k", { 1, "" } } } }, "axis 'k': value #2 (\"\") is not allowed: an empty string")
  expect({ axes = { { "2k", { 1 } } } }, "axis #1 name must be a word")
  expect({ axes = { { "T", { 1 } }, { "T", { 2 } } } }, "axis 'T' appears twice")
  expect({ axes = { { "T", { 1 } } }, fixed = { T = 3 } },
         "'T' is both an axis and a fixed setting")
  expect({ axes = { { "T", { 1 } } }, output = 5 }, "field 'output' must be a file name")
  expect({ axes = "T" }, "field 'axes' must be a non-empty list")
  expect({ axes = { { "T", { 1 } } }, shard = { 3, 2 } }, "field 'shard' must be {i, n}")
  -- an error inside a point names the point
  local okp, msg = pcall(scan.run, { axes = { { "T", { 1, 2 } } }, quiet = true,
    each = function(pt) if pt.T == 2 then error("boom") end return 1 end })
  U.check(not okp, "a failing point passed")
  U.has(msg, "point 2 (T=2)", "point error")
  U.has(msg, "boom", "point error text")
end)
U.rmdir(dir)
if not ok then error(err, 0) end
if not ok3 then error(err3, 0) end
print("test_scan_resume: ok")
