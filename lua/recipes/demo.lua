--[[
  demo.lua -- the `make demo` recipe

  Scenario (our own): a 20 MeV electron beam crosses a thin tungsten foil
  (W, Z = 74).  Next to it, a hypothetical projectile "X" of charge +1 at
  T = 300 MeV with the same Lorentz factor as the electron:

      T_X / m_X = T_e / m_e   =>   m_X = (300 / 20) m_e = 7.66498425 MeV,
      gamma = 1 + T/m = 40.139 for both.

  X is computed once as spin 0 and once as spin 1/2, the electron as spin
  1/2; each with screening "none" (bare nucleus) and "exponential".  Thin
  foil: one atom at a time, cross sections per atom, no transport.

  Prints the six spectra dsigma/dk at the same fractions y = k/T as an
  aligned table, then two ratios that show what the knobs do, and writes
  everything (long format, one line per point) to a CSV file:
  arg[1], or build/demo-spectra.csv under the project root.

  Usage:  build/brakelight lua/recipes/demo.lua [out.csv]
]]

local bl = require "brakelight"
local tabular = require "brakelight.tabular"

local ME = bl.particle("electron").mass   -- MeV
local TARGET = "W"
local T_E, T_X = 20.0, 300.0              -- kinetic energies, MeV
local M_X = T_X / T_E * ME                -- same gamma as the electron
local RTOL = 1e-3
local Y = { 0.02, 0.05, 0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9, 0.97 }
local SCREENINGS = { "none", "exponential" }


--[[ Default CSV path: build/ next to lua/ when run as lua/recipes/demo.lua. ]]
local function default_csv()
  local root = (arg and arg[0] or ""):match("^(.-)lua[/\\]recipes[/\\]demo%.lua$")
  if root == nil then root = "" end
  return root .. "build/demo-spectra.csv"
end

local csvpath = (arg and arg[1]) or default_csv()

-- the projectiles: a preset and two custom particles of mass M_X
local beams = {
  { label = "e-", particle = bl.particle("electron"), T = T_E },
  { label = "X s=1/2", T = T_X,
    particle = bl.particle{ name = "X (spin 1/2)", mass = M_X, charge = 1,
                            spin = 0.5 } },
  { label = "X s=0", T = T_X,
    particle = bl.particle{ name = "X (spin 0)", mass = M_X, charge = 1,
                            spin = 0 } },
}

-- compute every spectrum; keep the warnings, each once with the runs it
-- concerns
local runs, warnings, seen = {}, {}, {}
local function note(list, who)
  for _, w in ipairs(list) do
    if not seen[w] then
      seen[w] = {}
      warnings[#warnings + 1] = w
    end
    table.insert(seen[w], who)
  end
end
local clock0 = os.clock()
for _, b in ipairs(beams) do
  for _, s in ipairs(SCREENINGS) do
    local sp = bl.spectrum{ particle = b.particle, target = TARGET, T = b.T,
                            y = Y, screening = s, rtol = RTOL }
    runs[#runs + 1] = { beam = b, screening = s, sp = sp }
    note(sp.warnings, b.particle.name .. " " .. s)
  end
end
local seconds = os.clock() - clock0

local settings = runs[1].sp.settings
print(string.format("brakelight %s demo: bremsstrahlung on a thin %s foil " ..
                    "(Z = %d), method %s, rtol %g, cross sections per atom",
                    bl._VERSION, settings.target.symbol, settings.target.Z,
                    settings.method, RTOL))
print(string.format("electron T = %g MeV (m = %.8g MeV); hypothetical X: " ..
                    "charge +1, T = %g MeV, m = %.8g MeV (same gamma = %.5g)",
                    T_E, ME, T_X, M_X, 1 + T_E / ME))
print()

-- table 1: the spectra
local columns = { { title = "y", unit = "1", fmt = "%.2f" } }
for _, r in ipairs(runs) do
  columns[#columns + 1] = { title = r.beam.label .. " " ..
                            (r.screening == "none" and "none" or "exp"),
                            unit = r.sp.units.dsdk, fmt = "%.4e" }
end
local rows = {}
for i, y in ipairs(Y) do
  local row = { y }
  for _, r in ipairs(runs) do row[#row + 1] = r.sp.dsdk[i] end
  rows[i] = row
end
print("dsigma/dk at photon energy k = y T (screening none / exp = exponential)")
io.write(tabular.format(columns, rows))
print()

-- table 2: ratios that isolate spin, screening and mass
local function run(label, s)
  for _, r in ipairs(runs) do
    if r.beam.label == label and r.screening == s then return r.sp end
  end
end
local xh, x0 = run("X s=1/2", "exponential"), run("X s=0", "exponential")
local en, ee = run("e-", "none"), run("e-", "exponential")
local xhn = run("X s=1/2", "none")
local rcols = {
  { title = "y", unit = "1", fmt = "%.2f" },
  { title = "X spin0/spin1/2", unit = "1", fmt = "%.4f" },
  { title = "e- exp/none", unit = "1", fmt = "%.4f" },
  { title = "X exp/none", unit = "1", fmt = "%.4f" },
  { title = "X/e- scaled none", unit = "1", fmt = "%.4f" },
}
local rrows = {}
for i, y in ipairs(Y) do
  rrows[i] = { y, x0.dsdk[i] / xh.dsdk[i], ee.dsdk[i] / en.dsdk[i],
               xh.dsdk[i] / xhn.dsdk[i],
               (M_X / ME)^2 * xhn.dsdk[i] / en.dsdk[i] * (T_X / T_E) }
end
print("ratios at equal y (exp = exponential screening); last column: " ..
      "(m_X/m_e)^2 (k dsigma/dk)_X / (k dsigma/dk)_e-,\n" ..
      "screening none, spin 1/2: 1 if the cross section scales as m^-2 " ..
      "at equal gamma, as the Born formula for a bare nucleus does")
io.write(tabular.format(rcols, rrows))
print()

-- table 3: what the foil does to the beam and how many photons it makes,
-- electrons with the module's defaults (Hartree-Fock screening, atomic
-- electrons, uniform nucleus, corrections where they hold); the foil is
-- 0.1 mm of tungsten, 0.193 g/cm^2 at the material's density
do
  local foil = bl.material(TARGET)
  local t = 0.01 * foil.density
  local el = bl.energy_loss{ particle = "electron", target = TARGET, T = T_E,
                             rtol = RTOL }
  local py = bl.photon_yield{ particle = "electron", target = TARGET, T = T_E,
                              thickness = t, kmin = 0.1 * T_E, bins = 3,
                              rtol = RTOL }
  print(string.format("electrons, 0.1 mm %s foil (%.4g g/cm^2 = %.3g X0, " ..
                      "method %s): radiated %.4g MeV cm^2/g (%.3g E/X0);",
                      TARGET, t, py.thickness_X0, el.settings.method, el.dedx,
                      el.dedx / el.E_over_X0))
  io.write("photons per electron above 0.1 T:")
  for i = 1, #py.photons do
    io.write(string.format("  %g-%g MeV: %.4g", py.k_low[i], py.k_high[i],
                           py.photons[i]))
  end
  print(string.format("  (total %.4g; %s)", py.total, py.note))
  print()
  note(el.warnings, "electron energy loss")
  note(py.warnings, "electron photon yield")
end

if #warnings > 0 then
  print("warnings:")
  for _, w in ipairs(warnings) do
    print("  " .. w)
    print("    for: " .. table.concat(seen[w], ", "))
  end
  print()
end

-- the CSV: long format, one line per (projectile, screening, y)
local ccols = {
  { title = "particle" }, { title = "mass", unit = "MeV" },
  { title = "charge", unit = "e" }, { title = "spin", unit = "hbar" },
  { title = "screening" }, { title = "T", unit = "MeV" },
  { title = "y", unit = "1" }, { title = "k", unit = "MeV" },
  { title = "dsdk", unit = "mb/MeV" }, { title = "err", unit = "mb/MeV" },
}
local crows = {}
for _, r in ipairs(runs) do
  local p, sp = r.beam.particle, r.sp
  for i = 1, #sp.k do
    crows[#crows + 1] = { p.name, p.mass, p.charge, p.spin, r.screening,
                          sp.settings.T, sp.y[i], sp.k[i], sp.dsdk[i],
                          sp.err[i] }
  end
end
local comments = {
  string.format("brakelight %s demo spectra (bremsstrahlung dsigma/dk " ..
                "per atom)", bl._VERSION),
  string.format("target %s (Z = %d), thin foil; method %s; rtol %g; " ..
                "nucleus %s; atomic electrons %s", settings.target.symbol,
                settings.target.Z, settings.method, RTOL, settings.nucleus,
                tostring(settings.electrons)),
  string.format("X is hypothetical: charge +1, mass %.10g MeV = (%g/%g) " ..
                "m_e, so that gamma equals the %g MeV electron's", M_X, T_X,
                T_E, T_E),
}
for _, w in ipairs(warnings) do
  comments[#comments + 1] = "warning: " .. w .. " [" ..
                            table.concat(seen[w], ", ") .. "]"
end
local ok, msg = tabular.write_csv(csvpath, ccols, crows, comments)
if not ok then
  error("cannot write the CSV file: " .. tostring(msg), 0)
end
print(string.format("%d points in %.2f s; CSV written to %s", #crows,
                    seconds, csvpath))
