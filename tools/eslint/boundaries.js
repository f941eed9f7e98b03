// The import boundaries of the codebase, as one ESLint rule (see DEVELOPERS.md, "Layers"):
// - shared/ is code both sides run: it imports nothing from server/ or src/;
// - the client (src/) and the server (server/) never import each other;
// - server/services/ does the work and never reaches up into server/routes/;
// - a client feature reaches another feature only through that feature's index.ts.
import path from 'node:path';

const ROOT = path.resolve(path.dirname(new URL(import.meta.url).pathname), '../..');

/** The layer a repository-relative path belongs to, or null for a path outside the checked folders. */
function layerOf(rel) {
  const parts = rel.split('/');
  if (parts[0] === 'shared') return { layer: 'shared' };
  if (parts[0] === 'server')
    return { layer: parts[1] === 'services' ? 'server/services' : parts[1] === 'routes' ? 'server/routes' : 'server' };
  if (parts[0] === 'src') {
    if (parts[1] === 'features' && parts.length > 3)
      return { layer: 'src', feature: parts[2], rest: parts.slice(3).join('/') };
    if (parts[1] === 'features' && parts.length === 3)
      return { layer: 'src', feature: parts[2].replace(/\.(ts|tsx)$/, ''), rest: '' };
    return { layer: 'src' };
  }
  return null;
}

/** Why an import from `from` (file) of `target` (resolved path) breaks a boundary, or null. */
export function boundaryViolation(fromFile, target) {
  const relFrom = path.relative(ROOT, fromFile).split(path.sep).join('/');
  const relTo = path.relative(ROOT, target).split(path.sep).join('/');
  if (relTo.startsWith('..')) return null;
  const a = layerOf(relFrom);
  const b = layerOf(relTo);
  if (!a || !b) return null;
  if (a.layer === 'shared' && b.layer !== 'shared')
    return `shared/ must not import from ${relTo.split('/')[0]}/ (${relTo})`;
  if (a.layer === 'src' && b.layer.startsWith('server')) return `the client must not import server code (${relTo})`;
  if (a.layer.startsWith('server') && b.layer === 'src') return `the server must not import client code (${relTo})`;
  if (a.layer === 'server/services' && b.layer === 'server/routes')
    return `a service must not import a route module (${relTo})`;
  if (a.feature && b.feature && a.feature !== b.feature) {
    const rest = b.rest.replace(/\.(ts|tsx)$/, '');
    if (rest !== '' && rest !== 'index')
      return `feature "${a.feature}" reaches into "${b.feature}": import from src/features/${b.feature} (its index.ts)`;
  }
  if (!a.feature && a.layer === 'src' && b.feature && relFrom.startsWith('src/routes/')) {
    const rest = b.rest.replace(/\.(ts|tsx)$/, '');
    if (rest !== '' && rest !== 'index')
      return `a screen reaches into feature "${b.feature}": import from src/features/${b.feature} (its index.ts)`;
  }
  return null;
}

export const boundariesPlugin = {
  rules: {
    boundaries: {
      meta: {
        type: 'problem',
        docs: { description: 'import boundaries between shared/, server/ and the client features' },
        schema: [],
      },
      create(context) {
        const file = context.filename;
        const check = (node, source) => {
          if (typeof source !== 'string' || !source.startsWith('.')) return;
          const target = path.resolve(path.dirname(file), source);
          const why = boundaryViolation(file, target);
          if (why) context.report({ node, message: why });
        };
        return {
          ImportDeclaration: (node) => check(node, node.source.value),
          ExportNamedDeclaration: (node) => node.source && check(node, node.source.value),
          ExportAllDeclaration: (node) => check(node, node.source.value),
          ImportExpression: (node) => node.source.type === 'Literal' && check(node, node.source.value),
        };
      },
    },
  },
};
