--[[
  test_recipes.lua -- issue 5: every recipe in lua/recipes/ (but the demo,
  which test_demo.lua runs) runs through the runner in its small mode
  (BRAKELIGHT_SMALL=1) and writes its files; run twice, the second run
  resumes from the first run's output and gives the same printout.
  Needs the runner (-q, -j 2).  That the recipes give the same in every
  stock interpreter is checked by scripts/run-lua-tests.sh --lua.
]]

local root = (arg[0]):match("^(.-)tests[/\\]lua[/\\][^/\\]+%.lua$")
local U = dofile(root .. "tests/lua/lib/scanutil.lua")

local recipes = {
  radiator_spectrum = { "radiator-spectrum.csv", "radiator-spectrum.png.gp" },
  energy_loss_table = { "energy-loss.csv", "energy-loss.png.gp" },
  spin_compare = { "spin-compare.csv", "spin-compare.png.gp" },
  screening_compare = { "screening-compare.csv", "screening-compare.png.gp" },
  sharded_scan = { "dsdk-table.csv" },
  tungsten_converter = { "tungsten-converter.csv", "tungsten-converter.png.gp" },
  tungsten_events = { "tungsten-events.hepmc3", "tungsten-events.lhe",
                      "tungsten-events-angles.png.gp" },
}
local dir = U.tmpdir()
local ok, err = pcall(function()
  local n = 0
  for name, files in pairs(recipes) do
    local path = U.root .. "lua/recipes/" .. name .. ".lua"
    local out = dir .. "/" .. name
    local code, so, se = U.run("-q", path, U.q(out), "BRAKELIGHT_SMALL=1")
    U.check(code == 0, "%s failed:\n%s", name, se)
    for _, f in ipairs(files) do
      U.check(U.read(out .. "/" .. f), "%s did not write %s", name, f)
    end
    local code2, so2, se2 = U.run("-q", path, U.q(out), "BRAKELIGHT_SMALL=1")
    U.check(code2 == 0, "%s failed on the second run:\n%s", name, se2)
    if name ~= "sharded_scan" then  -- it prints how many were reused
      U.check(so2 == so, "%s: second run printed differently", name)
    else
      U.has(so2, "0 computed now", name)
    end
    n = n + 1
  end
  -- the sharded recipe with -j 2 equals its single-process table
  local path = U.root .. "lua/recipes/sharded_scan.lua"
  local code, so, se = U.run("-q -j 2", path, U.q(dir .. "/j"), "BRAKELIGHT_SMALL=1")
  U.check(code == 0, "sharded_scan -j 2 failed:\n%s", se)
  U.check(U.data(dir .. "/j/dsdk-table.csv") ==
          U.data(dir .. "/sharded_scan/dsdk-table.csv"),
          "sharded_scan -j 2 differs from one process")
  U.check(n >= 5, "fewer than five recipes")
end)
U.rmdir(dir)
if not ok then error(err, 0) end
print("test_recipes: ok")
