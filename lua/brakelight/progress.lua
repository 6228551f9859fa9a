--[[
  brakelight.progress -- progress of a long loop on standard error

  local p = progress.new{ total = 120, label = "scan", mode = "bar" }
  p:update(done [, computed])   -- done: points finished so far (incl.
                                -- reused ones); computed: those computed
                                -- in this run (for the rate)
  p:finish()

  Modes:
    "bar"    one line redrawn in place (for a terminal):
               scan  [#########...........]  45/120  2.31 pt/s  left 0:32
             redrawn at most 5 times a second and at the end;
    "lines"  one plain line every `every` points (default: a tenth of the
             total, at least 1) and at the end:
               scan: 45/120 points (37.5 %), 2.31 points/s, 0:32 left
    "off"    nothing.
  The rate counts only the points computed in this run, so resumed
  points do not inflate it.  Time comes from opts.clock (seconds, any
  origin; the runner passes a monotonic clock) or os.time.
]]

local progress = {}
progress.__index = progress

local format, floor = string.format, math.floor


--[[ h:mm:ss or m:ss of a duration in seconds. ]]
local function hms(s)
  if s ~= s or s == math.huge then return "?" end
  s = math.floor(s + 0.5)
  local h, m = floor(s / 3600), floor((s % 3600) / 60)
  if h > 0 then return format("%d:%02d:%02d", h, m, s % 60) end
  return format("%d:%02d", m, s % 60)
end
progress.hms = hms


function progress.new(opts)
  local self = setmetatable({}, progress)
  self.total = assert(opts.total, "progress.new: total missing")
  self.label = opts.label or "progress"
  self.mode = opts.mode or "lines"
  self.every = opts.every or math.max(1, math.ceil(self.total / 10))
  self.clock = opts.clock or os.time
  self.out = opts.stream or io.stderr
  self.width = opts.width or 24
  self.t0 = self.clock()
  self.last = -math.huge
  self.lastline = 0
  self.done, self.computed = 0, 0
  return self
end


--[[ Rate (points/s) and seconds left, from the computed points. ]]
function progress:estimate()
  local dt = self.clock() - self.t0
  local rate = (dt > 0 and self.computed > 0) and self.computed / dt or nil
  local left = rate and (self.total - self.done) / rate or nil
  return rate, left, dt
end


function progress:draw(final)
  local rate, left = self:estimate()
  if self.mode == "bar" then
    local frac = self.total > 0 and self.done / self.total or 1
    local full = math.floor(frac * self.width + 0.5)
    local bar = string.rep("#", full) .. string.rep(".", self.width - full)
    local tail = rate and format("%7.3g pt/s  left %s", rate,
                                 final and "0:00" or hms(left)) or "   -- pt/s"
    self.out:write(format("\r%s  [%s]  %d/%d  %s \27[K", self.label, bar,
                          self.done, self.total, tail))
    if final then self.out:write("\n") end
  elseif self.mode == "lines" then
    local pct = self.total > 0 and 100 * self.done / self.total or 100
    local line = format("%s: %d/%d points (%.1f %%)", self.label, self.done,
                        self.total, pct)
    if rate then
      line = line .. format(", %.3g points/s, %s left", rate, hms(left))
    end
    self.out:write(line, "\n")
  end
  self.out:flush()
end


function progress:update(done, computed)
  self.done = done
  if computed then self.computed = computed end
  if self.mode == "bar" then
    local now = self.clock()
    if now - self.last >= 0.2 or done >= self.total then
      self.last = now
      self:draw(false)
    end
  elseif self.mode == "lines" then
    if done - self.lastline >= self.every and done < self.total then
      self.lastline = done
      self:draw(false)
    end
  end
end


function progress:finish()
  if self.mode ~= "off" and not self.finished then
    self.finished = true
    self:draw(true)
  end
end


return progress
