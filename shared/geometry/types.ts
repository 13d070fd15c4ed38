/** Length in millimetres (documentation alias; the core works in mm throughout). */
export type Millimetres = number;
/** Angle in degrees (data, API and UI unit). */
export type Degrees = number;
/** Angle in radians (used only inside the maths, converted once with toRadians). */
export type Radians = number;

/** A planar point [x, y] (or [r, z] in a side view), mm. */
export type Pt = [number, number];
/** A closed ring of points; the first point is NOT repeated at the end. */
export type Ring = Pt[];
/** A polygon: outer ring first (counter-clockwise), then holes (clockwise). */
export type Polygon2 = Ring[];
