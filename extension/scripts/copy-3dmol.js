// Serve 3Dmol.js from the labextension's own static folder: no CDN, works offline.
const fs = require('fs');
const path = require('path');
const src = require.resolve('3dmol/build/3Dmol-min.js');
const dest = path.resolve(__dirname, '..', '..', 'chemcheck', 'labextension', 'static', '3Dmol-min.js');
fs.mkdirSync(path.dirname(dest), { recursive: true });
fs.copyFileSync(src, dest);
console.log(`copied ${path.basename(src)} to ${dest}`);
