// Preloaded with `node -r` by tests/cli: makes the recalc's "computing" progress line throw a plain
// Error, as a fault the command does not expect (not a refused path, not a bad workbook), so the
// test can see what the person at the terminal sees then. Only process.stderr.write is wrapped. No values: invented fault only.
const write = process.stderr.write.bind(process.stderr);
process.stderr.write = (chunk, ...rest) => {
  if (/^computing /.test(String(chunk))) throw new Error("injected fault for the test");
  return write(chunk, ...rest);
};
