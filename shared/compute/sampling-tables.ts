/**
 * ISO 2859-1 single-sampling tables, kept as data.
 *
 * The tables are copied cell by cell from /work/shared/REFERENCES.md ("Attribute sampling") and
 * parsed once when the module loads. They are deliberately NOT generated from the diagonal
 * pattern. If they were, a test against the printed table could only check the formula against
 * itself. The parser rejects malformed rows so a bad edit fails at import time, not at the dock.
 *
 * Cell notation used here: `v` = ↓ (use the first plan below), `^` = ↑ (use the first plan
 * above), `Ac/Re` = a plan.
 */

export const INSPECTION_LEVELS = ['S-1', 'S-2', 'S-3', 'S-4', 'I', 'II', 'III'] as const;
export type InspectionLevel = (typeof INSPECTION_LEVELS)[number];

/** The preferred-series AQL columns printed in REFERENCES.md (percent nonconforming). */
export const AQL_VALUES = [0.1, 0.15, 0.25, 0.4, 0.65, 1.0, 1.5, 2.5, 4.0, 6.5, 10, 15] as const;
export type Aql = (typeof AQL_VALUES)[number];

export const SEVERITIES = ['normal', 'tightened', 'reduced'] as const;
export type Severity = (typeof SEVERITIES)[number];

/** Sample-size code letters. The standard skips I and O. */
export const CODE_LETTERS = [
  'A', 'B', 'C', 'D', 'E', 'F', 'G', 'H', 'J', 'K', 'L', 'M', 'N', 'P', 'Q', 'R',
] as const;
export type CodeLetter = (typeof CODE_LETTERS)[number];

export type TableCell =
  | { readonly kind: 'plan'; readonly accept: number; readonly reject: number }
  | { readonly kind: 'down' }
  | { readonly kind: 'up' };

export interface PlanTableRow {
  readonly letter: CodeLetter;
  readonly sampleSize: number;
  /** One cell per AQL_VALUES entry, same order. */
  readonly cells: readonly TableCell[];
}

export interface PlanTable {
  /** Which published table this follows, shown next to every plan. */
  readonly label: string;
  /** One row per CODE_LETTERS entry, same order. */
  readonly rows: readonly PlanTableRow[];
}

export interface CodeLetterRange {
  readonly minLotSize: number;
  /** Inclusive; Infinity for the open last range. */
  readonly maxLotSize: number;
  /** One letter per INSPECTION_LEVELS entry, same order. */
  readonly letters: readonly CodeLetter[];
}

// ---------------------------------------------------------------------------------------------
// Table 1: sample-size code letters. Source: ISO 2859-1 Table 1 as printed in REFERENCES.md.
// Each entry: largest lot size of the range, then letters for S-1 S-2 S-3 S-4 I II III. The
// smallest lot size of each range is the previous range's largest + 1; the first range starts
// at 2.
// ---------------------------------------------------------------------------------------------
const CODE_LETTER_SOURCE: readonly (readonly [maxLotSize: number, letters: string])[] = [
  [8, 'A A A A A A B'],
  [15, 'A A A A A B C'],
  [25, 'A A B B B C D'],
  [50, 'A B B C C D E'],
  [90, 'B B C C C E F'],
  [150, 'B B C D D F G'],
  [280, 'B C D E E G H'],
  [500, 'B C D E F H J'],
  [1200, 'C C E F G J K'],
  [3200, 'C D E G H K L'],
  [10000, 'C D F G J L M'],
  [35000, 'C D F H K M N'],
  [150000, 'D E G J L N P'],
  [500000, 'D E G J M P Q'],
  [Infinity, 'D E H K N Q R'],
];

/** Smallest lot size Table 1 covers. */
export const MIN_LOT_SIZE = 2;

// ---------------------------------------------------------------------------------------------
// Table 2-A: single sampling, normal inspection. Source: ISO 2859-1 Table 2-A as printed in
// REFERENCES.md. Columns: AQL 0.10 0.15 0.25 0.40 0.65 1.0 1.5 2.5 4.0 6.5 10 15.
// ---------------------------------------------------------------------------------------------
const NORMAL_SOURCE: readonly string[] = [
  'A    2 | v    v    v    v    v    v    v    v    v    0/1  ^    v',
  'B    3 | v    v    v    v    v    v    v    v    0/1  ^    v    1/2',
  'C    5 | v    v    v    v    v    v    v    0/1  ^    v    1/2  2/3',
  'D    8 | v    v    v    v    v    v    0/1  ^    v    1/2  2/3  3/4',
  'E   13 | v    v    v    v    v    0/1  ^    v    1/2  2/3  3/4  5/6',
  'F   20 | v    v    v    v    0/1  ^    v    1/2  2/3  3/4  5/6  7/8',
  'G   32 | v    v    v    0/1  ^    v    1/2  2/3  3/4  5/6  7/8  10/11',
  'H   50 | v    v    0/1  ^    v    1/2  2/3  3/4  5/6  7/8  10/11 14/15',
  'J   80 | v    0/1  ^    v    1/2  2/3  3/4  5/6  7/8  10/11 14/15 21/22',
  'K  125 | 0/1  ^    v    1/2  2/3  3/4  5/6  7/8  10/11 14/15 21/22 ^',
  'L  200 | ^    v    1/2  2/3  3/4  5/6  7/8  10/11 14/15 21/22 ^    ^',
  'M  315 | v    1/2  2/3  3/4  5/6  7/8  10/11 14/15 21/22 ^    ^    ^',
  'N  500 | 1/2  2/3  3/4  5/6  7/8  10/11 14/15 21/22 ^    ^    ^    ^',
  'P  800 | 2/3  3/4  5/6  7/8  10/11 14/15 21/22 ^    ^    ^    ^    ^',
  'Q 1250 | 3/4  5/6  7/8  10/11 14/15 21/22 ^    ^    ^    ^    ^    ^',
  'R 2000 | 5/6  7/8  10/11 14/15 21/22 ^    ^    ^    ^    ^    ^    ^',
];

// ---------------------------------------------------------------------------------------------
// Table 2-B: single sampling, tightened inspection. Source: ISO 2859-1 Table 2-B as printed in
// REFERENCES.md. REFERENCES notes that cells A–L × AQL 0.65–15 were read in a reproduction of
// MIL-STD-105E Table II-B and the remaining cells follow the same diagonal pattern. The printed
// table also lists row S (n 3150), but no arrow in these twelve columns reaches it (row R has a
// plan in every column from 0.10 up), so S is left out.
// ---------------------------------------------------------------------------------------------
const TIGHTENED_SOURCE: readonly string[] = [
  'A    2 | v    v    v    v    v    v    v    v    v    v    v    v',
  'B    3 | v    v    v    v    v    v    v    v    v    0/1  v    v',
  'C    5 | v    v    v    v    v    v    v    v    0/1  v    v    1/2',
  'D    8 | v    v    v    v    v    v    v    0/1  v    v    1/2  2/3',
  'E   13 | v    v    v    v    v    v    0/1  v    v    1/2  2/3  3/4',
  'F   20 | v    v    v    v    v    0/1  v    v    1/2  2/3  3/4  5/6',
  'G   32 | v    v    v    v    0/1  v    v    1/2  2/3  3/4  5/6  8/9',
  'H   50 | v    v    v    0/1  v    v    1/2  2/3  3/4  5/6  8/9  12/13',
  'J   80 | v    v    0/1  v    v    1/2  2/3  3/4  5/6  8/9  12/13 18/19',
  'K  125 | v    0/1  v    v    1/2  2/3  3/4  5/6  8/9  12/13 18/19 ^',
  'L  200 | 0/1  v    v    1/2  2/3  3/4  5/6  8/9  12/13 18/19 ^    ^',
  'M  315 | v    v    1/2  2/3  3/4  5/6  8/9  12/13 18/19 ^    ^    ^',
  'N  500 | v    1/2  2/3  3/4  5/6  8/9  12/13 18/19 ^    ^    ^    ^',
  'P  800 | 1/2  2/3  3/4  5/6  8/9  12/13 18/19 ^    ^    ^    ^    ^',
  'Q 1250 | 2/3  3/4  5/6  8/9  12/13 18/19 ^    ^    ^    ^    ^    ^',
  'R 2000 | 3/4  5/6  8/9  12/13 18/19 ^    ^    ^    ^    ^    ^    ^',
];

// ---------------------------------------------------------------------------------------------
// Reduced inspection. These values are RECALLED, NOT READ. REFERENCES.md could not read the cell
// values of ISO 2859-1:1999 Table 2-C (that edition closed the gap between Ac and Re). It gives
// MIL-STD-105E / ANSI Z1.4 Table II-C from memory, unverified, as a description: these
// sample sizes, arrows and 0/1 in the same cells as the normal table, and each rung of the
// normal ladder replaced as below. So the reduced table is Table 2-A with this substitution
// applied cell by cell. A normal cell missing from the map fails at module load.
// ---------------------------------------------------------------------------------------------
const REDUCED_SAMPLE_SIZE_SOURCE =
  'A2 B2 C2 D3 E5 F8 G13 H20 J32 K50 L80 M125 N200 P315 Q500 R800';

const REDUCED_CELL_FROM_NORMAL: Readonly<Record<string, string>> = {
  '0/1': '0/1',
  '1/2': '0/2',
  '2/3': '1/3',
  '3/4': '1/4',
  '5/6': '2/5',
  '7/8': '3/6',
  '10/11': '5/8',
  '14/15': '7/10',
  '21/22': '10/13',
};

/**
 * The Ac/Re rungs of the normal table in order of increasing AQL along a row (REFERENCES.md
 * Table 2-A). The switching score needs the rung one step tighter than a plan in the 0.10
 * column. That column's left neighbour (AQL 0.065) is not printed, so the previous rung is
 * used instead (see `acceptanceOneStepTighter` in sampling.ts).
 */
export const NORMAL_LADDER: readonly string[] = [
  '0/1', '1/2', '2/3', '3/4', '5/6', '7/8', '10/11', '14/15', '21/22',
];

export const TABLE_LABELS: Readonly<Record<Severity, string>> = {
  normal: 'ISO 2859-1 Table 2-A',
  tightened: 'ISO 2859-1 Table 2-B',
  reduced: 'MIL-STD-105E Table II-C (memory, unverified)',
};

// ---------------------------------------------------------------------------------------------
// Parsing: runs once at import. Errors here are programming errors in the data above, so they
// throw a plain Error, not a ComputeError.
// ---------------------------------------------------------------------------------------------

const DOWN: TableCell = { kind: 'down' };
const UP: TableCell = { kind: 'up' };

function isCodeLetter(value: string): value is CodeLetter {
  return (CODE_LETTERS as readonly string[]).includes(value);
}

function parseCell(token: string, where: string): TableCell {
  if (token === 'v') return DOWN;
  if (token === '^') return UP;
  const match = /^(\d+)\/(\d+)$/.exec(token);
  if (!match) throw new Error(`${where}: cannot read cell "${token}"`);
  const accept = Number(match[1]);
  const reject = Number(match[2]);
  if (reject <= accept) throw new Error(`${where}: Re must exceed Ac in "${token}"`);
  return { kind: 'plan', accept, reject };
}

function parsePlanTable(label: string, source: readonly string[]): PlanTable {
  if (source.length !== CODE_LETTERS.length) {
    throw new Error(`${label}: expected ${CODE_LETTERS.length} rows, got ${source.length}`);
  }
  const rows = source.map((line, index): PlanTableRow => {
    const [head, body] = line.split('|');
    const [letter, n] = head.trim().split(/\s+/);
    const where = `${label} row ${letter}`;
    if (letter !== CODE_LETTERS[index]) throw new Error(`${where}: expected row ${CODE_LETTERS[index]}`);
    const sampleSize = Number(n);
    if (!Number.isInteger(sampleSize) || sampleSize < 1) throw new Error(`${where}: bad sample size "${n}"`);
    const tokens = body.trim().split(/\s+/);
    if (tokens.length !== AQL_VALUES.length) {
      throw new Error(`${where}: expected ${AQL_VALUES.length} cells, got ${tokens.length}`);
    }
    return { letter: CODE_LETTERS[index], sampleSize, cells: tokens.map((t) => parseCell(t, where)) };
  });
  return { label, rows };
}

function parseCodeLetterRanges(): CodeLetterRange[] {
  let minLotSize = MIN_LOT_SIZE;
  return CODE_LETTER_SOURCE.map(([maxLotSize, text]) => {
    const letters = text.split(' ');
    if (letters.length !== INSPECTION_LEVELS.length || !letters.every(isCodeLetter)) {
      throw new Error(`ISO 2859-1 Table 1 range ending ${maxLotSize}: bad letters "${text}"`);
    }
    if (maxLotSize < minLotSize) throw new Error(`ISO 2859-1 Table 1: ranges out of order at ${maxLotSize}`);
    const range: CodeLetterRange = { minLotSize, maxLotSize, letters };
    minLotSize = maxLotSize + 1;
    return range;
  });
}

function deriveReducedTable(normal: PlanTable): PlanTable {
  const sizes = new Map<string, number>();
  for (const entry of REDUCED_SAMPLE_SIZE_SOURCE.split(' ')) {
    sizes.set(entry.slice(0, 1), Number(entry.slice(1)));
  }
  const rows = normal.rows.map((row): PlanTableRow => {
    const sampleSize = sizes.get(row.letter);
    if (sampleSize === undefined) throw new Error(`reduced table: no sample size for ${row.letter}`);
    const cells = row.cells.map((cell) => {
      if (cell.kind !== 'plan') return cell;
      const key = `${cell.accept}/${cell.reject}`;
      const reduced = REDUCED_CELL_FROM_NORMAL[key];
      if (reduced === undefined) throw new Error(`reduced table: no reduced plan for normal ${key}`);
      return parseCell(reduced, `reduced table row ${row.letter}`);
    });
    return { letter: row.letter, sampleSize, cells };
  });
  return { label: TABLE_LABELS.reduced, rows };
}

export const CODE_LETTER_RANGES: readonly CodeLetterRange[] = parseCodeLetterRanges();
export const NORMAL_TABLE: PlanTable = parsePlanTable(TABLE_LABELS.normal, NORMAL_SOURCE);
export const TIGHTENED_TABLE: PlanTable = parsePlanTable(TABLE_LABELS.tightened, TIGHTENED_SOURCE);
export const REDUCED_TABLE: PlanTable = deriveReducedTable(NORMAL_TABLE);

export const PLAN_TABLES: Readonly<Record<Severity, PlanTable>> = {
  normal: NORMAL_TABLE,
  tightened: TIGHTENED_TABLE,
  reduced: REDUCED_TABLE,
};
