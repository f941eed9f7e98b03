// The software version shown in figure provenance lines (package.json's, bundled at build time).
import { version } from '../../package.json';

export const SOFTWARE = `Sigmaline ${version}`;
