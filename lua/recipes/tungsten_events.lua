--[[
  tungsten_events.lua -- bremsstrahlung events of 8 GeV electrons in a thin
  tungsten foil, as HepMC3 and Les Houches files, and where the photons go

  Scenario (our own): a test-beam line puts 8 GeV electrons through a 35 um
  tungsten foil (0.01 radiation lengths) to tag photons downstream; the
  detector simulation wants the photons above 80 MeV with their correlated
  outgoing electron, drawn from the exact Born cross section (screened
  atom, atomic electrons, nuclear size, Elwert factor where it holds).
  The recipe draws 1e5 unweighted events with seed 2026, writes them as
  tungsten-events.hepmc3 and tungsten-events.lhe (the same events: same
  seed, same run), prints the cross section, the unweighting efficiency,
  the overweights, the photons per electron the foil gives above 80 MeV
  and the share of events on the atomic electrons, and plots the photon
  angle against the photon energy: the 10 %, 50 % and 90 % quantiles of
  theta_k (in units of m/E0) per bin of k (tungsten-events-angles.png).

  Usage: build/brakelight lua/recipes/tungsten_events.lua [outdir]
         (BRAKELIGHT_SMALL=1: 2000 events)
]]

local bl = require "brakelight"
local events = require "brakelight.events"
local plot = require "brakelight.plot"
local recipe = require "brakelight.recipe"

local N = recipe.small() and 2000 or 100000
local T, KMIN, SEED = 8000.0, 80.0, 2026
local THICK = 0.0035 * 19.3          -- 35 um of tungsten, g/cm^2
local function sampler()
  return bl.sampler{ particle = "electron", target = "W", T = T, kmin = KMIN,
                     seed = SEED, events = N }
end

local h = events.write{ sampler = sampler(), format = "hepmc3",
                        output = recipe.path("tungsten-events.hepmc3") }
local l = events.write{ sampler = sampler(), format = "lhe",
                        output = recipe.path("tungsten-events.lhe") }
local s = sampler()
local info = s:info()
local per_gram = bl.cross_section{ particle = "electron", target = "W", T = T,
                                   kmin = KMIN, rtol = 1e-3 }.per_gram

-- photon angle against energy: quantiles of gamma0 theta_k in 12 bins of ln k
local NB = 12
local bins = {}
for b = 1, NB do bins[b] = {} end
local nel = 0
local g0 = info.E0 / info.mass
for e in s:iter() do
  local k = e.k
  local b = math.floor(math.log(k[1] / KMIN) / math.log(T / KMIN) * NB) + 1
  if b > NB then b = NB end
  local th = math.atan(math.sqrt(k[2] * k[2] + k[3] * k[3]) / k[4])
  bins[b][#bins[b] + 1] = th * g0
  if e.hit == "electron" then nel = nel + 1 end
end
local st = s:stats()
local xs, q10, q50, q90 = {}, {}, {}, {}
for b = 1, NB do
  local t = bins[b]
  if #t >= 10 then
    table.sort(t)
    xs[#xs + 1] = KMIN * (T / KMIN) ^ ((b - 0.5) / NB)
    q10[#q10 + 1] = t[math.floor(0.1 * #t) + 1]
    q50[#q50 + 1] = t[math.floor(0.5 * #t) + 1]
    q90[#q90 + 1] = t[math.floor(0.9 * #t) + 1]
  end
end

print(string.format("%d events of 8 GeV e- on W, %g < k < %g MeV, seed %d",
                    N, KMIN, T, SEED))
print(string.format("sigma %.5g +- %.2g mb (setup), %.5g +- %.2g mb (this run)",
                    info.sigma, info.err, st.sigma, st.err))
print(string.format("unweighting efficiency %.3f, overweights %d (excess %.2g of events)",
                    st.efficiency, st.overweights, st.excess / N))
print(string.format("photons above %g MeV per electron in 35 um W: %.4g",
                    KMIN, info.sigma * per_gram * THICK))
print(string.format("events on the atomic electrons: %.2f %%", 100 * nel / N))
print("files: " .. h.path .. ", " .. l.path)

plot{ output = recipe.path("tungsten-events-angles.png"),
      title = "8 GeV e- on 35 um W: photon angle against energy",
      x = { label = "photon energy k", unit = "MeV", log = true },
      y = { label = "gamma0 theta_k", log = true },
      series = { { label = "10 %", x = xs, y = q10 },
                 { label = "median", x = xs, y = q50 },
                 { label = "90 %", x = xs, y = q90 } } }
