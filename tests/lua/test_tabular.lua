--[[
  test_tabular.lua -- lua/brakelight/tabular.lua: aligned text and CSV.
  Run: build/brakelight tests/lua/test_tabular.lua
]]

local tabular = require "brakelight.tabular"
local bl = require "brakelight"

-- the C module and the Lua submodule coexist under one name
assert(type(bl.dsdk) == "function", "require 'brakelight' is not the C module")
assert(type(tabular.format) == "function" and
       type(tabular.write_csv) == "function")

local columns = {
  { title = "y", unit = "1", fmt = "%.2f" },
  { title = "dsdk", unit = "mb/MeV", fmt = "%.3e" },
  { title = "label" },
}
local rows = {
  { 0.1, 445.15624, "a" },
  { 0.5, 49.422448, "long label" },
  { 0.9, 11.57, nil },
}

-- text: title, units, rule, rows; right-aligned, equal widths
do
  local s = tabular.format(columns, rows)
  local lines = {}
  for l in s:gmatch("([^\n]*)\n") do lines[#lines + 1] = l end
  assert(#lines == 6, "expected 6 lines, got " .. #lines .. ":\n" .. s)
  assert(lines[1]:match("^%s*y%s+dsdk%s+label$"), lines[1])
  assert(lines[2]:find("[1]", 1, true) and
         lines[2]:find("[mb/MeV]", 1, true), lines[2])
  assert(lines[3]:match("^[- ]+$"), lines[3])
  assert(lines[4]:find("0.10", 1, true) and
         lines[4]:find("4.452e+02", 1, true), lines[4])
  assert(lines[5]:find("long label", 1, true))
  -- right alignment: the numbers of column 2 end at the same position
  local e4 = select(2, lines[4]:find("4.452e+02", 1, true))
  local e5 = select(2, lines[5]:find("4.942e+01", 1, true))
  local e6 = select(2, lines[6]:find("1.157e+01", 1, true))
  assert(e4 == e5 and e5 == e6, "column 2 not aligned")
  -- the rule is as wide as the widest line of the full-width row
  assert(#lines[3] == #lines[5], "rule width " .. #lines[3] .. " vs " ..
         #lines[5])
end

-- bad arguments
do
  local ok, msg = pcall(tabular.format, {}, rows)
  assert(not ok and msg:find("bad argument #1 to 'format'", 1, true), msg)
  ok, msg = pcall(tabular.format, columns, { 5 })
  assert(not ok and msg:find("row #1", 1, true), msg)
  ok, msg = pcall(tabular.write_csv, nil, columns, rows)
  assert(not ok and msg:find("bad argument #1 to 'write_csv'", 1, true), msg)
end

-- CSV: comments, units line, header, quoting, full precision
do
  local path = os.tmpname()
  local crows = {
    { 0.1, 445.156243551, "plain" },
    { 0.5, 1 / 3, 'with, comma and "quote"' },
  }
  local ok, err = tabular.write_csv(path, columns, crows,
                                    { "first comment", "two\nlines" })
  assert(ok, err)
  local f = assert(io.open(path))
  local text = f:read("*a")
  f:close()
  os.remove(path)
  local lines = {}
  for l in text:gmatch("([^\n]*)\n") do lines[#lines + 1] = l end
  assert(lines[1] == "# first comment", lines[1])
  assert(lines[2] == "# two" and lines[3] == "# lines", text)
  assert(lines[4] == "# units: y = 1; dsdk = mb/MeV", lines[4])
  assert(lines[5] == "y,dsdk,label", lines[5])
  assert(lines[6] == "0.1,445.1562436,plain", lines[6])
  assert(lines[7] == '0.5,0.3333333333,"with, comma and ""quote"""',
         lines[7])
  assert(#lines == 7)
  -- failure to open is a soft failure: nil and a message
  local ok2, msg = tabular.write_csv("/nonexistent-dir/x.csv", columns, crows)
  assert(ok2 == nil and type(msg) == "string", "expected nil, msg")
end

print("test_tabular: ok")
