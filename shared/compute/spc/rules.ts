import { ComputeError } from '../errors';

/**
 * Run rules for control charts: Western Electric 1–4 (Statistical Quality Control Handbook,
 * 1956, as stated in NIST/SEMATECH e-Handbook §6.3.2) and Nelson 1–8 (J. Quality Technology
 * 16(4), 1984).
 *
 * Conventions (each is pinned by a test in tests/unit/spc-rules.test.ts):
 * - σ is the standard deviation of the plotted statistic (σ/√n for an X-bar chart). It may be
 *   given per point (p charts with varying sample sizes); the centre line is one value.
 * - "Beyond kσ" is strict: a point exactly at c + 3σ is not beyond 3σ. Consequently "within
 *   kσ" includes the boundary: |x − c| ≤ kσ.
 * - Each side of the centre line is judged separately: "2 of 3 beyond 2σ" needs both points on
 *   the same side.
 * - A one-side run counts points strictly above (or strictly below) the centre; a point exactly
 *   on the centre line ends both runs.
 * - A trend counts strict rises (or falls) between consecutive points; a tie ends it. The same
 *   holds for alternation: a tie ends the zig-zag.
 * - Nelson 7 (15 within 1σ) and Nelson 8 (8 with none within 1σ) count points on either side,
 *   mixed freely; neither requires both sides to appear.
 * - Firing: a rule fires at every point that completes a qualifying window, and the completing
 *   point must itself meet the rule's condition. A run of 10 above the centre fires the
 *   8-in-a-row rule at indices 7, 8 and 9; points A, B beyond 2σ followed by a point inside
 *   fire "2 of 3" at B only (the third point does not complete anything).
 * - "Exactly on" allows for binary rounding: within 1e-12 of the values' magnitude counts as on
 *   the line, so 10.3 is exactly at 3σ for c = 10, σ = 0.1 although 10.3 − 10 > 0.3 in binary.
 * - One signal per rule per point; index is 0-based, the message counts points from 1.
 *
 * The evaluation is one pass over the points, O(n) whatever rules are chosen, with a handful of
 * integer updates per point and no branches on the data (see "How the pass is organised").
 */

export type RuleId =
  | 'we1'
  | 'we2'
  | 'we3'
  | 'we4'
  | 'trend6'
  | 'nelson1'
  | 'nelson2'
  | 'nelson3'
  | 'nelson4'
  | 'nelson5'
  | 'nelson6'
  | 'nelson7'
  | 'nelson8';

export type RuleSetName = 'western-electric' | 'nelson';

export const RULE_SETS: Readonly<Record<RuleSetName, readonly RuleId[]>> = {
  'western-electric': ['we1', 'we2', 'we3', 'we4', 'trend6'],
  nelson: ['nelson1', 'nelson2', 'nelson3', 'nelson4', 'nelson5', 'nelson6', 'nelson7', 'nelson8'],
};

export const RULE_DESCRIPTIONS: Readonly<Record<RuleId, string>> = {
  we1: 'one point beyond 3σ',
  we2: '2 of 3 consecutive points beyond 2σ on the same side',
  we3: '4 of 5 consecutive points beyond 1σ on the same side',
  we4: '8 points in a row on the same side of the centre line',
  trend6: '6 points in a row steadily increasing or decreasing',
  nelson1: 'one point beyond 3σ',
  nelson2: '9 points in a row on the same side of the centre line',
  nelson3: '6 points in a row steadily increasing or decreasing',
  nelson4: '14 points in a row alternating up and down',
  nelson5: '2 of 3 consecutive points beyond 2σ on the same side',
  nelson6: '4 of 5 consecutive points beyond 1σ on the same side',
  nelson7: '15 points in a row within 1σ of the centre line',
  nelson8: '8 points in a row with none within 1σ of the centre line',
};

export interface Signal {
  rule: RuleId;
  /** 0-based index of the point that completes the pattern. */
  index: number;
  message: string;
}

/** Relative size of the band around a boundary that counts as "on" it (floating-point rounding). */
const BOUNDARY_TOLERANCE = 1e-12;

const ALL_RULES = new Set<string>(Object.keys(RULE_DESCRIPTIONS));

function resolveRules(rules: RuleSetName | readonly RuleId[]): readonly RuleId[] {
  if (typeof rules === 'string') {
    const set = RULE_SETS[rules as RuleSetName];
    if (!set) throw new ComputeError(`unknown rule set "${rules}"; use "western-electric" or "nelson"`, 'rules');
    return set;
  }
  for (const r of rules) {
    if (!ALL_RULES.has(r)) throw new ComputeError(`unknown rule "${r}"`, 'rules');
  }
  return rules;
}

type Kind = 'beyond3' | 'twoOfThree' | 'fourOfFive' | 'run8' | 'run9' | 'trend6' | 'alternate14' | 'within15' | 'outside8';

const KIND: Record<RuleId, Kind> = {
  we1: 'beyond3',
  nelson1: 'beyond3',
  we2: 'twoOfThree',
  nelson5: 'twoOfThree',
  we3: 'fourOfFive',
  nelson6: 'fourOfFive',
  we4: 'run8',
  nelson2: 'run9',
  trend6: 'trend6',
  nelson3: 'trend6',
  nelson4: 'alternate14',
  nelson7: 'within15',
  nelson8: 'outside8',
};

// ---------------------------------------------------------------------------------------------
// How the pass is organised, and why (it must keep up with 10⁶-point series):
// - Each point's zone is computed once, as 0/1 integers: above / below the centre line, beyond
//   1σ, 2σ and 3σ. `+(a > b)` compiles to a flag move, not a branch: on random data a branch per
//   condition would be mispredicted about half the time.
// - "k in a row" rules keep the last few flags of their condition as bits in an integer (a lane),
//   several lanes to an integer with a spare bit above each. Adding 1 at the bottom of a lane
//   carries into its spare bit exactly when its last k flags are all set, so one add and one AND
//   test every lane of an integer at once. How long a run is (for the message) is only needed
//   where a rule fires: one more than at the point before if it fired there too, else k.
// - "2 of 3" and "4 of 5" look the zones of the last 5 points up in a precomputed table.
// - The loop only records the rare points where a chosen rule fires; the signals are built after
//   it, since a call inside the loop makes the compiler reload everything after it, every point.
// - The loop runs over chunks of points in a function called many times, so the compiler
//   optimises it as a whole function with full type information, not in the middle of a loop.

// Lanes of the integer `runs`: [above the centre ×9][spare][below ×9][spare][rises ×5][spare]
// [falls ×5][spare]; of `zones`: [within 1σ ×15][spare][reversals ×12][spare][beyond 3σ][spare];
// newest flag lowest. Eight points with none within 1σ are 8 zeros at the bottom of the within
// lane. A reversal is a difference of the opposite sign to the one before it (a rise after a
// fall or a fall after a rise).
const ABOVE_AT = 0;
const BELOW_AT = 10;
const RISES_AT = 20;
const FALLS_AT = 26;
const WITHIN_AT = 0;
const REVERSALS_AT = 16;
const BEYOND3_AT = 29;

/** The bits that survive a shift by one point: every lane bit except each lane's lowest. */
const RUNS_KEEP = (0x1fe << ABOVE_AT) | (0x1fe << BELOW_AT) | (0x1e << RISES_AT) | (0x1e << FALLS_AT);
const ZONES_KEEP = (0x7ffe << WITHIN_AT) | (0xffe << REVERSALS_AT);

// Per point, 3 bits in the `window` integer (newest lowest), for the last 5 points.
const UP1 = 1; // beyond 1σ above the centre
const DN1 = 2; // beyond 1σ below
const BEYOND2 = 4; // beyond 2σ, on the side given by UP1 / DN1
const POINT_BITS = 3;
const WINDOW_MASK = (1 << (5 * POINT_BITS)) - 1;
const FIRES_2OF3_UP = 1;
const FIRES_2OF3_DN = 2;
const FIRES_4OF5_UP = 4;
const FIRES_4OF5_DN = 8;

/** Which windows each state of `window` completes; the newest point must itself qualify. */
const WINDOW_FIRES = ((): Uint8Array => {
  const table = new Uint8Array(WINDOW_MASK + 1);
  // A point's code is one of these (beyond 2σ implies beyond 1σ on the same side), so only 5⁵
  // of the 2¹⁵ states occur; filling just those keeps loading this module quick.
  const pointCodes = [0, UP1, DN1, UP1 | BEYOND2, DN1 | BEYOND2];
  const fill = (h: number, k: number, up1: number, dn1: number, up2: number, dn2: number): void => {
    if (k === 5) {
      let f = 0;
      if ((h & (UP1 | BEYOND2)) === (UP1 | BEYOND2) && up2 >= 2) f |= FIRES_2OF3_UP;
      if ((h & (DN1 | BEYOND2)) === (DN1 | BEYOND2) && dn2 >= 2) f |= FIRES_2OF3_DN;
      if (h & UP1 && up1 >= 4) f |= FIRES_4OF5_UP;
      if (h & DN1 && dn1 >= 4) f |= FIRES_4OF5_DN;
      table[h] = f;
      return;
    }
    for (let c = 0; c < pointCodes.length; c++) {
      const p = pointCodes[c];
      const two = k < 3 ? p >> 2 : 0; // beyond 2σ among the last 3
      fill(h | (p << (POINT_BITS * k)), k + 1, up1 + (p & UP1), dn1 + ((p & DN1) >> 1), up2 + (two & (p & UP1)), dn2 + (two & ((p & DN1) >> 1)));
    }
  };
  fill(0, 0, 0, 0, 0, 0);
  return table;
})();

// Kinds as small integers, so building the signals compares numbers, not strings.
const BEYOND3 = 1;
const TWO_OF_THREE = 2;
const FOUR_OF_FIVE = 3;
const RUN8 = 4;
const RUN9 = 5;
const TREND6 = 6;
const ALTERNATE14 = 7;
const WITHIN15 = 8;
const OUTSIDE8 = 9;

const KIND_CODE: Record<Kind, number> = {
  beyond3: BEYOND3,
  twoOfThree: TWO_OF_THREE,
  fourOfFive: FOUR_OF_FIVE,
  run8: RUN8,
  run9: RUN9,
  trend6: TREND6,
  alternate14: ALTERNATE14,
  within15: WITHIN15,
  outside8: OUTSIDE8,
};

/**
 * Message text after "point N", for the side above (first) and below (second): the text before
 * the count and the text after it, or null for a message without a count.
 */
const MESSAGE_PARTS: Record<Kind, readonly (readonly [string, string | null])[]> = {
  beyond3: [
    [' is above the upper 3σ limit', null],
    [' is below the lower 3σ limit', null],
  ],
  twoOfThree: [
    [': 2 of the last 3 points are beyond 2σ above the centre', null],
    [': 2 of the last 3 points are beyond 2σ below the centre', null],
  ],
  fourOfFive: [
    [': 4 of the last 5 points are beyond 1σ above the centre', null],
    [': 4 of the last 5 points are beyond 1σ below the centre', null],
  ],
  run8: [
    [' ends a run of ', ' points above the centre'],
    [' ends a run of ', ' points below the centre'],
  ],
  run9: [
    [' ends a run of ', ' points above the centre'],
    [' ends a run of ', ' points below the centre'],
  ],
  trend6: [
    [' ends ', ' points in a row steadily increasing'],
    [' ends ', ' points in a row steadily decreasing'],
  ],
  alternate14: [
    [' ends ', ' points in a row alternating up and down'],
    [' ends ', ' points in a row alternating up and down'],
  ],
  within15: [
    [' ends ', ' points in a row within 1σ of the centre'],
    [' ends ', ' points in a row within 1σ of the centre'],
  ],
  outside8: [
    [' ends ', ' points in a row with none within 1σ'],
    [' ends ', ' points in a row with none within 1σ'],
  ],
};

// Layout of the Int32Array shared by evaluateRules and scanChunk: for the chosen rules' lanes,
// the bits to test (`runs` only: its lanes of 9 may be tested at 8; `zones` lanes are exactly as
// long as their rules), where to add 1 and where a full lane carries to; then the state carried
// from one chunk to the next; then where invalid input was found.
const RUNS_TEST = 0;
const RUNS_ADD = 1;
const RUNS_CARRY = 2;
const ZONES_ADD = 3;
const ZONES_CARRY = 4;
const OUTSIDE_TEST = 5; // the bottom 8 bits of the within lane, when Nelson 8 is chosen
const OUTSIDE_SIGN = 6; // the sign bit: set when they are all 0 and 1 is taken from them
const WINDOW_SELECT = 7; // which of the FIRES_* bits matter
const RUNS = 8;
const ZONES = 9;
const WINDOW = 10;
const FAILED_AT = 11;
const INTS = 12;

// Layout of the Float64Array shared the same way.
const CENTER = 0;
const ABS_CENTER = 1;
const TOLERANCE = 2;
const SIGMA = 3; // σ, 2σ and 3σ when σ is one value
const SIGMA2 = 4;
const SIGMA3 = 5;
const PREVIOUS = 6; // the last point of the previous chunk
const REALS = 7;

/** scanChunk's result when a point (or its σ) is invalid; FAILED_AT holds its index. */
const BAD_POINT = -1;
const BAD_SIGMA = -2;

/** Points per chunk; a chunk's events fit in a buffer of this many records. */
const CHUNK = 2048;
const FIRST_CHUNK = 16;
/** Run lengths below this have their message text cached (see emit). */
const TAILS = 32;
// One event per point where a chosen rule fires: its index, runs, zones and window fires.
const EVENT_SIZE = 4;

/** What a rule list needs, worked out once per distinct list (see planFor). */
interface Plan {
  rules: readonly RuleId[];
  codes: Uint8Array;
  /** Per rule k, at 4k: before/after texts for above, at 4k + 2: for below; rule id included. */
  texts: (string | null)[];
  /** How many points the rule needs, which is also the count in its first message. */
  lengths: Int32Array;
  /** The loop constants of the Int32Array layout (RUNS_TEST to WINDOW_SELECT). */
  tests: Int32Array;
  /** Message text after "point N" for rule k, side and a short run, at (2k + side) · TAILS + count. */
  tails: (string | undefined)[];
}

/** Adds the lane of `width` flags at bit `at` to the tests at tests[add] and tests[carry]. */
function testLane(tests: Int32Array, add: number, carry: number, at: number, width: number): void {
  tests[add] |= 1 << at;
  tests[carry] |= 1 << (at + width);
}

/** Plans by rule list; charts ask for the same one or two lists again and again. */
const plans = new Map<string, Plan>();
const MAX_PLANS = 64;

function planFor(rules: readonly RuleId[]): Plan {
  const key = rules.join(' ');
  const known = plans.get(key);
  if (known) return known;
  const m = rules.length;
  const plan: Plan = {
    rules: [...rules],
    codes: new Uint8Array(m),
    texts: [],
    lengths: new Int32Array(m),
    tests: new Int32Array(WINDOW_SELECT + 1),
    tails: new Array<string | undefined>(2 * m * TAILS).fill(undefined),
  };
  const tests = plan.tests;
  let runLength = 0;
  rules.forEach((rule, k) => {
    const kind = KIND[rule];
    const code = KIND_CODE[kind];
    plan.codes[k] = code;
    for (const [before, after] of MESSAGE_PARTS[kind]) {
      // The rule id closes every message.
      if (after === null) plan.texts.push(`${before} (${rule})`, null);
      else plan.texts.push(before, `${after} (${rule})`);
    }
    // The loop's test must pass whenever a chosen rule fires; emit then checks each rule. Runs
    // of 8 and of 9 share their lanes, tested at the shorter length.
    if (code === BEYOND3) testLane(tests, ZONES_ADD, ZONES_CARRY, BEYOND3_AT, 1);
    else if (code === TWO_OF_THREE) tests[WINDOW_SELECT] |= FIRES_2OF3_UP | FIRES_2OF3_DN;
    else if (code === FOUR_OF_FIVE) tests[WINDOW_SELECT] |= FIRES_4OF5_UP | FIRES_4OF5_DN;
    else if (code === RUN8 || code === RUN9) {
      plan.lengths[k] = code === RUN8 ? 8 : 9;
      runLength = runLength === 0 ? plan.lengths[k] : Math.min(runLength, plan.lengths[k]);
    } else if (code === TREND6) {
      plan.lengths[k] = 6; // 5 rises are 6 points
      testLane(tests, RUNS_ADD, RUNS_CARRY, RISES_AT, 5);
      testLane(tests, RUNS_ADD, RUNS_CARRY, FALLS_AT, 5);
      tests[RUNS_TEST] |= (0x1f << RISES_AT) | (0x1f << FALLS_AT);
    } else if (code === ALTERNATE14) {
      plan.lengths[k] = 14; // 12 reversals are 13 alternating differences, 14 points
      testLane(tests, ZONES_ADD, ZONES_CARRY, REVERSALS_AT, 12);
    } else if (code === WITHIN15) {
      plan.lengths[k] = 15;
      testLane(tests, ZONES_ADD, ZONES_CARRY, WITHIN_AT, 15);
    } else if (code === OUTSIDE8) {
      plan.lengths[k] = 8;
      tests[OUTSIDE_TEST] = 0xff << WITHIN_AT;
      tests[OUTSIDE_SIGN] = 1 << 31;
    }
  });
  if (runLength > 0) {
    testLane(tests, RUNS_ADD, RUNS_CARRY, ABOVE_AT, runLength);
    testLane(tests, RUNS_ADD, RUNS_CARRY, BELOW_AT, runLength);
    tests[RUNS_TEST] |= (((1 << runLength) - 1) << ABOVE_AT) | (((1 << runLength) - 1) << BELOW_AT);
  }
  if (plans.size >= MAX_PLANS) plans.clear();
  plans.set(key, plan);
  return plan;
}

/**
 * Evaluates run rules over `points` around `center` with σ of the plotted statistic (one value,
 * or one per point). Signals are ordered by index, then by the order of the rule list.
 */
export function evaluateRules(
  points: ArrayLike<number>,
  center: number,
  sigma: number | ArrayLike<number>,
  rules: RuleSetName | readonly RuleId[] = 'western-electric',
): Signal[] {
  const selected = resolveRules(rules);
  const n = points.length;
  if (!Number.isFinite(center)) throw new ComputeError('the centre line must be a finite number', 'center');
  let sigmas: ArrayLike<number> | null = null;
  let fixed = 0;
  if (typeof sigma !== 'number') {
    if (sigma.length !== n) throw new ComputeError('give one sigma per point', 'sigma');
    sigmas = sigma;
  } else if (!(Number.isFinite(sigma) && sigma >= 0)) {
    throw new ComputeError('sigma must be a finite number of at least 0', 'sigma');
  } else {
    fixed = sigma;
  }

  const plan = planFor(selected);
  const ints = new Int32Array(INTS);
  ints.set(plan.tests);
  // Per rule: the index it last fired at (for how long a run is), that run's side and length.
  const last = new Float64Array(3 * plan.codes.length).fill(-2);
  const reals = new Float64Array(REALS);
  reals[CENTER] = center;
  reals[ABS_CENTER] = Math.abs(center);
  reals[TOLERANCE] = BOUNDARY_TOLERANCE;
  reals[SIGMA] = fixed; // 2σ and 3σ exactly as the per-point code computes them
  reals[SIGMA2] = 2 * fixed;
  reals[SIGMA3] = 3 * fixed;
  reals[PREVIOUS] = Number.NaN; // the first point has no difference: NaN is neither above nor below
  const count = Math.ceil(n); // as many points as `for (let i = 0; i < n; i++)` visits
  const events = new Int32Array(1 + Math.max(0, Math.min(count, CHUNK)) * EVENT_SIZE);
  const signals: Signal[] = [];
  // The first chunks are short so that scanChunk is called a few times, and the compiler has
  // seen every operation in it, before one long call makes it hot.
  for (let from = 0, size = FIRST_CHUNK; from < count; from += size, size = Math.min(CHUNK, 2 * size)) {
    events[0] = 1;
    const failed = scanChunk(points, from, Math.min(count, from + size), reals, sigmas, ints, events);
    if (failed === BAD_POINT) throw new ComputeError(`point ${ints[FAILED_AT] + 1} is not a finite number`, 'points');
    if (failed === BAD_SIGMA) {
      throw new ComputeError(`sigma for point ${ints[FAILED_AT] + 1} must be a finite number of at least 0`, 'sigma');
    }
    for (let at = 1; at < events[0]; at += EVENT_SIZE) emit(signals, plan, last, events, at);
  }
  return signals;
}

/**
 * Points [from, to): updates the state in `ints` and `reals` and appends one event to `events`
 * (whose first integer is where the next one goes) per point where a chosen rule fires.
 * Returns 0, or BAD_POINT / BAD_SIGMA with the index in ints[FAILED_AT].
 */
function scanChunk(
  points: ArrayLike<number>,
  from: number,
  to: number,
  reals: Float64Array,
  sigmas: ArrayLike<number> | null,
  ints: Int32Array,
  events: Int32Array,
): number {
  const center = reals[CENTER];
  const absCenter = reals[ABS_CENTER];
  const tolerance = reals[TOLERANCE];
  const fires = WINDOW_FIRES;
  const runsTest = ints[RUNS_TEST];
  const runsAdd = ints[RUNS_ADD];
  const runsCarry = ints[RUNS_CARRY];
  const zonesAdd = ints[ZONES_ADD];
  const zonesCarry = ints[ZONES_CARRY];
  const outsideTest = ints[OUTSIDE_TEST];
  const outsideSign = ints[OUTSIDE_SIGN];
  const windowSelect = ints[WINDOW_SELECT];
  let runs = ints[RUNS];
  let zones = ints[ZONES];
  let window = ints[WINDOW];
  let prev = reals[PREVIOUS];
  let s1 = reals[SIGMA];
  let s2 = reals[SIGMA2];
  let s3 = reals[SIGMA3];

  const end = to | 0;
  for (let i = from | 0; i < end; i++) {
    const x = points[i];
    if (!Number.isFinite(x)) {
      ints[FAILED_AT] = i;
      return BAD_POINT;
    }
    if (sigmas !== null) {
      const s = sigmas[i];
      if (!(Number.isFinite(s) && s >= 0)) {
        ints[FAILED_AT] = i;
        return BAD_SIGMA;
      }
      s1 = s;
      s2 = 2 * s;
      s3 = 3 * s;
    }
    // Compare differences with multiples of σ (never divide) so σ = 0 is handled. A point within
    // rounding (1e-12 relative) of a boundary is on it: 10.3 against c = 10, σ = 0.1 gives
    // d = 0.3000000000000007 in binary, which must not count as beyond 3σ. |d| is exactly d or
    // −d, so testing |d| − kσ and the side apart is the same as testing d − kσ and −d − kσ.
    const d = x - center;
    const a = Math.abs(d);
    const tol = tolerance * (Math.abs(x) + absCenter);
    const above = +(d > tol); // strictly above the centre line
    const below = +(-d > tol);
    const beyond1 = +(a - s1 > tol);
    const beyond2 = +(a - s2 > tol);
    const beyond3 = +(a - s3 > tol);
    const rise = +(x > prev);
    const fall = +(x < prev);
    // The last difference is the lowest bit of the rises and falls lanes.
    const reversal = (rise & (runs >> FALLS_AT)) | (fall & (runs >> RISES_AT));
    prev = x;

    runs = ((runs << 1) & RUNS_KEEP) | above | (below << BELOW_AT) | (rise << RISES_AT) | (fall << FALLS_AT);
    zones =
      ((zones << 1) & ZONES_KEEP) | (beyond1 ^ 1) | (reversal << REVERSALS_AT) | (beyond3 << BEYOND3_AT);
    // beyond1 implies a side: below is 1 exactly when the point is beyond 1σ below.
    window = ((window << POINT_BITS) | (beyond1 + (beyond1 & below)) | (beyond2 << 2)) & WINDOW_MASK;
    const windows = fires[window] & windowSelect;

    if (
      (((runs & runsTest) + runsAdd) & runsCarry) |
      ((zones + zonesAdd) & zonesCarry) |
      (((zones & outsideTest) - 1) & outsideSign) |
      windows
    ) {
      const at = events[0];
      events[at] = i;
      events[at + 1] = runs;
      events[at + 2] = zones;
      events[at + 3] = windows;
      events[0] = at + EVENT_SIZE;
    }
  }
  ints[RUNS] = runs;
  ints[ZONES] = zones;
  ints[WINDOW] = window;
  reals[PREVIOUS] = prev;
  return 0;
}

/** True when the lane of `width` flags at bit `at` of `lanes` is all set. */
function full(lanes: number, at: number, width: number): boolean {
  const mask = (1 << width) - 1;
  return ((lanes >> at) & mask) === mask;
}

/** Pushes the signals of the event at `at`, in the order of the rule list. */
function emit(signals: Signal[], plan: Plan, last: Float64Array, events: Int32Array, at: number): void {
  const { rules, codes, texts, lengths, tails } = plan;
  const i = events[at];
  const runs = events[at + 1];
  const zones = events[at + 2];
  const windows = events[at + 3];
  const head = `point ${i + 1}`;
  for (let k = 0; k < codes.length; k++) {
    let side = -1; // 0: the message for above (or the only one), 1: below; -1: does not fire
    switch (codes[k]) {
      case BEYOND3:
        if (full(zones, BEYOND3_AT, 1)) side = full(runs, ABOVE_AT, 1) ? 0 : 1;
        break;
      case TWO_OF_THREE:
        if (windows & FIRES_2OF3_UP) side = 0;
        else if (windows & FIRES_2OF3_DN) side = 1;
        break;
      case FOUR_OF_FIVE:
        if (windows & FIRES_4OF5_UP) side = 0;
        else if (windows & FIRES_4OF5_DN) side = 1;
        break;
      case RUN8:
      case RUN9:
        if (full(runs, ABOVE_AT, lengths[k])) side = 0;
        else if (full(runs, BELOW_AT, lengths[k])) side = 1;
        break;
      case TREND6:
        if (full(runs, RISES_AT, 5)) side = 0;
        else if (full(runs, FALLS_AT, 5)) side = 1;
        break;
      case ALTERNATE14:
        if (full(zones, REVERSALS_AT, 12)) side = 0;
        break;
      case WITHIN15:
        if (full(zones, WITHIN_AT, 15)) side = 0;
        break;
      case OUTSIDE8:
        // Before point 8 the lane's bottom bits are the empty start, not points outside 1σ.
        if (i >= 7 && ((zones >> WITHIN_AT) & 0xff) === 0) side = 0;
        break;
    }
    if (side < 0) continue;
    const before = texts[4 * k + 2 * side] as string;
    const after = texts[4 * k + 2 * side + 1];
    if (after === null) {
      signals.push({ rule: rules[k], index: i, message: head + before });
      continue;
    }
    // A run that also fired at the point before is that run, one longer; otherwise it has just
    // reached the rule's length.
    const count = last[3 * k] === i - 1 && last[3 * k + 1] === side ? last[3 * k + 2] + 1 : lengths[k];
    last[3 * k] = i;
    last[3 * k + 1] = side;
    last[3 * k + 2] = count;
    // Most runs stop soon after they fire, so the text after "point N" repeats: build it once.
    const cached = count < TAILS ? (2 * k + side) * TAILS + count : -1;
    let tail = cached < 0 ? undefined : tails[cached];
    if (tail === undefined) {
      tail = before + count + after;
      if (cached >= 0) tails[cached] = tail;
    }
    signals.push({ rule: rules[k], index: i, message: head + tail });
  }
}

/**
 * Rule 1 for a chart with its own limits (range, s and moving-range charts, whose limits are not
 * symmetric): a point fires when it is strictly above `ucl` or strictly below `lcl` (a point on a
 * limit, allowing for rounding as in evaluateRules, does not).
 * `indexOffset` shifts reported indices (moving range k belongs to point k + 1).
 */
export function limitSignals(
  points: readonly number[],
  ucl: number | readonly number[],
  lcl: number | readonly number[],
  rule: RuleId,
  indexOffset = 0,
): Signal[] {
  const out: Signal[] = [];
  for (let i = 0; i < points.length; i++) {
    const u = typeof ucl === 'number' ? ucl : ucl[i];
    const l = typeof lcl === 'number' ? lcl : lcl[i];
    const x = points[i];
    const index = i + indexOffset;
    if (x - u > BOUNDARY_TOLERANCE * (Math.abs(x) + Math.abs(u))) out.push({ rule, index, message: `point ${index + 1} is above the upper control limit (${rule})` });
    else if (l - x > BOUNDARY_TOLERANCE * (Math.abs(x) + Math.abs(l))) out.push({ rule, index, message: `point ${index + 1} is below the lower control limit (${rule})` });
  }
  return out;
}
