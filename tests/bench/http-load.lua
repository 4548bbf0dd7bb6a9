-- Driven by tests/bench/http-load.ts: wrk (Debian's package) replays prepared dashboard requests
-- and reports its latency percentiles in one line the caller parses. No response() hook on
-- purpose: defining one makes wrk hand every answer to Lua, which would cost CPU on the cores the
-- app under test shares.
local prepared = {}
local next_index = 0

-- args[1]: a file with one request a line, "path<TAB>cookie".
function init(args)
  for line in io.lines(args[1]) do
    local path, cookie = line:match('^([^\t]+)\t(.+)$')
    -- What the dashboard's browser sends with each API request: JSON wanted, compressed answers welcome.
    prepared[#prepared + 1] = wrk.format('GET', path, {
      ['Cookie'] = cookie,
      ['Accept'] = 'application/json',
      ['Accept-Encoding'] = 'gzip, deflate, br, zstd',
    })
  end
end

function request()
  next_index = next_index % #prepared + 1
  return prepared[next_index]
end

function done(summary, latency, _requests)
  local e = summary.errors
  io.write(string.format(
    'wrk-result requests=%d duration_us=%d not_ok=%d errors=%d p50_us=%d p95_us=%d p99_us=%d\n',
    summary.requests, summary.duration, e.status, e.connect + e.read + e.write + e.timeout,
    math.floor(latency:percentile(50)), math.floor(latency:percentile(95)), math.floor(latency:percentile(99))))
end
