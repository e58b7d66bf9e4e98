-- recordings.lua — wrk script of bench/combustion/run.sh: POSTs the
-- recordings named after "--" in turn (a different recording every
-- request, so nothing answers from a cache), as text/csv or JSON by their
-- file names (.csv or .json), to the URL's path and query.
local bodies, types = {}, {}
local n = 0

function init(args)
    for i = 1, #args do
        local f = assert(io.open(args[i], "rb"))
        bodies[i] = f:read("*a")
        f:close()
        types[i] = args[i]:match("%.json$") and "application/json" or "text/csv"
    end
end

function request()
    n = n % #bodies + 1
    return wrk.format("POST", wrk.path, { ["Content-Type"] = types[n] }, bodies[n])
end
