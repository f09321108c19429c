import { describe, expect, it } from 'vitest';
import { ComputeError } from '../../shared/compute/errors';
import {
  AQL_VALUES,
  INSPECTION_LEVELS,
  SEVERITIES,
  acceptanceOneStepTighter,
  approveReducedInspection,
  codeLetter,
  initialSwitchingState,
  judgeLot,
  nextSwitchingScore,
  nextSwitchingState,
  resolvePlan,
  resumeAfterSupplierAction,
  samplingPlan,
  zeroAcceptancePlan,
  type InspectionLevel,
  type LotResult,
  type SamplingPlan,
  type SamplingPlanInput,
  type Severity,
  type SwitchingOptions,
  type SwitchingState,
  type SwitchingStep,
} from '../../shared/compute/sampling';
import {
  CODE_LETTERS,
  NORMAL_TABLE,
  REDUCED_TABLE,
  TIGHTENED_TABLE,
  type PlanTable,
} from '../../shared/compute/sampling-tables';

// -----------------------------------------------------------------------------------------------
// Second, independent copy of REFERENCES.md "Attribute sampling", copied as printed
// (arrows as ↓/↑, ranges with en dashes) and parsed here with its own small parser. The module
// under test keeps its own copy in another notation. Comparing the two catches a typo in either.
// -----------------------------------------------------------------------------------------------

const PRINTED_TABLE_1 = `
2–8 A A A A A A B | 9–15 A A A A A B C | 16–25 A A B B B C D | 26–50 A B B C C D E
51–90 B B C C C E F | 91–150 B B C D D F G | 151–280 B C D E E G H | 281–500 B C D E F H J
501–1200 C C E F G J K | 1201–3200 C D E G H K L | 3201–10000 C D F G J L M
10001–35000 C D F H K M N | 35001–150000 D E G J L N P | 150001–500000 D E G J M P Q
500001+ D E H K N Q R
`;

const PRINTED_SAMPLE_SIZES =
  'A2 B3 C5 D8 E13 F20 G32 H50 J80 K125 L200 M315 N500 P800 Q1250 R2000';

const PRINTED_TABLE_2A = `
A   2  ↓   ↓   ↓   ↓   ↓   ↓   ↓   ↓   ↓   0/1 ↑   ↓
B   3  ↓   ↓   ↓   ↓   ↓   ↓   ↓   ↓   0/1 ↑   ↓   1/2
C   5  ↓   ↓   ↓   ↓   ↓   ↓   ↓   0/1 ↑   ↓   1/2 2/3
D   8  ↓   ↓   ↓   ↓   ↓   ↓   0/1 ↑   ↓   1/2 2/3 3/4
E  13  ↓   ↓   ↓   ↓   ↓   0/1 ↑   ↓   1/2 2/3 3/4 5/6
F  20  ↓   ↓   ↓   ↓   0/1 ↑   ↓   1/2 2/3 3/4 5/6 7/8
G  32  ↓   ↓   ↓   0/1 ↑   ↓   1/2 2/3 3/4 5/6 7/8 10/11
H  50  ↓   ↓   0/1 ↑   ↓   1/2 2/3 3/4 5/6 7/8 10/11 14/15
J  80  ↓   0/1 ↑   ↓   1/2 2/3 3/4 5/6 7/8 10/11 14/15 21/22
K 125  0/1 ↑   ↓   1/2 2/3 3/4 5/6 7/8 10/11 14/15 21/22 ↑
L 200  ↑   ↓   1/2 2/3 3/4 5/6 7/8 10/11 14/15 21/22 ↑   ↑
M 315  ↓   1/2 2/3 3/4 5/6 7/8 10/11 14/15 21/22 ↑   ↑   ↑
N 500  1/2 2/3 3/4 5/6 7/8 10/11 14/15 21/22 ↑   ↑   ↑   ↑
P 800  2/3 3/4 5/6 7/8 10/11 14/15 21/22 ↑   ↑   ↑   ↑   ↑
Q 1250 3/4 5/6 7/8 10/11 14/15 21/22 ↑   ↑   ↑   ↑   ↑   ↑
R 2000 5/6 7/8 10/11 14/15 21/22 ↑   ↑   ↑   ↑   ↑   ↑   ↑
`;

const PRINTED_TABLE_2B = `
A   2  ↓   ↓   ↓   ↓   ↓   ↓   ↓   ↓   ↓   ↓   ↓   ↓
B   3  ↓   ↓   ↓   ↓   ↓   ↓   ↓   ↓   ↓   0/1 ↓   ↓
C   5  ↓   ↓   ↓   ↓   ↓   ↓   ↓   ↓   0/1 ↓   ↓   1/2
D   8  ↓   ↓   ↓   ↓   ↓   ↓   ↓   0/1 ↓   ↓   1/2 2/3
E  13  ↓   ↓   ↓   ↓   ↓   ↓   0/1 ↓   ↓   1/2 2/3 3/4
F  20  ↓   ↓   ↓   ↓   ↓   0/1 ↓   ↓   1/2 2/3 3/4 5/6
G  32  ↓   ↓   ↓   ↓   0/1 ↓   ↓   1/2 2/3 3/4 5/6 8/9
H  50  ↓   ↓   ↓   0/1 ↓   ↓   1/2 2/3 3/4 5/6 8/9 12/13
J  80  ↓   ↓   0/1 ↓   ↓   1/2 2/3 3/4 5/6 8/9 12/13 18/19
K 125  ↓   0/1 ↓   ↓   1/2 2/3 3/4 5/6 8/9 12/13 18/19 ↑
L 200  0/1 ↓   ↓   1/2 2/3 3/4 5/6 8/9 12/13 18/19 ↑   ↑
M 315  ↓   ↓   1/2 2/3 3/4 5/6 8/9 12/13 18/19 ↑   ↑   ↑
N 500  ↓   1/2 2/3 3/4 5/6 8/9 12/13 18/19 ↑   ↑   ↑   ↑
P 800  1/2 2/3 3/4 5/6 8/9 12/13 18/19 ↑   ↑   ↑   ↑   ↑
Q 1250 2/3 3/4 5/6 8/9 12/13 18/19 ↑   ↑   ↑   ↑   ↑   ↑
R 2000 3/4 5/6 8/9 12/13 18/19 ↑   ↑   ↑   ↑   ↑   ↑   ↑
`;

// Reduced, as REFERENCES.md describes MIL-STD-105E Table II-C (memory, unverified).
const PRINTED_REDUCED_SAMPLE_SIZES =
  'A2 B2 C2 D3 E5 F8 G13 H20 J32 K50 L80 M125 N200 P315 Q500 R800';
const PRINTED_NORMAL_LADDER = '1/2 2/3 3/4 5/6 7/8 10/11 14/15 21/22';
const PRINTED_REDUCED_LADDER = '0/2 1/3 1/4 2/5 3/6 5/8 7/10 10/13';

/** '↓' | '↑' | 'Ac/Re', per printed cell. */
type PrintedCell = string;
interface PrintedRow {
  letter: string;
  n: number;
  cells: PrintedCell[];
}

function parsePrintedPlanTable(text: string): PrintedRow[] {
  return text
    .trim()
    .split('\n')
    .map((line) => {
      const [letter, n, ...cells] = line.trim().split(/\s+/);
      return { letter, n: Number(n), cells };
    });
}

interface PrintedRange {
  min: number;
  max: number;
  letters: string[];
}

function parsePrintedTable1(text: string): PrintedRange[] {
  return text
    .trim()
    .split(/\s*\|\s*|\n/)
    .map((entry) => {
      const [range, ...letters] = entry.trim().split(/\s+/);
      const open = range.endsWith('+');
      const [min, max] = open ? [Number(range.slice(0, -1)), Infinity] : range.split('–').map(Number);
      return { min, max, letters };
    });
}

function parseSizes(text: string): Map<string, number> {
  return new Map(text.split(' ').map((e) => [e.slice(0, 1), Number(e.slice(1))]));
}

/** The module's cell rendered in the printed notation. */
function cellText(table: PlanTable, row: number, col: number): string {
  const cell = table.rows[row].cells[col];
  if (cell.kind === 'down') return '↓';
  if (cell.kind === 'up') return '↑';
  return `${cell.accept}/${cell.reject}`;
}

/** Independent arrow walk over the printed rows: ↓ first plan below, ↑ first plan above. */
function printedResolve(rows: PrintedRow[], start: number, col: number) {
  const dir = rows[start].cells[col] === '↓' ? 1 : rows[start].cells[col] === '↑' ? -1 : 0;
  for (let r = start; r >= 0 && r < rows.length; r += dir) {
    const cell = rows[r].cells[col];
    if (cell.includes('/')) {
      const [ac, re] = cell.split('/').map(Number);
      return { letter: rows[r].letter, n: rows[r].n, ac, re };
    }
    if (dir === 0) break;
  }
  return undefined;
}

const TABLE_1 = parsePrintedTable1(PRINTED_TABLE_1);
const TABLE_2A = parsePrintedPlanTable(PRINTED_TABLE_2A);
const TABLE_2B = parsePrintedPlanTable(PRINTED_TABLE_2B);

function expectComputeError(fn: () => unknown, field: string, message?: RegExp): void {
  let caught: unknown;
  try {
    fn();
  } catch (error) {
    caught = error;
  }
  expect(caught).toBeInstanceOf(ComputeError);
  expect((caught as ComputeError).field).toBe(field);
  if (message) expect((caught as ComputeError).message).toMatch(message);
}

// -----------------------------------------------------------------------------------------------

describe('test copy of REFERENCES.md', () => {
  // Guards the oracle itself: a truncated copy would make the cell walks below pass vacuously.
  it('has 15 Table 1 ranges and 16 × 12 cells in Tables 2-A and 2-B', () => {
    expect(TABLE_1).toHaveLength(15); // ISO 2859-1 Table 1
    expect(TABLE_1.every((r) => r.letters.length === 7)).toBe(true); // ISO 2859-1 Table 1
    for (const t of [TABLE_2A, TABLE_2B]) {
      expect(t.map((r) => r.letter).join('')).toBe('ABCDEFGHJKLMNPQR'); // ISO 2859-1 Tables 2-A/2-B
      expect(t.every((r) => r.cells.length === 12)).toBe(true); // ISO 2859-1 Tables 2-A/2-B
    }
  });
});

describe('codeLetter', () => {
  const sut = codeLetter;

  it('matches every Table 1 cell at the low end, middle and high end of each range', () => {
    for (const range of TABLE_1) {
      const high = Number.isFinite(range.max) ? range.max : 10_000_000;
      const lots = [range.min, Math.floor((range.min + high) / 2), high];
      for (const lot of lots) {
        INSPECTION_LEVELS.forEach((level, i) => {
          expect(sut(lot, level), `lot ${lot} level ${level}`).toBe(range.letters[i]); // ISO 2859-1 Table 1
        });
      }
    }
  });

  it('covers the range boundaries 2, 8, 9, 15, 16 … 500000, 500001', () => {
    const boundaries = TABLE_1.flatMap((r) => (Number.isFinite(r.max) ? [r.min, r.max] : [r.min]));
    expect(boundaries).toEqual([
      2, 8, 9, 15, 16, 25, 26, 50, 51, 90, 91, 150, 151, 280, 281, 500, 501, 1200, 1201, 3200,
      3201, 10000, 10001, 35000, 35001, 150000, 150001, 500000, 500001,
    ]); // ISO 2859-1 Table 1 ranges
    // Either side of each boundary the letter changes in at least one level column.
    for (let i = 1; i < TABLE_1.length; i++) {
      const below = INSPECTION_LEVELS.map((l) => sut(TABLE_1[i].min - 1, l)).join('');
      const above = INSPECTION_LEVELS.map((l) => sut(TABLE_1[i].min, l)).join('');
      expect(below).toBe(TABLE_1[i - 1].letters.join('')); // ISO 2859-1 Table 1
      expect(above).toBe(TABLE_1[i].letters.join('')); // ISO 2859-1 Table 1
    }
  });

  it('gives the worked examples', () => {
    expect(sut(1000, 'II')).toBe('J'); // REFERENCES.md example, ISO 2859-1 Table 1
    expect(sut(10, 'II')).toBe('B'); // ISO 2859-1 Table 1 (9–15, II)
    expect(sut(500001, 'III')).toBe('R'); // ISO 2859-1 Table 1 (500001+, III)
    expect(sut(500000, 'S-1')).toBe('D'); // ISO 2859-1 Table 1 (150001–500000, S-1)
  });

  it('refuses lot sizes that are not whole numbers of at least 2', () => {
    for (const bad of [1, 0, -3, 1.5, 100.5, Number.NaN, Infinity]) {
      expectComputeError(() => sut(bad, 'II'), 'lotSize', /whole number of at least 2/); // ISO 2859-1 Table 1 starts at 2
    }
  });

  it('refuses an unknown inspection level', () => {
    expectComputeError(() => sut(100, 'IV' as InspectionLevel), 'level', /Unknown inspection level "IV"/); // ISO 2859-1 Table 1 columns
  });
});

describe('plan tables against the independent copy', () => {
  it('normal sample sizes match the printed list and Table 2-A rows', () => {
    const sizes = parseSizes(PRINTED_SAMPLE_SIZES);
    NORMAL_TABLE.rows.forEach((row, r) => {
      expect(row.sampleSize).toBe(sizes.get(row.letter)); // ISO 2859-1 sample sizes
      expect(row.sampleSize).toBe(TABLE_2A[r].n); // ISO 2859-1 Table 2-A
      expect(TIGHTENED_TABLE.rows[r].sampleSize).toBe(TABLE_2B[r].n); // ISO 2859-1 Table 2-B
    });
  });

  it('every cell of Table 2-A (normal) matches', () => {
    TABLE_2A.forEach((row, r) => {
      expect(NORMAL_TABLE.rows[r].letter).toBe(row.letter); // ISO 2859-1 Table 2-A
      row.cells.forEach((printed, c) => {
        expect(cellText(NORMAL_TABLE, r, c), `2-A ${row.letter}/${AQL_VALUES[c]}`).toBe(printed); // ISO 2859-1 Table 2-A
      });
    });
  });

  it('every cell of Table 2-B (tightened) matches', () => {
    TABLE_2B.forEach((row, r) => {
      expect(TIGHTENED_TABLE.rows[r].letter).toBe(row.letter); // ISO 2859-1 Table 2-B
      row.cells.forEach((printed, c) => {
        expect(cellText(TIGHTENED_TABLE, r, c), `2-B ${row.letter}/${AQL_VALUES[c]}`).toBe(printed); // ISO 2859-1 Table 2-B
      });
    });
  });

  it('reduced table follows the REFERENCES description cell by cell', () => {
    const sizes = parseSizes(PRINTED_REDUCED_SAMPLE_SIZES);
    const normalLadder = PRINTED_NORMAL_LADDER.split(' ');
    const reducedLadder = PRINTED_REDUCED_LADDER.split(' ');
    const toReduced = (cell: string) =>
      cell.includes('/') && cell !== '0/1' ? reducedLadder[normalLadder.indexOf(cell)] : cell;
    TABLE_2A.forEach((row, r) => {
      expect(REDUCED_TABLE.rows[r].sampleSize).toBe(sizes.get(row.letter)); // MIL-STD-105E Table II-C sample sizes (memory, unverified)
      row.cells.forEach((printed, c) => {
        expect(cellText(REDUCED_TABLE, r, c), `reduced ${row.letter}/${AQL_VALUES[c]}`).toBe(toReduced(printed)); // MIL-STD-105E Table II-C (memory, unverified), REFERENCES mapping
      });
    });
  });

  it('resolvePlan follows the arrows exactly like the printed tables in every cell', () => {
    const cases: [Severity, PrintedRow[]][] = [
      ['normal', TABLE_2A],
      ['tightened', TABLE_2B],
    ];
    for (const [severity, rows] of cases) {
      rows.forEach((row, r) => {
        AQL_VALUES.forEach((aql, c) => {
          const expected = printedResolve(rows, r, c);
          const call = () => resolvePlan(CODE_LETTERS[r], aql, severity);
          if (expected === undefined) {
            expectComputeError(call, 'aql', /no .* plan/); // ISO 2859-1 Tables 2-A/2-B: arrow leads off the table
            return;
          }
          const got = call();
          const label = `${severity} ${row.letter}/${aql}`;
          expect([got.planLetter, got.sampleSize, got.accept, got.reject], label).toEqual([
            expected.letter,
            expected.n,
            expected.ac,
            expected.re,
          ]); // ISO 2859-1 Tables 2-A/2-B arrow rule
        });
      });
    }
  });

  it('only A/10 normal (and reduced) has no plan among all cells', () => {
    const missing: string[] = [];
    for (const severity of SEVERITIES) {
      for (const letter of CODE_LETTERS) {
        for (const aql of AQL_VALUES) {
          try {
            resolvePlan(letter, aql, severity);
          } catch {
            missing.push(`${severity} ${letter}/${aql}`);
          }
        }
      }
    }
    expect(missing).toEqual(['normal A/10', 'reduced A/10']); // REFERENCES: row A at AQL 10 points up to nothing
  });
});

describe('resolvePlan arrow resolution', () => {
  const sut = resolvePlan;
  const pick = (p: ReturnType<typeof resolvePlan>) => [p.planLetter, p.sampleSize, p.accept, p.reject];

  it('resolves a dozen cells by hand from the printed tables', () => {
    expect(pick(sut('A', 6.5, 'normal'))).toEqual(['A', 2, 0, 1]); // ISO 2859-1 Table 2-A, plan in cell
    expect(pick(sut('B', 6.5, 'normal'))).toEqual(['A', 2, 0, 1]); // ISO 2859-1 Table 2-A, ↑ one row
    expect(pick(sut('A', 0.1, 'normal'))).toEqual(['K', 125, 0, 1]); // ISO 2859-1 Table 2-A, long ↓
    expect(pick(sut('L', 0.1, 'normal'))).toEqual(['K', 125, 0, 1]); // ISO 2859-1 Table 2-A, ↑
    expect(pick(sut('M', 0.1, 'normal'))).toEqual(['N', 500, 1, 2]); // ISO 2859-1 Table 2-A, ↓
    expect(pick(sut('A', 15, 'normal'))).toEqual(['B', 3, 1, 2]); // ISO 2859-1 Table 2-A, ↓
    expect(pick(sut('E', 1.5, 'normal'))).toEqual(['D', 8, 0, 1]); // ISO 2859-1 Table 2-A, ↑
    expect(pick(sut('E', 2.5, 'normal'))).toEqual(['F', 20, 1, 2]); // ISO 2859-1 Table 2-A, ↓
    expect(pick(sut('K', 15, 'normal'))).toEqual(['J', 80, 21, 22]); // ISO 2859-1 Table 2-A, ↑
    expect(pick(sut('R', 1.0, 'normal'))).toEqual(['Q', 1250, 21, 22]); // ISO 2859-1 Table 2-A, ↑
    expect(pick(sut('R', 15, 'normal'))).toEqual(['J', 80, 21, 22]); // ISO 2859-1 Table 2-A, long ↑
    expect(pick(sut('A', 10, 'tightened'))).toEqual(['D', 8, 1, 2]); // ISO 2859-1 Table 2-B, REFERENCES: long ↓ to D
    expect(pick(sut('A', 0.1, 'tightened'))).toEqual(['L', 200, 0, 1]); // ISO 2859-1 Table 2-B, long ↓
    expect(pick(sut('K', 0.25, 'tightened'))).toEqual(['M', 315, 1, 2]); // ISO 2859-1 Table 2-B, ↓ ↓
    expect(pick(sut('B', 15, 'tightened'))).toEqual(['C', 5, 1, 2]); // ISO 2859-1 Table 2-B, ↓
    expect(pick(sut('R', 15, 'tightened'))).toEqual(['J', 80, 18, 19]); // ISO 2859-1 Table 2-B, long ↑
    expect(pick(sut('J', 1.0, 'reduced'))).toEqual(['J', 32, 1, 3]); // MIL-STD-105E Table II-C (memory, unverified)
    expect(pick(sut('K', 0.1, 'reduced'))).toEqual(['K', 50, 0, 1]); // MIL-STD-105E Table II-C (memory, unverified)
    expect(pick(sut('A', 15, 'reduced'))).toEqual(['B', 2, 0, 2]); // MIL-STD-105E Table II-C (memory, unverified)
  });

  it('labels the table each plan follows', () => {
    expect(sut('J', 1.0, 'normal').table).toBe('ISO 2859-1 Table 2-A'); // ISO 2859-1 Table 2-A
    expect(sut('J', 1.0, 'tightened').table).toBe('ISO 2859-1 Table 2-B'); // ISO 2859-1 Table 2-B
    expect(sut('J', 1.0, 'reduced').table).toBe('MIL-STD-105E Table II-C (memory, unverified)'); // REFERENCES reduced
  });
});

describe('samplingPlan', () => {
  const sut = samplingPlan;
  const input = (overrides: Partial<SamplingPlanInput> = {}): SamplingPlanInput => ({
    lotSize: 1000,
    level: 'II',
    aql: 1.0,
    severity: 'normal',
    ...overrides,
  });

  it('lot 1000, level II, AQL 1.0 normal → J, n 80, Ac 2 Re 3', () => {
    const plan = sut(input());
    expect([plan.codeLetter, plan.planLetter]).toEqual(['J', 'J']); // REFERENCES example, ISO 2859-1 Table 1
    expect([plan.sampleSize, plan.accept, plan.reject]).toEqual([80, 2, 3]); // REFERENCES example, ISO 2859-1 Table 2-A
    expect(plan.inspectAll).toBe(false); // ISO 2859-1: n 80 < lot 1000
    expect(plan.table).toBe('ISO 2859-1 Table 2-A');
  });

  it('lot 10 at AQL 0.65 → n 20 > lot → inspect 100 %, Ac/Re kept from the plan', () => {
    const plan = sut(input({ lotSize: 10, aql: 0.65 }));
    expect([plan.codeLetter, plan.planLetter, plan.planSampleSize]).toEqual(['B', 'F', 20]); // ISO 2859-1 Tables 1, 2-A (↓ B → F)
    expect(plan.inspectAll).toBe(true); // REFERENCES example: n 20 > lot 10 → 100 %
    expect(plan.sampleSize).toBe(10); // REFERENCES: inspect 100 % of the lot
    expect([plan.accept, plan.reject]).toEqual([0, 1]); // ISO 2859-1 Table 2-A F/0.65
  });

  it('inspects 100 % when n equals the lot size but not when n is one less', () => {
    const equal = sut(input({ lotSize: 20, aql: 0.65 }));
    const above = sut(input({ lotSize: 21, aql: 0.65 }));
    expect([equal.planSampleSize, equal.inspectAll, equal.sampleSize]).toEqual([20, true, 20]); // REFERENCES: n ≥ lot size → 100 %
    expect([above.planSampleSize, above.inspectAll, above.sampleSize]).toEqual([20, false, 20]); // REFERENCES: n < lot size → sample
  });

  it('refuses row A at AQL 10 normal with a clear message', () => {
    expectComputeError(() => sut(input({ lotSize: 5, aql: 10 })), 'aql', /no normal plan for code letter A at AQL 10.*up past the top/); // REFERENCES: A/10 points up to nothing
  });

  it('lot 1000, AQL 1.0 tightened → n 80, Ac 1 Re 2', () => {
    const plan = sut(input({ severity: 'tightened' }));
    expect([plan.planLetter, plan.sampleSize, plan.accept, plan.reject]).toEqual(['J', 80, 1, 2]); // REFERENCES worked example, ISO 2859-1 Table 2-B
    expect(plan.table).toBe('ISO 2859-1 Table 2-B');
  });

  it('A/10 tightened goes down to D (n 8, Ac 1 Re 2)', () => {
    const plan = sut(input({ lotSize: 50, level: 'S-1', aql: 10, severity: 'tightened' }));
    expect(plan.codeLetter).toBe('A'); // ISO 2859-1 Table 1 (26–50, S-1)
    expect([plan.planLetter, plan.sampleSize, plan.accept, plan.reject, plan.inspectAll]).toEqual(['D', 8, 1, 2, false]); // REFERENCES: A/10 long ↓ to D
    const small = sut(input({ lotSize: 5, aql: 10, severity: 'tightened' }));
    expect([small.planSampleSize, small.sampleSize, small.inspectAll]).toEqual([8, 5, true]); // REFERENCES: n 8 ≥ lot 5 → 100 %
  });

  it('reduced plan for lot 1000, AQL 1.0 → n 32, Ac 1 Re 3', () => {
    const plan = sut(input({ severity: 'reduced' }));
    expect([plan.planLetter, plan.sampleSize, plan.accept, plan.reject]).toEqual(['J', 32, 1, 3]); // MIL-STD-105E Table II-C (memory, unverified)
    expect(plan.table).toMatch(/memory, unverified/);
  });

  it('refuses bad input with the field named', () => {
    expectComputeError(() => sut(input({ lotSize: 1 })), 'lotSize'); // ISO 2859-1 Table 1 starts at 2
    expectComputeError(() => sut(input({ lotSize: 1.5 })), 'lotSize');
    expectComputeError(() => sut(input({ lotSize: Number.NaN })), 'lotSize');
    expectComputeError(() => sut(input({ aql: 0.3 })), 'aql', /AQL 0.3 is not a column/); // ISO 2859-1 preferred AQLs
    expectComputeError(() => sut(input({ aql: Number.NaN })), 'aql');
    expectComputeError(() => sut(input({ level: 'IV' as InspectionLevel })), 'level');
    expectComputeError(() => sut(input({ severity: 'strict' as Severity })), 'severity');
  });
});

describe('judgeLot', () => {
  const sut = judgeLot;

  it('accepts at Ac and rejects at Re on a normal plan', () => {
    const plan = samplingPlan({ lotSize: 1000, level: 'II', aql: 1.0, severity: 'normal' });
    expect(sut(plan, 2)).toEqual({ accepted: true, returnToNormal: false }); // ISO 2859-1 Table 2-A J/1.0 Ac 2
    expect(sut(plan, 3)).toEqual({ accepted: false, returnToNormal: false }); // ISO 2859-1 Table 2-A J/1.0 Re 3
  });

  it('on reduced, a count between Ac and Re accepts but returns to normal', () => {
    const plan = samplingPlan({ lotSize: 1000, level: 'II', aql: 1.0, severity: 'reduced' });
    expect(sut(plan, 1)).toEqual({ accepted: true, returnToNormal: false }); // MIL-STD-105E reduced (memory): d ≤ Ac
    expect(sut(plan, 2)).toEqual({ accepted: true, returnToNormal: true }); // REFERENCES: between Ac and Re accepts, returns to normal
    expect(sut(plan, 3)).toEqual({ accepted: false, returnToNormal: true }); // ISO 2859-1 §9.3: reduced lot not accepted → normal
  });

  it('refuses a nonconforming count that is negative, fractional or above the sample size', () => {
    const plan = samplingPlan({ lotSize: 1000, level: 'II', aql: 1.0, severity: 'normal' });
    for (const bad of [-1, 1.5, 81, Number.NaN]) {
      expectComputeError(() => sut(plan, bad), 'nonconforming');
    }
  });
});

describe('zeroAcceptancePlan', () => {
  const sut = zeroAcceptancePlan;

  it('takes n = min(sample size, lot size), Ac 0, Re 1', () => {
    expect(sut({ lotSize: 500, sampleSize: 32 })).toMatchObject({ sampleSize: 32, accept: 0, reject: 1, inspectAll: false }); // common practice (c = 0)
    expect(sut({ lotSize: 20, sampleSize: 32 })).toMatchObject({ sampleSize: 20, inspectAll: true }); // common practice: n ≥ lot → 100 %
    expect(sut({ lotSize: 32, sampleSize: 32 })).toMatchObject({ sampleSize: 32, inspectAll: true }); // common practice: n ≥ lot → 100 %
  });

  it('rejects on the first nonconforming unit', () => {
    const plan = sut({ lotSize: 500, sampleSize: 32 });
    expect(judgeLot(plan, 0).accepted).toBe(true); // common practice (c = 0)
    expect(judgeLot(plan, 1).accepted).toBe(false); // common practice (c = 0)
  });

  it('refuses bad sizes', () => {
    expectComputeError(() => sut({ lotSize: 0, sampleSize: 5 }), 'lotSize');
    expectComputeError(() => sut({ lotSize: 2.5, sampleSize: 5 }), 'lotSize');
    expectComputeError(() => sut({ lotSize: 10, sampleSize: 0 }), 'sampleSize');
    expectComputeError(() => sut({ lotSize: 10, sampleSize: Number.NaN }), 'sampleSize');
  });
});

// -----------------------------------------------------------------------------------------------
// Switching rules
// -----------------------------------------------------------------------------------------------

function makePlan(overrides: Partial<SamplingPlanInput> = {}): SamplingPlan {
  return samplingPlan({ lotSize: 1000, level: 'II', aql: 1.0, severity: 'normal', ...overrides });
}

function makeLot(plan: SamplingPlan, nonconforming: number, accepted?: boolean): LotResult {
  return {
    plan,
    nonconforming,
    accepted: accepted ?? judgeLot(plan, nonconforming).accepted,
    aql: plan.aql,
    level: plan.level,
    lotSize: plan.lotSize,
  };
}

/** Applies lots in order, each on a plan of the state's current severity. */
function run(
  start: SwitchingState,
  counts: number[],
  planFor: (severity: Severity) => SamplingPlan = (severity) => makePlan({ severity }),
  opts?: SwitchingOptions,
): SwitchingStep[] {
  const steps: SwitchingStep[] = [];
  let state = start;
  for (const d of counts) {
    const step = nextSwitchingState(state, makeLot(planFor(state.severity), d), opts);
    steps.push(step);
    state = step.state;
  }
  return steps;
}

const last = (steps: SwitchingStep[]) => steps[steps.length - 1];
// J/1.0: normal 2/3, tightened 1/2, reduced 1/3 (n 80/80/32). Counts below are chosen per plan.
const ACCEPT = 0;
const REJECT_NORMAL = 3;
const REJECT_TIGHTENED = 2;

function tightenedState(): SwitchingState {
  return last(run(initialSwitchingState(), [REJECT_NORMAL, REJECT_NORMAL])).state;
}

describe('nextSwitchingState', () => {
  const sut = nextSwitchingState;

  it('starts on normal inspection with a score of 0', () => {
    expect(initialSwitchingState()).toEqual({
      severity: 'normal',
      consecutiveAccepted: 0,
      recentResults: [],
      switchingScore: 0,
      notAcceptedOnTightened: 0,
      discontinued: false,
      reducedEligible: false,
    }); // ISO 2859-1 §9.1/§9.3.3.2 (memory): start on normal, score 0
  });

  it('normal → tightened when 2 of 5 consecutive lots are not accepted', () => {
    const steps = run(initialSwitchingState(), [REJECT_NORMAL, ACCEPT, ACCEPT, ACCEPT, REJECT_NORMAL]);
    expect(steps.slice(0, 4).every((s) => s.state.severity === 'normal' && s.event === undefined)).toBe(true); // ISO 2859-1 §9.3: 1 of 4 is not enough
    expect(last(steps).event).toBe('to-tightened'); // ISO 2859-1 §9.3: 2 of 5 not accepted
    expect(last(steps).state.severity).toBe('tightened'); // ISO 2859-1 §9.3
  });

  it('normal → tightened on 2 consecutive lots not accepted', () => {
    const steps = run(initialSwitchingState(), [REJECT_NORMAL, REJECT_NORMAL]);
    expect(steps.map((s) => s.event)).toEqual([undefined, 'to-tightened']); // ISO 2859-1 §9.3: 2 of 2 (fewer than 5)
  });

  it('stays normal when the 2 lots not accepted are 6 lots apart', () => {
    const steps = run(initialSwitchingState(), [REJECT_NORMAL, ACCEPT, ACCEPT, ACCEPT, ACCEPT, REJECT_NORMAL]);
    expect(last(steps).state.severity).toBe('normal'); // ISO 2859-1 §9.3: only 1 of the last 5
    expect(last(steps).state.recentResults).toEqual([true, true, true, true, false]); // last 5 on normal
  });

  it('counts a lot refused for another reason (d < Re) as not accepted', () => {
    const plan = makePlan();
    const first = sut(initialSwitchingState(), makeLot(plan, 0, false));
    const second = sut(first.state, makeLot(plan, 1, false));
    expect(second.event).toBe('to-tightened'); // ISO 2859-1 §9.3: "not accepted on original inspection"
  });

  it('tightened → normal after 5 consecutive lots accepted', () => {
    const steps = run(tightenedState(), [ACCEPT, ACCEPT, ACCEPT, ACCEPT, ACCEPT]);
    expect(steps[3].state.severity).toBe('tightened'); // ISO 2859-1 §9.3: 4 are not enough
    expect(steps[3].state.consecutiveAccepted).toBe(4);
    expect(last(steps).event).toBe('to-normal'); // ISO 2859-1 §9.3: 5 consecutive accepted
    expect(last(steps).state).toEqual(initialSwitchingState()); // ISO 2859-1 §9.3.3.2 (memory): score restarts at 0
  });

  it('a lot not accepted on tightened restarts the run of 5', () => {
    const steps = run(tightenedState(), [ACCEPT, ACCEPT, ACCEPT, ACCEPT, REJECT_TIGHTENED, ACCEPT, ACCEPT, ACCEPT, ACCEPT]);
    expect(last(steps).state.severity).toBe('tightened'); // ISO 2859-1 §9.3: run broken at lot 5
    expect(last(steps).state.consecutiveAccepted).toBe(4);
  });

  it('5 lots not accepted (cumulative) on tightened → discontinued until the supplier acts', () => {
    const counts = [REJECT_TIGHTENED, ACCEPT, REJECT_TIGHTENED, REJECT_TIGHTENED, ACCEPT, REJECT_TIGHTENED, REJECT_TIGHTENED];
    const steps = run(tightenedState(), counts);
    expect(steps[5].state.discontinued).toBe(false); // ISO 2859-1 §9.4 (memory): 4 are not enough
    expect(steps[5].state.notAcceptedOnTightened).toBe(4);
    expect(last(steps).event).toBe('discontinued'); // ISO 2859-1 §9.4 (memory): 5th lot not accepted on tightened
    expect(last(steps).state.discontinued).toBe(true);

    const blocked = last(steps).state;
    expectComputeError(() => sut(blocked, makeLot(makePlan({ severity: 'tightened' }), 0)), 'state', /stopped/); // ISO 2859-1 §9.4 (memory): no acceptance
    const resumed = resumeAfterSupplierAction(blocked);
    expect(resumed).toEqual({ ...initialSwitchingState(), severity: 'tightened' }); // ISO 2859-1 §9.4 (memory): resume on tightened
    expectComputeError(() => resumeAfterSupplierAction(resumed), 'state');
  });

  it('leaving tightened clears the count of lots not accepted', () => {
    const steps = run(tightenedState(), [REJECT_TIGHTENED, REJECT_TIGHTENED, REJECT_TIGHTENED, REJECT_TIGHTENED, ACCEPT, ACCEPT, ACCEPT, ACCEPT, ACCEPT]);
    expect(last(steps).event).toBe('to-normal'); // ISO 2859-1 §9.3: 5 consecutive accepted
    const again = run(last(steps).state, [REJECT_NORMAL, REJECT_NORMAL, REJECT_TIGHTENED]);
    expect(last(again).state).toMatchObject({ severity: 'tightened', notAcceptedOnTightened: 1, discontinued: false }); // ISO 2859-1 §9.4 (memory): count is per tightened period
  });

  it('switching score reaching 30 marks reduced inspection eligible, without switching', () => {
    // J/1.0 normal is 2/3 (Ac ≥ 2): each lot with d ≤ 1 adds 3.
    const steps = run(initialSwitchingState(), Array<number>(11).fill(ACCEPT));
    expect(steps[8].state.switchingScore).toBe(27); // ISO 2859-1 §9.3.3.2 (memory): 9 × 3
    expect(steps[8].state.reducedEligible).toBe(false);
    expect(steps[9].state.switchingScore).toBe(30); // ISO 2859-1 §9.3.3.2 (memory): 10 × 3
    expect(steps[9].event).toBe('reduced-eligible'); // ISO 2859-1 §9.3.3.2 (memory): score ≥ 30, no approval yet
    expect(steps[9].state).toMatchObject({ severity: 'normal', reducedEligible: true });
    expect(steps[10].event).toBeUndefined(); // announced once
    expect(steps[10].state).toMatchObject({ severity: 'normal', reducedEligible: true, switchingScore: 33 });
  });

  it('with the engineer approving, score 30 → reduced', () => {
    const steps = run(initialSwitchingState(), Array<number>(10).fill(ACCEPT), undefined, { engineerApprovesReduced: true });
    expect(steps[8].state.severity).toBe('normal'); // ISO 2859-1 §9.3.3.2 (memory): score 27 < 30
    expect(last(steps).event).toBe('to-reduced'); // ISO 2859-1 §9.3.3.2 (memory): score ≥ 30 and approval
    expect(last(steps).state).toEqual({ ...initialSwitchingState(), severity: 'reduced' });
  });

  it('approval after eligibility switches to reduced; before it, approval is refused', () => {
    const eligible = last(run(initialSwitchingState(), Array<number>(10).fill(ACCEPT))).state;
    expect(approveReducedInspection(eligible).state.severity).toBe('reduced'); // ISO 2859-1 §9.3.3.2 (memory)
    const notYet = last(run(initialSwitchingState(), Array<number>(9).fill(ACCEPT))).state;
    expectComputeError(() => approveReducedInspection(notYet), 'state'); // ISO 2859-1 §9.3.3.2 (memory): score 27 < 30
  });

  it('unsteady production blocks reduced even with approval', () => {
    const steps = run(initialSwitchingState(), Array<number>(10).fill(ACCEPT), undefined, {
      engineerApprovesReduced: true,
      productionSteady: false,
    });
    expect(last(steps).state).toMatchObject({ severity: 'normal', reducedEligible: false, switchingScore: 30 }); // ISO 2859-1 §9.3.3.2 (memory): steady production required
    expect(last(steps).event).toBeUndefined();
  });

  it('reduced → normal on a lot not accepted, on a count in the gap, or on unsteady production', () => {
    const reduced: SwitchingState = { ...initialSwitchingState(), severity: 'reduced' };
    const plan = makePlan({ severity: 'reduced' }); // J/1.0 reduced: n 32, 1/3 (memory)
    const stay = sut(reduced, makeLot(plan, 1));
    expect(stay.state).toMatchObject({ severity: 'reduced', consecutiveAccepted: 1 }); // MIL-STD-105E reduced (memory): d ≤ Ac stays
    const rejected = sut(reduced, makeLot(plan, 3));
    expect([rejected.event, rejected.state.severity]).toEqual(['to-normal', 'normal']); // ISO 2859-1 §9.3: reduced lot not accepted → normal
    const gap = sut(reduced, makeLot(plan, 2));
    expect([gap.event, gap.state.severity]).toEqual(['to-normal', 'normal']); // REFERENCES: between Ac and Re → accepted, back to normal
    const unsteady = sut(reduced, makeLot(plan, 0), { productionSteady: false });
    expect(unsteady.event).toBe('to-normal'); // ISO 2859-1 §9.3 (memory): production irregular → normal
    expect(rejected.state.switchingScore).toBe(0); // ISO 2859-1 §9.3.3.2 (memory): score restarts on normal
  });

  it('refuses a lot result that does not fit the state', () => {
    const normal = initialSwitchingState();
    expectComputeError(() => sut(normal, makeLot(makePlan({ severity: 'tightened' }), 0)), 'plan', /tightened plan/);
    expectComputeError(() => sut(normal, { ...makeLot(makePlan(), 0), lotSize: 999 }), 'plan');
    expectComputeError(() => sut(normal, makeLot(makePlan(), 3, true)), 'accepted', /reaches Re 3/); // ISO 2859-1 Table 2-A: d ≥ Re rejects
    expectComputeError(() => sut(normal, makeLot(makePlan(), 81)), 'nonconforming');
  });

  it('does not change the state it is given', () => {
    const state = Object.freeze({ ...initialSwitchingState(), recentResults: Object.freeze([true]) as boolean[] });
    expect(() => sut(state, makeLot(makePlan(), REJECT_NORMAL))).not.toThrow();
    expect(state.recentResults).toEqual([true]);
  });
});

describe('nextSwitchingScore', () => {
  const sut = nextSwitchingScore;

  it('Ac ≥ 2: +3 when the lot passes one AQL step tighter, otherwise reset to 0', () => {
    const plan = makePlan(); // J/1.0 (80, 2/3); one step tighter J/0.65 (80, 1/2)
    expect(sut(12, makeLot(plan, 1))).toBe(15); // REFERENCES §9.3.3.2 example: d ≤ 1 → +3
    expect(sut(12, makeLot(plan, 2))).toBe(0); // REFERENCES §9.3.3.2 example: d = 2 accepted but score → 0
    expect(sut(12, makeLot(plan, 3))).toBe(0); // ISO 2859-1 §9.3.3.2 (memory): not accepted → 0
  });

  it('Ac 0 or 1: +2 when accepted, otherwise reset to 0', () => {
    const ac0 = makePlan({ aql: 0.15 }); // J/0.15 (80, 0/1)
    const ac1 = makePlan({ aql: 0.65 }); // J/0.65 (80, 1/2)
    expect([ac0.accept, ac1.accept]).toEqual([0, 1]); // ISO 2859-1 Table 2-A
    expect(sut(10, makeLot(ac0, 0))).toBe(12); // ISO 2859-1 §9.3.3.2 (memory): Ac 0 accepted → +2
    expect(sut(10, makeLot(ac1, 1))).toBe(12); // ISO 2859-1 §9.3.3.2 (memory): Ac 1 accepted → +2
    expect(sut(10, makeLot(ac1, 2))).toBe(0); // ISO 2859-1 §9.3.3.2 (memory): not accepted → 0
    expect(sut(10, makeLot(ac0, 0, false))).toBe(0); // not accepted for another reason → 0
  });

  it('reaches 30 after 15 accepted lots on an Ac 0 plan', () => {
    const plan = makePlan({ aql: 0.15 });
    const steps = run(initialSwitchingState(), Array<number>(15).fill(ACCEPT), () => plan);
    expect(steps[13].state.switchingScore).toBe(28); // ISO 2859-1 §9.3.3.2 (memory): 14 × 2
    expect(last(steps).event).toBe('reduced-eligible'); // ISO 2859-1 §9.3.3.2 (memory): 15 × 2 = 30
  });

  it('AQL 0.10 with Ac ≥ 2 uses the previous rung of the ladder (0.065 column not printed)', () => {
    const plan = makePlan({ lotSize: 200_000, aql: 0.1 }); // P/0.10 (800, 2/3)
    expect([plan.planLetter, plan.accept]).toEqual(['P', 2]); // ISO 2859-1 Tables 1, 2-A
    expect(sut(0, makeLot(plan, 1))).toBe(3); // ISO 2859-1 §9.3.3.2 (memory), tighter rung 1/2 by the diagonal pattern (memory)
    expect(sut(0, makeLot(plan, 2))).toBe(0);
  });
});

describe('acceptanceOneStepTighter', () => {
  const sut = acceptanceOneStepTighter;

  it('reads the next lower AQL in the row that was sampled', () => {
    expect(sut('J', 1.0)).toBe(1); // REFERENCES §9.3.3.2 example: J/0.65 is 1/2
    expect(sut('J', 15)).toBe(14); // ISO 2859-1 Table 2-A: J/10 is 14/15 (plan row of K/15 ↑)
    expect(sut('R', 0.65)).toBe(14); // ISO 2859-1 Table 2-A: R/0.40 is 14/15
    expect(sut('Q', 0.1)).toBe(2); // diagonal pattern (memory): rung below 3/4 is 2/3
  });

  it('finds a tighter plan for every Ac ≥ 2 cell of Table 2-A, with a smaller Ac', () => {
    for (const row of NORMAL_TABLE.rows) {
      row.cells.forEach((cell, c) => {
        if (cell.kind !== 'plan' || cell.accept < 2) return;
        expect(sut(row.letter, AQL_VALUES[c]), `${row.letter}/${AQL_VALUES[c]}`).toBeLessThan(cell.accept); // ISO 2859-1 Table 2-A ladder
      });
    }
  });
});
