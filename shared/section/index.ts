/** Section engine: along-track distance, pressure and density grids, isopycnal slope and gradients, geostrophy. */
export * from './distance';
export * from './grid';
export * from './slope';
export * from './geostrophy';
export * from './line';
