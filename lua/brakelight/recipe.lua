--[[
  brakelight.recipe -- small conveniences shared by lua/recipes/*.lua

  recipe.small()        -> true when the environment variable
                           BRAKELIGHT_SMALL is set to a non-empty value other
                           than "0" (the tests run every recipe that way: few
                           points, loose tolerance)
  recipe.outdir()       -> the directory for the recipe's files: the first
                           script argument, else "." ; created if missing
  recipe.path(name)     -> outdir .. "/" .. name
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

return recipe
