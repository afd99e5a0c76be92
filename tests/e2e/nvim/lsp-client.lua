-- A second LSP client for Tessera: headless Neovim 0.7 (Debian's) talks to `tessera lsp --stdio`,
-- opens the deliberate-mistakes spec, waits for its diagnostics, opens the demo, asks for the hover
-- on a fragment name, and writes what it received to a JSON file for nvim-lsp.mjs to check.
-- Neovim 0.7 has no vim.lsp.start: start_client + buf_attach_client, by hand (-u NONE turns
-- filetype detection off).
-- Environment: TESSERA_ROOT (folder to run npx in), TESSERA_DIAGNOSTICS_FILE, TESSERA_HOVER_FILE,
-- TESSERA_HOVER_FRAGMENT, TESSERA_OUT.
local root = assert(vim.env.TESSERA_ROOT, 'TESSERA_ROOT not set')
local diagnostics_file = assert(vim.env.TESSERA_DIAGNOSTICS_FILE, 'TESSERA_DIAGNOSTICS_FILE not set')
local hover_file = assert(vim.env.TESSERA_HOVER_FILE, 'TESSERA_HOVER_FILE not set')
local fragment = assert(vim.env.TESSERA_HOVER_FRAGMENT, 'TESSERA_HOVER_FRAGMENT not set')
local out = assert(vim.env.TESSERA_OUT, 'TESSERA_OUT not set')

local t0 = vim.loop.hrtime()
local function ms() return math.floor((vim.loop.hrtime() - t0) / 1e6) end

local report = {
  ok = false,
  nvim = string.format('%d.%d.%d', vim.version().major, vim.version().minor, vim.version().patch),
  timings_ms = {},
}
local client_id, exited = nil, nil
local published = {} -- uri -> the last publishDiagnostics params

local function open(file)
  vim.cmd('edit ' .. vim.fn.fnameescape(file))
  local bufnr = vim.api.nvim_get_current_buf()
  assert(vim.lsp.buf_attach_client(bufnr, client_id), 'buf_attach_client failed for ' .. file)
  return bufnr
end

local function main()
  client_id = vim.lsp.start_client({
    name = 'tessera',
    cmd = { 'npx', '--no', 'tessera', 'lsp', '--stdio' },
    cmd_cwd = root,
    root_dir = root,
    handlers = {
      ['textDocument/publishDiagnostics'] = function(err, result, ctx, config)
        published[result.uri] = result
        return vim.lsp.handlers['textDocument/publishDiagnostics'](err, result, ctx, config)
      end,
    },
    on_exit = function(code, signal) exited = { code = code, signal = signal } end,
  })
  assert(client_id, 'vim.lsp.start_client returned nil (could not start npx tessera lsp --stdio)')

  -- 1. diagnostics of the mistakes file
  local bufnr = open(diagnostics_file)
  local uri = vim.uri_from_bufnr(bufnr)
  local got = vim.wait(30000, function()
    return exited ~= nil or (published[uri] ~= nil and #published[uri].diagnostics > 0)
  end, 10)
  assert(not exited, 'language server exited early: ' .. vim.inspect(exited) .. ' (see ' .. vim.lsp.get_log_path() .. ')')
  assert(got, 'no diagnostics within 30 s')
  report.timings_ms.diagnostics = ms()
  report.diagnostics = {}
  for _, d in ipairs(published[uri].diagnostics) do
    table.insert(report.diagnostics, {
      code = d.code, message = d.message, severity = d.severity, source = d.source,
      line = d.range.start.line, character = d.range.start.character,
    })
  end
  report.shown_by_neovim = #vim.diagnostic.get(bufnr)

  -- 2. hover on the fragment name in the demo
  local demo = open(hover_file)
  local position
  for index, text in ipairs(vim.api.nvim_buf_get_lines(demo, 0, -1, false)) do
    local column = text:find('fragment ' .. fragment .. ' ', 1, true)
    if column then
      position = { line = index - 1, character = column - 1 + #'fragment ' + 1 }
      break
    end
  end
  assert(position, "no line 'fragment " .. fragment .. "' in " .. hover_file)
  report.hover_position = position
  local responses, err = vim.lsp.buf_request_sync(demo, 'textDocument/hover',
    { textDocument = { uri = vim.uri_from_bufnr(demo) }, position = position }, 10000)
  assert(responses, 'hover request failed: ' .. tostring(err))
  local response = responses[client_id]
  assert(response, 'no hover response')
  assert(not response.error, 'hover error: ' .. vim.inspect(response.error))
  local contents = response.result and response.result.contents
  assert(contents, 'hover returned no contents')
  if type(contents) == 'table' and contents.value then
    report.hover = contents.value
    report.hover_kind = contents.kind
  else
    report.hover = table.concat(vim.lsp.util.convert_input_to_markdown_lines(contents), '\n')
  end
  report.timings_ms.hover = ms()

  vim.lsp.stop_client(client_id)
  report.server_stopped = vim.wait(5000, function() return exited ~= nil end, 10)
  report.server_exit = exited
  report.ok = true
end

local ok, e = xpcall(main, debug.traceback)
if not ok then
  report.error = tostring(e)
  io.stderr:write('lsp-client.lua failed: ', tostring(e), '\n')
  if client_id and not exited then vim.lsp.stop_client(client_id, true) end
end
local written, werr = pcall(function()
  local f = assert(io.open(out, 'w'))
  f:write(vim.json.encode(report), '\n')
  f:close()
end)
if not written then io.stderr:write('could not write ', out, ': ', tostring(werr), '\n') end
-- Always leave: an uncaught error would keep headless nvim waiting for input.
vim.cmd((ok and written) and 'qall!' or 'cquit 1')
