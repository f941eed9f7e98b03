/** Why an import of `target` from `fromFile` (absolute paths) breaks a layer boundary, or null. */
export function boundaryViolation(fromFile: string, target: string): string | null;
export const boundariesPlugin: unknown;
