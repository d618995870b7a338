import { ChangeDetectionStrategy, Component, computed, input, linkedSignal, output, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { formatTenths } from '../../../../shared/rules/measurement';
import type { RulesProfile } from '../../../../shared/rules/rules-profile';
import { GloveKeypad } from '../../ui/glove-keypad/glove-keypad';
import { knownTotal, scaleProofJudgement, type ControlWeight, type ScaleProofEntry } from './scale-proof';
import { StepJudgementView } from './step-judgement-view';

export interface ScaleProved {
  controlWeightIds: string[];
  knownTenths: number;
  readingTenths: number;
}

// A plausibility guard against mistyping (0.1–3000.0 kg), not a rule value: the engine judges the reading.
const readingRange = { minTenths: 1, maxTenths: 30000 } as const;

const kg = (tenths: number): string => formatTenths(tenths, 'kilogram');

/**
 * Proving a scale before weighing in a run: the control weights issued at the scale are judged, the
 * official chooses which went on the scale and keys in what it reads. The host saves each `proved` and
 * passes it back in as `saved`.
 */

@Component({
  selector: 'rl-scale-proof-step',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, GloveKeypad, StepJudgementView],
  templateUrl: './scale-proof-step.html',
  styleUrl: './scale-proof-step.scss',
  host: { class: 'scale-proof-step' },
})
export class ScaleProofStep {
  readonly profile = input.required<RulesProfile>();
  /** Names this sled's keypad drafts (e.g. "check:<id>"), so a value half keyed survives the app being killed; null keeps no draft. */
  readonly draftScope = input<string | null>(null);
  /** What is written on the scale, e.g. "SC-02". */
  readonly scaleLabel = input.required<string>();
  /** The calibrated control weights issued to this official at this scale. */
  readonly controlWeights = input.required<readonly ControlWeight[]>();
  readonly saved = input<ScaleProofEntry | null>(null);
  readonly proved = output<ScaleProved>();

  /** The weights on the scale: all of them at first, or those of the saved proof. */
  protected readonly chosenIds = linkedSignal<readonly string[]>(
    () => this.saved()?.controlWeightIds ?? this.controlWeights().map((weight) => weight.id),
  );
  /** The reading with the chosen weights; a new choice of weights needs a new reading. */
  private readonly entry = linkedSignal<ScaleProofEntry | null>(() => this.saved());
  protected readonly lastEntered = signal('');
  protected readonly readingRange = readingRange;

  protected readonly weightRows = computed(() => {
    const chosen = new Set(this.chosenIds());
    return this.controlWeights().map((weight) => ({
      ...weight,
      isChosen: chosen.has(weight.id),
      massText: weight.nominalMass === null ? 'certified mass not known' : kg(weight.nominalMass),
    }));
  });

  protected readonly known = computed(() => knownTotal(this.controlWeights(), this.chosenIds()));
  protected readonly knownLine = computed(() => {
    const known = this.known();
    return 'problem' in known ? { isKnown: false, words: known.problem } : { isKnown: true, words: kg(known.tenths) };
  });
  protected readonly judgement = computed(() => scaleProofJudgement(this.profile(), this.controlWeights(), this.entry()));
  protected readonly readingTenths = computed(() => this.entry()?.readingTenths ?? null);

  protected toggle(id: string): void {
    const chosen = new Set(this.chosenIds());
    if (chosen.has(id)) chosen.delete(id);
    else chosen.add(id);
    // Kept in the order the weights are listed, so "weight 3" in a verdict is the third in the list.
    this.chosenIds.set(this.controlWeights().map((weight) => weight.id).filter((weightId) => chosen.has(weightId)));
    this.entry.set(null);
    this.lastEntered.set('');
  }

  protected save(readingTenths: number): void {
    const controlWeightIds = [...this.chosenIds()];
    this.entry.set({ controlWeightIds, readingTenths });
    const known = this.known();
    if ('problem' in known) {
      this.lastEntered.set(`Not saved: ${known.problem}`);
      return;
    }
    this.proved.emit({ controlWeightIds, knownTenths: known.tenths, readingTenths });
    this.lastEntered.set(`Saved: the scale reads ${kg(readingTenths)} with ${kg(known.tenths)} on it.`);
  }
}
