--[[
  brakelight.tabular -- aligned text tables and CSV files, pure Lua

  require "brakelight.tabular" (the C module is "brakelight"; this file
  lives in lua/brakelight/, which is found through package.path).

  A table is described by a list of columns and a list of rows:

    columns = { {title = "y", unit = "1", fmt = "%.3f"},
                {title = "dsdk", unit = "mb/MeV", fmt = "%.4e"}, ... }
    rows    = { {0.1, 445.2}, {0.5, 49.42}, ... }   -- one value per column

  `fmt` (a string.format pattern) formats numbers in text, `csvfmt` in
  CSV; strings are written as they are; nil is an empty cell.  Numbers
  without a pattern use "%.6g" in text and "%.10g" in CSV (integers as
  they are).

  tabular.format(columns, rows)        -> string: title line, unit line,
                                          rule, rows; right-aligned
  tabular.write_csv(path, columns, rows, comments)
                                       -> true, or nil and a message
     comment lines first, each prefixed "# "; then the header (the titles)
     and one line per row; the units go in a "# units:" comment line.
]]

local tabular = {}

local format, rep, concat = string.format, string.rep, table.concat
local compat = require "brakelight.compat"
local mtype = compat.mtype


--[[ Text of one cell: numbers by `fmt` (or `default`), strings as is. ]]
local function cell(value, fmt, default)
  if value == nil then
    return ""
  elseif type(value) == "number" then
    if fmt then return format(fmt, value) end
    if mtype(value) == "integer" then return compat.inttext(value) end
    return format(default, value)
  else
    return tostring(value)
  end
end


--[[ Check the arguments shared by format and write_csv; raise if bad. ]]
local function checkargs(fname, columns, rows)
  if type(columns) ~= "table" or #columns == 0 then
    error(format("bad argument #1 to '%s' (non-empty list of columns " ..
                 "expected, got %s)", fname, type(columns)), 3)
  end
  for i, c in ipairs(columns) do
    if type(c) ~= "table" or type(c.title) ~= "string" then
      error(format("bad argument #1 to '%s' (column #%d must be a table " ..
                   "with a string 'title')", fname, i), 3)
    end
  end
  if type(rows) ~= "table" then
    error(format("bad argument #2 to '%s' (list of rows expected, got %s)",
                 fname, type(rows)), 3)
  end
  for i, r in ipairs(rows) do
    if type(r) ~= "table" then
      error(format("bad argument #2 to '%s' (row #%d is a %s, not a " ..
                   "table)", fname, i, type(r)), 3)
    end
  end
end


--[[
  Aligned text: a title line, a unit line ("[MeV]"; blank when no column
  has a unit), a rule of dashes and one line per row.  Columns are
  right-aligned and separated by two spaces.  Returns the string.
]]
function tabular.format(columns, rows)
  checkargs("format", columns, rows)
  local ncol = #columns
  local text, width = {}, {}
  local hasunit = false
  for j, c in ipairs(columns) do
    width[j] = #c.title
    if c.unit and c.unit ~= "" then
      hasunit = true
      width[j] = math.max(width[j], #c.unit + 2)
    end
  end
  for i, r in ipairs(rows) do
    text[i] = {}
    for j = 1, ncol do
      local s = cell(r[j], columns[j].fmt, "%.6g")
      text[i][j] = s
      if #s > width[j] then width[j] = #s end
    end
  end
  local function line(cells)
    local out = {}
    for j = 1, ncol do
      out[j] = rep(" ", width[j] - #cells[j]) .. cells[j]
    end
    return (concat(out, "  "):gsub("%s+$", ""))
  end
  local lines, titles, units, rule = {}, {}, {}, {}
  for j, c in ipairs(columns) do
    titles[j] = c.title
    units[j] = (c.unit and c.unit ~= "") and "[" .. c.unit .. "]" or ""
    rule[j] = rep("-", width[j])
  end
  lines[#lines + 1] = line(titles)
  if hasunit then lines[#lines + 1] = line(units) end
  lines[#lines + 1] = line(rule)
  for i = 1, #rows do lines[#lines + 1] = line(text[i]) end
  return concat(lines, "\n") .. "\n"
end


--[[ One CSV field: quoted when it holds a comma, a quote or a newline. ]]
local function csvfield(s)
  if s:find('[,"\r\n]') then
    return '"' .. s:gsub('"', '""') .. '"'
  end
  return s
end


--[[
  Write a CSV file: the comment lines (each "# " .. line), a "# units:"
  line when any column has a unit, the header (titles) and the rows.
  Numbers keep 10 significant digits unless the column has a `csvfmt`.
  Returns true, or nil and a message when the file cannot be written.
]]
function tabular.write_csv(path, columns, rows, comments)
  if type(path) ~= "string" then
    error(format("bad argument #1 to 'write_csv' (file name expected, " ..
                 "got %s)", type(path)), 2)
  end
  checkargs("write_csv", columns, rows)
  local out = {}
  for _, c in ipairs(comments or {}) do
    for l in (tostring(c) .. "\n"):gmatch("([^\n]*)\n") do
      out[#out + 1] = "# " .. l
    end
  end
  local titles, units, hasunit = {}, {}, false
  for j, c in ipairs(columns) do
    titles[j] = csvfield(c.title)
    if c.unit and c.unit ~= "" then
      hasunit = true
      units[#units + 1] = c.title .. " = " .. c.unit
    end
  end
  if hasunit then out[#out + 1] = "# units: " .. concat(units, "; ") end
  out[#out + 1] = concat(titles, ",")
  for _, r in ipairs(rows) do
    local f = {}
    for j, c in ipairs(columns) do
      f[j] = csvfield(cell(r[j], c.csvfmt, "%.10g"))
    end
    out[#out + 1] = concat(f, ",")
  end
  local file, msg = io.open(path, "w")
  if not file then return nil, msg end
  local ok, werr = file:write(concat(out, "\n"), "\n")
  local cok, cerr = file:close()
  if not ok then return nil, werr end
  if not cok then return nil, cerr end
  return true
end


return tabular
