/**
 * Jest 30 cannot load ESM on Node 20 and NestJS 12 ships ESM: @swc/jest compiles our TypeScript
 * and the ESM packages in node_modules (see docs/architecture.md). swc does not type-check, so the
 * test run also runs `tsc --noEmit`.
 */
/** @type {import('jest').Config} */
module.exports = {
  rootDir: '.',
  testEnvironment: 'node',
  testMatch: ['<rootDir>/src/**/*.spec.ts', '<rootDir>/test/**/*.e2e-spec.ts'],
  transform: {
    '^.+\\.(t|j|mj)s$': [
      '@swc/jest',
      {
        jsc: {
          parser: { syntax: 'typescript', decorators: true },
          transform: { legacyDecorator: true, decoratorMetadata: true },
          target: 'es2022',
        },
        module: { type: 'commonjs' },
      },
    ],
  },
  transformIgnorePatterns: [
    '/node_modules/(?!(@nestjs|file-type|strtok3|token-types|peek-readable|@tokenizer|uint8array-extras|@borewit|ml-levenberg-marquardt|is-any-array)/)',
  ],
  moduleFileExtensions: ['ts', 'js', 'mjs', 'json'],
  testTimeout: 30000,
};
