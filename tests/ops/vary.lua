-- tests/ops/vary.lua — wrk script for the ops benchmarks: scales the first
-- numeric query parameter of the path by a factor between 1 and 1.48 that
-- changes on every request, so no cache can answer the benchmark.
local n = 0
request = function()
  n = n + 1
  local f = 1 + (n % 97) / 200
  local p = string.gsub(wrk.path, "=(%d+%.?%d*)", function(v)
    return "=" .. string.format("%.6g", tonumber(v) * f)
  end, 1)
  return wrk.format("GET", p)
end
