import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { expectRulesError } from './expect-rules-error';
import { planFinishInspections, type FinishPlanInput } from './finish-plan';
import type { DrawOutcome, FinishPlan, RulesProfile } from './rules-profile';
import { shippedProfile } from './shipped-profiles';

const withAlways = (profile: RulesProfile, always: FinishPlan['always']): RulesProfile => ({
  ...profile,
  finishPlan: { ...profile.finishPlan, always },
});

// The shipped profiles list no always-inspected places. Trade practice names "top 3, top 10" without
// tiers; the ranges and tiers below are this test's own assumption, not rule values.
const artificial = withAlways(shippedProfile('artificial', 'international'), [{ fromPlace: 1, toPlace: 3, tier: 'detailed' }]);
const natural = withAlways(shippedProfile('natural', 'international'), [
  { fromPlace: 1, toPlace: 10, tier: 'remeasure' },
  { fromPlace: 1, toPlace: 3, tier: 'detailed' },
]);

const finishers = (count: number) => Array.from({ length: count }, (_, i) => ({ bib: 101 + i, place: i + 1 }));
const plan = (profile: RulesProfile, parts: Partial<FinishPlanInput> = {}) =>
  planFinishInspections({ profile, finishers: [], drawResults: new Map(), delegateOrders: [], gapProbeFlags: [], ...parts });
const drawn = (entries: [number, DrawOutcome][]) => new Map(entries);

describe('places always inspected (artificial track)', () => {
  it('when place 2 finishes and places 1–3 are always inspected in detail, then it gets a detailed check for its place', () => {
    const result = plan(artificial, { finishers: finishers(2) });
    expect(result.inspections).toContainEqual({
      bib: 102,
      place: 2,
      tier: 'detailed',
      reasons: ['Place 2: always inspected (places 1–3, detailed check)'],
      isAwaitingDraw: false,
    });
  });

  it('when place 3 is the last always-inspected place, then place 3 is inspected and place 4 with no-inspection drawn is not', () => {
    const result = plan(artificial, { finishers: finishers(4), drawResults: drawn([[104, 'none']]) });
    expect(result.inspections.map((i) => i.place)).toEqual([1, 2, 3]);
    expect(result.awaitingDraw).toEqual([]);
  });

  it('when a place that is always inspected was drawn anyway, then the draw does not count and says why', () => {
    const result = plan(artificial, { finishers: finishers(1), drawResults: drawn([[101, 'none']]) });
    expect(result.inspections[0]).toMatchObject({ bib: 101, tier: 'detailed' });
    expect(result.drawsNotCounted).toEqual([{ bib: 101, outcome: 'none', why: 'Place 1 is always inspected, so its draw does not count.' }]);
  });

  it('when the shipped profile lists no always-inspected places, then every finisher waits for the draw', () => {
    const result = plan(shippedProfile('artificial', 'international'), { finishers: finishers(3) });
    expect(result.inspections).toEqual([]);
    expect(result.awaitingDraw).toEqual(finishers(3));
  });
});

describe('the draw at the finish (artificial track)', () => {
  // trade practice, no published source: finish tiers are re-measure and detailed check
  it.each([
    ['remeasure', 'Drawn at the finish: re-measure'],
    ['detailed', 'Drawn at the finish: detailed check'],
  ] as const)('when place 5 draws %s, then it gets that tier with the draw as its reason', (outcome, reason) => {
    const result = plan(artificial, { finishers: finishers(5), drawResults: drawn([[105, outcome]]) });
    expect(result.inspections.find((i) => i.bib === 105)).toEqual({
      bib: 105,
      place: 5,
      tier: outcome,
      reasons: [reason],
      isAwaitingDraw: false,
    });
  });

  it('when a finisher outside the always places has no draw result yet, then it is listed as awaiting the draw', () => {
    const result = plan(artificial, { finishers: finishers(6), drawResults: drawn([[104, 'none'], [106, 'none']]) });
    expect(result.awaitingDraw).toEqual([{ bib: 105, place: 5 }]);
    expect(result.inspections.some((i) => i.bib === 105)).toBe(false);
  });

  it('when the draw results come as a record instead of a map, then the plan is the same', () => {
    const input = { finishers: finishers(6), drawResults: drawn([[104, 'detailed'], [105, 'none'], [106, 'remeasure']]) };
    const asRecord = { ...input, drawResults: { 104: 'detailed', 105: 'none', 106: 'remeasure' } as const };
    expect(plan(artificial, asRecord)).toEqual(plan(artificial, input));
  });

  it('when a draw result names a bib that is not among the finishers, then it is reported and inspects nobody', () => {
    const result = plan(artificial, { finishers: finishers(3), drawResults: drawn([[150, 'detailed']]) });
    expect(result.inspections.some((i) => i.bib === 150)).toBe(false);
    expect(result.drawsNotCounted).toEqual([{ bib: 150, outcome: 'detailed', why: 'Bib 150 is not among the finishers.' }]);
  });
});

describe('gap probe and technical delegate (artificial track)', () => {
  // trade practice, no published source: a gap probe that enters the joint brings extra finish inspections
  it('when the gap probe entered the joint and the draw gave no inspection, then the sled still gets the follow-up tier', () => {
    const result = plan(artificial, { finishers: finishers(5), drawResults: drawn([[105, 'none']]), gapProbeFlags: [105] });
    expect(result.inspections).toContainEqual({
      bib: 105,
      place: 5,
      tier: artificial.finishPlan.gapProbeFollowUp,
      reasons: ['Gap probe entered the joint at the start'],
      isAwaitingDraw: false,
    });
  });

  it('when the gap probe asks for re-measure and the draw for a detailed check, then detailed wins and both reasons stay', () => {
    const profile = { ...artificial, finishPlan: { ...artificial.finishPlan, gapProbeFollowUp: 'remeasure' as const } };
    const result = plan(profile, { finishers: finishers(5), drawResults: drawn([[105, 'detailed']]), gapProbeFlags: [105, 105] });
    expect(result.inspections.find((i) => i.bib === 105)).toMatchObject({
      tier: 'detailed',
      reasons: ['Drawn at the finish: detailed check', 'Gap probe entered the joint at the start'],
    });
  });

  it('when a gap-probe sled has not drawn yet, then it is inspected and marked as still awaiting its draw', () => {
    const result = plan(artificial, { finishers: finishers(5), gapProbeFlags: [105], drawResults: drawn([[104, 'none']]) });
    expect(result.inspections.find((i) => i.bib === 105)?.isAwaitingDraw).toBe(true);
    expect(result.awaitingDraw).toEqual([]);
  });

  it('when the delegate orders a re-measure of an always-inspected place, then the detailed check stays and both reasons are kept', () => {
    const orders = [{ bib: 102, tier: 'remeasure' as const, reason: 'bridge looked loose' }];
    const result = plan(artificial, { finishers: finishers(3), delegateOrders: orders });
    expect(result.inspections.find((i) => i.bib === 102)).toMatchObject({
      tier: 'detailed',
      reasons: ['Place 2: always inspected (places 1–3, detailed check)', 'Ordered by the technical delegate: bridge looked loose'],
    });
  });

  // trade practice, no published source: the technical delegate may inspect any sled at any time
  it('when the delegate orders an inspection of a sled not among the finishers, then it is still listed, after the finishers', () => {
    const orders = [{ bib: 7, tier: 'detailed' as const, reason: 'steel looked re-ground' }];
    const result = plan(artificial, { finishers: finishers(1), delegateOrders: orders });
    expect(result.inspections.map((i) => i.bib)).toEqual([101, 7]);
    expect(result.inspections[1]).toEqual({
      bib: 7,
      place: null,
      tier: 'detailed',
      reasons: ['Ordered by the technical delegate: steel looked re-ground'],
      isAwaitingDraw: false,
    });
  });
});

describe('natural track', () => {
  it('when place 3 lies in both always ranges, then the detailed check wins and both places reasons are kept', () => {
    const result = plan(natural, { finishers: finishers(3) });
    expect(result.inspections[2]).toMatchObject({
      place: 3,
      tier: 'detailed',
      reasons: ['Place 3: always inspected (places 1–10, re-measure)', 'Place 3: always inspected (places 1–3, detailed check)'],
    });
  });

  it('when place 4 and place 10 finish, then they get a re-measure; place 11 waits for its draw', () => {
    const result = plan(natural, { finishers: finishers(11) });
    expect(result.inspections.find((i) => i.place === 4)?.tier).toBe('remeasure');
    expect(result.inspections.find((i) => i.place === 10)?.tier).toBe('remeasure');
    expect(result.inspections.some((i) => i.place === 11)).toBe(false);
    expect(result.awaitingDraw).toEqual([{ bib: 111, place: 11 }]);
  });

  it('when place 11 draws a detailed check, then it gets one', () => {
    const result = plan(natural, { finishers: finishers(11), drawResults: drawn([[111, 'detailed']]) });
    expect(result.inspections.find((i) => i.place === 11)?.reasons).toEqual(['Drawn at the finish: detailed check']);
  });

  it('when the delegate gives no reason, then the order still counts and says who ordered it', () => {
    const result = plan(natural, {
      finishers: finishers(12),
      drawResults: drawn([[112, 'none']]),
      delegateOrders: [{ bib: 112, tier: 'remeasure', reason: '  ' }],
    });
    expect(result.inspections.find((i) => i.bib === 112)?.reasons).toEqual(['Ordered by the technical delegate']);
  });

  it('when gap probe flags are given for natural track, then it is refused as the wrong track type', () => {
    expectRulesError(() => plan(natural, { finishers: finishers(3), gapProbeFlags: [101] }), 'wrong-track-type');
  });
});

describe('bad input', () => {
  it.each([
    ['a bib listed twice', { finishers: [{ bib: 5, place: 1 }, { bib: 5, place: 2 }] }],
    ['place 0', { finishers: [{ bib: 5, place: 0 }] }],
    ['a draw result that is not an outcome', { finishers: finishers(5), drawResults: { 105: 'maybe' as DrawOutcome } }],
    [
      'a draw result under a start number that is not a number',
      { finishers: finishers(5), drawResults: { x: 'none' } as unknown as Record<number, DrawOutcome> },
    ],
    ['a delegate order with an unknown tier', { delegateOrders: [{ bib: 5, tier: 'quick' as 'remeasure', reason: '' }] }],
  ])('when the plan is given %s, then it is refused', (_, parts) => {
    expectRulesError(() => plan(artificial, parts), 'invalid-input');
  });

  it('when an always range runs backwards, then it is refused', () => {
    const backwards = withAlways(artificial, [{ fromPlace: 3, toPlace: 1, tier: 'detailed' }]);
    expectRulesError(() => plan(backwards, { finishers: finishers(3) }), 'invalid-input');
  });
});

describe('no finisher is silently left out', () => {
  it('when any finishers, draws and always ranges are given, then each finisher is inspected, awaits its draw, or drew no inspection', () => {
    const outcome = fc.constantFrom<DrawOutcome | undefined>('none', 'remeasure', 'detailed', undefined);
    const range = fc.record({
      fromPlace: fc.integer({ min: 1, max: 5 }),
      length: fc.nat({ max: 5 }),
      tier: fc.constantFrom('remeasure' as const, 'detailed' as const),
    });
    fc.assert(
      fc.property(fc.array(outcome, { maxLength: 20 }), fc.array(range, { maxLength: 3 }), (outcomes, ranges) => {
        const always = ranges.map(({ fromPlace, length, tier }) => ({ fromPlace, toPlace: fromPlace + length, tier }));
        const field = finishers(outcomes.length);
        const draws = drawn(
          field.flatMap(({ bib }, i) => (outcomes[i] ? [[bib, outcomes[i]] as [number, DrawOutcome]] : [])),
        );
        const result = plan(withAlways(artificial, always), { finishers: field, drawResults: draws });
        for (const { bib, place } of field) {
          const isAlways = always.some((r) => place >= r.fromPlace && place <= r.toPlace);
          const isInspected = result.inspections.some((i) => i.bib === bib);
          const isAwaiting = result.awaitingDraw.some((a) => a.bib === bib);
          expect(isInspected || isAwaiting || draws.get(bib) === 'none').toBe(true);
          expect(isInspected && isAwaiting).toBe(false);
          if (isAlways) expect(isInspected).toBe(true);
        }
      }),
    );
  });
});
