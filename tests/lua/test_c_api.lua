--[[
  test_c_api.lua -- the same material computed through the C API alone
  (tests/capi/target_values.c, built as build/target_values) and through
  the Lua module gives identical numbers, bit for bit (17 significant
  digits): the binding converts tables, the core computes.
]]

local bl = require "brakelight"

local root = (arg and arg[0] or ""):match("^(.-)tests[/\\]lua[/\\][^/\\]+%.lua$")
assert(root, "cannot find the project root from arg[0]")
-- the build directory: BL_BUILD_DIR (scripts/run-lua-tests.sh --build DIR), else build/
local build = os.getenv("BL_BUILD_DIR") or "build"
build = (build:sub(1, 1) == "/" and build or root .. build) .. "/"

local function run (material, T, method)
  local cmd = build .. "target_values '" .. material .. "' " .. T .. " "
              .. method
  -- the exit status through the shell (io.popen's close gives none in
  -- Lua 5.1 and LuaJIT): a sanitizer report must fail the test too
  local p = assert(io.popen(cmd .. "; echo \"exit status $?\""))
  local out = p:read("*a")
  p:close()
  local body, status = out:match("^(.*)exit status (%d+)\n$")
  assert(status == "0", "target_values failed (" .. tostring(status)
         .. "): " .. cmd .. "\n" .. out)
  assert(body:find("photons", 1, true), "target_values printed no yield")
  return body
end

local function lua_values (material, T, method)
  local lines = {}
  local function add (name, v, e)
    lines[#lines + 1] = string.format("%s %.17g %.17g", name, v, e)
  end
  local base = { particle = "electron", target = material, T = T,
                  method = method }
  local function opts (extra)
    local o = {}
    for key, v in pairs(base) do o[key] = v end
    for key, v in pairs(extra) do o[key] = v end
    return o
  end
  local s = bl.spectrum(opts{ k = { T / 20, T / 4, T / 2, 3 * T / 4 },
                              threads = 2 })
  for i = 1, 4 do add("dsdk", s.dsdk[i], s.err[i]) end
  local e = bl.energy_loss(opts{})
  add("energy_loss", e.per_unit, e.err)
  local y = bl.photon_yield(opts{ thickness = 0.5, kmin = T / 20, bins = 4 })
  for i = 1, 4 do add("photons", y.photons[i], y.err[i]) end
  return table.concat(lines, "\n") .. "\n"
end

-- the default ("auto": high-energy form, the distorted waves near the
-- tip) on one case, the Born integral on the others
for _, case in ipairs{ { "PbWO4", 20, "born" }, { "H2O", 1e4, "auto" },
                       { "brass", 300, "born" } } do
  local material, T, method = case[1], case[2], case[3]
  local target = material == "brass" and "Cu0.7Zn0.3" or material
  local c, l = run(target, T, method), lua_values(target, T, method)
  if c ~= l then
    error(("C and Lua differ for %s at T = %g MeV:\nC:\n%sLua:\n%s")
          :format(target, T, c, l))
  end
end
print("test_c_api: ok")
