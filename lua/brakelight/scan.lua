--[[
  brakelight.scan -- parameter scans: axes, points, records, resume, shards

    local scan = require "brakelight.scan"
    local records, info = scan.run{
      title  = "dsigma/dk of electrons",          -- optional
      axes   = { { "target", { "C", "Cu", "Pb" } },
                 { "T", { 10, 100, 1000 }, unit = "MeV" },
                 { name = "screening", values = { "none", "exponential" } } },
      fixed  = { particle = "electron", rtol = 1e-3 },  -- every point
      units  = { dsdk = "mb/MeV", err = "mb/MeV" },     -- any column
      columns = { "dsdk", "err" },       -- order of the value columns
      output = "dsdk.csv",               -- optional; ".json" for JSON
      each   = function(pt)
        local v, e = bl.dsdk(pt:with{ k = 0.5 * pt.T })
        return { dsdk = v, err = e }
      end,
    }

  Axes.  Each axis is { name, values [, unit =, labels =] } or
  { name =, values =, unit =, labels = }.  Any option can be an axis:
  the scan does not interpret names.  Values may be numbers, strings,
  booleans or objects (particles, materials: anything with a `name` or a
  __tostring; plain tables are labelled by their JSON text); `labels`
  overrides the text.  Axis values are checked first: an empty list, a
  NaN or infinite number, an empty string, a function, a repeated label
  or a name clash raises an error naming the axis and the value.

  Points and their order.  The points are the Cartesian product of the
  axes, numbered 1..N with the LAST axis varying fastest (row-major, as
  nested loops in axis order).  The order depends only on the axes as
  declared.  A point's key, e.g. "target=Cu;T=100;screening=none", is
  made of the axis names and value labels; resume and merge use it.

  The call.  `each(pt)` gets a point: a table with the fixed settings and
  the axis values (the values themselves, e.g. particle objects), plus
  methods pt:with{...} (a plain copy with more fields; scan.omit as a
  value drops a field), pt:key() and pt:index().  It returns a table of
  named values, each a number, string or boolean (one record), or arrays
  of equal length (one record per element, the scalars repeated); a
  number alone is taken as { value = x }.

  Records.  One table per record: the axis values (numbers, strings,
  booleans; object values by their label) and the returned values.  The
  columns are the axes in order, then `columns`, then other returned
  names in alphabetical order.

  Output and resume.  With `output`, the records are written there
  (scanfile layout: a comment block with the tool version, every axis
  and setting, the shard and the unit of each column).  If the file
  exists, its points are taken as done and skipped: a killed run,
  started again, computes only what is missing.  The file must come from
  the same scan (same axis names, same fixed settings); otherwise the
  scan stops with an error and leaves the file alone.  Every write goes
  to a temporary file in the same directory, renamed over the output:
  an interrupted run never leaves a half-written file, and existing
  results are never replaced by fewer.  The file is rewritten after a
  point unless the last write took more than 1/20 of the time since
  (option checkpoint = seconds sets a fixed interval instead), after an
  error or interruption, and at the end.

  Shards.  Shard i of n holds the points i, i+n, i+2n, ... (round robin,
  so costly corners spread over all shards).  The shard comes from
  spec.shard = {i, n}, else from the runner (--shard I/N, the Slurm
  job-array variables, -j workers), else 1 of 1.  With n > 1 the output
  "dir/name.ext" becomes "dir/name.shard-i-of-n.ext"; points found in
  "dir/name.ext" itself (an earlier merged run) are reused.  Join shard
  files with `brakelight --merge` (brakelight.merge).

  Progress goes to stderr: a bar on a terminal, a line every `every`
  points otherwise, nothing with the runner's --quiet or quiet = true
  (spec.progress = false also silences it, "bar"/"lines" forces a mode).

  Returns records (of this shard, in point order) and info =
  { total =, selected =, computed =, reused =, path =, shard = {i, n} }.

  scan.points(spec)  -> list of points {index =, key =, values = {...}}
  scan.shard_path(output, i, n) -> the shard's file name
  scan.omit          -> sentinel for pt:with
]]

local compat = require "brakelight.compat"
local scanfile = require "brakelight.scanfile"
local progress = require "brakelight.progress"

local scan = {}
local format, concat = string.format, table.concat

scan.omit = setmetatable({}, { __tostring = function() return "scan.omit" end })

-- units of the names brakelight itself uses; spec.units overrides
scan.units = {
  T = "MeV", k = "MeV", E = "MeV", mass = "MeV", y = "1", rtol = "1",
  dsdk = "mb/MeV", d2sigma = "mb/(MeV sr)", theta = "rad", theta_k = "rad",
  theta_p = "rad", phi = "rad", charge = "e", spin = "hbar", Z = "1",
  kmin = "MeV", kmax = "MeV", sigma = "mb", mean_k = "MeV",
  dedx = "MeV cm^2/g", dsdomega = "mb/sr", thickness = "g/cm^2",
  photons = "per incident particle",
}

local RESERVED = { with = true, key = true, index = true }


--[[ A value shown in a message: nan, inf, quoted strings. ]]
local function show(v)
  if type(v) == "number" then
    if v ~= v then return "nan" end
    if v == math.huge then return "inf" end
    if v == -math.huge then return "-inf" end
  elseif type(v) == "string" then
    return format("%q", v)
  end
  return tostring(v)
end


--[[ The runner's description of this process, or nil (stock lua5.4). ]]
local function session()
  local s = package.loaded["brakelight.session"]
  return type(s) == "table" and s or nil
end

--[[ Interrupts: the runner's flag and hold (see src/runner/runner.c);
     in another host no flag, and hold just calls. ]]
local function interrupted()
  local s = session()
  return s and s.interrupted and s.interrupted() or nil
end
local function hold(f, ...)
  local s = session()
  if s and s.hold then return s.hold(f, ...) end
  return f(...)
end
-- try(body, handler): body(); on an error, handler(err) with interrupts
-- held from the moment of the error (no Lua instruction runs between)
local function try(body, handler)
  local s = session()
  if s and s.try then return s.try(body, handler) end
  local ok, err = pcall(body)
  if not ok then return handler(err) end
end


--[[ Two 32-bit sums of the bytes of s (mod two primes), as 16 hex digits;
     plain arithmetic, the same in every Lua. ]]
local function hash(s)
  local h1, h2 = 5381, 52711
  local byte = string.byte
  for i = 1, #s, 64 do
    local t = { byte(s, i, i + 63) }
    for j = 1, #t do
      h1 = (h1 * 257 + t[j]) % 4294967291
      h2 = (h2 * 263 + t[j]) % 4294967279
    end
  end
  return format("%08x%08x", h1, h2)
end


--[[
  Fingerprint of the computation: the bytecode of `each` (string.dump,
  stripped where the Lua can) and, recursively, of the Lua functions it
  reaches through upvalues.  Values of upvalues do not count (a log file
  name or a flag from the environment may differ between the runs of one
  scan): a change of code or of a constant written in the code does.  The
  Lua version is part of it: bytecode differs between Luas (and Lua 5.1,
  5.2 keep line numbers and the chunk name in a dump), so the fingerprint
  is stable across runs of one host, not across hosts.
]]
function scan.fingerprint(f)
  local parts, seen = { _VERSION, type(jit) == "table" and "jit" or "" }, {}
  local function add(fn, depth)
    if seen[fn] then return end
    seen[fn] = true
    local ok, code = pcall(string.dump, fn, true)
    parts[#parts + 1] = ok and code or "C function"
    if not ok or depth > 16 then return end
    for i = 1, 255 do
      local name, v = debug.getupvalue(fn, i)
      if name == nil then break end
      if type(v) == "function" then add(v, depth + 1) end
    end
  end
  add(f, 0)
  return hash(concat(parts, "\0"))
end


--[[ Raise a scan error that names the caller's argument. ]]
local function argerr(fname, fmt, ...)
  error(format("bad argument #1 to '%s' (" .. fmt .. ")", fname, ...), 3)
end

local function checkname(fname, what, name)
  if type(name) ~= "string" or not name:match("^[%a_][%w_%.%-]*$") then
    argerr(fname, "%s name must be a word (letters, digits, _ . -), got %s",
           what, type(name) == "string" and format("%q", name) or type(name))
  end
  if RESERVED[name] then
    argerr(fname, "%s name '%s' is reserved (point method)", what, name)
  end
end

--[[ Check a unit text: one line, no ']' (it ends the unit in CSV). ]]
local function checkunit(fname, name, u)
  if u == nil then return nil end
  if type(u) ~= "string" or u:find("[%]\r\n]") then
    argerr(fname, "unit of '%s' must be a string without ']' or line " ..
           "breaks, got %s", name, tostring(u))
  end
  return u ~= "" and u or nil
end


--[[
  Validate spec and build the scan description:
  { axes = {{name, values, labels, recvals, unit, type}}, settings,
    fixed, total, units, fname }.
]]
local function describe(spec, fname)
  if type(spec) ~= "table" then
    argerr(fname, "table expected, got %s", type(spec))
  end
  local axes, seen = {}, {}
  if type(spec.axes) ~= "table" or #spec.axes == 0 then
    argerr(fname, "field 'axes' must be a non-empty list of axes, got %s",
           type(spec.axes))
  end
  local units = {}
  for k, v in pairs(scan.units) do units[k] = v end
  if spec.units ~= nil then
    if type(spec.units) ~= "table" then
      argerr(fname, "field 'units' must be a table, got %s", type(spec.units))
    end
    for k, v in pairs(spec.units) do units[k] = checkunit(fname, tostring(k), v) end
  end
  for i, a in ipairs(spec.axes) do
    if type(a) ~= "table" then
      argerr(fname, "axis #%d must be a table {name, values}, got %s", i, type(a))
    end
    local name, values = a.name or a[1], a.values or a[2]
    checkname(fname, format("axis #%d", i), name)
    if seen[name] then argerr(fname, "axis '%s' appears twice", name) end
    seen[name] = true
    if type(values) ~= "table" then
      argerr(fname, "axis '%s': values must be a list, got %s", name, type(values))
    end
    local n = values.n or #values
    if n == 0 then argerr(fname, "axis '%s' has no values", name) end
    for k in pairs(values) do
      if k ~= "n" and not (compat.mtype(k) == "integer" and k >= 1 and k <= n) then
        argerr(fname, "axis '%s': values must be a list (1..n), found key %s",
               name, tostring(k))
      end
    end
    local labels, recvals, bylabel = {}, {}, {}
    local ntype = { number = 0, boolean = 0 }
    if a.labels ~= nil and (type(a.labels) ~= "table" or #a.labels ~= n) then
      argerr(fname, "axis '%s': labels must be a list of %d strings", name, n)
    end
    for j = 1, n do
      local v = values[j]
      if v == nil then
        argerr(fname, "axis '%s': value #%d is nil", name, j)
      end
      local lab, why
      if a.labels then
        lab = a.labels[j]
        if type(lab) ~= "string" or lab == "" or lab:find("[\r\n]") then
          argerr(fname, "axis '%s': label #%d must be a one-line non-empty " ..
                 "string, got %s", name, j, tostring(lab))
        end
      else
        lab, why = scanfile.label(v)
        if not lab then
          argerr(fname, "axis '%s': value #%d (%s) is not allowed: %s", name,
                 j, show(v), why)
        end
      end
      if type(v) == "function" or type(v) == "thread" then
        argerr(fname, "axis '%s': value #%d is a %s", name, j, type(v))
      end
      if type(v) == "number" and (v ~= v or v == math.huge or v == -math.huge) then
        argerr(fname, "axis '%s': value #%d is %s", name, j, tostring(v))
      end
      if bylabel[lab] then
        argerr(fname, "axis '%s': values #%d and #%d have the same label " ..
               "'%s' (give labels = {...})", name, bylabel[lab], j, lab)
      end
      bylabel[lab] = j
      labels[j] = lab
      if ntype[type(v)] then ntype[type(v)] = ntype[type(v)] + 1 end
    end
    local t = ntype.number == n and "number" or
              (ntype.boolean == n and "boolean" or "string")
    for j = 1, n do
      local v = values[j]
      recvals[j] = (t == "string" and type(v) ~= "string") and labels[j] or v
    end
    axes[i] = { name = name, values = values, labels = labels, n = n,
                recvals = recvals, type = t,
                unit = checkunit(fname, name, a.unit) or units[name] }
  end
  local fixed = spec.fixed or {}
  if type(fixed) ~= "table" then
    argerr(fname, "field 'fixed' must be a table, got %s", type(fixed))
  end
  local snames = {}
  for k in pairs(fixed) do
    checkname(fname, "fixed setting", k)
    if seen[k] then
      argerr(fname, "'%s' is both an axis and a fixed setting", k)
    end
    snames[#snames + 1] = k
  end
  table.sort(snames)
  local settings = {}
  for i, k in ipairs(snames) do
    local lab, why = scanfile.label(fixed[k])
    if not lab then
      argerr(fname, "fixed setting '%s' (%s) is not allowed: %s", k,
             show(fixed[k]), why)
    end
    settings[i] = { name = k, label = lab, unit = units[k] }
  end
  local total = 1
  for _, a in ipairs(axes) do total = total * a.n end
  if spec.each ~= nil and type(spec.each) ~= "function" then
    argerr(fname, "field 'each' must be a function, got %s", type(spec.each))
  end
  if spec.output ~= nil and (type(spec.output) ~= "string" or spec.output == "") then
    argerr(fname, "field 'output' must be a file name, got %s",
           tostring(spec.output))
  end
  return { axes = axes, settings = settings, fixed = fixed, total = total,
           units = units, fname = fname }
end


--[[ Axis indices of point p (1-based), last axis fastest. ]]
local function indices(d, p)
  local idx, r = {}, p - 1
  for i = #d.axes, 1, -1 do
    local n = d.axes[i].n
    idx[i] = r % n + 1
    r = compat.idiv(r, n)
  end
  return idx
end

local function keyof(d, idx)
  local names, labels = {}, {}
  for i, a in ipairs(d.axes) do
    names[i] = a.name
    labels[i] = a.labels[idx[i]]
  end
  return scanfile.key(names, labels)
end


-- pt:with(extra): a copy of the point's fields with extra's on top
-- (scan.omit removes a field).
local function pointwith(pt, extra)
  local t = {}
  for k, v in pairs(pt) do t[k] = v end
  for k, v in pairs(extra or {}) do
    if v == scan.omit then t[k] = nil else t[k] = v end
  end
  return t
end

--[[ The point table handed to `each`. ]]
local function makepoint(d, p, idx, key)
  local pt = {}
  for k, v in pairs(d.fixed) do pt[k] = v end
  for i, a in ipairs(d.axes) do pt[a.name] = a.values[idx[i]] end
  local mt = {
    __index = {
      with = pointwith,
      key = function() return key end,
      index = function() return p end,
    },
  }
  return setmetatable(pt, mt)
end


function scan.points(spec)
  local d = describe(spec, "points")
  local list = {}
  for p = 1, d.total do
    local idx = indices(d, p)
    local values = {}
    for i, a in ipairs(d.axes) do values[a.name] = a.recvals[idx[i]] end
    list[p] = { index = p, key = keyof(d, idx), values = values }
  end
  return list
end


function scan.shard_path(output, i, n)
  if n <= 1 then return output end
  local stem, ext = output:match("^(.*)(%.[%w]+)$")
  if not stem or stem:match("[/\\]$") or stem == "" then stem, ext = output, "" end
  return format("%s.shard-%d-of-%d%s", stem, i, n, ext)
end


--[[ The shard {i, n}: spec.shard, the runner's, or {1, 1}. ]]
local function getshard(spec, fname)
  local s = spec.shard
  if s ~= nil then
    if type(s) ~= "table" or compat.mtype(s[1]) ~= "integer" or
       compat.mtype(s[2]) ~= "integer" or s[2] < 1 or s[1] < 1 or s[1] > s[2] then
      argerr(fname, "field 'shard' must be {i, n} with 1 <= i <= n, got %s",
             type(s) == "table" and format("{%s, %s}", tostring(s[1]),
                                           tostring(s[2])) or tostring(s))
    end
    return s[1], s[2]
  end
  local ss = session()
  if ss and ss.shard and ss.shards then return ss.shard, ss.shards end
  return 1, 1
end


--[[ Record value of an axis read back from a file -> its label. ]]
local function labelof(a, v)
  if v == nil then return nil end
  if a.type == "number" and type(v) == "number" then
    return (scanfile.label(v))
  end
  return tostring(v)
end


--[[
  Load the records of an existing file into `done` (key -> records), after
  checking it comes from the same scan.  Raises, naming the file, when it
  is unreadable or from another scan; never touches the file.
]]
local function loadinto(d, path, done, selected, fname, strict, ident)
  local doc, msg, why = scanfile.read(path)
  if not doc then
    if why == "missing" then return nil end
    error(format("%s: cannot resume from output '%s': %s (the file is left " ..
                 "as it is; move it away to start afresh)", fname, path,
                 tostring(msg)), 0)
  end
  local function refuse(what)
    error(format("%s: output '%s' holds a different scan (%s); it is left " ..
                 "as it is: choose another output or move it away", fname,
                 path, what), 0)
  end
  if #doc.axes ~= #d.axes then
    refuse(format("%d axes, this scan has %d", #doc.axes, #d.axes))
  end
  for i, a in ipairs(d.axes) do
    if doc.axes[i].name ~= a.name then
      refuse(format("axis #%d is '%s', here '%s'", i, doc.axes[i].name, a.name))
    end
    doc.axes[i].type = doc.axes[i].type or a.type
  end
  local fl = {}
  for _, s in ipairs(doc.settings) do fl[s.name] = s.label end
  for _, s in ipairs(d.settings) do
    if fl[s.name] ~= s.label then
      refuse(format("setting %s = %s, here %s", s.name, tostring(fl[s.name]),
                    s.label))
    end
    fl[s.name] = nil
  end
  local extra = next(fl)
  if extra then refuse(format("setting %s = %s, absent here", extra, fl[extra])) end
  -- the same computation: tool version, declared columns, fingerprint
  local diff = {}
  local version = (doc.tool or ""):match("^brakelight (%S+)")
  if version ~= ident.version then
    diff[#diff + 1] = format("it was written by brakelight %s, this is %s",
                             tostring(version or "(unknown)"), ident.version)
  end
  if doc.computation ~= ident.computation then
    diff[#diff + 1] = doc.computation and
      format("its computation ('each' and what it uses) had fingerprint " ..
             "%s, here %s", doc.computation, ident.computation) or
      "it records no fingerprint of its computation"
  end
  local dc, hc = concat(doc.declared or {}, ","), concat(ident.declared, ",")
  if dc ~= hc then
    diff[#diff + 1] = format("its declared columns are {%s}, here {%s}", dc, hc)
  end
  if #diff > 0 and not ident.accept then
    error(format("%s: output '%s' holds results of another computation: %s; " ..
                 "nothing was computed and the file is left as it is.  To " ..
                 "recompute, move the file away or choose another output; " ..
                 "to keep its results and compute only the missing points " ..
                 "with this code, run again with BRAKELIGHT_ACCEPT=1 in the " ..
                 "environment (or accept = true in the scan)", fname, path,
                 concat(diff, "; ")), 0)
  end
  for _, n in ipairs(doc.notes or {}) do  -- earlier acceptances stay noted
    local a = n:match("^accepted earlier results %((.*)%)$")
    if a then ident.kept[#ident.kept + 1] = a end
  end
  if #diff > 0 then ident.accepted[#ident.accepted + 1] = path .. ": " .. concat(diff, "; ") end
  for _, c in ipairs(doc.columns) do
    if c.kind == "value" then ident.filecols[c.name] = true end
  end
  local valuecols = {}
  for _, c in ipairs(doc.columns) do
    if c.kind == "value" then valuecols[#valuecols + 1] = c end
  end
  local names = {}
  for i, a in ipairs(d.axes) do names[i] = a.name end
  for _, r in ipairs(doc.records) do
    local labels = {}
    for i, a in ipairs(d.axes) do
      labels[i] = labelof(doc.axes[i], r[a.name])
      if labels[i] == nil then refuse("a record without axis '" .. a.name .. "'") end
    end
    local key = scanfile.key(names, labels)
    if selected[key] then
      local list = done[key]
      if not list or list.from ~= path then
        list = { from = path }
        done[key] = list
      end
      local rec = {}
      for i, a in ipairs(d.axes) do
        rec[a.name] = a.recvals[selected[key].idx[i]]
      end
      for _, c in ipairs(valuecols) do rec[c.name] = r[c.name] end
      list[#list + 1] = rec
    elseif strict then
      error(format("%s: output '%s' holds point %s, which is not among " ..
                   "the points of this %s; it is left as it is: choose " ..
                   "another output or move it away", fname, path, key,
                   strict), 0)
    end
  end
  return valuecols
end


--[[ Normalise what `each` returned into a list of value tables. ]]
local function torecords(ret, key, fname)
  if type(ret) == "number" or type(ret) == "string" or type(ret) == "boolean" then
    ret = { value = ret }
  end
  if type(ret) ~= "table" then
    error(format("%s: 'each' returned %s at point %s; expected a table of " ..
                 "named values", fname, type(ret), key), 0)
  end
  local scalars, arrays, len = {}, {}, nil
  for k, v in pairs(ret) do
    if type(k) ~= "string" or not k:match("^[%a_][%w_%.%-]*$") then
      error(format("%s: 'each' returned a value named %s at point %s; names " ..
                   "must be words", fname, tostring(k), key), 0)
    end
    local tv = type(v)
    if tv == "table" then
      local n = #v
      if len and n ~= len then
        error(format("%s: 'each' returned arrays of lengths %d and %d at " ..
                     "point %s", fname, len, n, key), 0)
      end
      len = n
      arrays[k] = v
    elseif tv == "number" or tv == "string" or tv == "boolean" then
      scalars[k] = v
    else
      error(format("%s: 'each' returned a %s for '%s' at point %s", fname, tv,
                   k, key), 0)
    end
  end
  if not len then return { scalars } end
  local list = {}
  for j = 1, len do
    local r = {}
    for k, v in pairs(scalars) do r[k] = v end
    for k, v in pairs(arrays) do
      local x = v[j]
      local tx = type(x)
      if x ~= nil and tx ~= "number" and tx ~= "string" and tx ~= "boolean" then
        error(format("%s: element %d of '%s' is a %s at point %s", fname, j,
                     k, tx, key), 0)
      end
      r[k] = x
    end
    list[j] = r
  end
  return list
end


--[[
  The lock of output `path` (brakelight.sys.lock on PATH.lock), or nil
  without the module.  A lock held by a live run is an error naming it; a
  lock file left by a run that no longer holds it is taken over with a
  note on stderr.
]]
local function takelock(path, fname, script)
  local sys = scanfile.sys()
  if not sys then return nil end
  local lockpath = path .. ".lock"
  local lk, prev, why = sys.lock(lockpath)
  if not lk then
    if why == "held" then
      local who = (prev or ""):gsub("\n+$", ""):gsub("\n", ", ")
      error(format("%s: output '%s' is being written by another run (%s; " ..
                   "lock file '%s'); nothing was computed.  Wait for that " ..
                   "run to end, or stop it, then run again", fname, path,
                   who ~= "" and who or "holder unknown", lockpath), 0)
    end
    error(format("%s: cannot lock output '%s': %s", fname, path,
                 tostring(prev)), 0)
  end
  if prev and prev:find("%S") then
    io.stderr:write(format("%s: note: taking over the lock of output '%s' " ..
                           "left by a run that has ended (%s)\n", fname, path,
                           (prev:gsub("\n+$", ""):gsub("\n", ", "))))
  end
  lk:write(format("pid %d\nhost %s\nstarted %s\nscript %s\n", sys.pid(),
                  sys.host(), os.date("!%Y-%m-%dT%H:%M:%SZ"),
                  tostring(script or "?")))
  -- holding the lock, we are the only writer: temporary files of this
  -- output left by a killed run are garbage
  local dir, base = path:match("^(.*[/\\])([^/\\]*)$")
  if not dir then dir, base = "", path end
  for _, name in ipairs(sys.dir(dir == "" and "." or dir) or {}) do
    if scanfile.is_tmpname(name, base) then os.remove(dir .. name) end
  end
  return lk
end


function scan.run(spec)
  local fname = "scan.run"
  local d = describe(spec, fname)
  if type(spec.each) ~= "function" then
    argerr(fname, "field 'each' must be a function, got %s", type(spec.each))
  end
  local ss = session()
  if spec.shard == nil and ss and ss.shard_error then
    error(fname .. ": " .. ss.shard_error, 2)
  end
  local si, sn = getshard(spec, fname)
  if ss and ss.worker and not spec.output then
    error(fname .. ": a scan run by -j workers needs 'output' (the workers " ..
          "hand their points over through files)", 2)
  end
  -- the points of this shard
  local order, selected = {}, {}
  for p = si, d.total, sn do
    local idx = indices(d, p)
    local key = keyof(d, idx)
    order[#order + 1] = { p = p, idx = idx, key = key }
    selected[key] = order[#order]
  end
  -- output: check writable, load earlier results
  local path = spec.output and scan.shard_path(spec.output, si, sn)
  local done, colseen, valuecols = {}, {}, {}
  local function addcol(name)
    if not colseen[name] then
      colseen[name] = true
      valuecols[#valuecols + 1] = name
    end
  end
  for _, a in ipairs(d.axes) do colseen[a.name] = true end
  local declared = {}
  if spec.columns ~= nil then
    if type(spec.columns) ~= "table" then
      argerr(fname, "field 'columns' must be a list of names, got %s",
             type(spec.columns))
    end
    for _, c in ipairs(spec.columns) do
      checkname(fname, "column", c)
      addcol(c)
      declared[#declared + 1] = c
    end
  end
  local tool, version = "brakelight", "(unknown)"
  local okbl, bl = pcall(require, "brakelight")
  if okbl and type(bl) == "table" and bl._VERSION then
    version = tostring(bl._VERSION)
    tool = "brakelight " .. version
  end
  tool = tool .. " (" .. _VERSION .. ")"
  local script = spec.script or (ss and ss.script) or (arg and arg[0])
  local ident = { version = version, computation = scan.fingerprint(spec.each),
                  declared = declared, filecols = {}, accepted = {}, kept = {},
                  accept = spec.accept == true or
                           os.getenv("BRAKELIGHT_ACCEPT") == "1" }
  local lock
  if path then
    local ok, msg = scanfile.probe(path)
    if not ok then
      error(format("%s: cannot write output '%s': %s", fname, path,
                   tostring(msg)), 2)
    end
  end
  local loaded = false   -- saving is allowed once the output is read
  local function load()
    if not path then return end
    local what = sn > 1 and format("shard %d of %d", si, sn) or "scan"
    if path ~= spec.output then  -- reuse points of an earlier merged file
      local cols = loadinto(d, spec.output, done, selected, fname, nil, ident)
      for _, c in ipairs(cols or {}) do addcol(c.name) end
    end
    local cols = loadinto(d, path, done, selected, fname, what, ident)
    for _, c in ipairs(cols or {}) do addcol(c.name) end
  end

  -- the document, rebuilt for every write
  local function document()
    local recs, types = {}, {}
    for _, o in ipairs(order) do
      for _, r in ipairs(done[o.key] or {}) do
        recs[#recs + 1] = r
        for k, v in pairs(r) do
          local t = types[k]
          local tv = type(v)
          if t == nil then types[k] = tv
          elseif t ~= tv then types[k] = "string" end
        end
      end
    end
    local extra = {}
    for k in pairs(types) do if not colseen[k] then extra[#extra + 1] = k end end
    table.sort(extra)
    for _, k in ipairs(extra) do addcol(k) end
    local columns, axes = {}, {}
    for i, a in ipairs(d.axes) do
      axes[i] = { name = a.name, labels = a.labels, unit = a.unit, type = a.type }
      columns[i] = { name = a.name, kind = "axis", type = a.type, unit = a.unit }
    end
    for _, c in ipairs(valuecols) do
      columns[#columns + 1] = { name = c, kind = "value",
                                type = types[c] or "number", unit = d.units[c] }
    end
    for _, r in ipairs(recs) do  -- mixed-type columns are written as text
      for _, c in ipairs(columns) do
        if c.type == "string" and r[c.name] ~= nil and
           type(r[c.name]) ~= "string" then
          r[c.name] = tostring(r[c.name])
        end
      end
    end
    local notes = {}
    for i, n in ipairs(spec.notes or {}) do notes[i] = tostring(n) end
    local seen = {}
    for _, list in ipairs({ ident.kept, ident.accepted }) do
      for _, a in ipairs(list) do
        if not seen[a] then
          seen[a] = true
          notes[#notes + 1] = "accepted earlier results (" .. a .. ")"
        end
      end
    end
    return { layout = scanfile.LAYOUT, tool = tool, title = spec.title,
             script = script, notes = notes, axes = axes,
             settings = d.settings, shard = { si, sn }, columns = columns,
             computation = ident.computation, declared = declared,
             records = recs }, recs
  end

  -- saving: every write runs with interrupts held, so it always ends;
  -- a failed checkpoint is reported once and retried later, the final
  -- save a few times before it raises
  local clock = (ss and ss.clock) or os.clock
  local lastend, lastcost, dirty = clock(), 0, false
  local failing, retryat = nil, 0
  local function write()
    return scanfile.write(path, (document()))
  end
  local function save(force)
    if not path or not (dirty or force) then return true end
    local now = clock()
    if not force then
      if failing and now < retryat then return false end
      if spec.checkpoint then
        if now - lastend < spec.checkpoint then return true end
      elseif now - lastend < 20 * lastcost then
        return true
      end
    end
    local ok, msg = hold(write)
    local tries = 1
    while not ok and force and tries < 4 do  -- the last save: retry
      local sys = scanfile.sys()
      if sys then hold(sys.sleep, 0.25 * tries) end
      ok, msg = hold(write)
      tries = tries + 1
    end
    if not ok then
      if not failing then
        io.stderr:write(format("%s: warning: cannot write output '%s': %s " ..
                               "(the points stay in memory; retrying)\n",
                               fname, path, tostring(msg)))
      end
      failing = tostring(msg)
      retryat = clock() + math.max(1, 20 * lastcost)
      return false, msg
    end
    if failing then
      io.stderr:write(format("%s: output '%s' written again\n", fname, path))
    end
    failing = nil
    lastend = clock()
    lastcost = lastend - now
    dirty = false
    return true
  end

  -- progress
  local mode = spec.progress
  local quiet = spec.quiet or (ss and ss.quiet)
  if quiet or mode == false then
    mode = "off"
  elseif mode == nil or mode == true then
    mode = (ss and ss.progress) or "lines"
  end
  local label = spec.label or spec.title or "scan"
  if sn > 1 then label = format("%s [shard %d/%d]", label, si, sn) end
  local nreused, ndone, ncomp, bar = 0, 0, 0, nil

  local missingfile = false
  if path then
    local f = io.open(path, "rb")
    if f then f:close() else missingfile = true end
  end
  local checkedcols = false
  local function body()
    -- the lock is taken in here, with interrupts held until `lock` holds
    -- it, so that the handler below releases it whatever moment a signal
    -- comes (taken before this function, a signal in between left the
    -- lock file behind)
    if path then hold(function() lock = takelock(path, fname, script) end) end
    load()
    for _, o in ipairs(order) do if done[o.key] then nreused = nreused + 1 end end
    loaded = true
    bar = progress.new{ total = #order, label = label, mode = mode,
                        every = spec.every, clock = ss and ss.clock }
    ndone = nreused
    if nreused < #order then bar:update(ndone, 0) end
    for _, o in ipairs(order) do
      if not done[o.key] then
        if interrupted() then error("interrupted", 0) end
        local pt = makepoint(d, o.p, o.idx, o.key)
        local ok, ret = xpcall(function() return spec.each(pt) end,
                              debug.traceback)  -- 5.1: no arguments
        -- an interrupt caught inside `each` never becomes a result
        if interrupted() then error("interrupted", 0) end
        if not ok then
          error(format("%s: point %d (%s): %s", fname, o.p, o.key,
                       tostring(ret)), 0)
        end
        local list = torecords(ret, o.key, fname)
        for _, r in ipairs(list) do
          for i, a in ipairs(d.axes) do
            if r[a.name] ~= nil then
              error(format("%s: 'each' returned '%s' at point %s, which is " ..
                           "an axis name", fname, a.name, o.key), 0)
            end
            r[a.name] = a.recvals[o.idx[i]]
          end
        end
        if not checkedcols and nreused > 0 and not ident.accept then
          -- reused records must have the columns this code returns
          checkedcols = true
          for k in pairs(list[1] or {}) do
            if not colseen[k] and not ident.filecols[k] then
              error(format("%s: 'each' returns a column '%s' that the " ..
                           "records in '%s' lack: they come from another " ..
                           "computation; move the file away to recompute, " ..
                           "or run with BRAKELIGHT_ACCEPT=1 to keep them " ..
                           "(their '%s' stays empty)", fname, k, path, k), 0)
            end
          end
        end
        done[o.key] = list
        dirty = true
        ndone, ncomp = ndone + 1, ncomp + 1
        save(false)
        bar:update(ndone, ncomp)
      end
    end
    if dirty or missingfile or #ident.accepted > 0 then
      local fin, fmsg = save(true)
      if not fin then
        error(format("%s: cannot write output '%s': %s (tried 4 times; the " ..
                     "%d points computed now are lost)", fname, path,
                     tostring(fmsg), ncomp), 0)
      end
    end
    if lock then lock:release() end
    if nreused < #order then bar:finish() end
  end
  -- on any error or interrupt: keep what was computed (interrupts are
  -- held from the error on, so this always completes), then raise: an
  -- interrupt as such, another error as it came
  try(body, function(err)
    local saved, msg = true, nil
    if path and loaded and (dirty or missingfile) then saved, msg = save(true) end
    if lock then lock:release() end
    if mode == "bar" and loaded then io.stderr:write("\n") end
    local sig = interrupted()
    local where = ""
    local ndone = 0   -- from what is saved, not the counter (which an
    for _, o in ipairs(order) do  -- interrupt may have cut before it grew)
      if done[o.key] then ndone = ndone + 1 end
    end
    if path and loaded then
      where = saved and format("; %d of %d points are in '%s': run the " ..
                               "same command again to compute the rest",
                               ndone, #order, path)
              or format("; the %d points computed now could not be " ..
                        "written to '%s': %s", ncomp, path, tostring(msg))
    end
    if sig then
      error(format("%s: interrupted by signal %d%s", fname, sig, where), 0)
    end
    if not saved then err = tostring(err) .. where end
    error(err, 0)
  end)
  if path and ss and ss.manifest then
    local f = io.open(ss.manifest, "a")
    if f then
      f:write(spec.output, "\t", path, "\n")
      f:close()
    end
  end
  local _, recs = document()
  return recs, { total = d.total, selected = #order, computed = ncomp,
                 reused = nreused, path = path, shard = { si, sn } }
end


return scan
