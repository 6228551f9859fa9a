--[[
  brakelight.json -- a small JSON writer and reader, pure Lua

  Why our own and not lua-cjson: scan files must round-trip every double
  exactly (cjson keeps 14 significant digits by default), must come out
  byte for byte the same from the same data (cjson writes object keys in
  hash order, so two identical runs give different files), and the
  helpers must work in a stock interpreter (Lua 5.1 to 5.4, LuaJIT)
  without extra packages.  This file
  is small and only needs what scan files use.

  json.encode(value [, opts])  -> string
     value: nil (null), boolean, number, string, or table.  A table is an
     array when it is empty or its keys are exactly 1..#t; otherwise an
     object, written with its keys sorted (opts.order = {k1, k2, ...}
     writes these keys first, in this order).  Numbers: integers as
     such, floats with the fewest digits that read back to the same
     double; NaN and infinities are written as null.  Strings are
     escaped as JSON requires (UTF-8 passes through).
  json.decode(text)            -> value, or raises "json: ... at byte N"
     Objects and arrays become tables; null becomes json.null (a unique
     sentinel), so arrays keep their length.
  json.number(x)               -> the shortest round-trip text of number x
]]

local json = {}

local format, concat, byte, char, sub = string.format, table.concat,
  string.byte, string.char, string.sub
local compat = require "brakelight.compat"
local mtype = compat.mtype

json.null = setmetatable({}, { __tostring = function() return "null" end })


--[[ Shortest decimal text of x that reads back to the same number. ]]
function json.number(x)
  if mtype(x) == "integer" then return compat.inttext(x) end
  if x ~= x then return "nan" end
  if x == math.huge then return "inf" end
  if x == -math.huge then return "-inf" end
  for digits = 15, 17 do
    local s = format("%." .. digits .. "g", x)
    if tonumber(s) == x then return s end
  end
  return format("%.17g", x)
end


local escapes = {
  ['"'] = '\\"', ["\\"] = "\\\\", ["\b"] = "\\b", ["\f"] = "\\f",
  ["\n"] = "\\n", ["\r"] = "\\r", ["\t"] = "\\t",
}

--[[ A JSON string literal for s. ]]
local function quote(s)
  return '"' .. s:gsub('[%c"\\]', function(c)
    return escapes[c] or format("\\u%04x", byte(c))
  end) .. '"'
end
json.quote = quote


--[[ Is t an array (empty, or keys exactly 1..#t)? ]]
local function isarray(t)
  local n = #t
  for k in pairs(t) do
    if mtype(k) ~= "integer" or k < 1 or k > n then return false end
  end
  return true
end


--[[ Append the encoding of v to buffer out; `seen` guards against cycles. ]]
local function enc(v, out, seen, order)
  local tv = type(v)
  if v == nil or v == json.null then
    out[#out + 1] = "null"
  elseif tv == "boolean" then
    out[#out + 1] = tostring(v)
  elseif tv == "number" then
    if v ~= v or v == math.huge or v == -math.huge then
      out[#out + 1] = "null"
    else
      out[#out + 1] = json.number(v)
    end
  elseif tv == "string" then
    out[#out + 1] = quote(v)
  elseif tv == "table" then
    if seen[v] then error("json: cannot encode a table that contains itself", 0) end
    seen[v] = true
    if isarray(v) then
      out[#out + 1] = "["
      for i = 1, #v do
        if i > 1 then out[#out + 1] = "," end
        enc(v[i], out, seen)
      end
      out[#out + 1] = "]"
    else
      local keys, first = {}, {}
      for _, k in ipairs(order or {}) do
        if v[k] ~= nil then keys[#keys + 1] = k; first[k] = true end
      end
      local rest = {}
      for k in pairs(v) do
        if type(k) ~= "string" then
          error("json: object keys must be strings, got " .. type(k), 0)
        end
        if not first[k] then rest[#rest + 1] = k end
      end
      table.sort(rest)
      for _, k in ipairs(rest) do keys[#keys + 1] = k end
      out[#out + 1] = "{"
      for i, k in ipairs(keys) do
        if i > 1 then out[#out + 1] = "," end
        out[#out + 1] = quote(k)
        out[#out + 1] = ":"
        enc(v[k], out, seen)
      end
      out[#out + 1] = "}"
    end
    seen[v] = nil
  else
    error("json: cannot encode a " .. tv, 0)
  end
end


function json.encode(v, opts)
  local out = {}
  enc(v, out, {}, opts and opts.order)
  return concat(out)
end


-- reader -----------------------------------------------------------------

local function fail(pos, what)
  error(format("json: %s at byte %d", what, pos), 0)
end

local function skip(s, pos)
  return (s:find("[^ \t\r\n]", pos)) or #s + 1
end

local decodeval

local utf8char = compat.utf8char

local function decstring(s, pos)
  local out, i = {}, pos + 1
  while true do
    local j = s:find('["\\]', i)
    if not j then fail(pos, "unterminated string") end
    out[#out + 1] = sub(s, i, j - 1)
    if sub(s, j, j) == '"' then return concat(out), j + 1 end
    local e = sub(s, j + 1, j + 1)
    local simple = { b = "\b", f = "\f", n = "\n", r = "\r", t = "\t",
                     ['"'] = '"', ["\\"] = "\\", ["/"] = "/" }
    if simple[e] then
      out[#out + 1] = simple[e]
      i = j + 2
    elseif e == "u" then
      local hex = sub(s, j + 2, j + 5)
      if not hex:match("^%x%x%x%x$") then fail(j, "bad \\u escape") end
      local cp = tonumber(hex, 16)
      i = j + 6
      if cp >= 0xD800 and cp <= 0xDBFF and sub(s, i, i + 1) == "\\u" then
        local lo = tonumber(sub(s, i + 2, i + 5), 16)
        if lo and lo >= 0xDC00 and lo <= 0xDFFF then
          cp = 0x10000 + (cp - 0xD800) * 0x400 + (lo - 0xDC00)
          i = i + 6
        end
      end
      out[#out + 1] = utf8char(cp)
    else
      fail(j, "bad escape")
    end
  end
end

function decodeval(s, pos)
  pos = skip(s, pos)
  local c = sub(s, pos, pos)
  if c == "{" then
    local t = {}
    pos = skip(s, pos + 1)
    if sub(s, pos, pos) == "}" then return t, pos + 1 end
    while true do
      if sub(s, pos, pos) ~= '"' then fail(pos, "object key expected") end
      local k
      k, pos = decstring(s, pos)
      pos = skip(s, pos)
      if sub(s, pos, pos) ~= ":" then fail(pos, "':' expected") end
      t[k], pos = decodeval(s, pos + 1)
      pos = skip(s, pos)
      c = sub(s, pos, pos)
      if c == "}" then return t, pos + 1 end
      if c ~= "," then fail(pos, "',' or '}' expected") end
      pos = skip(s, pos + 1)
    end
  elseif c == "[" then
    local t, n = {}, 0
    pos = skip(s, pos + 1)
    if sub(s, pos, pos) == "]" then return t, pos + 1 end
    while true do
      n = n + 1
      t[n], pos = decodeval(s, pos)
      pos = skip(s, pos)
      c = sub(s, pos, pos)
      if c == "]" then return t, pos + 1 end
      if c ~= "," then fail(pos, "',' or ']' expected") end
      pos = pos + 1
    end
  elseif c == '"' then
    return decstring(s, pos)
  elseif s:find("^true", pos) then
    return true, pos + 4
  elseif s:find("^false", pos) then
    return false, pos + 5
  elseif s:find("^null", pos) then
    return json.null, pos + 4
  else
    local num = s:match("^-?%d+%.?%d*[eE]?[-+]?%d*", pos)
    if not num or num == "" or num == "-" then fail(pos, "value expected") end
    local v = compat.tointeger(tonumber(num)) and not num:find("[.eE]")
              and compat.tointeger(tonumber(num)) or tonumber(num)
    if v == nil then fail(pos, "bad number '" .. num .. "'") end
    return v, pos + #num
  end
end


function json.decode(s)
  if type(s) ~= "string" then
    error("bad argument #1 to 'decode' (string expected, got " .. type(s) .. ")", 2)
  end
  local v, pos = decodeval(s, 1)
  pos = skip(s, pos)
  if pos <= #s then fail(pos, "trailing characters") end
  return v
end


return json
