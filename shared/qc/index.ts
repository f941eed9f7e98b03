/** Automatic quality-control tests of a CTD profile (Argo real-time tests and ours) and their proposals. */
export * from './tests';
export * from './run';
