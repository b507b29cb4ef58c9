// Remove build outputs (portable; no extra dependency).
const fs = require('fs');
const path = require('path');
for (const p of ['lib', 'lib-test', 'tsconfig.tsbuildinfo', '../chemcheck/labextension']) {
  fs.rmSync(path.resolve(__dirname, '..', p), { recursive: true, force: true });
}
