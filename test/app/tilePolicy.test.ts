// The tile-server policy the built app enforces (src/app/tilePolicy.ts): the list fixed at build
// (DG_TILE_ORIGINS; default OpenStreetMap's standard tile server) is the only one allowed.
import { describe, expect, it } from 'vitest';
import { ALLOWED_TILE_ORIGINS, DEFAULT_TILE_ORIGINS, checkTileOrigin, tileOrigin } from '../../src/app/tilePolicy';

describe('tile policy', () => {
  it('finds the origin of an XYZ template', () => {
    expect(tileOrigin('https://tile.openstreetmap.org/{z}/{x}/{y}.png')).toBe('https://tile.openstreetmap.org');
    expect(tileOrigin('https://tiles.example.org:8443/{z}/{x}/{y}@2x.png?key=1')).toBe('https://tiles.example.org:8443');
    expect(tileOrigin('not a url')).toBeNull();
  });
  it('outside a build (no define) the default list applies', () => {
    expect(ALLOWED_TILE_ORIGINS).toEqual(DEFAULT_TILE_ORIGINS);
  });
  it('allows listed servers, refuses others naming the ones allowed, and accepts "no basemap"', () => {
    const list = ['https://tiles.example.org'];
    expect(checkTileOrigin('https://tiles.example.org/{z}/{x}/{y}.png', list)).toBeNull();
    expect(checkTileOrigin('https://tile.openstreetmap.org/{z}/{x}/{y}.png', list)).toMatch(/only from https:\/\/tiles\.example\.org/);
    expect(checkTileOrigin('http://tiles.example.org/{z}/{x}/{y}.png', list)).toMatch(/only from/);
    expect(checkTileOrigin('', list)).toBeNull();
  });
});
