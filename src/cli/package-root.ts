/** The package's own files: moved to src/case/package-root.ts (the view needs them too); kept here for the commands. */
export { defaultCasePath, packageRoot, packageVersion } from '../case/package-root.js';
