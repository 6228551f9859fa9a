--[[
  bench_integrated.lua -- timing of energy_loss (`make bench`); never a
  test.  Run by the runner: build/brakelight scripts/bench_integrated.lua
  Targets: method "born" at rtol 1e-3 within 50 ms; method "auto" within
  5 ms once the high-energy tables of the target are cached (the first
  call builds them and is timed apart).  CPU time, median of 5 calls.
]]

local bl = require "brakelight"

local function median_ms(f, n)
  local t = {}
  for i = 1, n do
    local c = os.clock()
    f()
    t[i] = (os.clock() - c) * 1e3
  end
  table.sort(t)
  return t[(n + 1) // 2]
end

local function row(label, opt, target)
  local first = os.clock()
  local r = bl.energy_loss(opt)
  first = (os.clock() - first) * 1e3
  local ms = median_ms(function() bl.energy_loss(opt) end, 5)
  print(string.format("%-34s %10.4g %9.1f %9.2f %7.0f  %s", label, r.dedx,
                      first, ms, target, ms <= target and "met" or "MISSED"))
end

print("energy_loss (radiative stopping power), electrons, rtol 1e-3")
print(string.format("%-34s %10s %9s %9s %7s", "case", "MeV cm2/g",
                    "first[ms]", "ms", "target"))
for _, c in ipairs{ { "H2O", 10 }, { "Pb", 10 }, { "Cu", 100 },
                    { "Pb", 1000 } } do
  row(string.format("born  %-4s T = %g MeV", c[1], c[2]),
      { particle = "electron", target = c[1], T = c[2], method = "born",
        rtol = 1e-3 }, 50)
end
for _, c in ipairs{ { "H2O", 1e4 }, { "Cu", 1e5 }, { "Pb", 1e5 },
                    { "Pb", 1e6 } } do
  row(string.format("auto  %-4s T = %g MeV", c[1], c[2]),
      { particle = "electron", target = c[1], T = c[2], rtol = 1e-3 }, 5)
end
