--[[
  brakelight.merge -- join the shard files of a scan into one file

  merge.files(output, inputs [, opts]) -> info
     Reads every input (CSV or JSON scan files, see brakelight.scanfile),
     checks that they come from one scan (same layout, axes with the same
     values, same fixed settings, same shard count), puts their records in
     point order and writes `output` atomically (format by its extension,
     so CSV shards can become one JSON file).  Raises, and writes nothing,
     when an input is unreadable, when a point is in two inputs, or when
     a point of the scan is in none (the message names the point keys and
     the files).  info = { points =, records =, inputs = }.
     opts.allow_missing = true writes a partial file instead of failing.
     An existing `output` must be a readable file of the same scan (same
     axes, settings and computation): otherwise merge raises, naming it
     and saying how to proceed, and leaves it as it is; its records count
     as one more input for the points no input holds (a merged file is
     never replaced by fewer points).  While merging, `output` is locked
     (OUTPUT.lock, as a scan locks its output).
  merge.manifests(paths [, opts]) -> list of infos
     Used by the runner after `-j N`: each manifest line is
     "output<TAB>shard file"; every output is merged from its shard files,
     which are then removed.
]]

local compat = require "brakelight.compat"
local scanfile = require "brakelight.scanfile"

local merge = {}
local format, concat = string.format, table.concat


--[[ Axis labels of record r, in axis order, as the key. ]]
local function recordkey(doc, r)
  local names, labels = {}, {}
  for i, a in ipairs(doc.axes) do
    local v = r[a.name]
    if v == nil then return nil end
    names[i] = a.name
    labels[i] = type(v) == "number" and (scanfile.label(v)) or tostring(v)
  end
  return scanfile.key(names, labels)
end


--[[ All point keys of doc's axes, in point order (last axis fastest). ]]
local function allkeys(doc)
  local keys, names = {}, {}
  for i, a in ipairs(doc.axes) do names[i] = a.name end
  local n = scanfile.npoints(doc)
  for p = 1, n do
    local labels, r = {}, p - 1
    for i = #doc.axes, 1, -1 do
      local m = #doc.axes[i].labels
      labels[i] = doc.axes[i].labels[r % m + 1]
      r = compat.idiv(r, m)
    end
    keys[p] = scanfile.key(names, labels)
  end
  return keys
end


--[[ Describe how doc b differs from doc a (same scan?), or nil. ]]
local function differs(a, b, anyshards)
  if #a.axes ~= #b.axes then return "number of axes" end
  for i, x in ipairs(a.axes) do
    local y = b.axes[i]
    if x.name ~= y.name then return format("axis #%d name", i) end
    if concat(x.labels, "\0") ~= concat(y.labels, "\0") then
      return format("values of axis '%s'", x.name)
    end
  end
  local sa, sb = {}, {}
  for _, s in ipairs(a.settings) do sa[#sa + 1] = s.name .. "=" .. s.label end
  for _, s in ipairs(b.settings) do sb[#sb + 1] = s.name .. "=" .. s.label end
  if concat(sa, "\0") ~= concat(sb, "\0") then return "fixed settings" end
  if a.computation ~= b.computation then
    return format("computation fingerprints (%s and %s)",
                  tostring(a.computation), tostring(b.computation))
  end
  if concat(a.declared or {}, ",") ~= concat(b.declared or {}, ",") then
    return "declared columns"
  end
  if not anyshards and a.shard[2] ~= b.shard[2] then
    return format("shard count (%d and %d)", a.shard[2], b.shard[2])
  end
  return nil
end


function merge.files(output, inputs, opts)
  opts = opts or {}
  if type(output) ~= "string" or output == "" then
    error("merge: output file name expected, got " .. tostring(output), 2)
  end
  if type(inputs) ~= "table" or #inputs == 0 then
    error("merge: no input files given", 2)
  end
  local docs = {}
  for i, path in ipairs(inputs) do
    local doc, msg = scanfile.read(path)
    if not doc then error(format("merge: cannot read '%s': %s", path, msg), 0) end
    doc.path = path
    docs[i] = doc
    if i > 1 then
      local what = differs(docs[1], doc)
      if what then
        error(format("merge: '%s' and '%s' are not from the same scan " ..
                     "(%s differ)", docs[1].path, path, what), 0)
      end
    end
  end
  local first = docs[1]
  -- one writer: the output's lock; then an existing output must be this scan
  local lock
  local sys = scanfile.sys()
  if sys then
    local prev, why
    lock, prev, why = sys.lock(output .. ".lock")
    if not lock then
      error(format("merge: output '%s' is being written by another run " ..
                   "(%s; lock file '%s'); nothing was merged", output,
                   why == "held" and (tostring(prev):gsub("\n+$", ""):gsub("\n", ", "))
                   or tostring(prev), output .. ".lock"), 0)
    end
  end
  local function fail(msg)
    if lock then lock:release() end
    error(msg, 0)
  end
  local existing
  do
    local doc, msg, why = scanfile.read(output)
    if doc then
      local what = differs(first, doc, true)
      if what then
        fail(format("merge: output '%s' exists and holds a different scan " ..
                    "(%s differ from '%s'); nothing was merged and it is " ..
                    "left as it is: choose another output, or move it away " ..
                    "to replace it", output, what, first.path))
      end
      doc.path = output
      existing = doc
    elseif why ~= "missing" then
      fail(format("merge: output '%s' exists but cannot be read (%s); " ..
                  "nothing was merged and it is left as it is: repair it, " ..
                  "or move it away to replace it", output, tostring(msg)))
    end
  end
  local shardseen = {}
  for _, doc in ipairs(docs) do
    local s = doc.shard[1]
    if doc.shard[2] > 1 and shardseen[s] then
      fail(format("merge: '%s' and '%s' are both shard %d of %d",
                  shardseen[s], doc.path, s, doc.shard[2]))
    end
    shardseen[s] = doc.path
  end
  -- records by key; a key in two files is an error
  local bykey, from = {}, {}
  for _, doc in ipairs(docs) do
    local mine = {}
    for j, r in ipairs(doc.records) do
      local key = recordkey(doc, r)
      if not key then
        fail(format("merge: record %d of '%s' lacks an axis value", j,
                    doc.path))
      end
      if from[key] and from[key] ~= doc.path then
        fail(format("merge: point %s is in both '%s' and '%s'", key,
                    from[key], doc.path))
      end
      from[key] = doc.path
      if not mine[key] then
        mine[key] = true
        bykey[key] = {}
      end
      table.insert(bykey[key], r)
    end
  end
  if existing then  -- its points that no input holds stay
    local mine = {}
    for _, r in ipairs(existing.records) do
      local key = recordkey(existing, r)
      if key and (not from[key] or mine[key]) then
        if not mine[key] then
          mine[key] = true
          bykey[key] = {}
          from[key] = output
        end
        table.insert(bykey[key], r)
      end
    end
  end
  local keys = allkeys(first)
  local known, missing = {}, {}
  for _, k in ipairs(keys) do
    known[k] = true
    if not bykey[k] then missing[#missing + 1] = k end
  end
  for k in pairs(bykey) do
    if not known[k] then
      fail(format("merge: point %s of '%s' is not among the points of the " ..
                  "scan's axes", k, from[k]))
    end
  end
  if #missing > 0 and not opts.allow_missing then
    local show = {}
    for i = 1, math.min(5, #missing) do show[i] = missing[i] end
    fail(format("merge: %d of %d points are missing from the %d input " ..
                "file(s), e.g. %s", #missing, #keys, #docs,
                concat(show, ", ")))
  end
  -- columns: union, in order of first appearance, axes first
  local columns, seen = {}, {}
  for _, doc in ipairs(docs) do
    for _, c in ipairs(doc.columns) do
      local prev = seen[c.name]
      if not prev then
        seen[c.name] = { name = c.name, kind = c.kind, type = c.type,
                         unit = c.unit }
        columns[#columns + 1] = seen[c.name]
      elseif prev.unit ~= c.unit then
        fail(format("merge: column '%s' has unit '%s' in '%s' and '%s' " ..
                    "elsewhere", c.name, tostring(c.unit), doc.path,
                    tostring(prev.unit)))
      elseif prev.type ~= c.type then
        prev.type = "string"
      end
    end
  end
  local records = {}
  for _, k in ipairs(keys) do
    for _, r in ipairs(bykey[k] or {}) do records[#records + 1] = r end
  end
  local notes = {}
  for _, n in ipairs(first.notes or {}) do notes[#notes + 1] = n end
  notes[#notes + 1] = format("merged from %d file(s)", #docs)
  local out = { layout = first.layout, tool = first.tool, title = first.title,
                script = first.script, notes = notes, axes = first.axes,
                settings = first.settings, shard = { 1, 1 },
                computation = first.computation, declared = first.declared,
                columns = columns, records = records }
  local ok, msg = scanfile.write(output, out)
  if not ok then
    fail(format("merge: cannot write '%s': %s", output, tostring(msg)))
  end
  if lock then lock:release() end
  return { points = #keys - #missing, records = #records, inputs = #docs,
           missing = #missing }
end


function merge.manifests(paths, opts)
  local groups, order = {}, {}
  for _, m in ipairs(paths) do
    local f = io.open(m, "r")
    if f then
      for line in f:lines() do
        local out, shard = line:match("^(.-)\t(.*)$")
        if out then
          if not groups[out] then
            groups[out] = { seen = {} }
            order[#order + 1] = out
          end
          if not groups[out].seen[shard] then
            groups[out].seen[shard] = true
            table.insert(groups[out], shard)
          end
        end
      end
      f:close()
    end
  end
  local infos = {}
  for _, out in ipairs(order) do
    local list = groups[out]
    table.sort(list)
    local info = merge.files(out, list, opts)
    info.output = out
    for _, s in ipairs(list) do
      if s ~= out then os.remove(s) end
    end
    infos[#infos + 1] = info
  end
  return infos
end


return merge
