import type { FormulaProblem } from '../types';

/**
 * A formula error shown where it is: the message, then the formula with a caret under the character
 * where the parser stopped (when the server gave a position).
 */
export function FormulaProblemView({
  formula,
  problem,
  id,
}: {
  formula: string;
  problem: FormulaProblem;
  id?: string;
}) {
  const pos = problem.position != null && problem.position <= formula.length ? problem.position : null;
  return (
    <div id={id} role="alert" className="border-l-2 border-warn bg-warn-wash/50 px-3 py-2 text-sm">
      <p className="text-warn-strong">
        {problem.message}
        {pos != null && <span className="ml-2 font-mono text-xs">at character {pos + 1}</span>}
      </p>
      {pos != null && (
        <pre
          aria-hidden="true"
          data-testid="formula-caret"
          className="mt-1 overflow-x-auto font-mono text-xs leading-4 text-ink-strong"
        >
          {formula}
          {'\n'}
          <span className="text-warn-strong">{' '.repeat(pos)}^</span>
        </pre>
      )}
    </div>
  );
}
