import pkg from '../../../../package.json';

/** The package version, inlined by the bundler so the Report names the tool that wrote it. */
export const LOUDWORD_VERSION: string = pkg.version;
