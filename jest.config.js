/**
 * Three jest projects: the engine (pure numerics), the server (HTTP over a real SQLite file)
 * and the UI (jest-expo, react-native-web renderer). Browser tests run separately (tests/e2e).
 */
const swc = [
  '@swc/jest',
  {
    jsc: {
      parser: { syntax: 'typescript', tsx: false },
      target: 'es2022',
    },
    module: { type: 'commonjs' },
  },
];
const alias = { '^@/(.*)$': '<rootDir>/$1' };

module.exports = {
  projects: [
    {
      displayName: 'engine',
      testEnvironment: 'node',
      roots: ['<rootDir>/tests/engine'],
      transform: { '^.+\\.(t|j)sx?$': swc },
      moduleNameMapper: alias,
    },
    {
      displayName: 'server',
      testEnvironment: 'node',
      roots: ['<rootDir>/tests/server'],
      transform: { '^.+\\.(t|j)sx?$': swc },
      transformIgnorePatterns: ['/node_modules/(?!(lucia|@lucia-auth|@oslojs)/)'],
      moduleNameMapper: alias,
    },
    {
      displayName: 'ui',
      preset: 'jest-expo/web',
      roots: ['<rootDir>/tests/ui'],
      // Whole screens render in jsdom on a shared, often busy machine. Tests wait for what they read
      // (never a fixed time); these limits only end a test that is really stuck. Jest reads
      // `testTimeout` from the top-level config alone, so the UI project's limit goes to its set-up
      // file (tests/ui/support/setup.ts), which calls jest.setTimeout with it.
      globals: { uiTestTimeoutMs: 120_000 },
      setupFilesAfterEnv: ['<rootDir>/tests/ui/support/setup.ts'],
      // The project has no babel.config.js (Metro uses babel-preset-expo by default), so the
      // preset's babel-jest transform is given the preset explicitly.
      transform: {
        '\\.m?[jt]sx?$': [
          'babel-jest',
          { presets: ['babel-preset-expo'], caller: { name: 'metro', bundler: 'metro', platform: 'web' } },
        ],
      },
      moduleNameMapper: alias,
      // jest-expo's list, plus d3-scale/d3-shape and their d3 dependencies, which ship only ES modules.
      transformIgnorePatterns: [
        '/node_modules/(?!(.pnpm|react-native|@react-native|@react-native-community|expo|@expo|@expo-google-fonts|react-navigation|@react-navigation|@sentry/react-native|native-base|standard-navigation|d3-[a-z-]+|internmap))',
        '/node_modules/react-native-reanimated/plugin/',
        '/node_modules/@react-native/babel-preset/',
      ],
    },
  ],
};
