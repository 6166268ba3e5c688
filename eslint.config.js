// Lint rules for the whole project: TypeScript everywhere, Svelte components in renderer/.
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import svelte from 'eslint-plugin-svelte';
import globals from 'globals';

// The engine stays pure: no DOM, no Node I/O.
const PURE_ENGINE = {
  group: ['node:*', 'fs', 'path', 'electron', 'svelte', 'svelte/*', 'plotly.js-dist-min'],
  message: 'shared/ is pure TypeScript: no Node I/O, no DOM, no Svelte, no Electron.',
};

/**
 * The parts of shared/ and what each may import (DEVELOPERS.md, "Stages and what they may
 * import"). Lower may not import higher; type imports count too, so no folder cycle can form.
 */
const SHARED_MAY_IMPORT = {
  table: [],
  stats: [],
  optimize: ['stats'],
  units: ['table'],
  import: ['stats', 'optimize', 'units', 'table'],
  quality: ['stats', 'optimize', 'units', 'table'],
  models: ['stats', 'optimize', 'units', 'table', 'import', 'quality'],
  economics: ['stats', 'optimize', 'units', 'table', 'import', 'quality', 'models'],
  analysis: ['stats', 'optimize', 'units', 'table', 'import', 'quality', 'models', 'economics'],
  report: [
    'stats',
    'optimize',
    'units',
    'table',
    'import',
    'quality',
    'models',
    'economics',
    'analysis',
  ],
  // models: the model names a project file may list (validated on reading).
  project: ['table', 'units', 'models'],
  demo: ['stats', 'optimize', 'units', 'table', 'models'],
  // The desktop contract (window.plotrate's types), imported by electron/ and renderer/.
  desktop: [],
};

/** Imports of types only that a part may make on top of SHARED_MAY_IMPORT. */
const SHARED_MAY_IMPORT_TYPES = {
  // The project file keeps the import's column mapping.
  project: ['import'],
  // The shell opens and saves projects.
  desktop: ['project'],
};

/**
 * The report takes an analysis and writes bytes: it fits nothing. Its values may come from these
 * modules only where they do not fit (types from anywhere below are fine).
 */
const REPORT_NO_FITTING = [
  {
    // The curve half of the models (names, dashes, parameter units, curves), never the
    // catalog, which carries the fitters (tests/layout.reportFitsNothing.test.ts checks
    // the whole import chain).
    regex: '^(\\.\\./)+(shared/)?models/(?!(modelTypes|modelCurve|curves|curveValue|rateFormat)$)',
    allowTypeImports: true,
    message: 'shared/report fits nothing: take the fits from the analysis result.',
  },
  {
    regex:
      '^(\\.\\./)+(shared/)?analysis/(?!(leadingModel|rateGrid|recommendationModel|regionalReturn|regionalRecommendation|siteModelRows|sitePlots|modelLabel|describeFTest|sitesInputError|repriceAcrossSites|chooseSiteModels)$)',
    allowTypeImports: true,
    message: "shared/report fits nothing: take the fitting steps' results from the analysis.",
  },
  {
    regex:
      '^(\\.\\./)+(shared/)?(economics/bootstrapOptimum|optimize/|stats/(leastSquares|qr|oneWayAnova|randomizedBlockAnova|rateBlockModel|lackOfFit|interceptTest)$)',
    allowTypeImports: true,
    message: 'shared/report fits nothing: resampling and model fits belong to the analysis.',
  },
];

function folderPattern(folders, allowTypeImports, message) {
  return {
    regex: `^(\\.\\./)+(shared/)?(${folders.join('|')})(/|$)`,
    allowTypeImports,
    message,
  };
}

/** no-restricted-imports per part of shared/, plus the adapters' boundaries. */
function stageBoundaries() {
  const parts = Object.keys(SHARED_MAY_IMPORT);
  const outsideShared = {
    regex: '^(\\.\\./)+(renderer|electron|cli|tests|bench|scripts)(/|$)',
    message: 'shared/ imports nothing from the adapters, tests or scripts.',
  };
  const configs = [];
  for (const part of parts) {
    const allowed = new Set([part, ...SHARED_MAY_IMPORT[part]]);
    const typesOnly = SHARED_MAY_IMPORT_TYPES[part] ?? [];
    const mayImport = SHARED_MAY_IMPORT[part];
    const message =
      mayImport.length > 0
        ? `shared/${part} may import only ${mayImport.join(', ')} of shared/ (DEVELOPERS.md, stages).`
        : `shared/${part} imports nothing else of shared/ (DEVELOPERS.md, stages).`;
    const forbidden = parts.filter((p) => !allowed.has(p) && !typesOnly.includes(p));
    const patterns = [PURE_ENGINE, outsideShared];
    if (forbidden.length > 0) patterns.push(folderPattern(forbidden, false, message));
    if (typesOnly.length > 0)
      patterns.push(
        folderPattern(
          typesOnly,
          true,
          `shared/${part} may import only types from ${typesOnly.join(', ')}.`,
        ),
      );
    const rule = (extra) => ({
      'no-restricted-imports': 'off',
      '@typescript-eslint/no-restricted-imports': ['error', { patterns: [...patterns, ...extra] }],
    });
    if (part === 'report') {
      configs.push({ files: ['shared/report/**/*.ts'], rules: rule(REPORT_NO_FITTING) });
    } else {
      configs.push({ files: [`shared/${part}/**/*.ts`], rules: rule([]) });
    }
  }
  const adapter = (files, folders, message) => ({
    files,
    rules: {
      'no-restricted-imports': 'off',
      '@typescript-eslint/no-restricted-imports': [
        'error',
        { patterns: [{ regex: `^(\\.\\./)+(${folders.join('|')})(/|$)`, message }] },
      ],
    },
  });
  configs.push(
    adapter(
      ['renderer/**/*.ts', 'renderer/**/*.svelte'],
      ['electron', 'cli'],
      'renderer/ imports neither electron/ nor cli/: the shell is reached through window.plotrate, typed in shared/desktop/desktopContract.ts.',
    ),
    // The one atomic file writer and the one capped file reader are the shell's (plain Node, no
    // electron import); the command line writes and reads through them too.
    adapter(
      ['cli/**/*.ts'],
      ['renderer', 'electron(?!/(atomicWrite|readCappedFile|shellErrors)$)'],
      'The command line calls shared/ only, and electron/atomicWrite.ts, readCappedFile.ts and shellErrors.ts for its file I/O.',
    ),
    adapter(['electron/**/*.ts'], ['renderer', 'cli'], 'The shell calls shared/ only.'),
  );
  return configs;
}

export default tseslint.config(
  {
    ignores: [
      'node_modules/',
      'dist/',
      'dist-electron/',
      'dist-cli/',
      'release/',
      'test-output/',
      'scratch/',
    ],
  },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  ...svelte.configs['flat/recommended'],
  {
    languageOptions: { globals: { ...globals.browser, ...globals.node } },
    rules: {
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_' },
      ],
    },
  },
  {
    files: ['**/*.svelte', '**/*.svelte.ts'],
    languageOptions: { parserOptions: { parser: tseslint.parser } },
  },
  ...stageBoundaries(),
);
