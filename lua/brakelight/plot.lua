--[[
  brakelight.plot -- line plots through gnuplot (PNG or SVG), pure Lua

    local plot = require "brakelight.plot"    -- also brakelight.plot in
    plot{                                     -- the runner
      output = "spectra.svg",                 -- .png or .svg
      title  = "Photon spectra, 10 GeV electrons",
      x = { label = "photon energy k", unit = "MeV", log = true },
      y = { label = "k dsigma/dk", unit = "mb" },   -- log chosen if omitted
      series = { { label = "C",  x = {...}, y = {...} },
                 { label = "Pb", x = {...}, y = {...} } },
    }

  Series may also come from scan records:
      plot{ output =, records = recs, x = "k", y = "dsdk", by = "target" }
  (x, y name columns; `by` names the column, or a list of columns, whose
  values split the records into series; labels and units come from
  `units` = {col = unit} or brakelight.scan.units).

  Axes: `log` true/false; when omitted an axis is logarithmic if every
  value is positive and they span two decades or more.  The unit goes
  in brackets after the label.  One line (with small markers) per series,
  a legend naming them.  The look: white background, light dotted grid,
  no top or right border, a palette of our own.

  Writes three files next to the image: IMAGE.dat (the data, one block
  per series, each headed by its label), IMAGE.gp (the gnuplot script,
  which reads IMAGE.dat from its own directory) and the image, e.g.
  x.png.dat, x.png.gp, x.png: every image has files of its own.  Each is
  written whole and renamed into place (the image by gnuplot into a
  temporary name first).  Texts (title, labels, series names) go into the
  script as single-quoted gnuplot strings with quotes doubled and line
  breaks and other control characters replaced by spaces, and without
  enhanced-text markup: no text can end the string, start a command or
  a substitution, or turn into sub- or superscripts.
  In a shard run (--shard, a Slurm shard, a -j worker) plot draws
  nothing and returns false and why: the run on the merged output draws.
  Without
  gnuplot (or if it fails) the data and script are still written, a
  message says so on stderr, and plot returns false and the message;
  with `strict = true` it raises instead.  On success it returns true and
  { image =, data =, script = }.
]]

local plot = {}
local format, concat = string.format, table.concat
local compat = require "brakelight.compat"
local scanfile = require "brakelight.scanfile"

-- our palette: deep teal, brick, ochre, slate blue, olive, plum, graphite
plot.palette = { "#00717a", "#b5442f", "#c98d1c", "#4a5fa8", "#6b8a2a",
                 "#8e4585", "#4d4d4d", "#1f9e89" }

local function fail(fmt, ...)
  error(format("bad argument #1 to 'plot' (" .. fmt .. ")", ...), 3)
end

--[[ A text as a gnuplot string: single quotes (no backslash escapes, no
     backquote substitution inside), a quote doubled, control characters
     (line breaks first) as spaces. ]]
local function gq(s)
  s = tostring(s):gsub("[%c]", " "):gsub("'", "''")
  return "'" .. s .. "'"
end
plot.quote = gq

local function shq(s)
  return "'" .. tostring(s):gsub("'", "'\\''") .. "'"
end

--[[ Build series from scan records. ]]
local function fromrecords(spec)
  local xs, ys = spec.x, spec.y
  local xc = type(xs) == "table" and xs.column or xs
  local yc = type(ys) == "table" and ys.column or ys
  if type(xc) ~= "string" or type(yc) ~= "string" then
    fail("with 'records', x and y must name columns")
  end
  local by = spec.by
  if type(by) == "string" then by = { by } end
  local series, index = {}, {}
  for i, r in ipairs(spec.records) do
    local parts = {}
    for j, c in ipairs(by or {}) do parts[j] = tostring(r[c]) end
    local label = #parts > 0 and concat(parts, ", ") or yc
    local s = index[label]
    if not s then
      s = { label = label, x = {}, y = {} }
      index[label] = s
      series[#series + 1] = s
    end
    local x, y = r[xc], r[yc]
    if type(x) ~= "number" or type(y) ~= "number" then
      fail("record %d: columns '%s' and '%s' must be numbers", i, xc, yc)
    end
    s.x[#s.x + 1] = x
    s.y[#s.y + 1] = y
  end
  local units = {}
  local ok, scan = pcall(require, "brakelight.scan")
  if ok then for k, v in pairs(scan.units) do units[k] = v end end
  for k, v in pairs(spec.units or {}) do units[k] = v end
  local function axis(a, c)
    local t = type(a) == "table" and a or {}
    return { label = t.label or c, unit = t.unit or units[c], log = t.log }
  end
  return series, axis(xs, xc), axis(ys, yc)
end

--[[ Should an axis be logarithmic? (all positive, >= 2 decades) ]]
local function autolog(series, field)
  local lo, hi = math.huge, -math.huge
  for _, s in ipairs(series) do
    for _, v in ipairs(s[field]) do
      if v == v then  -- NaN skipped
        if v <= 0 then return false end
        if v < lo then lo = v end
        if v > hi then hi = v end
      end
    end
  end
  return hi > 0 and lo > 0 and hi / lo >= 100
end

local function axislabel(a)
  local l = a.label or ""
  if a.unit and a.unit ~= "" and a.unit ~= "1" then l = l .. " [" .. a.unit .. "]" end
  return l
end


--[[ Is gnuplot on the PATH? ]]
function plot.have_gnuplot()
  return compat.execute("command -v gnuplot >/dev/null 2>&1")
end


function plot.draw(spec)
  if type(spec) ~= "table" then fail("table expected, got %s", type(spec)) end
  local out = spec.output
  if type(out) ~= "string" then fail("field 'output' (file name) missing") end
  local ext = out:lower():match("%.(%w+)$")
  if ext ~= "png" and ext ~= "svg" then
    fail("field 'output' must end in .png or .svg, got '%s'", out)
  end
  local series, xa, ya
  if spec.records then
    series, xa, ya = fromrecords(spec)
  else
    series = spec.series
    xa = type(spec.x) == "table" and spec.x or { label = spec.x }
    ya = type(spec.y) == "table" and spec.y or { label = spec.y }
  end
  if type(series) ~= "table" or #series == 0 then
    fail("no series to plot (give 'series' or 'records')")
  end
  for i, s in ipairs(series) do
    if type(s.x) ~= "table" or type(s.y) ~= "table" or #s.x ~= #s.y or #s.x == 0 then
      fail("series #%d needs x and y arrays of equal, non-zero length", i)
    end
  end
  for _, a in ipairs({ xa, ya }) do
    if a.range ~= nil and (type(a.range) ~= "table" or
       type(a.range[1]) ~= "number" or type(a.range[2]) ~= "number") then
      fail("an axis range must be {lo, hi} (numbers)")
    end
  end
  if spec.size ~= nil and (type(spec.size) ~= "table" or
     compat.mtype(spec.size[1]) ~= "integer" or compat.mtype(spec.size[2]) ~= "integer") then
    fail("field 'size' must be {width, height} in pixels (integers)")
  end
  -- a shard run draws nothing: the run on the merged output does
  local ss = package.loaded["brakelight.session"]
  if type(ss) == "table" and (ss.worker or (ss.shards or 1) > 1) then
    local m = format("plot: %s not drawn in shard %d of %d (the run on the " ..
                     "merged output draws it)", out, ss.shard or 0, ss.shards or 0)
    return false, m
  end
  local xlog = xa.log
  if xlog == nil then xlog = autolog(series, "x") end
  local ylog = ya.log
  if ylog == nil then ylog = autolog(series, "y") end

  local dir, base = out:match("^(.*[/\\])([^/\\]*)$")
  if not dir then dir, base = "", out end
  local datname, gpname = base .. ".dat", base .. ".gp"

  -- the data: one block per series, blocks separated by two blank lines
  local d = { format("# brakelight.plot data for %s; columns: x y; one " ..
                     "block per series (gnuplot index 0, 1, ...)", base) }
  for i, s in ipairs(series) do
    if i > 1 then d[#d + 1] = "\n" end
    d[#d + 1] = format("# series %d: %s", i,
                       (tostring(s.label or i):gsub("%c", " ")))
    for j = 1, #s.x do
      d[#d + 1] = format("%.10g %.10g", s.x[j], s.y[j])
    end
  end
  local okw, msg = scanfile.write_text(dir .. datname, concat(d, "\n") .. "\n")
  if not okw then error(format("plot: cannot write '%s': %s", dir .. datname, msg), 2) end

  local w, h = 800, 520
  if type(spec.size) == "table" then w, h = spec.size[1], spec.size[2] end
  local g = {
    "# gnuplot script written by brakelight.plot; run in this directory:",
    "#   gnuplot " .. gpname,
    ext == "png"
      and format("set terminal pngcairo size %d,%d font 'Sans,11' " ..
                 "background rgb 'white'", w, h)
      or format("set terminal svg size %d,%d font 'Sans,11' " ..
                "background rgb 'white' dynamic", w, h),
    "# the image (brakelight.plot passes a temporary name as 'out')",
    "if (!exists('out')) out = " .. gq(base),
    "set output out",
    "set encoding utf8",
    "set border 3 lw 1.2 lc rgb '#333333'",
    "set tics nomirror out scale 0.6",
    "set grid xtics ytics mxtics mytics lt 1 lw 0.6 lc rgb '#dddddd' dt 3",
    "set key outside right top Left reverse noopaque samplen 2.5 spacing 1.3",
    "set xlabel " .. gq(axislabel(xa)) .. " noenhanced",
    "set ylabel " .. gq(axislabel(ya)) .. " noenhanced",
  }
  if spec.title then
    g[#g + 1] = "set title " .. gq(spec.title) .. " noenhanced font 'Sans,12'"
  end
  if xlog then g[#g + 1] = "set logscale x 10"; g[#g + 1] = "set format x '10^{%T}'" end
  if ylog then g[#g + 1] = "set logscale y 10"; g[#g + 1] = "set format y '10^{%T}'" end
  if xa.range then g[#g + 1] = format("set xrange [%.17g:%.17g]", xa.range[1], xa.range[2]) end
  if ya.range then g[#g + 1] = format("set yrange [%.17g:%.17g]", ya.range[1], ya.range[2]) end
  local parts = {}
  for i, s in ipairs(series) do
    local color = s.color or plot.palette[(i - 1) % #plot.palette + 1]
    parts[i] = format("%s index %d using 1:2 with linespoints lw 2 pt 7 " ..
                      "ps 0.45 lc rgb %s title %s noenhanced",
                      i == 1 and gq(datname) or "''", i - 1, gq(color),
                      gq(s.label or ("series " .. i)))
  end
  g[#g + 1] = "plot " .. concat(parts, ", \\\n     ")
  okw, msg = scanfile.write_text(dir .. gpname, concat(g, "\n") .. "\n")
  if not okw then error(format("plot: cannot write '%s': %s", dir .. gpname, msg), 2) end

  local info = { image = out, data = dir .. datname, script = dir .. gpname }
  local why
  if not plot.have_gnuplot() then
    why = "gnuplot not found (Debian package gnuplot-nox)"
  else
    -- the image goes to a temporary name, renamed when gnuplot succeeded
    local tmp = scanfile.tmpname(base):gsub("^.*[/\\]", "")
    local cmd = format("cd %s && gnuplot -e %s %s 2>&1", shq(dir ~= "" and dir or "."),
                       shq("out = " .. gq(tmp)), shq(gpname))
    local text, code = compat.capture(cmd)
    if code ~= 0 then
      why = "gnuplot failed: " .. text:gsub("%s+$", "")
      os.remove(dir .. tmp)
    else
      local rok, rerr = os.rename(dir .. tmp, out)
      if not rok then
        os.remove(dir .. tmp)
        why = "cannot rename the image into place: " .. tostring(rerr)
      end
    end
  end
  if why then
    local m = format("plot: %s; the data (%s) and the gnuplot script (%s) " ..
                     "are written: plot them elsewhere", why, info.data,
                     info.script)
    if spec.strict then error(m, 2) end
    io.stderr:write(m, "\n")
    return false, m, info
  end
  return true, info
end


return setmetatable(plot, { __call = function(_, spec) return plot.draw(spec) end })
