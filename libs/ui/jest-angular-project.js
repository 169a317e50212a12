// Shared jest settings for the Angular projects (libs/ui and both portals): jsdom, zoneless TestBed.
const { join } = require('node:path');
const { createCjsPreset } = require('jest-preset-angular/presets');

const root = join(__dirname, '../..');

module.exports = function angularProject(name, dir) {
  return {
    ...createCjsPreset({
      testEnvironment: 'jest-preset-angular/environments/jest-jsdom-env',
      tsconfig: join(root, 'libs/ui/tsconfig.spec.json'),
    }),
    displayName: name,
    rootDir: join(root, dir),
    testMatch: ['**/*.spec.ts'],
    setupFilesAfterEnv: [join(root, 'libs/ui/jest-setup.ts')],
    moduleNameMapper: {
      '^@ohmprint/ui/testing$': join(root, 'libs/ui/src/testing/index.ts'),
      '^@ohmprint/(spectral-engine|contracts|ui)$': join(root, 'libs/$1/src/index.ts'),
    },
  };
};
