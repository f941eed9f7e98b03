// Writes docs/api.md from the route table (server/lib/apiDoc.ts). Needs no services: the route factories
// only describe routes here.
import { writeFileSync } from 'node:fs';
import { allRoutes } from '../server/routes/registry';
import { renderApiDoc, describingDeps } from '../server/lib/apiDoc';
import { loadSettings } from '../server/config';

writeFileSync(new URL('../docs/api.md', import.meta.url), renderApiDoc(allRoutes(describingDeps(loadSettings({})))));
console.log('docs/api.md written');
