// The seawater core's public face: TEOS-10 functions by their published names.
// Argument order throughout: p in dbar, t and CT in °C, SP unitless, SA in g/kg, lon/lat in degrees.

// density half
export * from './density';
export { grav, grav_surface, z_from_p, p_from_z, depth_from_z, z_from_p_batch, depth_from_p_batch } from './depth';
export { Nsquared, type NsquaredResult } from './stability';
export {
  geo_strf_dyn_height,
  geostrophic_velocity,
  geo_strf_velocity,
  layer_transport,
  distance,
  f,
  pchipSlopesFritschButland,
  EARTH_MEAN_RADIUS,
  type DynHeightOptions,
  type DynHeightInterpolation,
  type GeostrophicVelocityOptions,
  type CastTS,
  type StrfVelocityResult,
} from './geostrophy';
export { spiciness0, spiciness0_batch } from './spiciness';
export { mixed_layer_depth, type MldOptions, type MldResult, type MldStatus } from './mld';
export { deriveCast, CastInputSchema, type CastInput, type CastNote, type DerivedCast } from './derive';

// thermodynamic half
export * from './conversions';
export * from './pss78';
export * from './saar';
export * from './eos80';
export * from './ranges';
