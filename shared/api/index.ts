// The one contract between database, server and screen: the domain's enums, the variable catalogue, the
// quality flags and the isopycnal levels policy. Imported by server/, src/ and the deliveries alike.
export * from './enums';
export * from './flags';
export * from './variables';
export * from './settings';
export * from './resources';
export * from './stations';
export * from './castHistory';
