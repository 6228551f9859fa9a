--[[
  numcheck.lua -- two helpers of the numerical Lua tests (test_physics.lua,
  test_integrated.lua); in lib/ so that the test driver skips it.  Loaded
  with dofile(<dir of the test> .. "lib/numcheck.lua"); returns a table:

  rel(a, b)              |a - b| / max(|a|, |b|)
  check(cond, fmt, ...)  raise string.format(fmt, ...) at the caller when
                         cond is false
]]

local M = {}

function M.rel(a, b)
  return math.abs(a - b) / math.max(math.abs(a), math.abs(b))
end

function M.check(cond, fmt, ...)
  if not cond then error(string.format(fmt, ...), 2) end
end

return M
