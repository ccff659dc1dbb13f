// Preloaded with `node -r` by the reliability tests: writes the process's resource usage
// (peak RSS, CPU) to $SOILCELL_RUSAGE_FILE when it exits, however it exits short of a kill.
const fs = require("fs");
const file = process.env.SOILCELL_RUSAGE_FILE;
if (file) {
  process.on("exit", () => {
    fs.writeFileSync(file, JSON.stringify(process.resourceUsage()));
  });
}
