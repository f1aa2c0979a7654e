// Three suites, run in one process one file at a time (they share the test databases):
// unit (shared code), api (supertest against PostgreSQL), e2e (the web build in Chromium).
const tsJest = [
  'ts-jest',
  {
    tsconfig: {
      module: 'commonjs',
      moduleResolution: 'node10',
      target: 'es2022',
      jsx: 'react-jsx',
      esModuleInterop: true,
      strict: true,
      skipLibCheck: true,
      customConditions: null,
      // Each file is compiled alone (fast); `tsc --noEmit` in `npm test` checks types across files.
      isolatedModules: true,
    },
    diagnostics: false,
  },
];

const project = (name, extra = {}) => ({
  displayName: name,
  testEnvironment: 'node',
  testMatch: [`<rootDir>/tests/${name}/**/*.test.ts`],
  transform: { '^.+\\.tsx?$': tsJest },
  moduleNameMapper: { '^@/(.*)$': '<rootDir>/$1' },
  ...extra,
});

module.exports = {
  // Generous because the browser suite waits on a real page; unit and API tests finish far sooner.
  testTimeout: 60_000,
  projects: [
    project('unit'),
    project('api'),
    project('e2e'),
  ],
};
