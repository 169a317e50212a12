// Shared jest settings for the Node-side projects (engine, contracts, API, reference checks).
const { join } = require('node:path');

const root = __dirname;

module.exports = function nodeProject(name, dir, extra = {}) {
  return {
    displayName: name,
    rootDir: join(root, dir),
    testEnvironment: 'node',
    testMatch: ['**/*.spec.ts'],
    transform: {
      '^.+\\.ts$': ['ts-jest', { tsconfig: join(root, 'tsconfig.spec.json') }],
    },
    moduleNameMapper: {
      '^@ohmprint/spectral-engine$': join(root, 'libs/spectral-engine/src/index.ts'),
      '^@ohmprint/contracts$': join(root, 'libs/contracts/src/index.ts'),
    },
    ...extra,
  };
};
