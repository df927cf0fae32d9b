/**
 * The house's walls, checked by `npm run lint` (dependency-cruiser). Each rule's name is what a
 * break prints; its comment says why the wall is there. tests/house/dependency-rules.test.ts breaks
 * each rule on purpose in a scratch tree to prove it is caught.
 */
/** Our own code: the libraries, the apps, the worker and the scripts. */
const ours = '^(libs|apps|jobs|scripts)/';

module.exports = {
  forbidden: [
    {
      name: 'engine-imports-nothing-of-ours',
      comment: 'libs/forecasting is pure estimation and forecasting: no database, no HTTP, no other library of ours.',
      severity: 'error',
      from: { path: '^libs/forecasting/' },
      to: { path: ours, pathNot: '^libs/forecasting/' },
    },
    {
      name: 'contracts-import-only-zod',
      comment: 'libs/contracts is shared with the browser: zod schemas and types, nothing else.',
      severity: 'error',
      from: { path: '^libs/contracts/' },
      to: { pathNot: '^(libs/contracts/|node_modules/zod/)' },
    },
    {
      name: 'db-imports-only-contracts',
      comment: 'libs/db is schema and client: of ours it may use the shared contracts only.',
      severity: 'error',
      from: { path: '^libs/db/' },
      to: { path: ours, pathNot: '^libs/(db|contracts)/' },
    },
    {
      name: 'web-imports-only-contracts',
      comment: 'The browser app talks to the API over HTTP; of our code it may share the contracts only.',
      severity: 'error',
      from: { path: '^apps/web/' },
      to: { path: ours, pathNot: '^(apps/web/|libs/contracts/)' },
    },
    {
      name: 'apps-never-import-each-other',
      comment: 'The API, the web app and the command line share code through libs/, never directly.',
      severity: 'error',
      from: { path: '^apps/([^/]+)/' },
      to: { path: '^apps/', pathNot: '^apps/$1/' },
    },
    {
      name: 'jobs-never-import-apps',
      comment: 'The worker calls the domain libraries; it must not go through the web server or the command line.',
      severity: 'error',
      from: { path: '^jobs/' },
      to: { path: '^apps/' },
    },
    {
      name: 'libs-never-import-apps',
      comment: 'Domain code lives in libs/ and knows no app; an app folder can change without breaking a library.',
      severity: 'error',
      from: { path: '^libs/' },
      to: { path: '^(apps|jobs|scripts)/' },
    },
    {
      name: 'no-circular-libraries',
      comment: 'Libraries form layers; a cycle between two of them means the cut is in the wrong place.',
      severity: 'error',
      from: { path: '^libs/([^/]+)/' },
      to: { circular: true, path: '^libs/', pathNot: '^libs/$1/' },
    },
  ],
  options: {
    doNotFollow: { path: 'node_modules' },
    exclude: { path: '^(node_modules|dist|\\.data|\\.angular)/' },
    tsConfig: { fileName: 'tsconfig.json' },
    tsPreCompilationDeps: true,
    enhancedResolveOptions: { exportsFields: ['exports'], conditionNames: ['import', 'require', 'node', 'default', 'types'] },
  },
};
