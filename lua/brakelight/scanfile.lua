--[[
  brakelight.scanfile -- scan result files (CSV and JSON): label, key,
  read, write (atomically), pure Lua

  A scan file holds a document:

    doc = {
      layout   = 1,
      tool     = "brakelight 0.1.0",      -- who wrote it
      title    = "...", script = "...",   -- optional
      notes    = { "...", ... },          -- optional free lines
      axes     = { {name =, labels = {...}, unit =, type =}, ... },
      settings = { {name =, label =, unit =}, ... },  -- fixed settings
      shard    = { i, n },                -- this file holds shard i of n
      computation = "hex",                -- fingerprint of the computation
                                          -- (brakelight.scan), optional
      declared = { "dsdk", ... },         -- the scan's `columns`, optional
      columns  = { {name =, kind = "axis"|"value", type =, unit =}, ... },
      records  = { {colname = value, ...}, ... },     -- in point order
    }

  `type` is "number", "string" or "boolean"; a record's values have that
  type (nil for an empty cell).  The points of a scan are the Cartesian
  product of the axes, last axis fastest; a point is named by its key,
  made of the axis names and value labels (scanfile.key).  A point may
  own several records (a returned array gives one record per element);
  they are consecutive.

  CSV layout: comment lines "# ..." (see scanfile.write), one header
  line with the column names, one line per record.  JSON layout: one
  object with the fields above; records are objects with the keys in
  column order, one record per line.  The format follows the file name:
  ".json" is JSON, anything else CSV.

  scanfile.label(v)            -> text naming an axis or setting value,
                                  or nil and the reason it cannot
  scanfile.key(names, labels)  -> the point key
  scanfile.format(path)        -> "csv" or "json"
  scanfile.encode(doc, fmt)    -> the file text
  scanfile.decode(text, fmt, path) -> doc, or nil and a message
  scanfile.read(path)          -> doc; nil, msg, "missing" when the file
                                  does not exist; nil, msg when unreadable
  scanfile.write(path, doc)    -> true, or nil and a message.  Writes a
                                  temporary file of a name of its own
                                  (.NAME.PID-N.writing) in the same
                                  directory, syncs it to disk (fsync, with
                                  the module loaded) and renames it over
                                  `path`: a reader sees the old file or the
                                  new one, never half of one, and two
                                  writers never share a temporary file
  scanfile.write_text(path, text) the same for any text
  scanfile.tmpname(path)       -> a fresh temporary name next to path
  scanfile.is_tmpname(name, base) -> true for a temporary name of base

  A cell that does not read as its column's type (a number column holding
  "xx56.9") is an error naming the file, the line and the column; empty
  cells are nil; "nan", "inf", "-inf" are what the writer writes for
  those numbers.
  scanfile.probe(path)         -> true, or nil and a message when no file
                                  can be created next to `path`
]]

local json = require "brakelight.json"

local scanfile = {}
local format, concat = string.format, table.concat

scanfile.LAYOUT = 1


--[[ Text naming value v (axis value or setting). ]]
function scanfile.label(v)
  local tv = type(v)
  if tv == "number" then
    if v ~= v then return nil, "NaN" end
    if v == math.huge or v == -math.huge then return nil, "infinite" end
    return json.number(v)
  elseif tv == "string" then
    if v == "" then return nil, "an empty string" end
    if v:find("[\r\n]") then return nil, "a string with a line break" end
    return v
  elseif tv == "boolean" then
    return tostring(v)
  elseif tv == "table" or tv == "userdata" then
    local ok, name = pcall(function() return v.name end)
    if ok and type(name) == "string" and name ~= "" then return name end
    local mt = getmetatable(v)
    if type(mt) == "table" and mt.__tostring then return tostring(v) end
    if tv == "table" then
      local ok2, s = pcall(json.encode, v)
      if ok2 then return s end
    end
    return nil, "a " .. tv .. " without a name (give labels = {...})"
  else
    return nil, "a " .. tv
  end
end


--[[ Percent-escape the characters that separate parts of a key. ]]
local function esc(s)
  return (s:gsub("[%%;=]", function(c) return format("%%%02X", c:byte()) end))
end

function scanfile.key(names, labels)
  local parts = {}
  for i, n in ipairs(names) do parts[i] = n .. "=" .. esc(labels[i]) end
  return concat(parts, ";")
end


function scanfile.format(path)
  return path:lower():match("%.json$") and "json" or "csv"
end


-- CSV ----------------------------------------------------------------------

--[[ One CSV field: quoted when it holds a comma, quote, line break or
     leading/trailing space. ]]
local function csvfield(s)
  if s:find('[,"\r\n]') or s:find("^%s") or s:find("%s$") then
    return '"' .. s:gsub('"', '""') .. '"'
  end
  return s
end

--[[ Text of one cell. ]]
local function celltext(v)
  if v == nil then return "" end
  if type(v) == "number" then return json.number(v) end
  return tostring(v)
end

--[[ Split CSV text into rows of fields (quoted fields may span lines). ]]
local function csvrows(text, path, line0)
  local rows, row, field, starts = {}, {}, {}, {}
  local i, n, line = 1, #text, line0
  local rowstart = line0
  local function endfield() row[#row + 1] = concat(field); field = {} end
  local function endrow()
    endfield()
    rows[#rows + 1] = row
    starts[#rows] = rowstart
    row = {}
  end
  while i <= n do
    local c = text:sub(i, i)
    if c == '"' and #field == 0 then
      local j = i + 1
      while true do
        local q = text:find('"', j, true)
        if not q then
          return nil, format("%s:%d: unterminated quoted field", path, line)
        end
        field[#field + 1] = text:sub(j, q - 1)
        local _, nl = text:sub(j, q - 1):gsub("\n", "")
        line = line + nl
        if text:sub(q + 1, q + 1) == '"' then
          field[#field + 1] = '"'
          j = q + 2
        else
          i = q + 1
          break
        end
      end
    elseif c == "," then
      endfield()
      i = i + 1
    elseif c == "\n" or c == "\r" then
      endrow()
      line = line + 1
      rowstart = line
      i = i + ((c == "\r" and text:sub(i + 1, i + 1) == "\n") and 2 or 1)
    else
      local j = text:find('[,\r\n]', i) or n + 1
      field[#field + 1] = text:sub(i, j - 1)
      i = j
    end
  end
  if #field > 0 or #row > 0 then endrow() end
  return rows, nil, starts
end

--[[ One CSV line from a list of strings. ]]
local function csvline(list)
  local f = {}
  for i, s in ipairs(list) do f[i] = csvfield(s) end
  return concat(f, ",")
end

--[[ Name with its unit in brackets, for the comment block. ]]
local function withunit(name, unit)
  if unit and unit ~= "" then return name .. " [" .. unit .. "]" end
  return name
end

--[[ The total number of points of doc's axes. ]]
function scanfile.npoints(doc)
  local n = 1
  for _, a in ipairs(doc.axes) do n = n * #a.labels end
  return n
end

local function oneline(s)
  return (tostring(s):gsub("[\r\n]+", " "))
end

local function encode_csv(doc)
  local out = {}
  local function c(s) out[#out + 1] = "# " .. s end
  c(format("brakelight scan table, layout %d", doc.layout or scanfile.LAYOUT))
  c("tool: " .. oneline(doc.tool or "brakelight"))
  if doc.computation then c("computation: " .. oneline(doc.computation)) end
  if doc.declared and #doc.declared > 0 then
    c("declared columns: " .. csvline(doc.declared))
  end
  if doc.title then c("title: " .. oneline(doc.title)) end
  if doc.script then c("script: " .. oneline(doc.script)) end
  for _, n in ipairs(doc.notes or {}) do c("note: " .. oneline(n)) end
  local total = scanfile.npoints(doc)
  c(format("order: Cartesian product of the axes below, last axis fastest; " ..
           "%d points in all", total))
  local i, n = doc.shard[1], doc.shard[2]
  if n > 1 then
    c(format("shard: %d of %d (points %d, %d, %d, ... of that order)",
             i, n, i, i + n, i + 2 * n))
  else
    c("shard: 1 of 1 (every point)")
  end
  for _, a in ipairs(doc.axes) do
    c("axis " .. withunit(a.name, a.unit) .. ": " .. csvline(a.labels))
  end
  for _, s in ipairs(doc.settings) do
    c("setting " .. withunit(s.name, s.unit) .. ": " .. oneline(s.label))
  end
  for _, col in ipairs(doc.columns) do
    c("column " .. withunit(col.name, col.unit) .. ": " .. col.kind .. " " ..
      col.type)
  end
  local names = {}
  for j, col in ipairs(doc.columns) do names[j] = col.name end
  out[#out + 1] = csvline(names)
  for _, r in ipairs(doc.records) do
    local f = {}
    for j, col in ipairs(doc.columns) do f[j] = celltext(r[col.name]) end
    out[#out + 1] = csvline(f)
  end
  return concat(out, "\n") .. "\n"
end

--[[ Split "name [unit]: rest" into name, unit (or nil), rest. ]]
local function nameunit(s)
  local name, unit, rest = s:match("^([%w_%.%-]+) %[([^%]]*)%]: (.*)$")
  if name then return name, unit, rest end
  name, rest = s:match("^([%w_%.%-]+): ?(.*)$")
  return name, nil, rest
end

--[[ Convert cell text to a value of column type t: value, or nil and the
     reason when the text is not of that type (nil alone: empty). ]]
local function typed(text, t)
  if text == "" then return nil end
  if t == "number" then
    local v = tonumber(text)
    if v == nil then
      if text == "nan" then return 0 / 0 end
      if text == "inf" then return math.huge end
      if text == "-inf" then return -math.huge end
      return nil, "is not a number"
    end
    return v
  elseif t == "boolean" then
    if text == "true" then return true end
    if text == "false" then return false end
    return nil, "is not a boolean (true or false)"
  end
  return text
end

local function decode_csv(text, path)
  local doc = { axes = {}, settings = {}, columns = {}, records = {},
                notes = {} }
  local lineno, pos = 0, 1
  local sawmagic = false
  while true do
    local nl = text:find("\n", pos, true)
    local line = text:sub(pos, (nl or #text + 1) - 1):gsub("\r$", "")
    if line:sub(1, 1) ~= "#" then break end
    lineno = lineno + 1
    local body = line:gsub("^#%s?", "")
    local function bad(what)
      return nil, format("%s:%d: %s", path, lineno, what)
    end
    local lay = body:match("^brakelight scan table, layout (%d+)$")
    if lay then
      sawmagic = true
      doc.layout = tonumber(lay)
    elseif body:find("^tool: ") then doc.tool = body:sub(7)
    elseif body:find("^computation: ") then doc.computation = body:sub(14)
    elseif body:find("^declared columns: ") then
      local rows, msg = csvrows(body:sub(19), path, lineno)
      if not rows then return nil, msg end
      doc.declared = rows[1] or {}
    elseif body:find("^title: ") then doc.title = body:sub(8)
    elseif body:find("^script: ") then doc.script = body:sub(9)
    elseif body:find("^note: ") then doc.notes[#doc.notes + 1] = body:sub(7)
    elseif body:find("^order: ") then -- informative
    elseif body:find("^shard: ") then
      local i, n = body:match("^shard: (%d+) of (%d+)")
      if not i then return bad("bad shard line") end
      doc.shard = { tonumber(i), tonumber(n) }
    elseif body:find("^axis ") then
      local name, unit, rest = nameunit(body:sub(6))
      if not name then return bad("bad axis line") end
      local rows, msg = csvrows(rest, path, lineno)
      if not rows then return nil, msg end
      doc.axes[#doc.axes + 1] = { name = name, unit = unit,
                                  labels = rows[1] or {} }
    elseif body:find("^setting ") then
      local name, unit, rest = nameunit(body:sub(9))
      if not name then return bad("bad setting line") end
      doc.settings[#doc.settings + 1] = { name = name, unit = unit,
                                          label = rest }
    elseif body:find("^column ") then
      local name, unit, rest = nameunit(body:sub(8))
      local kind, t = (rest or ""):match("^(%a+) (%a+)$")
      if not name or not kind then return bad("bad column line") end
      doc.columns[#doc.columns + 1] = { name = name, unit = unit,
                                        kind = kind, type = t }
    end
    if not nl then pos = #text + 1; break end
    pos = nl + 1
  end
  if not sawmagic then
    return nil, format("%s: not a brakelight scan table (no layout line)", path)
  end
  if not doc.shard then return nil, path .. ": no shard line" end
  local rows, msg, starts = csvrows(text:sub(pos), path, lineno + 1)
  if not rows then return nil, msg end
  local header = table.remove(rows, 1)
  table.remove(starts, 1)
  if not header or #header ~= #doc.columns then
    return nil, format("%s:%d: header has %d columns, comment block lists %d",
                       path, lineno + 1, header and #header or 0, #doc.columns)
  end
  for j, col in ipairs(doc.columns) do
    if header[j] ~= col.name then
      return nil, format("%s:%d: column %d is '%s', comment block says '%s'",
                         path, lineno + 1, j, header[j], col.name)
    end
  end
  for r, row in ipairs(rows) do
    if not (#row == 1 and row[1] == "") then  -- skip blank lines
      if #row ~= #doc.columns then
        return nil, format("%s:%d: record %d has %d fields, expected %d",
                           path, starts[r], r, #row, #doc.columns)
      end
      local rec = {}
      for j, col in ipairs(doc.columns) do
        local v, why = typed(row[j], col.type)
        if why then
          return nil, format("%s:%d: column %d ('%s'): %q %s", path,
                             starts[r], j, col.name, row[j], why)
        end
        rec[col.name] = v
      end
      doc.records[#doc.records + 1] = rec
    end
  end
  for _, a in ipairs(doc.axes) do
    for _, col in ipairs(doc.columns) do
      if col.name == a.name then a.type = col.type end
    end
  end
  return doc
end


-- JSON ---------------------------------------------------------------------

local function encode_json(doc)
  local q = json.quote
  local out = {}
  local function field(name, value, last)
    out[#out + 1] = "  " .. q(name) .. ": " .. value .. (last and "" or ",")
  end
  out[#out + 1] = "{"
  field("brakelight_scan_layout", tostring(doc.layout or scanfile.LAYOUT))
  field("tool", q(doc.tool or "brakelight"))
  if doc.computation then field("computation", q(doc.computation)) end
  if doc.declared and #doc.declared > 0 then
    field("declared_columns", json.encode(doc.declared))
  end
  if doc.title then field("title", q(doc.title)) end
  if doc.script then field("script", q(doc.script)) end
  field("notes", json.encode(doc.notes or {}))
  field("order", q("Cartesian product of the axes, last axis fastest"))
  field("points_in_all", tostring(scanfile.npoints(doc)))
  field("shard", json.encode({ doc.shard[1], doc.shard[2] }))
  -- an array of objects, one per line, with the fields `keys` (in that
  -- order) taken from each item; `rename` maps a field to the item's key
  local function objects(items, keys, rename)
    if #items == 0 then return "[]" end
    local lines = {}
    for i, it in ipairs(items) do
      local o = {}
      for _, k in ipairs(keys) do o[k] = it[rename and rename[k] or k] end
      lines[i] = "    " .. json.encode(o, { order = keys })
    end
    return "[\n" .. concat(lines, ",\n") .. "\n  ]"
  end
  field("axes", objects(doc.axes, { "name", "unit", "type", "labels" }))
  field("settings", objects(doc.settings, { "name", "unit", "value" },
                            { value = "label" }))
  field("columns", objects(doc.columns, { "name", "unit", "kind", "type" }))
  local order = {}
  for i, c in ipairs(doc.columns) do order[i] = c.name end
  local recs = {}
  for i, r in ipairs(doc.records) do
    local parts = {}
    for _, name in ipairs(order) do
      local v = r[name]
      if v ~= nil then
        if type(v) == "number" and (v ~= v or v == math.huge or v == -math.huge) then
          v = json.number(v)  -- "nan", "inf": JSON has no such numbers
        end
        parts[#parts + 1] = q(name) .. ":" .. json.encode(v)
      end
    end
    recs[i] = "    {" .. concat(parts, ",") .. "}"
  end
  field("records", #recs > 0 and "[\n" .. concat(recs, ",\n") .. "\n  ]" or "[]",
        true)
  out[#out + 1] = "}"
  return concat(out, "\n") .. "\n"
end

local function decode_json(text, path)
  local ok, t = pcall(json.decode, text)
  if not ok then return nil, path .. ": " .. tostring(t) end
  if type(t) ~= "table" or t.brakelight_scan_layout == nil then
    return nil, path .. ": not a brakelight scan file (no layout field)"
  end
  local function str(v) if v == json.null then return nil end return v end
  local doc = { layout = t.brakelight_scan_layout, tool = str(t.tool),
                title = str(t.title), script = str(t.script),
                notes = t.notes or {}, shard = t.shard, axes = {},
                settings = {}, columns = {}, records = {},
                computation = str(t.computation),
                declared = type(t.declared_columns) == "table" and
                           t.declared_columns or nil }
  if type(doc.shard) ~= "table" or #doc.shard ~= 2 then
    return nil, path .. ": bad or missing 'shard'"
  end
  for i, a in ipairs(t.axes or {}) do
    doc.axes[i] = { name = a.name, unit = str(a.unit), type = str(a.type),
                    labels = a.labels }
  end
  for i, s in ipairs(t.settings or {}) do
    doc.settings[i] = { name = s.name, unit = str(s.unit), label = s.value }
  end
  for i, c in ipairs(t.columns or {}) do
    doc.columns[i] = { name = c.name, unit = str(c.unit), kind = c.kind,
                       type = c.type }
  end
  -- records are written one per line after the line '"records": ['
  local line0 = 0
  local at = text:find('\n  "records": [', 1, true)
  if at then
    local _, nl = text:sub(1, at):gsub("\n", "")
    line0 = nl + 1
  end
  local want = { number = "number", string = "string", boolean = "boolean" }
  for i, r in ipairs(t.records or {}) do
    local rec = {}
    if type(r) ~= "table" then
      return nil, format("%s:%d: record %d is not an object", path, line0 + i, i)
    end
    for j, c in ipairs(doc.columns) do
      local v, why = r[c.name], nil
      if v == json.null then v = nil end
      if c.type == "number" and type(v) == "string" then
        v, why = typed(v, "number")
      elseif v ~= nil and want[c.type] and type(v) ~= want[c.type] then
        why = "is not a " .. c.type
      end
      if why then
        return nil, format("%s:%d: record %d, column %d ('%s'): %s %s", path,
                           line0 + i, i, j, c.name, json.encode(r[c.name]), why)
      end
      rec[c.name] = v
    end
    doc.records[i] = rec
  end
  return doc
end


-- files --------------------------------------------------------------------

function scanfile.encode(doc, fmt)
  if fmt == "json" then return encode_json(doc) end
  return encode_csv(doc)
end

function scanfile.decode(text, fmt, path)
  if fmt == "json" then return decode_json(text, path or "?") end
  return decode_csv(text, path or "?")
end

function scanfile.read(path)
  local f, msg = io.open(path, "rb")
  if not f then
    local missing = tostring(msg):find("No such file", 1, true) ~= nil
    return nil, msg, missing and "missing" or nil
  end
  local text = f:read("*a")
  f:close()
  if text == nil then return nil, "cannot read " .. path end
  return scanfile.decode(text, scanfile.format(path), path)
end

--[[ The system helpers of the module (fsync, pid), or nil without it. ]]
local sys
local function getsys()
  if sys == nil then
    sys = false
    if pcall(require, "brakelight") then
      local ok, m = pcall(require, "brakelight.sys")
      if ok and type(m) == "table" then sys = m end
    end
  end
  return sys or nil
end
scanfile.sys = getsys

--[[ This process's id: from the module, else /proc/self/stat, else 0. ]]
local pid
local function getpid()
  if pid == nil then
    local m = getsys()
    if m then pid = m.pid() end
    if pid == nil then
      local f = io.open("/proc/self/stat", "r")
      pid = f and tonumber((f:read("*l") or ""):match("^(%d+)")) or 0
      if f then f:close() end
    end
  end
  return pid
end
scanfile.pid = getpid

--[[ Temporary name next to path (same directory, so rename is atomic),
     unique to this process and call: .NAME.PID-N.writing ]]
local counter = 0
local function tmpname(path)
  local dir, base = path:match("^(.*[/\\])([^/\\]*)$")
  if not dir then dir, base = "", path end
  counter = counter + 1
  return format("%s.%s.%d-%d.writing", dir, base, getpid(), counter)
end
scanfile.tmpname = tmpname

function scanfile.is_tmpname(name, base)
  local b = name:match("^%.(.*)%.%d+%-%d+%.writing$")
  return b ~= nil and (base == nil or b == base)
end

--[[ Write text to path atomically: a temporary file of its own, flush,
     fsync, rename, fsync of the directory. ]]
function scanfile.write_text(path, text)
  local tmp = tmpname(path)
  local f, msg = io.open(tmp, "wb")
  if not f then return nil, msg end
  local ok, werr = f:write(text)
  local fok, ferr = true, nil
  if ok then fok, ferr = f:flush() end
  local cok, cerr = f:close()
  local m = getsys()
  local sok, serr = true, nil
  if ok and fok and cok and m then sok, serr = m.fsync(tmp) end
  if not (ok and fok and cok and sok) then
    os.remove(tmp)
    return nil, tmp .. ": " .. tostring(werr or ferr or cerr or serr)
  end
  local rok, rerr = os.rename(tmp, path)
  if not rok then
    os.remove(tmp)
    return nil, rerr
  end
  if m then
    local dir = path:match("^(.*)[/\\][^/\\]*$")
    m.fsync(dir == nil and "." or (dir == "" and "/" or dir))  -- the rename
  end
  return true
end

function scanfile.write(path, doc)
  return scanfile.write_text(path, scanfile.encode(doc, scanfile.format(path)))
end

function scanfile.probe(path)
  local tmp = tmpname(path)
  local f, msg = io.open(tmp, "wb")
  if not f then return nil, msg end
  f:close()
  os.remove(tmp)
  return true
end


return scanfile
