import type { Feature, Geometry, Position } from 'geojson';
import type { ImportResult, PlanFeatureProps } from '@shared/schemas/floorPlan';

/**
 * An ImportResult in the form it crosses from the import worker: every coordinate in one
 * Float64Array and the features' structure in typed arrays (all moved, not copied, by
 * postMessage's transfer list), the rest as plain data. Rebuilding the GeoJSON from it costs a
 * fraction of what the structured clone of millions of small arrays costs the receiving thread.
 */
export interface PackedResult {
  meta: Omit<ImportResult, 'geometry'>;
  /** x, y of every position, feature after feature, ring after ring. */
  coords: Float64Array;
  /** Per coordinate list (a Point's one position, a LineString, a ring): index of its first position; one more at the end. */
  partStart: Uint32Array;
  /** Per feature: index of its first coordinate list; one more at the end. */
  featurePart: Uint32Array;
  /** Per feature: 0 Point, 1 LineString, 2 Polygon. */
  kind: Uint8Array;
  /** Per feature: index into `layers` and `entities`; closed flag; parts (0 = none). */
  layer: Uint32Array;
  entity: Uint32Array;
  closed: Uint8Array;
  parts: Uint32Array;
  layers: string[];
  entities: string[];
  /** Label properties of Point features, by feature index. */
  labels: Array<{ i: number; text?: string; textHeight?: number; rotation?: number }>;
}

const KIND = { Point: 0, LineString: 1, Polygon: 2 } as const;

/** Packs a result for the trip out of the worker (see PackedResult); features of other types are refused. */
export function packResult(r: ImportResult): PackedResult {
  const fs = r.geometry.features;
  const n = fs.length;
  let positions = 0;
  let lists = 0;
  for (const f of fs) {
    const g = f.geometry;
    if (g.type === 'Point') {
      positions++;
      lists++;
    } else if (g.type === 'LineString') {
      positions += g.coordinates.length;
      lists++;
    } else if (g.type === 'Polygon') {
      for (const ring of g.coordinates) positions += ring.length;
      lists += g.coordinates.length;
    } else throw new Error(`packResult: unexpected geometry ${g.type}`);
  }
  const coords = new Float64Array(2 * positions);
  const partStart = new Uint32Array(lists + 1);
  const featurePart = new Uint32Array(n + 1);
  const kind = new Uint8Array(n);
  const layer = new Uint32Array(n);
  const entity = new Uint32Array(n);
  const closed = new Uint8Array(n);
  const parts = new Uint32Array(n);
  const layerIds = new Map<string, number>();
  const entityIds = new Map<string, number>();
  const labels: PackedResult['labels'] = [];
  let p = 0;
  let l = 0;
  const putList = (list: readonly Position[]) => {
    partStart[l++] = p;
    for (const q of list) {
      coords[2 * p] = q[0];
      coords[2 * p + 1] = q[1];
      p++;
    }
  };
  for (let i = 0; i < n; i++) {
    const f = fs[i];
    const g = f.geometry;
    featurePart[i] = l;
    kind[i] = KIND[g.type as keyof typeof KIND];
    if (g.type === 'Point') putList([g.coordinates]);
    else if (g.type === 'LineString') putList(g.coordinates);
    else if (g.type === 'Polygon') for (const ring of g.coordinates) putList(ring);
    const pr = f.properties;
    let li = layerIds.get(pr.layer);
    if (li === undefined) layerIds.set(pr.layer, (li = layerIds.size));
    let ei = entityIds.get(pr.entity);
    if (ei === undefined) entityIds.set(pr.entity, (ei = entityIds.size));
    layer[i] = li;
    entity[i] = ei;
    closed[i] = pr.closed ? 1 : 0;
    parts[i] = pr.parts ?? 0;
    if (pr.text !== undefined || pr.textHeight !== undefined || pr.rotation !== undefined) {
      labels.push({ i, text: pr.text, textHeight: pr.textHeight, rotation: pr.rotation });
    }
  }
  partStart[l] = p;
  featurePart[n] = l;
  const { geometry: _g, ...meta } = r;
  return {
    meta,
    coords,
    partStart,
    featurePart,
    kind,
    layer,
    entity,
    closed,
    parts,
    layers: [...layerIds.keys()],
    entities: [...entityIds.keys()],
    labels,
  };
}

/** The buffers of a packed result, for postMessage's transfer list. */
export function packedBuffers(p: PackedResult): ArrayBuffer[] {
  return [p.coords, p.partStart, p.featurePart, p.kind, p.layer, p.entity, p.closed, p.parts].map((a) => a.buffer as ArrayBuffer);
}

/** The ImportResult a packed result was made from (same features, properties and positions). */
export function unpackResult(p: PackedResult): ImportResult {
  const n = p.kind.length;
  const features: Array<Feature<Geometry, PlanFeatureProps>> = new Array(n);
  const { coords, partStart, featurePart } = p;
  const list = (k: number): Position[] => {
    const a = partStart[k];
    const b = partStart[k + 1];
    const out: Position[] = new Array(b - a);
    for (let j = a; j < b; j++) out[j - a] = [coords[2 * j], coords[2 * j + 1]];
    return out;
  };
  const labelAt = new Map(p.labels.map((x) => [x.i, x]));
  for (let i = 0; i < n; i++) {
    const props: PlanFeatureProps = { layer: p.layers[p.layer[i]], entity: p.entities[p.entity[i]], closed: p.closed[i] === 1 };
    const lab = labelAt.get(i);
    if (lab) {
      if (lab.text !== undefined) props.text = lab.text;
      if (lab.textHeight !== undefined) props.textHeight = lab.textHeight;
      if (lab.rotation !== undefined) props.rotation = lab.rotation;
    }
    if (p.parts[i] > 0) props.parts = p.parts[i];
    let geometry: Geometry;
    const k0 = featurePart[i];
    if (p.kind[i] === 0) geometry = { type: 'Point', coordinates: [coords[2 * partStart[k0]], coords[2 * partStart[k0] + 1]] };
    else if (p.kind[i] === 1) geometry = { type: 'LineString', coordinates: list(k0) };
    else {
      const rings: Position[][] = [];
      for (let k = k0; k < featurePart[i + 1]; k++) rings.push(list(k));
      geometry = { type: 'Polygon', coordinates: rings };
    }
    features[i] = { type: 'Feature', properties: props, geometry };
  }
  return { ...p.meta, geometry: { type: 'FeatureCollection', features } };
}

/** A number as JSON.stringify writes it (non-finite numbers become null). */
function jsonNumber(x: number): string {
  return Number.isFinite(x) ? String(x) : 'null';
}

/** Characters of JSON text gathered as one string before they are written out as bytes. */
const JSON_PIECE_CHARS = 1 << 16;

/**
 * The JSON text of `unpackResult(p).geometry`, written straight from the packed arrays: exactly
 * the characters JSON.stringify gives for that FeatureCollection, without making its objects (an
 * array per position). Used where the geometry is only stored or sent on. Pieces of the text go
 * into one growing byte buffer as they are made (a string grown by += keeps every small piece
 * until it is read, more memory than the arrays it stands for), decoded once at the end.
 */
export function packedGeometryJson(p: PackedResult): string {
  const n = p.kind.length;
  const { coords, partStart, featurePart } = p;
  const layerJson = p.layers.map((s) => JSON.stringify(s));
  const entityJson = p.entities.map((s) => JSON.stringify(s));
  const labelAt = new Map(p.labels.map((x) => [x.i, x]));
  // about 20 bytes a position, 90 a feature
  let buf = Buffer.allocUnsafe(Math.max(1024, 20 * (coords.length / 2) + 90 * n));
  let used = 0;
  const flush = (piece: string) => {
    const need = used + 3 * piece.length;
    if (need > buf.length) {
      const bigger = Buffer.allocUnsafe(Math.max(need, Math.ceil(buf.length * 1.5)));
      buf.copy(bigger, 0, 0, used);
      buf = bigger;
    }
    used += buf.write(piece, used, 'utf8');
  };
  let s = '{"type":"FeatureCollection","features":[';
  const position = (j: number) => `[${jsonNumber(coords[2 * j])},${jsonNumber(coords[2 * j + 1])}]`;
  const list = (k: number) => {
    s += '[';
    for (let j = partStart[k]; j < partStart[k + 1]; j++) {
      if (j > partStart[k]) s += ',';
      s += position(j);
      if (s.length >= JSON_PIECE_CHARS) {
        flush(s);
        s = '';
      }
    }
    s += ']';
  };
  for (let i = 0; i < n; i++) {
    if (i > 0) s += ',';
    s += `{"type":"Feature","properties":{"layer":${layerJson[p.layer[i]]},"entity":${entityJson[p.entity[i]]},"closed":${p.closed[i] === 1}`;
    const lab = labelAt.get(i);
    if (lab) {
      if (lab.text !== undefined) s += `,"text":${JSON.stringify(lab.text)}`;
      if (lab.textHeight !== undefined) s += `,"textHeight":${jsonNumber(lab.textHeight)}`;
      if (lab.rotation !== undefined) s += `,"rotation":${jsonNumber(lab.rotation)}`;
    }
    if (p.parts[i] > 0) s += `,"parts":${p.parts[i]}`;
    const k0 = featurePart[i];
    if (p.kind[i] === 0) s += `},"geometry":{"type":"Point","coordinates":${position(partStart[k0])}}}`;
    else if (p.kind[i] === 1) {
      s += '},"geometry":{"type":"LineString","coordinates":';
      list(k0);
      s += '}}';
    } else {
      s += '},"geometry":{"type":"Polygon","coordinates":[';
      for (let k = k0; k < featurePart[i + 1]; k++) {
        if (k > k0) s += ',';
        list(k);
      }
      s += ']}}';
    }
    if (s.length >= JSON_PIECE_CHARS) {
      flush(s);
      s = '';
    }
  }
  flush(s + ']}');
  return buf.toString('utf8', 0, used);
}
