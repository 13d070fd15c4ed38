import { DEFAULT_ROLE_HEIGHT, type LayerRole } from '@shared/schemas/floorPlan';

export { DEFAULT_ROLE_HEIGHT };

/**
 * Whole words (tokens of the layer name) that mark a role; checked in the order of the table.
 * Besides English: French, German, Spanish, Dutch and Italian words (written without accents,
 * German umlauts also as AE/OE/UE), and the four-letter element codes of discipline-prefixed
 * layer names ("A-WALL", "S-COLS", "A-FLOR-OTLN", "A-EQPM", "A-ANNO-DIMS"; common practice in
 * layer-naming standards).
 */
const TOKEN_RULES: ReadonlyArray<[LayerRole, RegExp]> = [
  ['ignore', /^(TEXT|TXT|TEXTS|DIM|DIMS|DIMENSION|DIMENSIONS|ANNO|ANNOT|ANNOTATION|HATCH|HATCHES|HATCHING|PATT|IDEN|DEFPOINTS|NOTE|NOTES|LABEL|LABELS|TITLE|BORDER|FRAME|GRID|AXIS|AXES|VIEWPORT|VPORT|SYMBOL|SYMBOLS|SYMB|FURN|FURNITURE|DOOR|DOORS|WINDOW|WINDOWS|GLAZ|TEXTE|COTE|COTES|COTATION|HACHURE|HACHURES|MOBILIER|PORTE|PORTES|FENETRE|FENETRES|CARTOUCHE|BESCHRIFTUNG|BEMASSUNG|BEMASZUNG|MASSE|SCHRAFFUR|TUER|TUEREN|TUR|TUREN|FENSTER|MOEBEL|MOBEL|RASTER|ACHSE|ACHSEN|TEXTO|TEXTOS|COTA|COTAS|ACOTACION|ACOTACIONES|RAYADO|PUERTA|PUERTAS|VENTANA|VENTANAS|MOBILIARIO|EJE|EJES|TEKST|TEKSTEN|MAATVOERING|MATEN|ARCERING|DEUR|DEUREN|RAAM|RAMEN|MEUBILAIR|TESTO|TESTI|QUOTA|QUOTE|TRATTEGGIO|PORTA|PORTE|FINESTRA|FINESTRE|ARREDI|ASSI)\d*$/],
  ['outline', /^(OUTLINE|OUTLINES|BOUNDARY|BOUNDARIES|BOUNDS|FLOOR|FLOORS|PERIMETER|PERIM|ENVELOPE|FOOTPRINT|HALL|OTLN|CONTOUR|CONTOURS|PERIMETRE|UMRISS|UMRANDUNG|KONTUR|BODEN|HALLE|CONTORNO|PERIMETRO|LIMITE|NAVE|OMTREK|CONTOUREN|VLOER|PERIMETRO|SAGOMA)\d*$/],
  ['wall', /^(WALL|WALLS|PARTITION|PARTITIONS|MUR|MURS|CLOISON|CLOISONS|WAND|WANDE|WAENDE|MAUER|MAUERN|MAUERWERK|MURO|MUROS|PARED|PAREDES|TABIQUE|TABIQUES|MUUR|MUREN|WANDEN|MURI|PARETE|PARETI|TRAMEZZO|TRAMEZZI)\d*$/],
  ['column', /^(COL|COLS|COLUMN|COLUMNS|PILLAR|PILLARS|PIER|PIERS|POST|POSTS|STANCHION|STANCHIONS|POTEAU|POTEAUX|STUTZE|STUTZEN|STUETZE|STUETZEN|SAULE|SAULEN|SAEULE|SAEULEN|COLUMNA|COLUMNAS|PILAR|PILARES|KOLOM|KOLOMMEN|COLONNA|COLONNE|PILASTRO|PILASTRI)\d*$/],
  ['obstacle', /^(MACH|MACHINE|MACHINES|MACHINERY|EQUIP|EQUIPMENT|EQPT|EQPM|OBST|OBSTACLE|OBSTACLES|OBSTRUCTION|RACK|RACKS|RACKING|CONVEYOR|CONVEYORS|PLANT|MASCHINE|MASCHINEN|ANLAGE|ANLAGEN|MAQUINA|MAQUINAS|EQUIPO|EQUIPOS|MACHINE|MACHINES|MACHINERIE|MACCHINA|MACCHINE|MACCHINARI)\d*$/],
];

/** Parts of words that mark a role when no whole word did (e.g. "PARTITIONWALL", "MACHINERY2", "AUSSENWAND"). */
const PART_RULES: ReadonlyArray<[LayerRole, RegExp]> = [
  ['ignore', /TEXT|DIM|ANNO|HATCH|DEFPOINT|BEMASS|SCHRAFF/],
  ['outline', /OUTLINE|BOUNDAR|FLOOR|PERIM|UMRISS/],
  ['wall', /WALL|PARTITION|WAND|MAUER|WAENDE/],
  ['column', /COLUMN|PILLAR|STUETZ|STUTZ|SAEUL|POTEAU|COLONN|COLUMNA/],
  ['obstacle', /MACH|EQUIP|OBST|MASCHIN|MAQUIN|MACCHIN/],
];

/** Upper case without accents: "Wände" → "WANDE", "Stütze" → "STUTZE", "ß" → "SS". */
function plainUpper(name: string): string {
  return name.normalize('NFD').replace(/[\u0300-\u036f]/g, '').replace(/ß/g, 'SS').toUpperCase();
}

/**
 * Guesses what a layer stands for from its name (common practice in CAD layer naming):
 * OUTLINE/BOUNDARY/FLOOR → outline, WALL → wall, COL/COLUMN/PILLAR → column,
 * MACH/EQUIP/OBST → obstacle, TEXT/DIM/ANNO/HATCH/DEFPOINTS → ignore, and the same words in
 * French, German, Spanish, Dutch and Italian. Annotation words win, so "WALL-HATCH" is ignored.
 * A name that says nothing is taken as an obstacle: drawn geometry an arm might hit is kept in
 * the checks until the planner says otherwise.
 */
export function guessLayerRole(name: string): LayerRole {
  const upper = plainUpper(name);
  const tokens = upper.split(/[^A-Z0-9]+/).filter(Boolean);
  for (const [role, re] of TOKEN_RULES) if (tokens.some((t) => re.test(t))) return role;
  for (const [role, re] of PART_RULES) if (re.test(upper)) return role;
  return 'obstacle';
}

/** Default height of a role, mm above the floor (null = full height): walls and columns full height, obstacles 1500 mm. */
export function defaultLayerHeight(role: LayerRole): number | null {
  return DEFAULT_ROLE_HEIGHT[role];
}

/** `#rrggbb` of a 24-bit colour number; white (ACI 7 on a dark screen) when unknown. */
export function colorHex(color: unknown): string {
  if (typeof color !== 'number' || !Number.isInteger(color) || color < 0 || color > 0xffffff) return '#ffffff';
  return `#${color.toString(16).padStart(6, '0')}`;
}
