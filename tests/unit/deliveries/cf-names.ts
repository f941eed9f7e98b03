// CF standard names the deliveries may write, with the unit spellings we accept for each: written
// from memory of the CF standard name table (version 8x); canonical units first. The deliveries'
// CF test checks every standard_name in a delivered file against this list.
export const CF_NAMES_FROM_MEMORY: Record<string, { units: string[] }> = {
  latitude: { units: ['degrees_north'] },
  longitude: { units: ['degrees_east'] },
  time: { units: ['seconds since 1970-01-01T00:00:00Z'] },
  depth: { units: ['m'] },
  sea_floor_depth_below_sea_surface: { units: ['m'] },
  sea_water_pressure_due_to_sea_water: { units: ['Pa', 'dbar'] },
  reference_pressure: { units: ['Pa', 'dbar'] },
  sea_water_conservative_temperature: { units: ['K', 'degree_Celsius'] },
  sea_water_temperature: { units: ['K', 'degree_Celsius'] },
  sea_water_potential_temperature: { units: ['K', 'degree_Celsius'] },
  sea_water_absolute_salinity: { units: ['g kg-1'] },
  sea_water_practical_salinity: { units: ['1'] },
  sea_water_sigma_theta: { units: ['kg m-3'] },
  sea_water_density: { units: ['kg m-3'] },
  sea_water_electrical_conductivity: { units: ['S m-1', 'mS cm-1'] },
  moles_of_oxygen_per_unit_mass_in_sea_water: { units: ['mol kg-1', 'umol kg-1'] },
  cell_thickness: { units: ['m'] },
  sea_water_reference_salinity: { units: ['g kg-1'] },
  square_of_brunt_vaisala_frequency_in_sea_water: { units: ['s-2'] },
};
