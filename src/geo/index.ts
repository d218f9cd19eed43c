/** Public surface of the geo layer (see README.md). */
export { normalizeDeg, sinCosDeg, azimuthOfVector } from './angles';
export { makeLocalFrame, geodeticToEcef, ecefToGeodetic, WGS84, MAX_LOCAL_OFFSET_M, type Frame, type LocalFrame } from './projection';
export { toFlow, fromFlow, type FlowPoint } from './flowFrame';
export { footprintSourcePlane, type SourcePlane } from './footprint';
export { distanceMetres, azimuthDeg, MAX_SEPARATION_M } from './geodesy';
export { contourBands, contoursToGeoJSON, bandLabel, ringArea, type ContourBand, type ContourInput, type PolygonSet, type Ring } from './contours';
export { ringCentroid, openRing, pointInRing } from './rings';
