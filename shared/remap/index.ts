/** Density-coordinate engine: inversions, coordinate fitness, Thorpe sorting, remap, binning, layer sets. */
export * from './interpolate';
export * from './inversions';
export * from './thorpe';
export * from './fitness';
export * from './remap';
export * from './binning';
export * from './layerSets';
