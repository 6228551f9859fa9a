--[[
  brakelight.events -- event files from a sampler (brakelight.sampler)

  events.write{sampler =, output =, format = "hepmc3" | "lhe" | "csv",
               n = (default: the rest of the sampler's shard), chunk = 4096}
    -> { path =, events =, stats = s:stats() }

  Streamed: chunk events at a time are formatted and written with one
  write and a flush, so a run of 1e8 events never sits in memory.
  Atomic: the file is written as OUTPUT.part and renamed to OUTPUT when
  complete (with its trailer); a run stopped by an error or a signal
  leaves OUTPUT.part holding the header and whole events only (never a
  partial event: each chunk is one write), and no OUTPUT.
  Shards: with sampler{shard = {i, n}} (or the runner's --shard / Slurm
  array task) OUTPUT becomes "name.shard-i-of-n.ext" (brakelight.scan's
  rule); events.merge{output =, inputs = {...}} joins shard files of one
  run into one file, events in order, and refuses a gap, a double or a
  file of another run.  With the runner's -j N the workers write the shard
  files and the final pass (shard 1 of 1) merges them into OUTPUT instead
  of making the events again (its result field merged = N).

  Formats (units of each standard):
  - hepmc3: the HepMC3 ASCII format (Asciiv3), MeV and mm: per event the
    beam (status 4) and the atom at rest (status 4, nuclear PDG code
    100ZZZAAA0) into one vertex, the photon, the projectile and the atom
    (status 1) out of it; the weight line W (pb); the attribute
    GenCrossSection (sigma and its error from setup in pb, accepted and
    attempted counts -1: the run's counts are in s:stats() and in the
    LHE and CSV trailers); attributes brakelight_hit (nucleus or
    electron) and brakelight_Z.  Static field: the outgoing atom carries q
    and the energy of the atom at rest (its recoil energy q^2/2M is
    neglected), so its mass in the record is sqrt(M^2 - q^2).  An event
    whose atomic electron recoils (e.recoil: the exact bound electron term)
    has six particles instead: the struck electron (PDG 11, momentum q,
    status 1) and the ion at rest (the nuclear code, energy M - m_e; the
    binding energy neglected) in place of the outgoing atom.  Read back
    by HepMC3 3.1.2 itself in make test-hepmc3 (tests/hepmc3/).
  - lhe: the Les Houches Event file format (version 3.0), GeV and pb:
    IDWTUP 3 (unweighted: XWGTUP = r XSECUP, r > 1 only for an overweight)
    or 4 (weighted: the mean of XWGTUP estimates sigma); beam and atom
    (status -1), photon, projectile and atom (status 1); with recoil,
    photon, projectile, electron and ion at rest (as in hepmc3).
  - csv: one line per event, MeV (see the header line); q is the struck
    electron's momentum where it recoils (p_E is then below E0 - k_E).
  The header records the process, sigma and its error (setup), the
  settings, the seed, the shard and the event range; the trailer the
  run's own sigma estimate, efficiency and overweights.
]]

local bl = require "brakelight"
local compat = require "brakelight.compat"

local events = {}
local format, concat = string.format, table.concat

local PB_PER_MB = 1e9
local ME = bl.particle("electron").mass   -- MeV

local PDG = {
  electron = 11, positron = -11, muon = 13, antimuon = -13,
  ["pion+"] = 211, ["pion-"] = -211, ["kaon+"] = 321, ["kaon-"] = -321,
  proton = 2212, antiproton = -2212,
}

local function argerr(fmt, ...)
  error(format("bad argument #1 to 'events.write' (" .. fmt .. ")", ...), 3)
end

local function nucleus_code(el)
  return 1000000000 + el.Z * 10000 + el.A * 10
end

local function fnum(x) return format("%.17g", x) end

--[[ The path of this shard's file. ]]
local function shardpath(output, info)
  local i, n = info.shard[1], info.shard[2]
  if n == 1 then return output end
  local scan = require "brakelight.scan"
  return scan.shard_path(output, i, n)
end

local function settings_lines(info, prefix)
  local t = {}
  local function add(k, v) t[#t + 1] = format("%s%s = %s", prefix, k, tostring(v)) end
  add("tool", "brakelight " .. tostring(bl._VERSION))
  add("process", format("%s + %s -> %s + photon + %s (bremsstrahlung)",
      info.particle, info.target, info.particle, info.target))
  add("T_MeV", fnum(info.T))
  add("kmin_MeV", fnum(info.kmin)); add("kmax_MeV", fnum(info.kmax))
  add("sigma_mb", fnum(info.sigma)); add("sigma_err_mb", fnum(info.err))
  add("method", info.method); add("screening", info.screening)
  add("coulomb_factor", info.coulomb_factor)
  add("electrons", info.electrons); add("nucleus", info.nucleus)
  add("mode", info.mode); add("seed", compat.inttext(info.seed))
  add("events_in_run", compat.inttext(info.events))
  add("shard", format("%d/%d", info.shard[1], info.shard[2]))
  add("event_range", format("%s..%s", compat.inttext(info.first),
      compat.inttext(info.last - 1)))
  add("expected_efficiency", fnum(info.efficiency))
  add("static_field", "the atom takes q and no energy; an atomic "
      .. "electron that recoils takes q with its energy (recoil)")
  for i, el in ipairs(info.elements) do
    add(format("element_%d", i), format("%s Z=%d A=%d share=%.6g", el.symbol,
        el.Z, el.A, el.share))
  end
  return t
end

---------------------------------------------------------------- writers
local W = {}

W.csv = {
  header = function(info)
    local t = settings_lines(info, "# ")
    t[#t + 1] = "id,weight_mb,Z,hit,k_E,k_px,k_py,k_pz,p_E,p_px,p_py,p_pz,q_x,q_y,q_z"
    return concat(t, "\n") .. "\n"
  end,
  event = function(e, _, buf)
    local k, p, q = e.k, e.p, e.q
    buf[#buf + 1] = format("%s,%.17g,%d,%s,%.17g,%.17g,%.17g,%.17g,%.17g,%.17g,%.17g,%.17g,%.17g,%.17g,%.17g\n",
      compat.inttext(e.id), e.weight, e.Z, e.hit, k[1], k[2], k[3], k[4],
      p[1], p[2], p[3], p[4], q[1], q[2], q[3])
  end,
  trailer = function(_, st)
    return format("# run_sigma_mb = %.17g\n# run_sigma_err_mb = %.17g\n# efficiency = %.6g\n# overweights = %s\n# excess = %.6g\n",
      st.sigma, st.err, st.efficiency, compat.inttext(st.overweights), st.excess)
  end,
}

W.hepmc3 = {
  header = function(info)
    return "HepMC::Version 3.02.06\nHepMC::Asciiv3-START_EVENT_LISTING\n" ..
      "W weight\n" ..
      format("T brakelight\\|%s\\|bremsstrahlung events %s on %s, T = %.17g MeV, seed %s\n",
        tostring(bl._VERSION), info.particle, info.target, info.T,
        compat.inttext(info.seed))
  end,
  event = function(e, info, buf)
    local el = info.elements[e.element]
    local M, m = el.mass, info.mass
    local k, p, q = e.k, e.p, e.q
    local qq = q[1] * q[1] + q[2] * q[2] + q[3] * q[3]
    local pdg = PDG[info.particle] or 0
    local xs = info.sigma * PB_PER_MB
    buf[#buf + 1] = format(
      "E %s 1 %d\nU MEV MM\nW %.17g\nA 0 GenCrossSection %.9g %.9g -1 -1\nA 0 brakelight_hit %s\nA 0 brakelight_Z %d\n" ..
      "P 1 0 %d 0 0 %.17g %.17g %.17g 4\nP 2 0 %d 0 0 0 %.17g %.17g 4\nV -1 0 [1,2]\n" ..
      "P 3 -1 22 %.17g %.17g %.17g %.17g 0 1\nP 4 -1 %d %.17g %.17g %.17g %.17g %.17g 1\n",
      compat.inttext(e.id), e.recoil and 6 or 5, e.weight * PB_PER_MB, xs,
      info.err * PB_PER_MB, e.hit, e.Z,
      pdg, info.p0, info.E0, m, nucleus_code(el), M, M,
      k[2], k[3], k[4], k[1], pdg, p[2], p[3], p[4], p[1], m)
    if e.recoil then   -- the struck electron, and the ion at rest
      buf[#buf + 1] = format(
        "P 5 -1 11 %.17g %.17g %.17g %.17g %.17g 1\nP 6 -1 %d 0 0 0 %.17g %.17g 1\n",
        q[1], q[2], q[3], math.sqrt(qq + ME * ME), ME, nucleus_code(el),
        M - ME, M - ME)
    else
      buf[#buf + 1] = format("P 5 -1 %d %.17g %.17g %.17g %.17g %.17g 1\n",
        nucleus_code(el), q[1], q[2], q[3], M, math.sqrt(M * M - qq))
    end
  end,
  trailer = function()
    return "HepMC::Asciiv3-END_EVENT_LISTING\n"
  end,
}

W.lhe = {
  header = function(info)
    local t = {'<LesHouchesEvents version="3.0">', "<header>", "<brakelight>"}
    for _, l in ipairs(settings_lines(info, "")) do t[#t + 1] = l end
    t[#t + 1] = "</brakelight>"
    t[#t + 1] = "</header>"
    t[#t + 1] = "<init>"
    local el = info.elements[1]
    local idw = info.mode == "weighted" and 4 or 3
    t[#t + 1] = format("%d %d %.10e %.10e 0 0 0 0 %d 1", PDG[info.particle] or 0,
      nucleus_code(el), info.E0 / 1000, 0.0, idw)
    local xs, xe = info.sigma * PB_PER_MB, info.err * PB_PER_MB
    t[#t + 1] = format("%.10e %.10e %.10e 1", xs, xe, xs)
    t[#t + 1] = "</init>"
    return concat(t, "\n") .. "\n"
  end,
  event = function(e, info, buf)
    local el = info.elements[e.element]
    local G = 1e-3
    local M, m = el.mass * G, info.mass * G
    local k, p, q = e.k, e.p, e.q
    local qq = (q[1] * q[1] + q[2] * q[2] + q[3] * q[3]) * G * G
    local pdg, nuc = PDG[info.particle] or 0, nucleus_code(el)
    -- unweighted: r XSECUP; weighted: f/g (the mean estimates sigma)
    local wgt = e.weight * info.events * PB_PER_MB
    local last
    if e.recoil then   -- the struck electron, and the ion at rest
      local me = ME * G
      last = format("11 1 1 2 0 0 %.10e %.10e %.10e %.10e %.10e 0 9\n" ..
        "%d 1 1 2 0 0 0 0 0 %.10e %.10e 0 9\n",
        q[1] * G, q[2] * G, q[3] * G, math.sqrt(qq + me * me), me,
        nuc, M - me, M - me)
    else
      last = format("%d 1 1 2 0 0 %.10e %.10e %.10e %.10e %.10e 0 9\n",
        nuc, q[1] * G, q[2] * G, q[3] * G, M, math.sqrt(M * M - qq))
    end
    buf[#buf + 1] = format("<event>\n%d 1 %.10e -1 %.10e -1\n" ..
      "%d -1 0 0 0 0 0 0 %.10e %.10e %.10e 0 9\n" ..
      "%d -1 0 0 0 0 0 0 0 %.10e %.10e 0 9\n" ..
      "22 1 1 2 0 0 %.10e %.10e %.10e %.10e 0 0 9\n" ..
      "%d 1 1 2 0 0 %.10e %.10e %.10e %.10e %.10e 0 9\n" ..
      "%s#brakelight id=%s hit=%s Z=%d\n</event>\n",
      e.recoil and 6 or 5, wgt, 1 / 137.035999084,
      pdg, info.p0 * G, info.E0 * G, m, nuc, M, M,
      k[2] * G, k[3] * G, k[4] * G, k[1] * G,
      pdg, p[2] * G, p[3] * G, p[4] * G, p[1] * G, m,
      last, compat.inttext(e.id), e.hit, e.Z)
  end,
  trailer = function(_, st)
    return format("<!-- run sigma %.9g +- %.3g pb, efficiency %.6g, overweights %s, excess %.6g -->\n</LesHouchesEvents>\n",
      st.sigma * PB_PER_MB, st.err * PB_PER_MB, st.efficiency,
      compat.inttext(st.overweights), st.excess)
  end,
}

local from_workers   -- below

function events.write(spec)
  if type(spec) ~= "table" then argerr("table expected, got %s", type(spec)) end
  local s, fmt = spec.sampler, spec.format or "hepmc3"
  if (type(s) ~= "userdata" and type(s) ~= "table") or type(s.info) ~= "function" then
    argerr("field 'sampler' must be a brakelight.sampler")
  end
  local wr = W[fmt]
  if not wr then
    argerr("field 'format' must be 'hepmc3', 'lhe' or 'csv', got %s", tostring(fmt))
  end
  if type(spec.output) ~= "string" or spec.output == "" then
    argerr("field 'output' must be a file name")
  end
  local chunk = spec.chunk or 4096
  if compat.mtype(chunk) ~= "integer" or chunk < 1 or chunk > 1000000 then
    argerr("field 'chunk' must be an integer in [1, 1000000], got %s", tostring(chunk))
  end
  local info = s:info()
  if spec.n == nil then
    local merged = from_workers(spec, info, fmt)
    if merged then return merged end
  end
  local n = spec.n or s:stats().remaining
  local path = shardpath(spec.output, info)
  local part = path .. ".part"
  local f, err = io.open(part, "w")
  if not f then error(format("events.write: cannot open %s: %s", part, err), 2) end
  local ok, msg = pcall(function()
    f:write(wr.header(info))
    f:flush()
    local done = 0
    while done < n do
      local m = n - done < chunk and n - done or chunk
      local evs = s:events(m)
      if #evs == 0 then break end
      local buf = {}
      for i = 1, #evs do wr.event(evs[i], info, buf) end
      assert(f:write(concat(buf)))
      f:flush()
      done = done + #evs
    end
    f:write(wr.trailer(info, s:stats()))
    assert(f:close())
    return done
  end)
  if not ok then
    pcall(f.close, f)
    error(msg, 0)   -- OUTPUT.part keeps the header and whole events
  end
  local rok, rerr = os.rename(part, path)
  if not rok then error(format("events.write: cannot rename %s: %s", part, rerr), 2) end
  return { path = path, events = msg, stats = s:stats() }
end

--[[
  events.merge{output =, inputs = {...}, format =}: join the shard files of
  one run into output, atomically: the first file's header, every file's
  events, the last file's trailer.  The headers must agree (but the shard
  and the event range) and the event numbers must run on without a gap or
  a double from the first file's first event; else it raises and writes
  nothing.  Returns the number of events.
]]
local ID = {
  hepmc3 = function(l) return l:sub(1, 2) == "E " and tonumber(l:match("^E (%d+)")) end,
  lhe = function(l) return l:sub(1, 11) == "#brakelight" and tonumber(l:match("id=(%d+)")) end,
  csv = function(l) return l:sub(1, 1) ~= "#" and l:sub(1, 3) ~= "id," and tonumber(l:match("^(%d+),")) end,
}
local function is_trailer(fmt, l)
  if fmt == "hepmc3" then return l:find("END_EVENT_LISTING", 1, true) ~= nil end
  if fmt == "lhe" then return l:sub(1, 4) == "<!--" or l == "</LesHouchesEvents>" end
  return l:sub(1, 6) == "# run_" or l:sub(1, 13) == "# efficiency " or
         l:sub(1, 14) == "# overweights " or l:sub(1, 9) == "# excess "
end
local function first_event_line(fmt, l)
  if fmt == "hepmc3" then return l:sub(1, 2) == "E " end
  if fmt == "lhe" then return l == "<event>" end
  return l:sub(1, 1) ~= "#" and l:sub(1, 3) ~= "id,"
end
local function header_key(l)   -- what must agree between the shards
  if l:find("shard", 1, true) or l:find("event_range", 1, true) then return nil end
  return l
end

function events.merge(spec)
  local fmt = spec.format or "hepmc3"
  if not ID[fmt] then
    error("events.merge: format must be 'hepmc3', 'lhe' or 'csv'", 2)
  end
  local out, inputs = spec.output, spec.inputs
  local part = out .. ".part"
  local f = assert(io.open(part, "w"))
  local nev, nextid, header0, alltrail = 0, nil, nil, {}
  local ok, err = pcall(function()
    for i, name in ipairs(inputs) do
      local h = io.open(name, "r")
      if not h then error(format("events.merge: cannot read %s", name), 0) end
      local inev, trailer, header = false, {}, {}
      for l in h:lines() do
        if is_trailer(fmt, l) then
          -- every shard's statistics stay, each marked with its shard
          if l:sub(1, 4) == "<!--" then
            l = format("<!-- shard %d of %d:%s", i, #inputs, l:sub(5))
            alltrail[#alltrail + 1] = l
          elseif l:sub(1, 2) == "# " then
            alltrail[#alltrail + 1] = format("# shard %d of %d: %s", i, #inputs, l:sub(3))
          else
            trailer[#trailer + 1] = l
          end
        else
          if not inev and first_event_line(fmt, l) then inev = true end
          if not inev then
            local k = header_key(l)
            if k then header[#header + 1] = k end
            if i == 1 then f:write(l, "\n") end
          else
            local id = ID[fmt](l)
            if id then
              if nextid and id ~= nextid then
                error(format("events.merge: %s: event %d where %d was expected "
                             .. "(an event lost or doubled)", name, id, nextid), 0)
              end
              nextid = id + 1
              nev = nev + 1
            end
            f:write(l, "\n")
          end
        end
      end
      h:close()
      local hk = table.concat(header, "\n")
      if header0 and hk ~= header0 then
        error(format("events.merge: %s is not a shard of the same run as %s",
                     name, inputs[1]), 0)
      end
      header0 = header0 or hk
      if i == #inputs then
        for _, l in ipairs(alltrail) do f:write(l, "\n") end
        if #trailer > 0 then f:write(concat(trailer, "\n"), "\n") end
      end
    end
  end)
  f:close()
  if not ok then os.remove(part); error(err, 0) end
  assert(os.rename(part, out))
  return nev
end


--[[ The shard files of output for n shards, when all exist. ]]
local function shard_files(output, n)
  local scan = require "brakelight.scan"
  local list = {}
  for i = 1, n do
    local p = scan.shard_path(output, i, n)
    local h = io.open(p, "r")
    if not h then return nil end
    h:close()
    list[i] = p
  end
  return list
end


--[[
  The final pass of a -j run (shard 1 of 1, from "workers"): the workers
  have written complete shard files (each renamed only when complete);
  merge them instead of making the events again.  Returns the write
  result, or nil when there is nothing to merge.
]]
function from_workers(spec, info, fmt)
  local ss = package.loaded["brakelight.session"]
  if type(ss) ~= "table" or ss.shard_from ~= "workers" or info.shard[2] ~= 1
     or ss.workers then
    return nil
  end
  for n = 2, 256 do
    local list = shard_files(spec.output, n)
    if list then
      local nev = events.merge{ output = spec.output, inputs = list, format = fmt }
      if nev ~= info.events then
        error(format("events.write: the shard files of %s hold %d events, the "
                     .. "run %d", spec.output, nev, info.events), 3)
      end
      for _, p in ipairs(list) do os.remove(p) end
      return { path = spec.output, events = nev, merged = n }
    end
  end
  return nil
end


return events
