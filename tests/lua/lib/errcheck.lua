--[[
  errcheck.lua -- the shape every bad-input error of the module must have,
  shared by tests/lua/test_errors.lua and test_material.lua; in lib/ so
  that the test driver skips it.  Loaded with
  dofile(<dir of the test> .. "lib/errcheck.lua"); returns expect_error.

  expect_error(fname, f, arg, want): f(arg) must fail with a string that
  starts with "bad argument #1 to 'fname' (", contains every string of
  `want` (plain find), starts lowercase and has no final period.  Returns
  the message.
]]

local find = string.find

return function (fname, f, arg, want)
  local ok, msg = pcall(f, arg)
  assert(not ok, fname .. ": expected an error for case " ..
                 table.concat(want, " | "))
  assert(type(msg) == "string", fname .. ": error is not a string")
  local prefix = "bad argument #1 to '" .. fname .. "' ("
  assert(find(msg, prefix, 1, true) == 1,
         "message does not start with " .. prefix .. ": " .. msg)
  for _, w in ipairs(want) do
    assert(find(msg, w, 1, true), "message lacks '" .. w .. "': " .. msg)
  end
  assert(msg:sub(#prefix + 1, #prefix + 1):match("%l"),
         "message should start lowercase: " .. msg)
  assert(msg:sub(-2) ~= ".)", "message should not end with a period: " .. msg)
  return msg
end
