// Keeps better-sqlite3 built for the Node ABI that runs the tests. Electron packaging
// rebuilds it for Electron's ABI; this guard flips it back (see DEVELOPERS.md).
const { execSync, spawnSync } = require('node:child_process');
const probe = "const D=require('better-sqlite3'); new D(':memory:').close()";
const loads = () => spawnSync(process.execPath, ['-e', probe], { stdio: 'pipe' }).status === 0;
if (!loads()) {
  console.warn(`better-sqlite3 does not load under Node ${process.version}; running npm rebuild better-sqlite3`);
  execSync('npm rebuild better-sqlite3', { stdio: 'inherit' });
  if (!loads()) process.exit(1);
}
