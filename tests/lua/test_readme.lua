--[[
  test_readme.lua -- issue 16, item 4: the README is true.

  1. Every ```lua and ```sh block of README.md runs: a Lua block is saved
     as a script in a fresh temporary directory and run there by the
     runner (build/brakelight -q); an sh block runs with bash -e in a
     fresh temporary directory with the runner's directory first on PATH.
     Both directories hold `build` and `lua` as links to the tree's, so
     commands written for the top of the source tree work, and every file
     a block writes lands in the temporary directory.  A block must exit
     with status 0.
  2. Where the README shows what a block prints or writes, it is compared.
  3. Every "(README, HEADING)" in the message texts of the code (string
     literals of src/**/*.c and lua/brakelight/*.lua) and every in-page
     link "(#anchor)" of README.md names a heading that exists.

  Markers: HTML comments on the lines right before a fence (blank lines
  between are allowed):
    <!-- not run: REASON -->        the block is not run (an install, a
                                    cluster submission); REASON is required
    <!-- run as: NAME -->           the script's file name (default
                                    block-N.lua / block-N.sh)
    <!-- run with: VAR=VALUE ... --> environment of the block
    <!-- needs: PROG ... -->        skipped, saying so, when a PROG is not
                                    on PATH
    <!-- output of the block above[; numbers to N significant digits] -->
        before a plain ``` block: the standard output of the last block
        that ran, line for line
    <!-- start of FILE written by the block above[; numbers to N
         significant digits] -->
        the lines shown are the first lines of FILE in that block's
        directory
    <!-- output of: COMMAND -->     the standard output of COMMAND, run at
                                    the top of the tree (the runner on PATH)
  Comparison: trailing blanks are ignored; with "numbers to N significant
  digits", every number in a line is compared as a number, equal when
  |a - b| <= 5 * 10^-N * max(|a|, |b|), and the text between numbers must
  be identical; without it, lines must be identical.

  Blocks under "Sharding and parallel runs" without a marker are skipped
  here (saying so): that section's commands need a cluster and its real
  Slurm test owns them; with a marker they are handled like the others.
  Run only by the runner: the blocks run through build/brakelight anyway,
  so a stock interpreter skips this file (saying so).
]]

if not package.loaded["brakelight.session"] then
  print("test_readme: skipped (a stock interpreter; the runner's run covers it)")
  return
end

local root = (arg[0]):match("^(.-)tests[/\\]lua[/\\][^/\\]+%.lua$")
local U = dofile(root .. "tests/lua/lib/scanutil.lua")
local R = U.root
local absroot
do
  local code, out = U.sh("cd " .. U.q(R) .. " && pwd")
  U.check(code == 0, "cannot find the tree's directory")
  absroot = out:gsub("%s+$", "")
end
local build = os.getenv("BL_BUILD_DIR") or "build"
if build:sub(1, 1) ~= "/" then build = absroot .. "/" .. build end
local runner = build .. "/brakelight"
-- the blocks' build/ is the tree's (the README speaks of it; a module of
-- build/asan would not load in a stock lua5.4), unless it has no runner
local treebuild = absroot .. "/build"
if not U.read(treebuild .. "/brakelight") then treebuild = build end
local OWNED = "Sharding and parallel runs"

local readme = assert(U.read(R .. "README.md"), "no README.md")
local failures = {}
local function fail(fmt, ...) failures[#failures + 1] = string.format(fmt, ...) end

--[[ Parse: blocks {lang, text, line, markers = {...}, section} and headings. ]]
local blocks, headings = {}, {}
do
  local lines = {}
  for l in (readme .. "\n"):gmatch("(.-)\r?\n") do lines[#lines + 1] = l end
  local i, section, pending = 1, "", {}
  while i <= #lines do
    local l = lines[i]
    local fence, lang = l:match("^(```+)%s*([%w_+-]*)%s*$")
    if fence then
      local b = { lang = lang, line = i, section = section, markers = pending,
                  body = {} }
      pending = {}
      i = i + 1
      while i <= #lines and not lines[i]:match("^" .. fence .. "%s*$") do
        b.body[#b.body + 1] = lines[i]
        i = i + 1
      end
      b.text = table.concat(b.body, "\n") .. "\n"
      blocks[#blocks + 1] = b
    else
      local h = l:match("^#+%s+(.-)%s*$")
      if h then
        headings[#headings + 1] = h
        section = h
        pending = {}
      else
        local m = l:match("^%s*<!%-%-%s*(.-)%s*%-%->%s*$")
        if m then pending[#pending + 1] = m
        elseif l:match("%S") then pending = {} end
      end
    end
    i = i + 1
  end
end

local function marker(b, pat)
  for _, m in ipairs(b.markers) do
    local v = m:match(pat)
    if v then return v end
  end
end

--[[ Compare shown lines with actual text. ]]
local function numbers_equal(a, b, n)
  local x, y = tonumber(a), tonumber(b)
  if not x or not y then return a == b end
  local scale = math.max(math.abs(x), math.abs(y))
  return math.abs(x - y) <= 5 * 10 ^ (-n) * scale
end
local NUM = "[-+]?%d+%.?%d*[eE][-+]?%d+"
local function split(line)       -- text and numbers alternately
  local parts, pos = {}, 1
  while true do
    local s, e = line:find("[-+]?%d+%.?%d*", pos)
    if not s then break end
    local s2, e2 = line:find(NUM, s)
    if s2 == s then e = e2 end
    -- a digit inside a word (X0, Bi4Ge3O12, 8a59ff) is text
    local before = s > 1 and line:sub(s - 1, s - 1) or ""
    local after = line:sub(e + 1, e + 1)
    if before:match("[%a_]") or after:match("[%a_]") then
      parts[#parts + 1] = { t = line:sub(pos, e) }
    else
      parts[#parts + 1] = { t = line:sub(pos, s - 1) }
      parts[#parts + 1] = { n = line:sub(s, e) }
    end
    pos = e + 1
  end
  parts[#parts + 1] = { t = line:sub(pos) }
  -- merge adjacent text parts
  local out = {}
  for _, p in ipairs(parts) do
    if p.t and #out > 0 and out[#out].t then out[#out].t = out[#out].t .. p.t
    else out[#out + 1] = p end
  end
  return out
end
local function lines_equal(shown, got, digits)
  shown, got = shown:gsub("%s+$", ""), got:gsub("%s+$", "")
  if not digits then return shown == got end
  local a, b = split(shown), split(got)
  if #a ~= #b then return false end
  for i = 1, #a do
    if a[i].t then
      if a[i].t ~= b[i].t then return false end
    elseif not (b[i].n and numbers_equal(a[i].n, b[i].n, digits)) then
      return false
    end
  end
  return true
end
local function compare(what, shown_lines, got, digits, prefix_only)
  local got_lines = {}
  for l in (got .. "\n"):gmatch("(.-)\n") do got_lines[#got_lines + 1] = l end
  while #got_lines > 0 and got_lines[#got_lines] == "" do got_lines[#got_lines] = nil end
  if not prefix_only and #got_lines ~= #shown_lines then
    fail("%s: README shows %d lines, got %d:\n%s", what, #shown_lines,
         #got_lines, got)
    return
  end
  for i, s in ipairs(shown_lines) do
    if not got_lines[i] or not lines_equal(s, got_lines[i], digits) then
      fail("%s, line %d: README shows\n  %s\ngot\n  %s", what, i, s,
           tostring(got_lines[i]))
      return
    end
  end
end

local function digits_of(m)
  local d = m and m:match("numbers to (%d+) significant digits")
  return d and tonumber(d)
end

local function newdir()
  local d = U.tmpdir()
  os.execute("ln -s " .. U.q(treebuild) .. " " .. U.q(d .. "/build") ..
             " && ln -s " .. U.q(absroot .. "/lua") .. " " .. U.q(d .. "/lua"))
  return d
end

--[[ 1, 2: run the blocks. ]]
local dirs, ran, notrun, skipped = {}, 0, 0, {}
local last             -- {dir, out, line} of the last block that ran
local ok, err = pcall(function()
  for n, b in ipairs(blocks) do
    local where = string.format("README.md:%d (%s)", b.line, b.section)
    if b.lang == "lua" or b.lang == "sh" then
      local reason = marker(b, "^not run:%s*(.*)$")
      local needs = marker(b, "^needs:%s*(.-)%s*$")
      local missing
      for prog in (needs or ""):gmatch("%S+") do
        if U.sh("command -v " .. U.q(prog) .. " >/dev/null") ~= 0 then
          missing = prog
        end
      end
      if reason then
        if reason == "" then fail("%s: 'not run' without a reason", where) end
        notrun = notrun + 1
      elseif missing then
        skipped[#skipped + 1] = where .. ": " .. missing .. " not installed"
      elseif b.section == OWNED and #b.markers == 0 then
        skipped[#skipped + 1] = where .. ": owned by the Slurm test"
      else
        local d = newdir()
        dirs[#dirs + 1] = d
        local name = marker(b, "^run as:%s*(%S+)") or
                     string.format("block-%d.%s", n, b.lang)
        U.write(d .. "/" .. name, b.text)
        local env = marker(b, "^run with:%s*(.-)%s*$") or ""
        local cmd
        if b.lang == "lua" then
          cmd = string.format("cd %s && %s %s -q %s </dev/null", U.q(d), env,
                              U.q(runner), U.q(name))
        else
          cmd = string.format("cd %s && PATH=%s:\"$PATH\" %s bash -e %s </dev/null",
                              U.q(d), U.q(build), env, U.q(name))
        end
        local t0 = os.time()
        local code, out, se = U.sh(cmd)
        if code ~= 0 then
          fail("%s: the %s block failed (status %s):\n%s%s", where, b.lang,
               tostring(code), out, se)
        end
        if os.time() - t0 > 8 then
          print(string.format("  note: %s took %d s", where, os.time() - t0))
        end
        ran = ran + 1
        last = { dir = d, out = out, where = where }
      end
    else
      local m = marker(b, "^output of the block above.*$")
      local f, fm = nil, nil
      for _, mk in ipairs(b.markers) do
        local file = mk:match("^start of (%S+) written by the block above")
        if file then f, fm = file, mk end
      end
      local c = marker(b, "^output of:%s*(.-)%s*$")
      if m then
        U.check(last, "%s: output shown before any block ran", where)
        compare(where .. ", output of " .. last.where, b.body, last.out,
                digits_of(m))
      elseif f then
        U.check(last, "%s: a file shown before any block ran", where)
        local t = U.read(last.dir .. "/" .. f)
        if not t then fail("%s: %s did not write %s", where, last.where, f)
        else compare(where .. ", " .. f, b.body, t, digits_of(fm), true) end
      elseif c then
        local code, out = U.sh(string.format("cd %s && PATH=%s:\"$PATH\" %s",
                                             U.q(absroot), U.q(build), c))
        if code ~= 0 then fail("%s: '%s' failed (status %s)", where, c, tostring(code)) end
        compare(where .. ", output of '" .. c .. "'", b.body, out, nil)
      end
    end
  end
end)
for _, d in ipairs(dirs) do U.rmdir(d) end
if not ok then error(err, 0) end

--[[ Two statements of the README's tables checked directly: dsdk takes
     y = k/T as spectrum does (the same number as k = y T, bit for bit; both
     at once is an error naming them), and spectrum's `threads` is the number
     used (threads = 0: at least 1, at most one per point). ]]
do
  local bl = require "brakelight"
  local base = { particle = "electron", target = "Cu", T = 20, method = "born",
                 rtol = 1e-3 }
  local function with(t)
    local c = {}
    for k, v in pairs(base) do c[k] = v end
    for k, v in pairs(t) do c[k] = v end
    return c
  end
  local vy = bl.dsdk(with{ y = 0.25 })
  local vk = bl.dsdk(with{ k = 5 })
  if vy ~= vk then fail("dsdk{y = 0.25} = %.17g, dsdk{k = 5} = %.17g", vy, vk) end
  local okb, eb = pcall(bl.dsdk, with{ y = 0.25, k = 5 })
  if okb or not tostring(eb):find("'k'", 1, true) or not tostring(eb):find("'y'", 1, true) then
    fail("dsdk with k and y: expected an error naming both, got %s", tostring(eb))
  end
  local oky, ey = pcall(bl.dsdk, with{ y = 1.5 })
  if oky or not tostring(ey):find("field 'y' must be in (0, 1), got 1.5", 1, true) then
    fail("dsdk{y = 1.5}: expected the range error, got %s", tostring(ey))
  end
  local s0 = bl.spectrum(with{ y = { 0.2, 0.4, 0.6 }, threads = 0 })
  local _, npout = U.sh("getconf _NPROCESSORS_ONLN")
  local np = tonumber((npout or ""):match("%d+"))
  local want = np and math.min(np, 3) or nil
  if type(s0.threads) ~= "number" or s0.threads < 1 or s0.threads > 3 or
     (want and s0.threads ~= want) then
    fail("spectrum{threads = 0}.threads = %s, expected min(processors, points) = %s",
         tostring(s0.threads), tostring(want))
  end
  local s1 = bl.spectrum(with{ y = { 0.2, 0.4, 0.6 }, threads = 1 })
  if s1.threads ~= 1 then fail("spectrum{threads = 1}.threads = %s", tostring(s1.threads)) end
  for i = 1, 3 do
    if s0.dsdk[i] ~= s1.dsdk[i] then fail("spectrum on threads differs at point %d", i) end
  end
end

--[[ 3: references to headings. ]]
local heading_set, anchors = {}, {}
for _, h in ipairs(headings) do
  heading_set[h] = true
  -- GitHub's anchors: lower case, punctuation dropped, blanks to '-'
  local a = h:lower():gsub("[^%w%s_%-\128-\255]", ""):gsub("%s", "-")
  anchors[a] = true
end
for a in readme:gmatch("%]%(#([^)]+)%)") do
  if not anchors[a] then fail("README.md links to #%s: no such heading", a) end
end

--[[ The string literals of a C file, adjacent ones joined. ]]
local function c_strings(text)
  local out, i, n = {}, 1, #text
  local cur, joinable = nil, false
  while i <= n do
    local c2 = text:sub(i, i + 1)
    local c = text:sub(i, i)
    if c2 == "/*" then
      local e = text:find("*/", i + 2, true) or n
      i = e + 2
    elseif c2 == "//" then
      i = (text:find("\n", i, true) or n) + 1
    elseif c == "'" then
      local j = i + 1
      while j <= n and text:sub(j, j) ~= "'" do
        if text:sub(j, j) == "\\" then j = j + 1 end
        j = j + 1
      end
      i = j + 1
      joinable = false
    elseif c == '"' then
      local j, buf = i + 1, {}
      while j <= n and text:sub(j, j) ~= '"' do
        if text:sub(j, j) == "\\" then buf[#buf + 1] = text:sub(j, j + 1); j = j + 2
        else buf[#buf + 1] = text:sub(j, j); j = j + 1 end
      end
      local s = table.concat(buf)
      if cur and joinable then out[#out] = out[#out] .. s
      else out[#out + 1] = s end
      cur, joinable = true, true
      i = j + 1
    elseif c:match("%s") then
      i = i + 1
    else
      joinable = false
      i = i + 1
    end
  end
  return out
end

local files = {}
do
  local p = io.popen("cd " .. U.q(absroot) ..
                     " && ls src/*/*.c src/*/*/*.c lua/brakelight/*.lua 2>/dev/null")
  for f in p:lines() do files[#files + 1] = f end
  p:close()
end
local refs = 0
for _, f in ipairs(files) do
  local text = assert(U.read(absroot .. "/" .. f))
  local strs
  if f:match("%.c$") then strs = c_strings(text)
  else strs = {}
    for s in text:gmatch('"([^"\n]*)"') do strs[#strs + 1] = s end
    for s in text:gmatch("'([^'\n]*)'") do strs[#strs + 1] = s end
  end
  for _, s in ipairs(strs) do
    for h in s:gmatch("README, ([^)]+)%)") do
      refs = refs + 1
      h = h:gsub('^\\?"', ""):gsub('\\?"$', "")
      if not heading_set[h] then
        fail("%s: a message points to (README, %s): README.md has no such heading", f, h)
      end
    end
  end
end
U.check(refs >= 2, "found only %d README references in messages (the scan of the sources is broken)", refs)
for _, s in ipairs(skipped) do print("  skipped " .. s) end
if #failures > 0 then
  error("test_readme: " .. #failures .. " problem(s):\n" ..
        table.concat(failures, "\n"), 0)
end
U.check(ran >= 5, "only %d README blocks ran", ran)
print(string.format("test_readme: ok (%d blocks ran, %d marked not run, %d " ..
                    "skipped, %d README references in messages)", ran, notrun,
                    #skipped, refs))
