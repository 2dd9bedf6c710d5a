-- Headless Neovim (0.7 or later) as a real LSP client of `settinglint server`, for NvimClientTests.
-- Environment: SETTINGLINT_SERVER (the server's command, one argument per line), SETTINGLINT_ROOT (the workspace),
-- SETTINGLINT_OUT (a folder for the results), SETTINGLINT_EDIT_LINE / _FROM / _TO (the edit to make, 1-based line).
-- It opens the file given on the command line, waits for diagnostics, writes them to first.txt, edits the line,
-- waits for the diagnostics to change, writes them to second.txt, and quits. Errors go to error.txt.
local out = vim.env.SETTINGLINT_OUT
local SEVERITY = { [1] = 'error', [2] = 'warning', [3] = 'note', [4] = 'hint' }

local function write(name, lines)
  local f = assert(io.open(out .. '/' .. name, 'w'))
  f:write(table.concat(lines, '\n'), '\n')
  f:close()
end

-- One line per diagnostic: code, 1-based line:column, level, message (sorted, so that the file is stable).
local function snapshot(bufnr)
  local lines = {}
  for _, d in ipairs(vim.diagnostic.get(bufnr)) do
    local lsp = d.user_data and d.user_data.lsp or {}
    local code = d.code or lsp.code or '?'
    table.insert(lines, string.format('%s %d:%d %s %s', code, d.lnum + 1, d.col + 1, SEVERITY[d.severity] or '?', d.message))
  end
  table.sort(lines)
  return lines
end

local function run()
  local cmd = vim.split(vim.env.SETTINGLINT_SERVER, '\n', { trimempty = true })
  local client_id = vim.lsp.start_client({ name = 'settinglint', cmd = cmd, root_dir = vim.env.SETTINGLINT_ROOT })
  assert(client_id, 'the server did not start')
  local bufnr = vim.api.nvim_get_current_buf()
  assert(vim.lsp.buf_attach_client(bufnr, client_id), 'could not attach the buffer')

  assert(vim.wait(60000, function() return #vim.diagnostic.get(bufnr) > 0 end, 50), 'no diagnostics within 60 s')
  local first = snapshot(bufnr)
  write('first.txt', first)

  local line = tonumber(vim.env.SETTINGLINT_EDIT_LINE)
  local old = vim.api.nvim_buf_get_lines(bufnr, line - 1, line, true)[1]
  assert(old == vim.env.SETTINGLINT_EDIT_FROM, 'line ' .. line .. ' is ' .. old)
  vim.api.nvim_buf_set_lines(bufnr, line - 1, line, true, { vim.env.SETTINGLINT_EDIT_TO })
  local joined = table.concat(first, '\n')
  assert(vim.wait(60000, function() return table.concat(snapshot(bufnr), '\n') ~= joined end, 50), 'diagnostics did not change within 60 s')
  write('second.txt', snapshot(bufnr))

  vim.lsp.stop_client(client_id)
  vim.wait(10000, function() return vim.lsp.get_client_by_id(client_id) == nil end, 50)
end

-- The file named on the command line is loaded after this script runs: start once the editor is up.
vim.api.nvim_create_autocmd('VimEnter', {
  once = true,
  callback = function()
    local ok, err = pcall(run)
    if not ok then write('error.txt', { tostring(err) }) end
    vim.cmd('qa!')
  end,
})
