// Worker-thread entry used when the API runs from TypeScript sources (ts-jest, tsx): compiles
// cpu-tasks.ts on the fly with tsx (which also applies the tsconfig path aliases). The compiled
// API loads cpu-tasks.js directly and never reads this file.
require('tsx/cjs/api').register();
module.exports = require('./cpu-tasks.ts');
