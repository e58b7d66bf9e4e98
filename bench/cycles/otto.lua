-- otto.lua — wrk script: GET /v1/cycles/otto (variable-property air) with a
-- different compression ratio (7..13) and peak temperature (1800..2600 K) on
-- every request, in non-repeating walks, so no cache can answer it.
local n = 0
local id = 0

function setup(thread)
  id = id + 1
  thread:set("offset", id * 0.173)
end

function request()
  n = n + 1
  local o = offset or 0
  local cr = 7 + ((n * 0.6180339 + o) % 6)
  local tp = 1800 + ((n * 7.919 + o) % 800)
  return wrk.format("GET", string.format(
    "/v1/cycles/otto?compression_ratio=%.5f&peak_temperature=%.4f", cr, tp))
end
