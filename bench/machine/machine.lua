-- machine.lua — wrk script for the machine routes (bench/machine/run.sh):
-- MACHINE_ROUTE in the runner's environment picks "site" (GET
-- /v1/machine/site, the ambient temperature and humidity varied on every
-- request) or "corrections" (GET /v1/machine/corrections, a 50-point
-- ambient-temperature curve, its range varied on every request). The
-- machine is the invented demo machine, Quillmere peaking station unit 1
-- (45 MW at 320 m; methane here for a short query).
local n = 0
local id = 0
local route = os.getenv("MACHINE_ROUTE") or "site"
local machine = "machine.design.pressure_ratio=15.5&machine.design.turbine_inlet_temperature=1480" ..
  "&machine.design.compressor_efficiency=0.87&machine.design.turbine_efficiency=0.9" ..
  "&machine.design.inlet_pressure_loss=0.01&machine.design.combustor_pressure_loss=0.04" ..
  "&machine.design.exhaust_pressure_loss=0.015&machine.design.combustor_efficiency=0.995" ..
  "&machine.design.mechanical_efficiency=0.99&machine.design.generator_efficiency=0.985" ..
  "&machine.design.site.altitude=320&machine.design.site.temperature=291.15" ..
  "&machine.design.site.relative_humidity=0.65&machine.design.net_power=45000" ..
  "&machine.design.fuel=methane&machine.control.igv_minimum_flow_fraction=0.75"

function setup(thread)
  id = id + 1
  thread:set("offset", id * 0.173)
end

function request()
  n = n + 1
  local o = offset or 0
  if route == "corrections" then
    local from = 243.15 + ((n * 0.6180339 + o) % 10)
    local to = 313.15 + ((n * 7.919 + o) % 10)
    return wrk.format("GET", string.format(
      "/v1/machine/corrections?%s&variable=temperature&row_count=50" ..
      "&temperature.from=%.4f&temperature.to=%.4f", machine, from, to))
  end
  local t = 263.15 + ((n * 3.0901699 + o) % 50)
  local rh = 0.2 + ((n * 0.0618034 + o) % 0.6)
  return wrk.format("GET", string.format(
    "/v1/machine/site?%s&site.altitude=320&site.temperature=%.4f&site.relative_humidity=%.4f",
    machine, t, rh))
end
