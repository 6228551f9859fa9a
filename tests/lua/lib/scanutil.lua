--[[
  scanutil.lua -- helpers shared by the scan tests (tests/lua/test_scan*.lua);
  in lib/ so that the test driver, which runs tests/lua/*.lua, skips it.
  Loaded with dofile(root .. "tests/lua/lib/scanutil.lua").
]]

local U = {}

U.root = (arg and arg[0] or ""):match("^(.-)tests[/\\]lua[/\\][^/\\]+%.lua$")
assert(U.root, "cannot find the project root from arg[0]")
if U.root == "" then U.root = "./" end
-- the build directory: BL_BUILD_DIR (scripts/run-lua-tests.sh --build DIR), else build/
local build = os.getenv("BL_BUILD_DIR") or "build"
build = (build:sub(1, 1) == "/" and build or U.root .. build) .. "/"
U.runner = build .. "brakelight"
package.path = U.root .. "lua/?.lua;" .. package.path
local compat = require "brakelight.compat"

function U.q(s) return "'" .. tostring(s):gsub("'", "'\\''") .. "'" end

--[[ A fresh temporary directory. ]]
function U.tmpdir()
  local p = io.popen("mktemp -d")
  local d = p:read("*l")
  p:close()
  return d
end

function U.rmdir(d) os.execute("rm -rf " .. U.q(d)) end

--[[ Run a shell command; returns exit code, stdout, stderr. ]]
function U.sh(cmd)
  local errf = os.tmpname()
  local out, code = compat.capture(cmd .. " 2>" .. U.q(errf))
  local f = io.open(errf)
  local err = f:read("*a")
  f:close()
  os.remove(errf)
  return code, out, err
end

--[[ Run the runner with options `opts` (a string) on script path. ]]
function U.run(opts, script, args, env)
  return U.sh((env or "") .. " " .. U.q(U.runner) .. " " .. (opts or "") ..
              " " .. U.q(script) .. " " .. (args or "") .. " </dev/null")
end

function U.write(path, text)
  local f = assert(io.open(path, "w"))
  f:write(text)
  f:close()
end

function U.read(path)
  local f = io.open(path, "rb")
  if not f then return nil end
  local t = f:read("*a")
  f:close()
  return t
end

--[[ The non-comment lines of a CSV file (header + records). ]]
function U.data(path)
  local t = assert(U.read(path), "missing " .. path)
  return (t:gsub("#[^\n]*\n", ""))
end

--[[ Names of temporary files (.NAME.PID-N.writing) left in directory d. ]]
function U.tmpfiles(d)
  local p = io.popen("ls -a " .. U.q(d))
  local t = {}
  for name in p:lines() do
    if name:find("^%..*%.%d+%-%d+%.writing$") then t[#t + 1] = name end
  end
  p:close()
  return table.concat(t, " ")
end

function U.check(cond, fmt, ...)
  if not cond then error(string.format(fmt, ...), 2) end
end

--[[ Assert that `text` contains the plain string `want`. ]]
function U.has(text, want, what)
  if not tostring(text):find(want, 1, true) then
    error(string.format("%s: expected to find %q in:\n%s", what or "text",
                        want, tostring(text)), 2)
  end
end

return U
