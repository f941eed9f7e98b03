/** Repeat occupations of one line: common positions, differences, heave, decomposition, summaries. */
export * from './positions';
export * from './decompose';
export * from './summary';
export * from './compare';
