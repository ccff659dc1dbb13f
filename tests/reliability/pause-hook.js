// (A helper: no reference values of its own; the workbooks it pauses are invented.)
// Preloaded with `node -r` by the kill tests: stops the soilcell process at one chosen point of a
// recalc, says so on stderr ("PAUSED <point>"), and waits there until the test kills it, so each
// kill lands exactly where it is meant to (a timer cannot promise that). The point is
// $SOILCELL_PAUSE_AT:
//   after-read      the input's bytes have been read, nothing computed
//   computing       the "computing" progress line has been printed
//   write-half      half of the temporary file's bytes are on disk
//   before-rename   the temporary file is whole and synced, not yet renamed to the output
//   after-rename    the output is in place
// Only fs calls are wrapped; the code under test is unchanged.
const fs = require("fs");
const point = process.env.SOILCELL_PAUSE_AT;
if (point) {
  const say = (what) => fs.writeSync(2, `PAUSED ${what}\n`);
  const wait = () => Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0);
  const pause = () => {
    say(point);
    wait();
  };
  const partialFds = new Set();
  const { readFileSync, openSync, writeSync, renameSync } = fs;
  fs.readFileSync = function (file, ...rest) {
    const r = readFileSync.call(fs, file, ...rest);
    if (point === "after-read" && typeof file === "string" && file.endsWith(".xlsx")) pause();
    return r;
  };
  fs.openSync = function (file, ...rest) {
    const fd = openSync.call(fs, file, ...rest);
    if (typeof file === "string" && file.endsWith(".partial")) partialFds.add(fd);
    return fd;
  };
  fs.writeSync = function (fd, data, ...rest) {
    if (point === "write-half" && partialFds.has(fd) && Buffer.isBuffer(data) && rest.length === 0 && data.length > 1) {
      writeSync.call(fs, fd, data, 0, Math.floor(data.length / 2));
      pause();
    }
    return writeSync.call(fs, fd, data, ...rest);
  };
  fs.renameSync = function (from, to) {
    if (point === "before-rename" && String(from).endsWith(".partial")) pause();
    const r = renameSync.call(fs, from, to);
    if (point === "after-rename" && String(from).endsWith(".partial")) pause();
    return r;
  };
  const write = process.stderr.write.bind(process.stderr);
  process.stderr.write = (chunk, ...rest) => {
    const r = write(chunk, ...rest);
    if (point === "computing" && /^computing /m.test(String(chunk))) pause();
    return r;
  };
}
