--[[
  energy_loss_table.lua -- radiative energy loss across materials and
  energies

  Scenario (our own): a table for sizing beam dumps: the mean energy an
  electron loses to bremsstrahlung per g/cm^2 of C, Al, Cu, W and Pb at
  kinetic energies from 10 MeV to 10 GeV,

      -dE/dx / rho = (N_A / A) * integral_0^T k dsigma/dk dk,

  with the module's defaults (method "auto": the distorted waves below the
  high-energy switch, the high-energy screening functions with the
  Coulomb correction above; the field of the atomic electrons, a
  uniformly charged nucleus); targets can be any material, here a few
  elements and water.  brakelight.energy_loss
  integrates over the photon energy (the k -> 0 end exactly).  The scan
  writes energy-loss.csv (resumable: kill it and start again) and
  energy-loss.png; a text table goes to stdout.  Also printed: phi_rad =
  integral / (T + m), the energy-loss cross section per formula unit,
  which flattens out at high energy, and the ratio to E/X0.

  Usage: build/brakelight lua/recipes/energy_loss_table.lua [outdir]
         (BRAKELIGHT_SMALL=1: 2 materials x 2 energies, few nodes)
]]

local bl = require "brakelight"
local scan = require "brakelight.scan"
local plot = require "brakelight.plot"
local recipe = require "brakelight.recipe"
local tabular = require "brakelight.tabular"

local small = recipe.small()
local ME = bl.particle("electron").mass

local targets = small and { "C", "Pb" } or { "C", "Al", "Cu", "W", "Pb", "H2O" }
local energies = small and { 10, 1000 } or { 10, 30, 100, 300, 1000, 3000, 10000 }

local records = scan.run{
  title = "radiative energy loss of electrons",
  axes = { { "target", targets }, { "T", energies } },
  fixed = { particle = "electron", rtol = small and 1e-2 or 1e-4 },
  units = { kdsdk_integral = "mb MeV", phi_rad = "mb",
            dEdx = "MeV cm2/g", err = "MeV cm2/g", E_over_X0 = "MeV cm2/g" },
  columns = { "kdsdk_integral", "phi_rad", "dEdx", "err", "E_over_X0" },
  output = recipe.path("energy-loss.csv"),
  each = function(pt)
    local r = bl.energy_loss{ particle = pt.particle, target = pt.target,
                              T = pt.T, rtol = pt.rtol }
    return { kdsdk_integral = r.per_unit, phi_rad = r.per_unit / (pt.T + ME),
             dEdx = r.dedx, err = r.err, E_over_X0 = r.E_over_X0 }
  end,
}

local cols = { { title = "target" }, { title = "T", unit = "MeV", fmt = "%g" },
               { title = "phi_rad", unit = "mb", fmt = "%.4g" },
               { title = "-dE/dx/rho", unit = "MeV cm2/g", fmt = "%.4g" },
               { title = "(dE/dx)/(E/X0)", fmt = "%.4f" } }
local rows = {}
for _, r in ipairs(records) do
  rows[#rows + 1] = { r.target, r.T, r.phi_rad, r.dEdx, r.dEdx / r.E_over_X0 }
end
io.write(tabular.format(cols, rows))

plot{ output = recipe.path("energy-loss.png"),
      title = "Radiative energy loss of electrons",
      records = records, x = { column = "T", label = "kinetic energy T" },
      y = { column = "dEdx", label = "-dE/dx / rho (radiative)" }, by = "target",
      units = { dEdx = "MeV cm^2/g" } }
