--[[
  brakelight.recipe -- small conveniences shared by lua/recipes/*.lua

  recipe.small()        -> true when the environment variable
                           BRAKELIGHT_SMALL is set to a non-empty value other
                           than "0" (the tests run every recipe that way: few
                           points, loose tolerance)
  recipe.outdir()       -> the directory for the recipe's files: the first
                           script argument, else "." ; created if missing
  recipe.path(name)     -> outdir .. "/" .. name
  recipe.gauss(n)       -> nodes and weights of n-point Gauss-Legendre on
                           (0, 1) (Newton on the Legendre recurrence)
  recipe.integrate(f_of_y_list, pieces, n)
                        -> integral over y in (0, 1) of a function given
                           vectorised: f(ylist) -> list of values; `pieces`
                           is a list of breakpoints such as {0, 0.5, 0.9, 1}
]]

local recipe = {}

function recipe.small()
  local v = os.getenv("BRAKELIGHT_SMALL")
  return v ~= nil and v ~= "" and v ~= "0"
end

function recipe.outdir()
  local d = (arg and arg[1]) or "."
  os.execute("mkdir -p '" .. d:gsub("'", "'\\''") .. "'")
  return d
end

function recipe.path(name)
  return recipe.outdir() .. "/" .. name
end

function recipe.gauss(n)
  local x, w = {}, {}
  for i = 1, n do
    local z = math.cos(math.pi * (i - 0.25) / (n + 0.5))
    local dp
    for _ = 1, 100 do
      local p1, p2 = 1.0, 0.0
      for j = 1, n do
        p1, p2 = ((2 * j - 1) * z * p1 - (j - 1) * p2) / j, p1
      end
      dp = n * (z * p1 - p2) / (z * z - 1)
      local dz = p1 / dp
      z = z - dz
      if math.abs(dz) < 1e-15 then break end
    end
    x[i] = 0.5 * (1 - z)
    w[i] = 1 / ((1 - z * z) * dp * dp)   -- 2/((1-z^2)p'^2) times 1/2
  end
  return x, w
end

function recipe.integrate(f, pieces, n)
  local gx, gw = recipe.gauss(n)
  local ys, ws = {}, {}
  for p = 1, #pieces - 1 do
    local a, b = pieces[p], pieces[p + 1]
    for i = 1, n do
      ys[#ys + 1] = a + (b - a) * gx[i]
      ws[#ws + 1] = (b - a) * gw[i]
    end
  end
  local vals = f(ys)
  local sum = 0
  for i = 1, #ys do sum = sum + ws[i] * vals[i] end
  return sum
end

return recipe
