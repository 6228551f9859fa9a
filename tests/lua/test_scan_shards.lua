--[[
  test_scan_shards.lua -- issue 5: a 3x3x2 scan sharded 4 ways (by
  --shard, by the Slurm job-array variables, by -j) and merged equals the
  unsharded run record for record; merge fails loudly on a missing or a
  duplicated point.  Cheap points: dsigma/dk at k = T/2, rtol 1e-3.
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

  -- Slurm job arrays select the same shards as --shard
  local arrays = {
    { "MIN=1 MAX=4", function(i) return i end },
    { "MIN=10 MAX=13 COUNT=4", function(i) return 9 + i end },
    { "MIN=0 MAX=6 COUNT=4", function(i) return 2 * (i - 1) end },  -- step 2
    { "COUNT=4", function(i) return i - 1 end },                    -- 0-based
  }
  for _, a in ipairs(arrays) do
    local env = a[1]:gsub("(%u+)=", "SLURM_ARRAY_TASK_%1=")
    for i = 1, 4 do
      local sdir = dir .. "/slurm"
      os.execute("mkdir -p " .. U.q(sdir))
      code, out, e = U.run("-q", script, U.q(sdir .. "/s.csv"),
                           env .. " SLURM_ARRAY_TASK_ID=" .. a[2](i))
      U.check(code == 0, "Slurm %s task %d failed: %s", a[1], a[2](i), e)
      U.has(out, string.format("shard %d/4 from slurm", i), "Slurm " .. a[1])
      local got = U.read(string.format("%s/s.shard-%d-of-4.csv", sdir, i))
      local want = U.read(string.format("%s/s.shard-%d-of-4.csv", dir, i))
      U.check(got == want, "Slurm %s task %d: shard file differs from " ..
              "--shard %d/4", a[1], a[2](i), i)
      U.rmdir(sdir)
    end
  end
  -- --shard wins over the Slurm variables
  code, out = U.run("-q --shard 2/4", script, U.q(dir .. "/w.csv"),
                    "SLURM_ARRAY_TASK_ID=0 SLURM_ARRAY_TASK_COUNT=3")
  U.check(code == 0, "--shard with Slurm variables failed")
  U.has(out, "shard 2/4 from option", "--shard over Slurm")
  -- variables that do not describe a regular array: a clear error
  code, out, e = U.run("-q", script, U.q(dir .. "/w.csv"),
                       "SLURM_ARRAY_TASK_ID=7 SLURM_ARRAY_TASK_MIN=0 SLURM_ARRAY_TASK_MAX=3")
  U.check(code ~= 0, "bad Slurm id accepted")
  U.has(e, "SLURM_ARRAY_TASK_ID=7 is not a task of the array 0-3", "bad Slurm id")
  code, out, e = U.run("-q", script, U.q(dir .. "/w.csv"),
                       "SLURM_ARRAY_TASK_ID=x SLURM_ARRAY_TASK_COUNT=4")
  U.check(code ~= 0, "malformed Slurm id accepted")
  U.has(e, "SLURM_ARRAY_TASK_ID='x'", "malformed Slurm id")
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
