--[[
  test_scan_outputs.lua -- issue 5: the JSON writer/reader round-trips
  every double; scan files carry version, settings and units; atomic
  writes; plots through gnuplot, and without it the data and the script.
  The plot without gnuplot runs in the runner (a changed PATH); the rest in
  any Lua host.
]]

local root = (arg[0]):match("^(.-)tests[/\\]lua[/\\][^/\\]+%.lua$")
local U = dofile(root .. "tests/lua/lib/scanutil.lua")
package.path = U.root .. "lua/?.lua;" .. package.path
local json = require "brakelight.json"
local scanfile = require "brakelight.scanfile"
local scan = require "brakelight.scan"
local plot = require "brakelight.plot"
local bl = require "brakelight"

-- JSON: exact doubles, escapes, stable key order
local vals = { 0.1, 1 / 3, 2 ^ -1074, 1.7976931348623157e308, -0.0, 123456789,
               6.02214076e23, 1e-300 }
local text = json.encode({ v = vals, s = "a\"b\\c\n\1", t = true })
assert(text == json.encode({ t = true, s = "a\"b\\c\n\1", v = vals }),
       "key order depends on construction")
local back = json.decode(text)
for i, v in ipairs(vals) do
  assert(back.v[i] == v, "json lost " .. string.format("%.17g", v))
end
assert(back.s == "a\"b\\c\n\1" and back.t == true)
assert(json.decode('{"a":[1,null,"\\u00e9\\ud83d\\ude00"]}').a[3] == "é😀")
assert(json.decode('[1,null,3]')[2] == json.null)
assert(not pcall(json.decode, "[1,2"), "truncated JSON accepted")
assert(select(2, pcall(json.decode, "{1:2}")):find("object key expected", 1, true))

local dir = U.tmpdir()
local ok, err = pcall(function()
  -- header: tool version, every axis and setting, units of each column
  local out = dir .. "/h.csv"
  local p = bl.particle{ name = "X", mass = 300, charge = 1, spin = 0 }
  local recs = scan.run{
    title = "header test", quiet = true,
    axes = { { "particle", { "electron", p } }, { "T", { 50, 500 } } },
    fixed = { target = "Cu", rtol = 1e-3, note = "a, \"quoted\" value" },
    units = { err = "mb/MeV" },
    output = out,
    each = function(pt)
      local s = bl.spectrum(pt:with{ y = { 0.25, 0.75 }, note = scan.omit })
      return { y = s.y, dsdk = s.dsdk, err = s.err, ok = true }
    end,
  }
  U.check(#recs == 8, "2 points x 2 particles x 2 y = 8 records, got %d", #recs)
  local t = U.read(out)
  U.has(t, "# tool: brakelight " .. bl._VERSION, "version line")
  U.has(t, "# axis particle: electron,X", "axis line")
  U.has(t, "# axis T [MeV]: 50,500", "axis unit")
  U.has(t, "# setting target: Cu", "setting")
  U.has(t, "# setting rtol [1]: 0.001", "setting unit")
  U.has(t, "# setting note: a, \"quoted\" value", "setting text")
  U.has(t, "# column dsdk [mb/MeV]: value number", "column unit")
  U.has(t, "# column err [mb/MeV]: value number", "user unit")
  U.has(t, "# column ok: value boolean", "boolean column")
  U.has(t, "particle,T,dsdk,err,ok,y\n", "header line")
  local doc = assert(scanfile.read(out))
  U.check(doc.records[1].ok == true and doc.records[5].particle == "X",
          "records read back wrong")
  -- the JSON file of the same scan holds the same records
  local recs2 = scan.run{
    title = "header test", quiet = true,
    axes = { { "particle", { "electron", p } }, { "T", { 50, 500 } } },
    fixed = { target = "Cu", rtol = 1e-3, note = "a, \"quoted\" value" },
    units = { err = "mb/MeV" }, output = dir .. "/h.json",
    each = function(pt)
      local s = bl.spectrum(pt:with{ y = { 0.25, 0.75 }, note = scan.omit })
      return { y = s.y, dsdk = s.dsdk, err = s.err, ok = true }
    end,
  }
  local dj = assert(scanfile.read(dir .. "/h.json"))
  for i, r in ipairs(doc.records) do
    for k, v in pairs(r) do
      U.check(dj.records[i][k] == v and recs2[i][k] == v,
              "JSON record %d field %s differs", i, k)
    end
  end
  U.check(dj.shard[1] == 1 and dj.shard[2] == 1, "JSON shard")
  -- no temporary file is left next to the outputs
  U.check(U.tmpfiles(dir) == "", "temporary files left: %s", U.tmpfiles(dir))
  -- atomic write: a failing write leaves the old file whole
  local okw, msgw = scanfile.write_text(dir .. "/none/x.csv", "x")
  U.check(not okw and msgw, "write into a missing directory succeeded")

  -- points and shards of the documented order
  local pts = scan.points{ axes = { { "a", { 1, 2 } }, { "b", { "x", "y", "z" } } } }
  U.check(#pts == 6 and pts[2].key == "a=1;b=y" and pts[4].key == "a=2;b=x",
          "point order is not last-axis-fastest")
  U.check(scan.shard_path("d/out.csv", 2, 4) == "d/out.shard-2-of-4.csv",
          "shard path")

  -- plot: PNG and SVG through gnuplot when present
  local series = { { label = "a", x = { 1, 10, 100 }, y = { 1, 0.1, 0.01 } },
                   { label = "b", x = { 1, 10, 100 }, y = { 2, 0.3, 0.02 } } }
  if plot.have_gnuplot() then
    for _, ext in ipairs({ "png", "svg" }) do
      local okp, info = plot{ output = dir .. "/p." .. ext, series = series,
                              x = { label = "k", unit = "MeV" },
                              y = { label = "dsdk", unit = "mb/MeV" } }
      U.check(okp, "plot %s failed: %s", ext, tostring(info))
      local img = U.read(dir .. "/p." .. ext)
      U.check(img and #img > 1000, "no %s image", ext)
      if ext == "png" then U.check(img:sub(2, 4) == "PNG", "not a PNG") end
      if ext == "svg" then U.has(img, "<svg", "svg") end
      local gp = U.read(dir .. "/p." .. ext .. ".gp")
      U.has(gp, "set logscale x", "log x (3 decades)")
      U.has(gp, "set logscale y", "log y")
      U.has(gp, "set xlabel 'k [MeV]' noenhanced", "x label with unit")
      U.has(gp, "title 'b' noenhanced", "legend")
    end
  end
  -- without gnuplot: a clear message, data and script still written
  local script = dir .. "/nognuplot.lua"
  U.write(script, [[
local plot = require "brakelight.plot"
local ok, msg, info = plot{ output = arg[1], x = "T", y = "v",
  series = { { label = "s", x = { 1, 2, 3 }, y = { 3, 2, -1 } } } }
print(ok, info.data, info.script)
]])
  local code, so, se = U.run("", script, U.q(dir .. "/q.svg"), "PATH=/nonexistent")
  U.check(code == 0, "plot without gnuplot raised: %s", se)
  U.has(so, "false", "plot result")
  U.has(se, "gnuplot not found", "message")
  U.check(U.read(dir .. "/q.svg.dat") and U.read(dir .. "/q.svg.gp"),
          "data or script missing without gnuplot")
  U.check(not U.read(dir .. "/q.svg.gp"):find("logscale y", 1, true),
          "log axis for data with a negative value")
  U.check(not pcall(plot, { output = dir .. "/x.pdf", series = series }),
          "plot accepted a .pdf output")

  -- issue 16: texts are escaped for gnuplot (a newline, quotes, a
  -- backslash, a backquote and a macro sign cannot run anything), each
  -- image has its own data and script, written whole; shards draw nothing
  local mark = dir .. "/RAN"
  local evil = "a\nsystem 'touch " .. mark .. "'\n\"x\" \\ `touch " .. mark ..
               "` @m b_c^2\r"
  for _, ext in ipairs({ "png", "svg" }) do
    local okp, info = plot{ output = dir .. "/e." .. ext, title = evil,
                            x = { label = evil }, y = { label = "y" },
                            series = { { label = evil, x = { 1, 2 }, y = { 1, 2 } } } }
    local gp = U.read(dir .. "/e." .. ext .. ".gp")
    U.check(gp, "no script for e.%s", ext)
    local lines = 0
    for l in gp:gmatch("[^\n]+") do
      lines = lines + 1
      U.check(not l:find("^system") and not l:find("^\"x"), "a label broke the script: %s", l)
    end
    U.check(not gp:find("\r", 1, true), "a carriage return went into the script")
    U.has(gp, "set title 'a system ''touch " .. mark .. "'' \"x\" \\ `touch " .. mark ..
          "` @m b_c^2 ' noenhanced", "title quoted")
    U.has(U.read(dir .. "/e." .. ext .. ".dat"), "# series 1: a system", "data comment")
    if plot.have_gnuplot() then
      U.check(okp, "plot with odd texts failed: %s", tostring(info))
      U.check(#(U.read(dir .. "/e." .. ext) or "") > 1000, "no image e.%s", ext)
    end
    U.check(U.read(mark) == nil, "a plot text ran a command")
  end
  local pdir = io.popen("ls -a " .. U.q(dir))
  for name in pdir:lines() do
    U.check(not name:find("%.writing$"), "temporary file %s left", name)
  end
  pdir:close()
  local sh = dir .. "/shardplot.lua"
  U.write(sh, [[
local plot = require "brakelight.plot"
print(plot{ output = arg[1], series = { { label = "s", x = { 1, 2 }, y = { 1, 2 } } } })
]])
  local code2, so2, se2 = U.run("--shard 2/3", sh, U.q(dir .. "/sh.png"))
  U.check(code2 == 0, "plot in a shard run failed: %s", se2)
  U.has(so2, "false", "shard plot result")
  U.has(so2, "not drawn in shard 2 of 3", "shard plot message")
  U.check(U.read(dir .. "/sh.png.gp") == nil and U.read(dir .. "/sh.png") == nil,
          "a shard run wrote plot files")
end)
U.rmdir(dir)
if not ok then error(err, 0) end
print("test_scan_outputs: ok")
