import { ChangeDetectionStrategy, Component, computed, input, linkedSignal, output } from '@angular/core';
import { judgeEquipment } from '../../../../shared/rules/equipment';
import { RulesInputError } from '../../../../shared/rules/rules-error';
import type { RulesProfile } from '../../../../shared/rules/rules-profile';
import { AnswerPair, type AnswerSide } from '../../ui/answer-pair/answer-pair';
import { VerdictCard } from '../verdict/verdict-card';
import { bibNotConfirmedLine } from './equipment-judgement';

export interface EquipmentAnswers {
  /** Only the items answered so far, by equipment id. */
  present: Record<string, boolean>;
  /** True when the bib is right, false when it is wrong or missing, null while not answered. */
  bibConfirmed: boolean | null;
}

/** One row of the checklist: the bib first, then each equipment item of the profile. */
interface Row {
  key: string;
  label: string;
  answer: boolean | undefined;
}

const bibKey = 'bib';

export { bibNotConfirmedLine };

/**
 * The first start check on both track types: the bib the start list expects and every item of the safety
 * equipment, each marked present or missing. The host saves each `answered` and passes the answers back in.
 */
@Component({
  selector: 'rl-equipment-step',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [AnswerPair, VerdictCard],
  templateUrl: './equipment-step.html',
  styleUrl: './equipment-step.scss',
  host: { class: 'equipment-step' },
})
export class EquipmentStep {
  readonly profile = input.required<RulesProfile>();
  /** The bib the start list expects on this sled. */
  readonly bib = input.required<number>();
  /** The equipment answers saved so far; answers for items no longer on the profile's list are ignored. */
  readonly saved = input<Record<string, boolean> | null>(null);
  /** The saved bib answer: true right, false wrong or missing, null not answered yet. */
  readonly savedBibConfirmed = input<boolean | null>(null);
  readonly answered = output<EquipmentAnswers>();

  private readonly present = linkedSignal<Record<string, boolean>>(() => {
    const known = new Set(this.profile().equipment.map((item) => item.id));
    return Object.fromEntries(Object.entries(this.saved() ?? {}).filter(([id]) => known.has(id)));
  });
  private readonly bibAnswer = linkedSignal<boolean | undefined>(() => this.savedBibConfirmed() ?? undefined);

  protected readonly rows = computed<Row[]>(() => [
    { key: bibKey, label: `Bib ${this.bib()} worn and readable`, answer: this.bibAnswer() },
    ...this.profile().equipment.map((item) => ({ key: item.id, label: item.label, answer: this.present()[item.id] })),
  ]);

  protected readonly stillToAnswer = computed(() =>
    this.rows()
      .filter((row) => row.answer === undefined)
      .map((row) => row.label),
  );

  /** Judged only once every row is answered; the engine's refusal is shown in its own words. */
  protected readonly judgement = computed(() => {
    if (this.stillToAnswer().length > 0) return null;
    try {
      return { verdict: judgeEquipment({ profile: this.profile(), present: this.present() }), refusal: null };
    } catch (error) {
      if (error instanceof RulesInputError) return { verdict: null, refusal: error.message };
      throw error;
    }
  });

  protected readonly bibMissing = computed(() => this.bibAnswer() === false);
  protected readonly bibNotConfirmedLine = bibNotConfirmedLine;
  protected readonly presentAnswer: AnswerSide = { label: 'Present', mark: '✓', name: 'present' };
  protected readonly missingAnswer: AnswerSide = { label: 'Missing', mark: '✕', name: 'missing' };

  protected answerWords(answer: boolean | undefined): string {
    if (answer === undefined) return 'Not answered yet';
    return answer ? 'Marked present' : 'Marked missing';
  }

  protected mark(row: Row, isPresent: boolean): void {
    if (row.key === bibKey) {
      this.bibAnswer.set(isPresent);
    } else {
      this.present.update((present) => ({ ...present, [row.key]: isPresent }));
    }
    this.answered.emit({ present: { ...this.present() }, bibConfirmed: this.bibAnswer() ?? null });
  }
}
