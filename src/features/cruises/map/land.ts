import type { FeatureCollection, Geometry } from 'geojson';
import type { GeometryCollection, Topology } from 'topojson-specification';
import { feature } from 'topojson-client';

/**
 * Land polygons from Natural Earth 1:50m (the world-atlas package), bundled with the app as
 * its own chunk and loaded on first use: no tile server, nothing fetched from outside.
 */
export async function loadLand(): Promise<FeatureCollection<Geometry>> {
  const module = await import('world-atlas/land-50m.json');
  const topology = module.default as unknown as Topology<{ land: GeometryCollection }>;
  return feature(topology, topology.objects.land);
}

export const landQueryKey = ['atlas', 'land-50m'] as const;
