// One runner for the whole repository: each folder with a jest.config.js is a project.
const { existsSync } = require('node:fs');
const { join } = require('node:path');

const candidates = [
  'libs/spectral-engine',
  'libs/contracts',
  'libs/ui',
  'apps/api',
  'apps/client-portal',
  'apps/lab-portal',
  'test/reference',
  'test/browser',
];

module.exports = {
  // testTimeout is a global option: jest ignores it inside a project's config. 30 s leaves room for a
  // loaded 2-core CI machine; the browser project raises it again in its setupFilesAfterEnv.
  testTimeout: 30_000,
  projects: candidates
    .map((dir) => join(__dirname, dir, 'jest.config.js'))
    .filter((file) => existsSync(file)),
};
