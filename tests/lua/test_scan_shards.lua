--[[
  test_scan_shards.lua -- issue 5: a 3x3x2 scan sharded 4 ways (by
  --shard, by a Slurm job array with the shard count given, by -j) and
  merged equals the unsharded run record for record; merge fails loudly
  on a missing or a duplicated point.  Issue 16: the shard count of a job
  array is never guessed (a partial resubmission keeps its shards; without
  the count a scan stops); option errors are one line.  Cheap points: dsigma/dk at k = T/2, rtol 1e-3.
  Needs the runner: every scan here runs in build/brakelight (its --shard,
  -j, --merge and Slurm handling are what is tested); the checks run in
  any Lua host.
]]

local root = (arg[0]):match("^(.-)tests[/\\]lua[/\\][^/\\]+%.lua$")
local U = dofile(root .. "tests/lua/lib/scanutil.lua")
package.path = U.root .. "lua/?.lua;" .. package.path
local scanfile = require "brakelight.scanfile"

local dir = U.tmpdir()
local script = dir .. "/scan.lua"
U.write(script, [[
local bl = require "brakelight"
local scan = require "brakelight.scan"
local recs, info = scan.run{
  title = "shard test",
  axes = { { "target", { "C", "Cu", "Pb" } }, { "T", { 10, 100, 1000 } },
           { "particle", { "electron", "muon" } } },
  fixed = { rtol = 1e-3 },
  columns = { "dsdk", "err" },
  output = arg[1],
  each = function(pt)
    local v, e = bl.dsdk(pt:with{ k = 0.5 * pt.T })
    return { dsdk = v, err = e }
  end,
}
local s = package.loaded["brakelight.session"]
print(string.format("selected %d of %d; shard %d/%d from %s", info.selected,
      info.total, info.shard[1], info.shard[2], s.shard_from))
]])

local ok, err = pcall(function()
  -- unsharded reference
  local code, out, e = U.run("-q", script, U.q(dir .. "/full.csv"))
  U.check(code == 0, "unsharded run failed: %s", e)
  U.has(out, "selected 18 of 18; shard 1/1 from none", "unsharded")
  local full = assert(scanfile.read(dir .. "/full.csv"))
  U.check(#full.records == 18, "18 records expected, got %d", #full.records)

  -- four shards through --shard
  local files = {}
  for i = 1, 4 do
    code, out, e = U.run("-q --shard " .. i .. "/4", script,
                         U.q(dir .. "/s.csv"))
    U.check(code == 0, "--shard %d/4 failed: %s", i, e)
    U.has(out, string.format("shard %d/4 from option", i), "--shard")
    local f = string.format("%s/s.shard-%d-of-4.csv", dir, i)
    files[#files + 1] = U.q(f)
    local doc = assert(scanfile.read(f))
    local want = i <= 2 and 5 or 4  -- 18 points: 5, 5, 4, 4
    U.check(#doc.records == want, "shard %d holds %d records, expected %d",
            i, #doc.records, want)
    -- round robin: shard i holds points i, i+4, ... of the full order
    for j, r in ipairs(doc.records) do
      local ref = full.records[i + 4 * (j - 1)]
      U.check(r.target == ref.target and r.T == ref.T and
              r.particle == ref.particle, "shard %d record %d is not point %d",
              i, j, i + 4 * (j - 1))
    end
  end

  -- merge: the same records, in the same order, as the unsharded run
  code, out, e = U.sh(U.q(U.runner) .. " --merge " .. U.q(dir .. "/m.csv") ..
                      " " .. table.concat(files, " "))
  U.check(code == 0, "merge failed: %s", e)
  U.has(e, "merged 18 points", "merge message")
  U.check(U.data(dir .. "/m.csv") == U.data(dir .. "/full.csv"),
          "merged CSV differs from the unsharded run")
  local merged = assert(scanfile.read(dir .. "/m.csv"))
  for j, r in ipairs(full.records) do
    for k, v in pairs(r) do
      U.check(merged.records[j][k] == v, "record %d field %s: %s vs %s", j, k,
              tostring(merged.records[j][k]), tostring(v))
    end
  end
  -- merging into JSON keeps every value exactly
  code, out, e = U.sh(U.q(U.runner) .. " -q --merge " .. U.q(dir .. "/m.json") ..
                      " " .. table.concat(files, " "))
  U.check(code == 0, "merge to JSON failed: %s", e)
  local mj = assert(scanfile.read(dir .. "/m.json"))
  for j, r in ipairs(full.records) do
    for k, v in pairs(r) do
      U.check(mj.records[j][k] == v, "JSON record %d field %s differs", j, k)
    end
  end

  -- a missing shard: merge fails, names the missing points, writes nothing
  code, out, e = U.sh(U.q(U.runner) .. " --merge " .. U.q(dir .. "/bad.csv") ..
                      " " .. table.concat(files, " ", 1, 3))
  U.check(code ~= 0, "merge with a missing shard succeeded")
  U.has(e, "4 of 18 points are missing", "missing message")
  U.has(e, "target=C;T=100;particle=muon", "missing point named")
  U.check(U.read(dir .. "/bad.csv") == nil, "failed merge wrote a file")

  -- a duplicated point: copy a record of shard 1 into shard 2
  local s1 = U.read(dir .. "/s.shard-1-of-4.csv")
  local s2 = U.read(dir .. "/s.shard-2-of-4.csv")
  local line = s1:match("\n(C,10,electron,[^\n]*)\n")
  assert(line, "record to duplicate not found")
  U.write(dir .. "/dup.shard-2-of-4.csv", s2 .. line .. "\n")
  U.write(dir .. "/m.csv.before", U.read(dir .. "/m.csv"))
  code, out, e = U.sh(U.q(U.runner) .. " --merge " .. U.q(dir .. "/m.csv") ..
                      " " .. files[1] .. " " .. U.q(dir .. "/dup.shard-2-of-4.csv") ..
                      " " .. files[3] .. " " .. files[4])
  U.check(code ~= 0, "merge with a duplicated point succeeded")
  U.has(e, "point target=C;T=10;particle=electron is in both", "duplicate message")
  U.check(U.read(dir .. "/m.csv") == U.read(dir .. "/m.csv.before"),
          "failed merge changed the existing output")

  -- Slurm job arrays: the shard count is given (--shard "$ID/N",
  -- --shards N or BRAKELIGHT_SHARDS=N), never taken from the array
  -- variables, which describe only the tasks submitted; each way selects
  -- the same shard files as --shard I/4
  local ways = {
    { "--shard", function(i) return "-q --shard " .. i .. "/4", "" end },
    { "--shards", function() return "-q --shards 4", "" end },
    { "BRAKELIGHT_SHARDS", function() return "-q", "BRAKELIGHT_SHARDS=4" end },
  }
  for _, w in ipairs(ways) do
    for i = 1, 4 do
      local sdir = dir .. "/slurm"
      os.execute("mkdir -p " .. U.q(sdir))
      local opts, env = w[2](i)
      -- a partial resubmission (sbatch --array=I) sets MIN = MAX = COUNT
      -- of what was submitted: it must not change the shard
      code, out, e = U.run(opts, script, U.q(sdir .. "/s.csv"), env ..
                           " SLURM_ARRAY_TASK_ID=" .. i .. " SLURM_ARRAY_TASK_MIN=" ..
                           i .. " SLURM_ARRAY_TASK_MAX=" .. i ..
                           " SLURM_ARRAY_TASK_COUNT=1")
      U.check(code == 0, "Slurm %s task %d failed: %s", w[1], i, e)
      U.has(out, string.format("shard %d/4 from %s", i,
                               w[1] == "--shard" and "option" or "slurm"),
            "Slurm " .. w[1])
      local got = U.read(string.format("%s/s.shard-%d-of-4.csv", sdir, i))
      local want = U.read(string.format("%s/s.shard-%d-of-4.csv", dir, i))
      U.check(got == want, "Slurm %s task %d: shard file differs from " ..
              "--shard %d/4", w[1], i, i)
      U.rmdir(sdir)
    end
  end
  -- a job array without the shard count: a scan stops before computing,
  -- a script without a scan runs
  code, out, e = U.run("-q", script, U.q(dir .. "/w.csv"),
                       "SLURM_ARRAY_TASK_ID=2 SLURM_ARRAY_TASK_MIN=2 " ..
                       "SLURM_ARRAY_TASK_MAX=2 SLURM_ARRAY_TASK_COUNT=1")
  U.check(code ~= 0, "a job array without N ran a scan")
  U.has(e, "SLURM_ARRAY_TASK_ID=2 is set, but the number of shards is not given", "no N")
  U.has(e, '--shard "$SLURM_ARRAY_TASK_ID/N"', "no N: what to do")
  U.check(U.read(dir .. "/w.csv") == nil and U.read(dir .. "/w.shard-1-of-1.csv") == nil,
          "a job array without N wrote an output")
  code, out, e = U.sh("SLURM_ARRAY_TASK_ID=2 " .. U.q(U.runner) ..
                      " -e 'print(1 + 1)' </dev/null")
  U.check(code == 0 and out:find("2", 1, true), "a plain script under an array failed: %s", e)
  -- an id outside 1..N, a malformed id or N: clear errors
  code, out, e = U.run("-q --shards 4", script, U.q(dir .. "/w.csv"),
                       "SLURM_ARRAY_TASK_ID=0")
  U.check(code ~= 0, "task id 0 of 4 shards accepted")
  U.has(e, "SLURM_ARRAY_TASK_ID=0 is not a shard of 1..4", "id 0")
  code, out, e = U.run("-q --shards 4", script, U.q(dir .. "/w.csv"),
                       "SLURM_ARRAY_TASK_ID=x")
  U.check(code ~= 0, "malformed Slurm id accepted")
  U.has(e, "SLURM_ARRAY_TASK_ID='x'", "malformed Slurm id")
  code, out, e = U.run("-q --shards 0", script, U.q(dir .. "/w.csv"))
  U.check(code ~= 0, "--shards 0 accepted")
  U.has(e, "bad value for --shards", "bad --shards")
  U.check(not e:find("usage:", 1, true) and select(2, e:gsub("\n", "")) == 1,
          "an option error printed more than one line: %s", e)
  U.has(e, "try 'brakelight --help'", "option error points to --help")
  code, out, e = U.run("-q --shards 4", script, U.q(dir .. "/w.csv"))
  U.check(code ~= 0, "--shards without a job array accepted")
  U.has(e, "--shards N takes the shard number from SLURM_ARRAY_TASK_ID", "--shards alone")
  -- --shard wins over the Slurm variables
  code, out = U.run("-q --shard 2/4", script, U.q(dir .. "/w.csv"),
                    "SLURM_ARRAY_TASK_ID=0 SLURM_ARRAY_TASK_COUNT=3")
  U.check(code == 0, "--shard with Slurm variables failed")
  U.has(out, "shard 2/4 from option", "--shard over Slurm")
  code, out, e = U.run("-q --shard 5/4", script, U.q(dir .. "/w.csv"))
  U.check(code ~= 0, "--shard 5/4 accepted")
  U.has(e, "bad value for --shard", "bad --shard")

  -- -j 2: two workers, merged, then a final pass that computes nothing
  code, out, e = U.run("-q -j 2", script, U.q(dir .. "/j.csv"))
  U.check(code == 0, "-j 2 failed: %s", e)
  U.has(out, "selected 18 of 18; shard 1/1 from workers", "-j final pass")
  U.check(U.data(dir .. "/j.csv") == U.data(dir .. "/full.csv"),
          "-j 2 output differs from the unsharded run")
  U.check(U.read(dir .. "/j.shard-1-of-2.csv") == nil,
          "-j left its shard files after merging")
  code, out, e = U.run("-q -j 2 --shard 1/2", script, U.q(dir .. "/j.csv"))
  U.check(code ~= 0, "-j with --shard accepted")
  U.has(e, "-j cannot be combined with --shard", "-j with --shard")
end)
U.rmdir(dir)
if not ok then error(err, 0) end
print("test_scan_shards: ok")
