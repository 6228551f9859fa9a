-- bench_erow.lua -- integrals over k of projectiles whose bound electron
-- term is exact at each photon energy (outside the other-projectile
-- table: mass above 10 GeV or T/m below 0.01), one runner's values and
-- times; scripts/bench_erow.sh runs it with a BASE runner and this tree's
-- in one run.  Never a test.
-- usage: brakelight scripts/bench_erow.lua LABEL [CASE]
-- See Copyright Notice in LICENSE
local bl = require("brakelight")
local label, only = arg[1] or "?", tonumber(arg[2])
local H = bl.particle{mass = 1e5, charge = 1, spin = 0.5, name = "M100GeV"}
local X = bl.particle{mass = 3e4, charge = 1, spin = 0.5, name = "M30GeV"}
local cases = {
  {"energy_loss", "pion+ water 0.1 keV born",
   {particle = "pion+", target = "water", T = 1e-4, method = "born"}},
  {"cross_section", "30 GeV on C 300 GeV born 1-100 MeV",
   {particle = X, target = "C", T = 3e5, method = "born", kmin = 1,
    kmax = 100}},
  {"energy_loss", "100 GeV on Fe 1 TeV auto",
   {particle = H, target = "Fe", T = 1e6}},
}
local function warns (r)
  local w = {}
  for _, s in ipairs(r.warnings or {}) do w[#w + 1] = tostring(s) end
  return table.concat(w, "; ")
end
for i, c in ipairs(cases) do
  if not only or only == i then
    local t0 = os.clock()
    local r = bl[c[1]](c[3])
    local t = os.clock() - t0
    local v = c[1] == "energy_loss" and r.dedx or r.sigma
    print(string.format("%-5s %d %-36s %-13s %.10e +- %.2e  %7.2f s  [%s]",
                        label, i, c[2], c[1], v, r.err or -1, t, warns(r)))
    io.stdout:flush()
  end
end
