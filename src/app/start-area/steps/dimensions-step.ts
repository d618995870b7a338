import { ChangeDetectionStrategy, Component, computed, input, output, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { formatTenths } from '../../../../shared/rules/measurement';
import type { DimensionRule, RulesProfile } from '../../../../shared/rules/rules-profile';
import { AnswerPair, type AnswerSide } from '../../ui/answer-pair/answer-pair';
import { GloveKeypad } from '../../ui/glove-keypad/glove-keypad';
import {
  allowedRangeText,
  dimensionJudgements,
  dimensionPlaces,
  noDimensions,
  type DimensionPlace,
  type SavedDimensions,
} from './dimension-readings';
import type { StepJudgement } from './step-judgement';
import { StepJudgementView } from './step-judgement-view';

export interface MeasuredDimension {
  kind: string;
  place: string | null;
  tenths: number;
}

export interface SeenDimension {
  kind: string;
  acceptable: boolean;
}

/**
 * What the keypad takes, in tenths: a typing guard of ours against a slipped key, not a rule value.
 * The limits themselves come from the profile and are judged by the rules engine.
 */
export const dimensionTypingRanges: Record<DimensionRule['unit'], { minTenths: number; maxTenths: number }> = {
  millimetre: { minTenths: 1, maxTenths: 20000 },
  degree: { minTenths: 1, maxTenths: 1800 },
};

interface ShownPlace extends DimensionPlace {
  tenths: number | null;
  text: string;
}

/** The place the one keypad is open on. */
interface ActivePad {
  key: string;
  kind: string;
  place: string | null;
  /** "Handguard height", or "Steel angle, left steel, place 1". */
  label: string;
  unit: DimensionRule['unit'];
  range: { minTenths: number; maxTenths: number };
  tenths: number | null;
}

interface RuleBlock {
  rule: DimensionRule;
  range: string;
  places: ShownPlace[];
  byEye: boolean | undefined;
  judgement: StepJudgement;
}

/**
 * The dimensions step of a natural-track start check, the sled upside down on the table: the minimum set
 * first, then the rest. One keypad at a time, on the place chosen or the next one still to measure. The
 * host saves each `measured` and `seen` and passes the saved values back in.
 */

@Component({
  selector: 'rl-dimensions-step',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, AnswerPair, GloveKeypad, StepJudgementView],
  templateUrl: './dimensions-step.html',
  styleUrl: './dimensions-step.scss',
  host: { class: 'dimensions-step' },
})
export class DimensionsStep {
  readonly profile = input.required<RulesProfile>();
  /** Names this sled's keypad drafts (e.g. "check:<id>"), so a value half keyed survives the app being killed; null keeps no draft. */
  readonly draftScope = input<string | null>(null);
  readonly saved = input<SavedDimensions>(noDimensions);
  readonly measured = output<MeasuredDimension>();
  readonly seen = output<SeenDimension>();

  /** Values keyed here that the host may not have passed back yet. */
  private readonly entered = signal<SavedDimensions>(noDimensions);
  private readonly values = computed<SavedDimensions>(() => ({
    values: { ...this.saved().values, ...this.entered().values },
    byEye: { ...this.saved().byEye, ...this.entered().byEye },
  }));
  /** The place key the official tapped; null = the next place still to measure. */
  private readonly chosenKey = signal<string | null>(null);

  protected readonly lastEntered = signal('');

  private readonly blocks = computed<RuleBlock[]>(() => {
    const values = this.values();
    return dimensionJudgements(this.profile(), values).map(({ rule, judgement }) => ({
      rule,
      range: allowedRangeText(rule),
      places: dimensionPlaces(rule).map((place) => {
        const tenths = values.values[place.key] ?? null;
        return { ...place, tenths, text: tenths === null ? 'not measured' : formatTenths(tenths, rule.unit) };
      }),
      byEye: values.byEye[rule.kind],
      judgement,
    }));
  });

  protected readonly sections = computed(() => {
    const blocks = this.blocks();
    return [
      { id: 'minimum', title: 'Minimum checks first', blocks: blocks.filter((block) => block.rule.minimumCheck) },
      { id: 'rest', title: 'Then the rest', blocks: blocks.filter((block) => !block.rule.minimumCheck) },
    ].filter((section) => section.blocks.length > 0);
  });

  /** Every place to measure, minimum set first (the blocks are already in working order). */
  private readonly places = computed(() => this.blocks().flatMap((block) => block.places.map((place) => ({ block, place }))));

  /** The one place the keypad is open on: the one tapped, else the first still unmeasured, else none. */
  protected readonly active = computed<ActivePad | null>(() => {
    const places = this.places();
    const chosen = this.chosenKey();
    const found = (chosen !== null && places.find(({ place }) => place.key === chosen)) || places.find(({ place }) => place.tenths === null);
    if (!found) return null;
    const { block, place } = found;
    return {
      key: place.key,
      kind: place.kind,
      place: place.place,
      label: place.place === null ? block.rule.label : `${block.rule.label}, ${lowerFirst(place.label)}`,
      unit: block.rule.unit,
      range: dimensionTypingRanges[block.rule.unit],
      tenths: place.tenths,
    };
  });

  /** The keypad as a list of none or one, so a new place gets a fresh keypad (its entry starts over). */
  protected readonly activePads = computed<ActivePad[]>(() => {
    const active = this.active();
    return active ? [active] : [];
  });

  protected choose(place: ShownPlace): void {
    this.chosenKey.set(place.key);
  }

  protected save(pad: ActivePad, tenths: number): void {
    this.entered.update((entered) => ({ ...entered, values: { ...entered.values, [pad.key]: tenths } }));
    this.chosenKey.set(null);
    this.measured.emit({ kind: pad.kind, place: pad.place, tenths });
    const next = this.active();
    this.lastEntered.set(`${pad.label}: ${formatTenths(tenths, pad.unit)} entered.${next ? ` Next: ${lowerFirst(next.label)}.` : ''}`);
  }

  protected readonly looksRight: AnswerSide = { label: 'Looks right', mark: '✓', name: 'looks-right' };
  protected readonly looksWrong: AnswerSide = { label: 'Does not look right', mark: '✕', name: 'does-not-look-right' };

  protected answer(rule: DimensionRule, acceptable: boolean): void {
    this.entered.update((entered) => ({ ...entered, byEye: { ...entered.byEye, [rule.kind]: acceptable } }));
    this.seen.emit({ kind: rule.kind, acceptable });
    this.lastEntered.set(`${rule.label}: ${acceptable ? 'looks right' : 'does not look right'}.`);
  }
}

const lowerFirst = (text: string) => text.charAt(0).toLowerCase() + text.slice(1);
