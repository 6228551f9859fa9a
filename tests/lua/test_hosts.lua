--[[
  test_hosts.lua -- the same scan gives the same files in every Lua host:
  run here (whichever interpreter runs this file: the runner, or lua5.1 ...
  luajit through `make test-lua-hosts`) and through the runner
  build/brakelight (a Lua 5.4 program; this part needs the runner), the
  CSV and JSON outputs are equal byte for byte but for the tool line,
  which names the Lua of each, the computation line (a fingerprint of
  bytecode, which is per Lua) and the script line (the script that ran:
  this file here, the scan script for the runner).  Integers, integral floats (also 2^40),
  fractions, a 15-digit integer and results from the module are in the
  records.
]]

local root = (arg and arg[0] or ""):match("^(.-)tests[/\\]lua[/\\][^/\\]+%.lua$")
assert(root, "cannot find the project root from arg[0] = " .. tostring(arg and arg[0]))
local U = dofile(root .. "tests/lua/lib/scanutil.lua")
local bl = require "brakelight"

local script = [[
local out = ...
local bl = require "brakelight"
bl.scan.run{
  axes = { { "target", { "C", "Pb" } }, { "T", { 10, 100.5, 1e3, 12345678 } },
           { "particle", { "electron", "muon" } } },
  fixed = { rtol = 1e-4 },
  output = out,
  quiet = true,
  each = function(pt)
    local v, e = bl.dsdk(pt:with{ k = 0.5 * pt.T })
    return { dsdk = v, err = e, n = 7, half = 0.5, big = 2 ^ 40,
             big15 = 123456789012345, neg = -3 }
  end,
}
]]

local dir = U.tmpdir()
local ok, err = pcall(function()
  local path = dir .. "/scan.lua"
  U.write(path, script)
  local chunk = assert(loadfile(path))
  for _, ext in ipairs{ "csv", "json" } do
    local here, there = dir .. "/here." .. ext, dir .. "/runner." .. ext
    chunk(here)
    local code, _, se = U.run("-q", path, U.q(there))
    U.check(code == 0, "runner failed: %s", se)
    local a, b = assert(U.read(here)), assert(U.read(there))
    U.has(a, "brakelight " .. bl._VERSION .. " (" .. _VERSION .. ")",
          "tool line of " .. ext)
    local function strip(t)
      local n1, n2, n3
      t, n1 = t:gsub('[^\n]*"?tool"?: [^\n]*\n', "", 1)
      t, n2 = t:gsub('[^\n]*"?script"?: [^\n]*\n', "", 1)
      t, n3 = t:gsub('[^\n]*"?computation"?: [^\n]*\n', "", 1)
      return t, n1 + n2 + n3
    end
    U.check(select(2, strip(a)) == 3 and select(2, strip(b)) == 3,
            "%s: no tool, script and computation lines", ext)
    U.check(strip(a) == strip(b), "%s differs from the runner's:\n%s\n----\n%s",
            ext, a, b)
    U.check(select(2, strip(a):gsub("\n", "")) > 16, "%s: too few lines", ext)
  end
end)
U.rmdir(dir)
if not ok then error(err, 0) end
print("test_hosts: ok (" .. _VERSION .. ")")
