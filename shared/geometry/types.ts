/**
 * Units are soft brands: a plain number still passes (data arrives as plain JSON numbers), but a
 * value typed in one unit does not pass where another is wanted (Radians where Degrees are
 * expected fails to compile). Conversion only through the named functions in angles.ts.
 */
declare const unitBrand: unique symbol;
/** Length in millimetres (the core works in mm throughout). */
export type Millimetres = number & { readonly [unitBrand]?: 'mm' };
/** Angle in degrees (data, API and UI unit). */
export type Degrees = number & { readonly [unitBrand]?: 'deg' };
/** Angle in radians (used only inside the maths, converted once with toRadians). */
export type Radians = number & { readonly [unitBrand]?: 'rad' };

/** A planar point [x, y] (or [r, z] in a side view), mm. */
export type Pt = [number, number];
/** A closed ring of points; the first point is NOT repeated at the end. */
export type Ring = Pt[];
/** A polygon: outer ring first (counter-clockwise), then holes (clockwise). */
export type Polygon2 = Ring[];

/**
 * Frames are hard brands: a point of one frame never passes where a point of the other is wanted;
 * only an ArmPose (frames.ts) turns one into the other. Both still pass where a plain Pt is read.
 */
declare const frameBrand: unique symbol;
/** A point in the plan frame [x east, y north], mm. */
export type PlanPoint = [x: number, y: number] & { readonly [frameBrand]: 'plan' };
/** A point in an arm's frame [x along J1 zero, y 90° counter-clockwise of it], origin on the J1 axis, mm. */
export type ArmPoint = [x: number, y: number] & { readonly [frameBrand]: 'arm' };

/** A plan-frame point from its coordinates, mm. */
export function planPoint(x: Millimetres, y: Millimetres): PlanPoint {
  return [x, y] as PlanPoint;
}

/** An arm-frame point from its coordinates, mm. */
export function armPoint(x: Millimetres, y: Millimetres): ArmPoint {
  return [x, y] as ArmPoint;
}
