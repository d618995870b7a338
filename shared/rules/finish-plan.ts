import { z } from 'zod';
import { drawOutcomeLabels } from './draw';
import { RulesInputError } from './rules-error';
import { drawOutcomes, finishTiers, type DrawOutcome, type FinishPlan, type FinishTier, type RulesProfile } from './rules-profile';

const bibSchema = z.number().int('A start number is a whole number.').min(1, 'Start numbers begin at 1.').safe();

const finishPlanInputSchema = z.strictObject({
  finishers: z.array(
    z.strictObject({ bib: bibSchema, place: z.number().int('A place is a whole number.').min(1, 'Places begin at 1.').safe() }),
  ),
  delegateOrders: z.array(z.strictObject({ bib: bibSchema, tier: z.enum(finishTiers), reason: z.string().max(300) })),
  gapProbeFlags: z.array(bibSchema),
});

/** Draw results by bib, as a Map or as a plain record (keys are then bib numbers written as text). */
export type DrawResults = ReadonlyMap<number, DrawOutcome> | Readonly<Record<number, DrawOutcome>>;

export type FinishPlanInput = z.input<typeof finishPlanInputSchema> & { profile: RulesProfile; drawResults: DrawResults };

export interface FinishInspection {
  bib: number;
  /** null when the sled is not among the finishers: the technical delegate may inspect any sled. */
  place: number | null;
  /** The highest tier any reason asks for. */
  tier: FinishTier;
  /** Every reason that applies, in plain words. */
  reasons: string[];
  /** A finisher outside the always-inspected places who has not drawn yet: the draw may still raise the tier. */
  isAwaitingDraw: boolean;
}

export interface FinishPlanResult {
  /** In order of place, then sleds that are not among the finishers by start number. */
  inspections: FinishInspection[];
  /** Finishers with no draw result and no other reason yet: never silently left out. */
  awaitingDraw: { bib: number; place: number }[];
  /** Draw results that do not decide anything, each with the reason why. */
  drawsNotCounted: { bib: number; outcome: DrawOutcome; why: string }[];
}

export const finishTierLabels: Record<FinishTier, string> = { remeasure: 're-measure', detailed: 'detailed check' };
const tierRank: Record<FinishTier, number> = { remeasure: 1, detailed: 2 };

function fail(message: string, details: string[] = []): never {
  throw new RulesInputError('invalid-input', message, details);
}

function parseInput(input: FinishPlanInput) {
  const { finishers, delegateOrders, gapProbeFlags } = input;
  const parsed = finishPlanInputSchema.safeParse({ finishers, delegateOrders, gapProbeFlags });
  if (!parsed.success) {
    const details = parsed.error.issues.map((issue) => `${issue.path.join('.')}: ${issue.message}`);
    fail(`The finish plan cannot be made: ${details.join(' ')}`, details);
  }
  return parsed.data;
}

function checkedRanges(plan: FinishPlan): FinishPlan['always'] {
  for (const range of plan.always) {
    if (range.fromPlace > range.toPlace) {
      fail(`The finish plan lists places ${range.fromPlace} to ${range.toPlace}: the first place must not come after the last.`);
    }
  }
  return plan.always;
}

function readDrawResults(results: DrawResults): Map<number, DrawOutcome> {
  const entries: [unknown, unknown][] = results instanceof Map ? [...results.entries()] : Object.entries(results);
  const outcomeSchema = z.enum(drawOutcomes);
  return new Map(
    entries.map(([key, outcome]) => {
      const bib = typeof key === 'number' ? key : Number(key);
      if (!bibSchema.safeParse(bib).success) {
        fail(`A draw result has the start number "${String(key)}", which is not a whole number from 1.`);
      }
      const parsed = outcomeSchema.safeParse(outcome);
      if (!parsed.success) fail(`The draw result of bib ${bib} is "${String(outcome)}", not one of: ${drawOutcomes.join(', ')}.`);
      return [bib, parsed.data];
    }),
  );
}

const placesText = ({ fromPlace, toPlace }: FinishPlan['always'][number]) =>
  fromPlace === toPlace ? `place ${fromPlace}` : `places ${fromPlace}–${toPlace}`;

/** Finishers by place, then sleds that are not among the finishers; ties by start number. */
function byPlaceThenBib(a: FinishInspection, b: FinishInspection): number {
  if (a.place !== b.place) {
    if (a.place === null) return 1;
    if (b.place === null) return -1;
    return a.place - b.place;
  }
  return a.bib - b.bib;
}

/**
 * Who gets inspected at the finish, and why: the places always inspected, the draw, the gap probe
 * at the start and the technical delegate's orders. The highest tier wins; every reason is kept.
 */
export function planFinishInspections(input: FinishPlanInput): FinishPlanResult {
  const { finishers, delegateOrders, gapProbeFlags } = parseInput(input);
  const { finishPlan } = input.profile;
  const ranges = checkedRanges(finishPlan);
  if (gapProbeFlags.length > 0 && input.profile.gapProbe === null) {
    throw new RulesInputError(
      'wrong-track-type',
      'These rules have no gap probe (it is used on artificial track): gap probe flags cannot apply.',
    );
  }
  const draws = readDrawResults(input.drawResults);

  const placeOf = new Map<number, number>();
  for (const { bib, place } of finishers) {
    if (placeOf.has(bib)) fail(`Bib ${bib} is listed twice among the finishers.`);
    placeOf.set(bib, place);
  }

  const collected = new Map<number, { tier: FinishTier; reasons: string[] }>();
  const add = (bib: number, tier: FinishTier, reason: string) => {
    const entry = collected.get(bib);
    if (!entry) collected.set(bib, { tier, reasons: [reason] });
    else {
      entry.reasons.push(reason);
      if (tierRank[tier] > tierRank[entry.tier]) entry.tier = tier;
    }
  };

  const byPlace = [...finishers].sort((a, b) => a.place - b.place || a.bib - b.bib);
  const notYetDrawn = new Set<number>();
  const drawsNotCounted: FinishPlanResult['drawsNotCounted'] = [];
  for (const { bib, place } of byPlace) {
    const always = ranges.filter((range) => place >= range.fromPlace && place <= range.toPlace);
    always.forEach((range) =>
      add(bib, range.tier, `Place ${place}: always inspected (${placesText(range)}, ${finishTierLabels[range.tier]})`),
    );
    const outcome = draws.get(bib);
    if (always.length > 0) {
      if (outcome) drawsNotCounted.push({ bib, outcome, why: `Place ${place} is always inspected, so its draw does not count.` });
    } else if (!outcome) {
      notYetDrawn.add(bib);
    } else if (outcome !== 'none') {
      add(bib, outcome, `Drawn at the finish: ${drawOutcomeLabels[outcome]}`);
    }
  }
  for (const [bib, outcome] of draws) {
    if (!placeOf.has(bib)) drawsNotCounted.push({ bib, outcome, why: `Bib ${bib} is not among the finishers.` });
  }
  for (const bib of new Set(gapProbeFlags)) add(bib, finishPlan.gapProbeFollowUp, 'Gap probe entered the joint at the start');
  for (const { bib, tier, reason } of delegateOrders) {
    const why = reason.trim();
    add(bib, tier, why ? `Ordered by the technical delegate: ${why}` : 'Ordered by the technical delegate');
  }

  const inspections: FinishInspection[] = [...collected].map(([bib, { tier, reasons }]) => ({
    bib,
    place: placeOf.get(bib) ?? null,
    tier,
    reasons,
    isAwaitingDraw: notYetDrawn.has(bib),
  }));
  inspections.sort(byPlaceThenBib);
  const awaitingDraw = byPlace.filter(({ bib }) => notYetDrawn.has(bib) && !collected.has(bib)).map(({ bib, place }) => ({ bib, place }));
  return { inspections, awaitingDraw, drawsNotCounted };
}
