// Preloaded with `node -r` by the reliability tests: writes the process's resource usage
// (peak RSS, CPU) to $SOILCELL_RUSAGE_FILE when it exits, however it exits short of a kill.
// The peak is read from /proc/self/status (VmHWM) where there is one: getrusage's maxRSS on
// Linux survives exec, so a child spawned by a large test process would report its parent's peak.
const fs = require("fs");
const file = process.env.SOILCELL_RUSAGE_FILE;
if (file) {
  process.on("exit", () => {
    const usage = process.resourceUsage();
    try {
      const m = /VmHWM:\s+(\d+) kB/.exec(fs.readFileSync("/proc/self/status", "utf8"));
      if (m) usage.maxRSS = Number(m[1]);
    } catch {
      // not Linux: getrusage's figure stands
    }
    fs.writeFileSync(file, JSON.stringify(usage));
  });
}
