-- brayton.lua — wrk script: GET /v1/cycles/brayton, a fuel-fired (methane)
-- regenerative cycle with two intercooled and two reheat stages (the bench
-- case of the brayton preset), pressure ratio (6..14) and turbine inlet
-- temperature (1250..1450 K) varied on every request. BRAYTON_EXTRA in the
-- environment of the runner is appended to the query (run.sh passes
-- "&optimum_search=true" for the run with the optimum searches, about 50
-- full evaluations each request; they are off by default).
local n = 0
local id = 0
local extra = os.getenv("BRAYTON_EXTRA") or ""

function setup(thread)
  id = id + 1
  thread:set("offset", id * 0.173)
end

function request()
  n = n + 1
  local o = offset or 0
  local rp = 6 + ((n * 0.6180339 + o) % 8)
  local tit = 1250 + ((n * 7.919 + o) % 200)
  return wrk.format("GET", string.format(
    "/v1/cycles/brayton?pressure_ratio=%.5f&turbine_inlet_temperature=%.4f" ..
    "&compressor_efficiency=0.87&turbine_efficiency=0.9&compressor_stages=2&turbine_stages=2" ..
    "&regenerator_effectiveness=0.8&fuel=methane&site.altitude=320&net_power=45000%s",
    rp, tit, extra))
end
