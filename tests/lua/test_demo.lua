--[[
  test_demo.lua -- the `make demo` recipe runs, prints an aligned table and
  writes a CSV in the layout it documents (lua/recipes/demo.lua).
  Run: build/brakelight tests/lua/test_demo.lua
  Needs the runner: the demo runs in build/brakelight, as `make demo` runs
  it; the checks of its output run in any Lua host.
]]

local root = (arg and arg[0] or ""):match("^(.-)tests[/\\]lua[/\\][^/\\]+%.lua$")
assert(root, "cannot find the project root from arg[0] = " .. tostring(arg and arg[0]))

-- the build directory: BL_BUILD_DIR (scripts/run-lua-tests.sh --build DIR), else build/
local build = os.getenv("BL_BUILD_DIR") or "build"
build = (build:sub(1, 1) == "/" and build or root .. build) .. "/"

local function quote(s) return "'" .. s:gsub("'", "'\\''") .. "'" end

local csv = os.tmpname()
local cmd = quote(build .. "brakelight") .. " " ..
            quote(root .. "lua/recipes/demo.lua") .. " " .. quote(csv) .. " 2>&1"
package.path = root .. "lua/?.lua;" .. package.path
local out, code = require("brakelight.compat").capture(cmd)
assert(code == 0, "demo failed:\n" .. out)
assert(out:find("[mb/MeV]", 1, true), "no unit line in the printed table")
assert(out:find("CSV written to " .. csv, 1, true), out)

local f = assert(io.open(csv))
local lines = {}
for l in f:lines() do lines[#lines + 1] = l end
f:close()
os.remove(csv)

local i = 1
while lines[i] and lines[i]:sub(1, 1) == "#" do i = i + 1 end
assert(i > 3, "expected comment lines first")
assert(lines[1]:find("brakelight " .. require("brakelight")._VERSION, 1, true),
       "first comment must name the version: " .. lines[1])
assert(lines[i] == "particle,mass,charge,spin,screening,T,y,k,dsdk,err",
       "header: " .. tostring(lines[i]))

-- rows: 3 projectiles x 2 screenings x 12 fractions y
local rows = {}
for j = i + 1, #lines do
  local f = {}
  for field in (lines[j] .. ","):gmatch("([^,]*),") do f[#f + 1] = field end
  assert(#f == 10, "row " .. j .. " has " .. #f .. " fields")
  local r = { particle = f[1], mass = tonumber(f[2]), spin = tonumber(f[4]),
              screening = f[5], T = tonumber(f[6]), y = tonumber(f[7]),
              k = tonumber(f[8]), dsdk = tonumber(f[9]), err = tonumber(f[10]) }
  assert(r.dsdk and r.dsdk > 0 and r.err >= 0, lines[j])
  assert(math.abs(r.k - r.y * r.T) <= 1e-9 * r.k, "k != y T: " .. lines[j])
  rows[#rows + 1] = r
end
assert(#rows == 72, "expected 72 data rows, got " .. #rows)

-- the scenario as stated: X has the electron's gamma, mass 15 m_e
local me = require("brakelight").particle("electron").mass
local function pick(name, scr, y)
  for _, r in ipairs(rows) do
    if r.particle == name and r.screening == scr and math.abs(r.y - y) < 1e-12 then
      return r
    end
  end
  error("no row for " .. name .. " " .. scr .. " " .. y)
end
local e = pick("electron", "none", 0.5)
local x0 = pick("X (spin 0)", "exponential", 0.97)
local xh = pick("X (spin 1/2)", "exponential", 0.97)
assert(e.T == 20 and x0.T == 300)
assert(math.abs(x0.mass - 15 * me) < 1e-9 and x0.spin == 0 and xh.spin == 0.5)
assert(math.abs(x0.T / x0.mass - e.T / e.mass) < 1e-9, "gamma differs")
-- near the tip the spin-0 spectrum falls far below spin 1/2 (test_physics)
assert(x0.dsdk < 0.5 * xh.dsdk, "spin 0 vs 1/2 at y = 0.97")

print("test_demo: ok")
