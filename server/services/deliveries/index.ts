// Deliveries: the file writers behind regridded tables and data packages.
export * from './table';
export * from './provenance';
export * from './csv';
export * from './xlsx';
export * from './netcdf';
export * from './cf';
export * from './package';
export * from './exchange';
export * from './names';
export * from './variables';
