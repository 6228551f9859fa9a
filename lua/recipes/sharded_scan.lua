--[[
  sharded_scan.lua -- a scan meant to be split over processes or a
  cluster's job array, then merged into one table

  Scenario (our own): a lookup table of dsigma/dk at the photon-energy
  fractions y = 0.1, 0.5, 0.9 for electrons, muons and charged pions on
  C, Fe, W and Pb at kinetic energies from 100 MeV to 1 TeV, for a fast
  simulation that interpolates in it.  Every point is independent, so:

    build/brakelight lua/recipes/sharded_scan.lua out/      one process
    build/brakelight -j 2 lua/recipes/sharded_scan.lua out/ two workers,
                                                  merged into one file
    build/brakelight --shard 3/8 lua/recipes/sharded_scan.lua out/
                    shard 3 of 8 -> out/dsdk-table.shard-3-of-8.csv
    (in a Slurm job array the shard comes from SLURM_ARRAY_TASK_*)
    build/brakelight --merge out/dsdk-table.csv out/dsdk-table.shard-*-of-8.csv

  Killed half-way, any of these picks up where it stopped.  When this
  process holds every point (one process, or the final pass after -j) it
  prints a summary.  BRAKELIGHT_SMALL=1: 2 x 2 x 2 points, loose tolerance.
]]

local bl = require "brakelight"
local scan = require "brakelight.scan"
local recipe = require "brakelight.recipe"

local small = recipe.small()

local records, info = scan.run{
  title = "dsigma/dk lookup table",
  axes = { { "particle", small and { "electron", "muon" } or
                          { "electron", "muon", "pion+" } },
           { "target", small and { "C", "Pb" } or { "C", "Fe", "W", "Pb" } },
           { "T", small and { 100, 1000 } or
                  { 100, 300, 1000, 3000, 1e4, 3e4, 1e5, 3e5, 1e6 } } },
  fixed = { screening = "exponential", rtol = small and 1e-2 or 1e-4 },
  columns = { "y", "k", "dsdk", "err", "warnings" },
  output = recipe.path("dsdk-table.csv"),
  each = function(pt)
    local s = bl.spectrum(pt:with{ y = { 0.1, 0.5, 0.9 } })
    return { y = s.y, k = s.k, dsdk = s.dsdk, err = s.err,
             warnings = table.concat(s.warnings, "; ") }
  end,
}

if info.selected == info.total then
  local worst = 0
  for _, r in ipairs(records) do worst = math.max(worst, r.err / r.dsdk) end
  -- after -j N this is the final pass on the merged file: the workers
  -- computed (or resumed) every point, so "0 computed now" would mislead
  local session = package.loaded["brakelight.session"]
  local how = (session and session.shard_from == "workers") and
              "merged from the -j workers" or
              string.format("%d computed now, %d from earlier runs",
                            info.computed, info.reused)
  print(string.format("%d points, %d records in %s (%s); largest relative " ..
                      "error %.2g", info.total, #records, info.path, how,
                      worst))
else
  print(string.format("shard %d of %d: %d of %d points in %s; merge the " ..
                      "shards with brakelight --merge", info.shard[1],
                      info.shard[2], info.selected, info.total, info.path))
end
