-- properties.lua — wrk script: GET /v1/properties for dry air at a different
-- temperature on every request (250..1750 K in a non-repeating walk), so no
-- cache anywhere can answer from a previous request.
local n = 0
local id = 0

function setup(thread)
  id = id + 1
  thread:set("offset", id * 0.137)
end

function request()
  n = n + 1
  local T = 250 + ((n * 7.919 + (offset or 0)) % 1500)
  return wrk.format("GET", string.format("/v1/properties?gas=air&T=%.4f&P=101.325", T))
end
