--[[
  brakelight.compat -- what the pure-Lua helpers, recipes and tests need
  from Lua 5.3/5.4, also in Lua 5.1, 5.2 and LuaJIT 2.1 (the helpers are
  written in the common subset of these hosts and take the rest from here).
  In 5.3 and 5.4 every function is the standard one or a thin wrapper.

  compat.mtype(x)       math.type; before 5.3 (every number a float) an
                        integral number of magnitude below 1e15 counts as
                        "integer", any other number as "float", so that
                        compat.inttext and %.15g write it as 5.4 writes the
                        same value (an integer below 1e15 as its digits, a
                        float by %.15g, which gives the same digits there)
  compat.inttext(x)     the text 5.4's tostring gives an integer x
  compat.tointeger(x)   math.tointeger (x itself, if integral, before 5.3)
  compat.idiv(a, b)     floor division a // b of integers
  compat.unpack         table.unpack or unpack
  compat.utf8char(cp)   utf8.char of one code point
  compat.loadstring(text, name)   load of a string (loadstring in 5.1)
  compat.execute(cmd)   os.execute -> true when the command exited with 0
                        (5.1 returns the status number, 5.2+ true or nil)
  compat.capture(cmd)   run a shell command, -> its standard output and exit
                        status (128 + n when killed by signal n).  Not
                        io.popen's close, which in 5.1 and LuaJIT returns no
                        status: the shell appends it to the output
]]

local compat = {}

local floor, format = math.floor, string.format

compat.mtype = math.type or function(x)
  if type(x) ~= "number" then return nil end
  if x == floor(x) and x > -1e15 and x < 1e15 then return "integer" end
  return "float"
end

if math.type then
  compat.inttext = tostring
else
  function compat.inttext(x)
    if x == 0 then return "0" end  -- not "-0"
    return format("%.0f", x)
  end
end

compat.tointeger = math.tointeger or function(x)
  if type(x) == "number" and x == floor(x) and x > -2 ^ 63 and x < 2 ^ 63 then
    return x
  end
  return nil
end

function compat.idiv(a, b)
  return floor(a / b)
end

compat.unpack = table.unpack or unpack

if utf8 then
  compat.utf8char = utf8.char
else
  function compat.utf8char(cp)
    if cp < 0x80 then return string.char(cp) end
    if cp < 0x800 then
      return string.char(0xC0 + floor(cp / 0x40), 0x80 + cp % 0x40)
    end
    if cp < 0x10000 then
      return string.char(0xE0 + floor(cp / 0x1000),
                         0x80 + floor(cp / 0x40) % 0x40, 0x80 + cp % 0x40)
    end
    return string.char(0xF0 + floor(cp / 0x40000),
                       0x80 + floor(cp / 0x1000) % 0x40,
                       0x80 + floor(cp / 0x40) % 0x40, 0x80 + cp % 0x40)
  end
end

function compat.loadstring(text, name)
  return (loadstring or load)(text, name)
end

function compat.execute(cmd)
  local r = os.execute(cmd)
  return r == true or r == 0
end

function compat.capture(cmd)
  local p = assert(io.popen("{ " .. cmd .. "\n}; printf '\\n%d' $?"))
  local text = p:read("*a")
  p:close()
  local out, code = text:match("^(.*)\n(%d+)$")
  return out or text, tonumber(code)
end

return compat
