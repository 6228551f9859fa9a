--[[
  tests/slurm/slow_scan.lua -- a small scan with slow points, for
  scripts/check-slurm.sh: one array task is cancelled while it computes
  and resubmitted alone.

    build/brakelight [--shard I/N] tests/slurm/slow_scan.lua OUTDIR

  16 points (2 particles x 2 targets x 4 energies), each a dsigma/dk at
  k = T/2 (rtol 1e-2), then a pause of BL_SLOW_POINT_SECS seconds
  (default 0.4; 0 for the unsharded reference run).  The pause is a
  child `sleep`, so the points are slow without loading the cores; the
  values do not depend on it.  Writes OUTDIR/slow-table.csv.
]]

local bl = require "brakelight"
local scan = require "brakelight.scan"
local recipe = require "brakelight.recipe"

local pause = tonumber(os.getenv("BL_SLOW_POINT_SECS") or "0.4")
assert(pause and pause >= 0 and pause <= 10,
       "BL_SLOW_POINT_SECS must be a number of seconds in [0, 10]")

scan.run{
  title = "slow points for the Slurm test",
  axes = { { "particle", { "electron", "muon" } },
           { "target", { "C", "Pb" } },
           { "T", { 10, 100, 1000, 10000 } } },
  fixed = { rtol = 1e-2, method = "born" },
  columns = { "dsdk", "err" },
  output = recipe.path("slow-table.csv"),
  each = function(pt)
    local v, e = bl.dsdk(pt:with{ k = pt.T / 2 })
    if pause > 0 then os.execute(string.format("sleep %.3f", pause)) end
    return { dsdk = v, err = e }
  end,
}
