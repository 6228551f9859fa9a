--[[
  test_scan_safety.lua -- issue 16, item 1: no result lost or silently
  damaged.  SIGINT/SIGTERM at random moments in scans of fast points
  (300x300 trivial points) and slow points, repeated: every finished point
  is on disk, in order, none twice, no temporary or lock file left, and the
  runs resumed one after the other complete the scan; an interrupt caught
  by a pcall in `each` (also inside a coroutine made before the signal)
  still stops the run and never becomes a result; one writer per output
  (a second run names the first and computes nothing; a lock left by a
  killed run is taken over with a note); a changed `each`, tool version or
  declared columns is refused, or accepted on request; damaged cells are
  an error naming file, line and column, and nothing is overwritten;
  --merge refuses an existing output of another scan; a long spectrum
  stops at the next point.
  Needs the runner (its signals, locks and session are what is tested);
  the seed of the random moments is printed.
]]

local root = (arg[0]):match("^(.-)tests[/\\]lua[/\\][^/\\]+%.lua$")
local U = dofile(root .. "tests/lua/lib/scanutil.lua")
package.path = U.root .. "lua/?.lua;" .. package.path
local scanfile = require "brakelight.scanfile"

local seed = tonumber(os.getenv("BL_TEST_SEED")) or os.time()
math.randomseed(seed)
print("test_scan_safety: seed " .. seed .. " (BL_TEST_SEED to repeat)")

local dir = U.tmpdir()
-- the whole randomized part when this file runs in the runner; in the
-- other hosts (which start the same runner for it) and under a test
-- wrapper (valgrind) fewer rounds of it, to keep make check short
local full = package.loaded["brakelight.session"] ~= nil and
             (os.getenv("BL_TEST_WRAP") or "") == ""

-- a scan of N x N trivial points; env SLOW=1 makes each point take ~25 ms
-- and log its key when it ends; SWALLOW=1 catches errors inside each
-- (pcall around the work, and a coroutine made before any signal)
local script = dir .. "/scan.lua"
U.write(script, [[
local scan = require "brakelight.scan"
local n = tonumber(os.getenv("N"))
local slow, swallow, log = os.getenv("SLOW"), os.getenv("SWALLOW"), arg[2]
local clock = require("brakelight.session").clock
local a = {}
for i = 1, n do a[i] = i end
local co = coroutine.wrap(function()
  while true do
    local t = clock()
    while clock() - t < 0.025 do end
    coroutine.yield("done")
  end
end)
local _, info = scan.run{ axes = { { "a", a }, { "b", a } }, output = arg[1],
  quiet = true,
  each = function(pt)
    local v = pt.a * 1000 + pt.b
    if slow then
      local t = clock()
      while clock() - t < 0.025 do end
    end
    if swallow then
      local ok, e = pcall(co)
      if not ok then return { v = -1, text = tostring(e) } end
      ok, e = pcall(function() local t = clock() while clock() - t < 0.01 do end end)
      if not ok then return { v = -2, text = tostring(e) } end
    end
    if log then
      local f = assert(io.open(log, "a"))
      f:write(pt:key(), "\n")
      f:close()
    end
    return { v = v }
  end }
print("computed " .. info.computed .. " reused " .. info.reused)
]])

--[[ Start the scan in the background, send `sig` after `after` seconds;
     returns exit code, stdout, stderr. ]]
local function interrupted(env, out, log, sig, after)
  local cmd = string.format("(%s %s %s %s %s & p=$!; sleep %.3f; kill -%s $p; wait $p)",
                            env, U.q(U.runner), U.q(script), U.q(out),
                            log and U.q(log) or "", after, sig)
  return U.sh(cmd .. " </dev/null")
end

--[[ The files next to out that must not stay: temporary files, the lock. ]]
local function leftovers(out)
  local base = out:match("([^/]+)$")
  local p = io.popen("ls -a " .. U.q(dir))
  local bad = {}
  for name in p:lines() do
    if scanfile.is_tmpname(name, base) or name == base .. ".lock" then
      bad[#bad + 1] = name
    end
  end
  p:close()
  return table.concat(bad, " ")
end

--[[ Records of out: checks they are the first m points in order, each once. ]]
local function prefix(out, n, what)
  local doc, msg, why = scanfile.read(out)
  if why == "missing" then return 0 end   -- stopped before the scan began
  assert(doc, what .. ": output unreadable: " .. tostring(msg))
  for i, r in ipairs(doc.records) do
    local a, b = math.floor((i - 1) / n) + 1, (i - 1) % n + 1
    U.check(r.a == a and r.b == b and r.v == a * 1000 + b,
            "%s: record %d is a=%s b=%s v=%s, expected point %d,%d", what, i,
            tostring(r.a), tostring(r.b), tostring(r.v), a, b)
    U.check(r.text == nil, "%s: an interrupt became a result: %s", what,
            tostring(r.text))
  end
  return #doc.records
end

local ok, err = pcall(function()
  -- 1. fast points, interrupted again and again at random moments
  local n, out = full and 300 or 150, dir .. "/fast.csv"
  local have, total = 0, n * n
  for round = 1, full and 5 or 2 do
    local sig = round % 2 == 1 and "INT" or "TERM"
    local after = 0.4 + (full and 1.2 or 0.3) * math.random()
    local code, so, se = interrupted("N=" .. n, out, nil, sig, after)
    if code == 0 then  -- finished before the signal
      have = prefix(out, n, "fast round " .. round .. ", finished")
      break
    end
    local signo = sig == "INT" and 2 or 15
    U.has(se, "interrupted by signal " .. signo, "fast round " .. round)
    local m = prefix(out, n, "fast round " .. round)
    U.check(m >= have, "fast round %d: %d points on disk, %d before", round, m, have)
    if se:find("points are in", 1, true) then  -- stopped in the scan
      U.has(se, m .. " of " .. total .. " points are in", "fast round " .. round ..
            " (finished = on disk)")
    elseif m == total then  -- the scan had ended; the signal came after it
      U.check(leftovers(out) == "", "fast round %d left %s", round,
              leftovers(out))
      have = m
      break
    else  -- stopped while setting up: nothing computed, nothing changed
      U.check(m == have, "fast round %d: stopped before the scan, %d points " ..
              "on disk, %d before", round, m, have)
    end
    U.check(leftovers(out) == "", "fast round %d left %s", round, leftovers(out))
    have = m
  end
  local code, so, se = U.run("", script, U.q(out), "N=" .. n)
  U.check(code == 0, "fast: the last run failed: %s", se)
  U.has(so, "computed " .. (total - have) .. " reused " .. have, "fast resume")
  U.check(prefix(out, n, "fast, complete") == total, "fast: not complete")

  -- 2. slow points: every point logged as finished is on disk but the
  -- one the signal may have cut between its log line and its return
  n, out = 7, dir .. "/slow.csv"
  local log = dir .. "/slow.log"
  for round = 1, full and 3 or 1 do
    local sig = round == 2 and "TERM" or "INT"
    code, so, se = interrupted("N=7 SLOW=1", out, log, sig, 0.15 + 0.5 * math.random())
    U.check(code ~= 0 or round > 1, "slow round %d was not stopped", round)
    local m = prefix(out, n, "slow round " .. round)
    local logged = 0
    for _ in (U.read(log) or ""):gmatch("[^\n]+") do logged = logged + 1 end
    U.check(logged == m or logged == m + 1, "slow round %d: %d logged, %d on disk",
            round, logged, m)
    U.write(log, string.rep("x\n", m))  -- the next round adds to what is on disk
    U.check(leftovers(out) == "", "slow round %d left %s", round, leftovers(out))
  end

  -- 3. an interrupt swallowed by pcall (and in a coroutine) in each
  out = dir .. "/swallow.csv"
  local t0 = os.time()
  code, so, se = interrupted("N=20 SWALLOW=1", out, nil, "TERM", 0.4)
  U.check(code ~= 0, "a pcall in each swallowed SIGTERM: the run ended with 0")
  U.check(os.time() - t0 < 8, "the swallowed interrupt let the scan run on")
  U.has(se, "interrupted by signal 15", "swallowed")
  prefix(out, 20, "swallowed")   -- no record holds the interrupt

  -- 4. an error at a random point: the points before it are on disk
  U.write(dir .. "/err.lua", [[
local scan = require "brakelight.scan"
local stop = tonumber(arg[2])
local a = {} for i = 1, 30 do a[i] = i end
scan.run{ axes = { { "a", a }, { "b", a } }, output = arg[1], quiet = true,
  each = function(pt)
    if pt:index() == stop then error("planned failure") end
    return { v = pt.a * 1000 + pt.b }
  end }]])
  local stop = math.random(2, 900)
  code, so, se = U.run("", dir .. "/err.lua", U.q(dir .. "/err.csv") .. " " .. stop)
  U.check(code ~= 0, "planned failure not raised")
  U.check(prefix(dir .. "/err.csv", 30, "error") == stop - 1,
          "error at point %d: not every earlier point is on disk", stop)

  -- 5. one writer per output: a second run names the first, computes nothing
  out = dir .. "/locked.csv"
  local bg = dir .. "/bg.pid"
  os.execute(string.format("N=6 SLOW=1 %s %s %s & echo $! > %s", U.q(U.runner),
                           U.q(script), U.q(out), U.q(bg)))
  -- wait until the first run holds its lock (a loaded machine starts it
  -- late), at most 10 s
  os.execute(string.format("for i in $(seq 100); do [ -e %s ] && break; "
                           .. "sleep 0.1; done", U.q(out .. ".lock")))
  local pid = U.read(bg):match("%d+")
  code, so, se = U.run("", script, U.q(out) .. " " .. U.q(dir .. "/second.log"), "N=6")
  U.check(code ~= 0, "a second writer was let in")
  U.has(se, "is being written by another run (pid " .. pid, "lock holder")
  U.has(se, "nothing was computed", "lock: before computing")
  U.check(U.read(dir .. "/second.log") == nil, "the second run computed points")
  os.execute("while kill -0 " .. pid .. " 2>/dev/null; do sleep 0.1; done")
  U.check(prefix(out, 6, "locked") == 36, "the first writer did not finish")
  U.check(leftovers(out) == "", "lock run left %s", leftovers(out))
  -- a lock left by a killed run: taken over with a note
  out = dir .. "/killed.csv"
  code = U.sh(string.format("(N=6 SLOW=1 %s %s %s & p=$!; for i in $(seq 100); "
                            .. "do [ -e %s ] && break; sleep 0.1; done; "
                            .. "sleep 0.1; kill -KILL $p; wait $p)",
                            U.q(U.runner), U.q(script), U.q(out),
                            U.q(out .. ".lock")))
  U.check(U.read(out .. ".lock") ~= nil, "SIGKILL left no lock file")
  U.write(scanfile.tmpname(out), "a temporary file of a killed run")
  code, so, se = U.run("", script, U.q(out), "N=6")
  U.check(code == 0, "the run after a killed one failed: %s", se)
  U.has(se, "taking over the lock of output '" .. out .. "' left by a run that has ended", "stale lock")
  U.check(leftovers(out) == "", "stale-lock run left %s", leftovers(out))

  -- 6. identity: another each, another tool version, other columns
  U.write(dir .. "/id.lua", [[
local scan = require "brakelight.scan"
scan.run{ axes = { { "T", { 10, 20 } } }, output = arg[1], quiet = true,
  columns = COLUMNS,
  each = function(pt) return { k = pt.T / 2 } end }]])
  local idcsv = dir .. "/id.csv"
  code, so, se = U.run("-e 'COLUMNS = {\"k\"}'", dir .. "/id.lua", U.q(idcsv))
  U.check(code == 0, "identity scan failed: %s", se)
  local before = U.read(idcsv)
  U.write(dir .. "/id4.lua", (U.read(dir .. "/id.lua"):gsub("T / 2", "T / 4")))
  code, so, se = U.run("-e 'COLUMNS = {\"k\"}'", dir .. "/id4.lua", U.q(idcsv))
  U.check(code ~= 0, "a changed each reused the old values")
  U.has(se, "holds results of another computation", "changed each")
  U.has(se, "fingerprint", "changed each: what differs")
  U.has(se, "BRAKELIGHT_ACCEPT=1", "changed each: how to accept")
  U.has(se, "move the file away", "changed each: how to recompute")
  U.check(U.read(idcsv) == before, "a refused run changed the file")
  code, so, se = U.run("-e 'COLUMNS = {\"k\", \"e\"}'", dir .. "/id.lua", U.q(idcsv))
  U.check(code ~= 0, "other declared columns accepted")
  U.has(se, "its declared columns are {k}, here {k,e}", "columns")
  U.write(dir .. "/old.csv", (before:gsub("# tool: brakelight %S+", "# tool: brakelight 0.0.1")))
  code, so, se = U.run("-e 'COLUMNS = {\"k\"}'", dir .. "/id.lua", U.q(dir .. "/old.csv"))
  U.check(code ~= 0, "a file of another tool version accepted")
  U.has(se, "it was written by brakelight 0.0.1", "version")
  code, so, se = U.run("-e 'COLUMNS = {\"k\"}'", dir .. "/id4.lua", U.q(idcsv),
                       "BRAKELIGHT_ACCEPT=1")
  U.check(code == 0, "BRAKELIGHT_ACCEPT=1 refused: %s", se)
  U.has(U.read(idcsv), "# note: accepted earlier results", "accepted: noted")

  -- 7. damaged cells: an error naming file, line and column; untouched
  local bad = before:gsub("\n10,5\n", "\n10,xx56.9\n")
  U.check(bad ~= before, "test set-up: cell not found")
  U.write(dir .. "/bad.csv", bad)
  code, so, se = U.run("-e 'COLUMNS = {\"k\"}'", dir .. "/id.lua", U.q(dir .. "/bad.csv"))
  U.check(code ~= 0, "a damaged cell was read")
  local line = 0
  for l in bad:gmatch("([^\n]*)\n") do
    line = line + 1
    if l == "10,xx56.9" then break end
  end
  U.has(se, dir .. "/bad.csv:" .. line .. ": column 2 ('k'): \"xx56.9\" is not a number",
        "damaged cell")
  U.check(U.read(dir .. "/bad.csv") == bad, "a damaged file was overwritten")
  code, so, se = U.run("-e 'COLUMNS = {\"k\"}'", dir .. "/id.lua", U.q(dir .. "/id.json"))
  U.check(code == 0, "JSON scan failed: %s", se)
  local j = U.read(dir .. "/id.json")
  local jbad = j:gsub('"k":5}', '"k":"xx56.9"}')
  U.check(jbad ~= j, "test set-up: JSON cell not found")
  U.write(dir .. "/bad.json", jbad)
  code, so, se = U.run("-e 'COLUMNS = {\"k\"}'", dir .. "/id.lua", U.q(dir .. "/bad.json"))
  U.check(code ~= 0, "a damaged JSON cell was read")
  U.has(se, "bad.json:", "damaged JSON: file")
  U.has(se, "column 2 ('k'): \"xx56.9\" is not a number", "damaged JSON: column")
  U.check(U.read(dir .. "/bad.json") == jbad, "a damaged JSON file was overwritten")

  -- 8. --merge onto an existing output of another scan, or a damaged one
  code, so, se = U.run("-q --shard 1/2", script, U.q(dir .. "/m.csv"), "N=4")
  U.check(code == 0, "shard 1 failed: %s", se)
  code, so, se = U.run("-q --shard 2/2", script, U.q(dir .. "/m.csv"), "N=4")
  U.check(code == 0, "shard 2 failed: %s", se)
  local shards = U.q(dir .. "/m.shard-1-of-2.csv") .. " " .. U.q(dir .. "/m.shard-2-of-2.csv")
  code, so, se = U.sh(U.q(U.runner) .. " --merge " .. U.q(idcsv) .. " " .. shards)
  U.check(code ~= 0, "--merge overwrote another scan")
  U.has(se, "output '" .. idcsv .. "' exists and holds a different scan", "merge refusal")
  U.has(se, "choose another output, or move it away", "merge: how to proceed")
  code, so, se = U.sh(U.q(U.runner) .. " --merge " .. U.q(dir .. "/bad.csv") .. " " .. shards)
  U.check(code ~= 0, "--merge overwrote a damaged file")
  U.has(se, "exists but cannot be read", "merge onto damaged")
  U.check(U.read(dir .. "/bad.csv") == bad, "merge changed a damaged file")
  code, so, se = U.sh(U.q(U.runner) .. " --merge " .. U.q(dir .. "/m.csv") .. " " .. shards)
  U.check(code == 0, "merge failed: %s", se)
  U.check(prefix(dir .. "/m.csv", 4, "merged") == 16, "merge incomplete")

  -- 9. a long spectrum stops at the next point on SIGINT
  U.write(dir .. "/spec.lua", [[
local bl = require "brakelight"
local k = {}
for i = 1, 4000 do k[i] = 0.5 + i * 0.02 end
bl.spectrum{ particle = "electron", target = "Pb", T = 100, k = k, rtol = 1e-8,
             method = "born", threads = 2 }
print("spectrum ended")]])
  t0 = os.time()
  code, so, se = U.sh(string.format("(r=$(realpath %s); cd %s && \"$r\" spec.lua & p=$!; sleep 1; kill -INT $p; wait $p)",
                                    U.q(U.runner), U.q(dir)))
  U.check(code ~= 0 and not so:find("spectrum ended", 1, true), "spectrum not stopped")
  U.check(os.time() - t0 < 10, "spectrum went on after SIGINT (%d s)", os.time() - t0)
  U.has(se, "spectrum: interrupted by signal 2", "spectrum interrupt")
  -- and the finished points are kept, in a new file it names
  local nfin, kept = se:match("(%d+) of 4000 points finished, kept in '([^']+)'")
  U.check(kept ~= nil, "finished points not kept: %s", se)
  if kept then
    local body = U.read(dir .. "/" .. kept) or ""
    local rows, good = 0, 0
    for line in body:gmatch("[^\n]+") do
      local kk, yy, v = line:match("^([%d.e+-]+),([%d.e+-]+),([%d.e+-]+),")
      if kk then
        rows = rows + 1
        -- each row is the value spectrum gives for that k alone
        if rows <= 3 then
          local one = require("brakelight").dsdk{ particle = "electron", target = "Pb", T = 100,
                               k = tonumber(kk), rtol = 1e-8, method = "born" }
          good = good + (math.abs(one / tonumber(v) - 1) < 1e-12 and 1 or 0)
        end
      end
    end
    U.check(rows == tonumber(nfin) and rows > 0, "kept %d rows, message says %s", rows, nfin)
    U.check(good == math.min(rows, 3), "kept values differ from dsdk (%d of 3 equal)", good)
    U.check(U.read(dir .. "/" .. kept .. ".part") == nil, "a .part file was left")
  end

  -- 9b. the same in the stock interpreter: the module's guard stops the
  -- call on SIGINT (passed on to lua.c's handler) and on SIGTERM (whose
  -- default action then ends the process), and the message names the file
  local build = os.getenv("BL_BUILD_DIR") or "build"
  build = build:sub(1, 1) == "/" and build or root .. build
  U.write(dir .. "/stock.lua", [[
package.cpath = arg[1] .. "/?.so;" .. package.cpath
local bl = require "brakelight"
local k = {}
for i = 1, 4000 do k[i] = 0.5 + i * 0.02 end
-- the signal comes 1 s after the long call begins, however long loading took
os.execute("(sleep 1; kill -" .. arg[2] .. " " .. require("brakelight.sys").pid() .. ") &")
bl.spectrum{ particle = "electron", target = "Pb", T = 100, k = k, rtol = 1e-8,
             method = "born", threads = 2 }
print("spectrum ended")]])
  local sys = require "brakelight.sys"
  for _, sig in ipairs{ "INT", "TERM" } do
    local old = {}
    for _, name in ipairs(sys.dir(dir)) do old[name] = true end
    t0 = os.time()
    code, so, se = U.sh(string.format("(b=$(realpath %s); cd %s && lua5.4 stock.lua \"$b\" %s; echo \"status $?\")",
                                      U.q(build), U.q(dir), sig))
    U.check(not so:find("spectrum ended", 1, true), "stock lua5.4: spectrum not stopped by SIG%s", sig)
    U.check(os.time() - t0 < 10, "stock lua5.4: spectrum went on after SIG%s (%d s)", sig, os.time() - t0)
    local kept
    if sig == "INT" then
      U.has(so, "status 1", "stock lua5.4 exit status after SIGINT")
      U.has(se, "spectrum: interrupted by signal 2", "stock lua5.4 spectrum interrupt")
      kept = se:match("points finished, kept in '([^']+)'")
      U.check(kept ~= nil, "stock lua5.4: finished points not named: %s", se)
    else   -- the default action, after the points are kept: no message
      U.has(so, "status 143", "stock lua5.4 exit status after SIGTERM")
      for _, name in ipairs(sys.dir(dir)) do
        if name:find("^spectrum%-interrupted%-.*%.csv$") and not old[name] then kept = name end
      end
      U.check(kept ~= nil, "stock lua5.4: no file kept after SIGTERM")
    end
    if kept then
      local body = U.read(dir .. "/" .. kept) or ""
      U.has(body, "spectrum interrupted by signal " .. (sig == "INT" and 2 or 15), "kept file header")
      U.check(select(2, body:gsub("\n[%d.]", "")) > 0, "stock lua5.4: kept file has no rows")
    end
  end

  -- 9c. sampler:events(n) in the stock interpreter: SIGINT stops it between
  -- chunks, the sampler is rewound (a retry gives the same events as an
  -- uninterrupted sampler) and the script may go on
  U.write(dir .. "/events.lua", [[
package.cpath = arg[1] .. "/?.so;" .. package.cpath
local bl = require "brakelight"
local o = { particle = "electron", target = "W", T = 10, kmin = 0.1, seed = 7,
            events = 1e8 }
local s = bl.sampler(o)
os.execute("(sleep 1; kill -INT " .. require("brakelight.sys").pid() .. ") &")
local ok, err = pcall(s.events, s, 1e8)
print(ok, err)
local a, b = s:events(2), bl.sampler(o):events(2)
local same = a[2].id == b[2].id
for i = 1, 4 do same = same and a[2].k[i] == b[2].k[i] end
print(same and "same events" or "other events")]])
  code, so, se = U.sh(string.format("(b=$(realpath %s); cd %s && lua5.4 events.lua \"$b\")",
                                    U.q(build), U.q(dir)))
  U.check(code == 0, "stock lua5.4 sampler script failed after SIGINT: %s", se)
  U.has(so, "sampler: interrupted by signal 2 after", "sampler interrupt")
  U.has(so, "same events", "sampler rewound after the interrupt")

  -- 10. failed checkpoints (in this process): reported, retried, not
  -- fatal; a last save that keeps failing is an error saying so
  local scan = require "brakelight.scan"
  local write, calls = scanfile.write, 0
  scanfile.write = function(path, doc)
    calls = calls + 1
    if calls >= 2 and calls <= 4 then return nil, "planned: disk full" end
    return write(path, doc)
  end
  local a = {}
  for i = 1, 40 do a[i] = i end
  local spec = { axes = { { "a", a } }, output = dir .. "/retry.csv", quiet = true,
                 checkpoint = 0, each = function(pt) return { v = 2 * pt.a } end }
  local okr, recs = pcall(scan.run, spec)
  U.check(okr, "a failed checkpoint was fatal: %s", tostring(recs))
  U.check(calls > 4, "checkpoints not retried (%d writes)", calls)
  U.check(#assert(scanfile.read(dir .. "/retry.csv")).records == 40, "retry: points lost")
  scanfile.write = function() return nil, "planned: disk full" end
  spec.output, spec.axes = dir .. "/never.csv", { { "a", { 1, 2, 3 } } }
  local okn, msgn = pcall(scan.run, spec)
  scanfile.write = write
  U.check(not okn, "a last save that failed passed silently")
  U.has(msgn, "tried 4 times; the 3 points computed now are lost", "final save")
end)
U.rmdir(dir)
if not ok then error(err, 0) end
print("test_scan_safety: ok")
