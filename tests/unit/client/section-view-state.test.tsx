import { describe, expect, it } from 'vitest';
import {
  DEFAULT_VIEW,
  geostrophyQueryString,
  parseViewState,
  sectionQueryString,
  serialiseViewState,
  stepStation,
  sampleGrid,
  nearestStation,
  type SectionViewState,
} from '../../../src/features/sections';

const full: SectionViewState = {
  property: 'sigma2',
  ref: 2000,
  layerSet: 'deep-set-1',
  inversions: 'drop',
  interpolation: 'pchip',
  range: { min: -1.5, max: 28.25 },
  densityShows: 'depth',
  station: 'c-17',
  tsColour: 'station',
  pRef: 1500,
  densityRange: { min: 36.5, max: 37.25 },
  palette: 'graphite',
  contours: 0.25,
  yAxis: 'depth',
  stretch: true,
  xAxis: 'latitude',
  frames: 'density',
  line: '0b6f7d2e-1c3a-4f5e-9a8b-7c6d5e4f3a2b',
};

describe('section view state in the URL', () => {
  it('is empty for the defaults, and an empty query gives the defaults', () => {
    expect(serialiseViewState(DEFAULT_VIEW)).toBe('');
    expect(parseViewState('')).toEqual(DEFAULT_VIEW);
  });

  it('round-trips every field', () => {
    const q = serialiseViewState(full);
    expect(parseViewState(q)).toEqual(full);
    expect(new URLSearchParams(q).get('cmin')).toBe('-1.5');
    expect(new URLSearchParams(q).get('ref')).toBe('2000');
  });

  it('carries the line into the URL and into the section and geostrophy queries', () => {
    expect(new URLSearchParams(serialiseViewState(full)).get('line')).toBe(full.line);
    expect(new URLSearchParams(sectionQueryString(full, 'pressure', null)).get('line')).toBe(full.line);
    expect(new URLSearchParams(geostrophyQueryString(full, null)).get('line')).toBe(full.line);
    expect(new URLSearchParams(sectionQueryString(DEFAULT_VIEW, 'pressure', null)).has('line')).toBe(false);
    expect(parseViewState('line=bad%20id').line).toBeNull();
  });

  it('writes only what differs from the defaults', () => {
    expect(serialiseViewState({ ...DEFAULT_VIEW, ref: 1000 })).toBe('ref=1000');
    expect(serialiseViewState({ ...DEFAULT_VIEW, property: 'SA', station: '12' })).toBe('property=SA&stn=12');
  });

  it('falls back to the default for each unreadable value, keeping the readable ones', () => {
    const s = parseViewState(
      'property=CT;drop&ref=1500&inv=shuffle&interp=cubic&dframe=x&ts=rainbow&pref=-4&set=%3Cscript%3E&stn=ok-3' +
        '&pal=jet&cint=-1&yax=feet&stretch=yes&xax=time&show=all&dmin=5&dmax=1',
    );
    expect(s).toEqual({ ...DEFAULT_VIEW, station: 'ok-3' });
  });

  it('keeps a colour range only when both ends are numbers, lower first', () => {
    expect(parseViewState('cmin=2&cmax=1').range).toBeNull();
    expect(parseViewState('cmin=2').range).toBeNull();
    expect(parseViewState('cmin=abc&cmax=3').range).toBeNull();
    expect(parseViewState('cmin=&cmax=3').range).toBeNull();
    expect(parseViewState('cmin=-2&cmax=3').range).toEqual({ min: -2, max: 3 });
  });

  it('accepts a derived variable name as the property and the deepest common level as the reference', () => {
    expect(parseViewState('property=spice_anom').property).toBe('spice_anom');
    expect(parseViewState('pref=deepest_common').pRef).toBe('deepest_common');
    expect(parseViewState('pref=2000').pRef).toBe(2000);
  });

  it('builds the section route query for each frame', () => {
    const pressure = new URLSearchParams(sectionQueryString(full, 'pressure', '36.8:0.02:37.1'));
    expect(Object.fromEntries(pressure)).toEqual({
      property: 'sigma2',
      coord: 'pressure',
      ref: '2000',
      levels: '36.8:0.02:37.1',
      inversions: 'drop',
      interpolation: 'pchip',
      bin: '10',
      line: full.line,
    });
    // "Depth of isopycnals" is the pressure column shown on the σ grid.
    const density = new URLSearchParams(sectionQueryString(full, 'density', null));
    expect(density.get('property')).toBe('pressure');
    expect(density.get('coord')).toBe('density');
    expect(density.has('levels')).toBe(false);
    expect(new URLSearchParams(geostrophyQueryString(DEFAULT_VIEW, null)).get('pRef')).toBe('deepest_common');
  });
});

describe('station cursor and readout helpers', () => {
  const stations = [
    { id: 'b', station: 'K-02', cast: '1', x: 40, latitude: 0, longitude: 0, bottom: 4000, deepest: 3900 },
    { id: 'a', station: 'K-01', cast: '1', x: 0, latitude: 0, longitude: 0, bottom: 4000, deepest: 3900 },
    { id: 'c', station: 'K-03', cast: '1', x: 95, latitude: 0, longitude: 0, bottom: 4000, deepest: 3900 },
  ];
  it('steps along the track, clamped at the ends, and starts at an end', () => {
    expect(stepStation(stations, null, 1)?.id).toBe('a');
    expect(stepStation(stations, null, -1)?.id).toBe('c');
    expect(stepStation(stations, 'a', 1)?.id).toBe('b');
    expect(stepStation(stations, 'b', 1)?.id).toBe('c');
    expect(stepStation(stations, 'c', 1)?.id).toBe('c');
    expect(stepStation(stations, 'b', -5)?.id).toBe('a');
  });
  it('samples the nearest grid cell and names the nearest station', () => {
    const grid = {
      x: [0, 10, 20],
      y: [0, 10],
      z: [
        [1, 2, 3],
        [4, null, 6],
      ],
    };
    expect(sampleGrid(grid, 11, 1)).toBe(2);
    expect(sampleGrid(grid, 19, 9)).toBe(6);
    expect(sampleGrid(grid, 9, 8)).toBeNull();
    expect(nearestStation(stations, 70)?.station).toBe('K-03');
  });
});
