--[[
  test_stock_lua.lua -- the module loads in the stock lua5.4 interpreter
  (issue 2 §1, §6) with package.cpath reaching build/, next to the pure-Lua
  helpers of lua/brakelight/, and gives the numbers the runner gives.
  Run from anywhere: build/brakelight tests/lua/test_stock_lua.lua
]]

local bl = require "brakelight"
local compat = require "brakelight.compat"

local root = (arg and arg[0] or ""):match("^(.-)tests[/\\]lua[/\\][^/\\]+%.lua$")
assert(root, "cannot find the project root from arg[0] = " .. tostring(arg and arg[0]))

-- the build directory: BL_BUILD_DIR (scripts/run-lua-tests.sh --build DIR), else build/
local build = os.getenv("BL_BUILD_DIR") or "build"
build = (build:sub(1, 1) == "/" and build or root .. build) .. "/"

local function quote(s) return "'" .. s:gsub("'", "'\\''") .. "'" end

local function exists(path)
  local f = io.open(path)
  if f then f:close() end
  return f ~= nil
end

-- nothing in lua/ may shadow the C module for require "brakelight"
assert(not exists(root .. "lua/brakelight.lua"),
       "lua/brakelight.lua would shadow the C module")
assert(not exists(root .. "lua/brakelight/init.lua"),
       "lua/brakelight/init.lua would shadow the C module")
assert(exists(build .. "brakelight.so"), build .. "brakelight.so missing")

local opts = 'particle = "electron", target = "Pb", T = 10, k = 5, rtol = 1e-6'
local script = [[
local root, build = ...
package.cpath = build .. "?.so;" .. package.cpath
package.path = root .. "lua/?.lua;" .. package.path
local bl = require "brakelight"
local tabular = require "brakelight.tabular"
assert(type(bl.dsdk) == "function", "require 'brakelight' is not the C module")
assert(package.searchpath("brakelight", package.cpath), "not found on cpath")
assert(type(tabular.format) == "function")
local ok, msg = pcall(bl.dsdk, { particle = "electron", target = "Pb", T = -1, k = 5 })
assert(not ok and msg:find("field 'T'", 1, true), msg)
print(bl._VERSION)
print(string.format("%.17g", (bl.dsdk{ ]] .. opts .. [[ })))
]]
local tmp = os.tmpname()
local f = assert(io.open(tmp, "w"))
f:write(script)
f:close()
local out, code = compat.capture("lua5.4 " .. quote(tmp) .. " " .. quote(root) .. " " .. quote(build) .. " 2>&1")
os.remove(tmp)
assert(code == 0, string.format("stock lua5.4 failed (exit status %s):\n%s",
                                tostring(code), out))
local version, value = out:match("^([^\n]*)\n([^\n]*)\n$")
assert(version == bl._VERSION, "version from stock lua5.4: " .. out)
local here = bl.dsdk(compat.loadstring("return { " .. opts .. " }")())
assert(tonumber(value) == here, string.format("stock lua5.4 gives %s, the " ..
       "this interpreter %.17g", tostring(value), here))

print("test_stock_lua: ok")
