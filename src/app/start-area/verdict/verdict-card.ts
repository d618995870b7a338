import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { outcomeLabels, type Verdict } from '../../../../shared/rules/verdict';
import { decidesLine, outcomeMarks, usedValueSource } from './verdict-words';

let nextId = 0;

/**
 * One verdict of the rules engine as evidence: the outcome in a mark and words, the reason, every
 * number, the working, the profile values used with their sources, and who decides.
 */
@Component({
  selector: 'rl-verdict-card',
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './verdict-card.html',
  styleUrl: './verdict-card.scss',
  host: { class: 'verdict-card', '[attr.data-outcome]': 'verdict().outcome' },
})
export class VerdictCard {
  readonly verdict = input.required<Verdict>();
  /** What was judged, e.g. "Left steel, spot 2 (front)"; leave empty when the page says it already. */
  readonly heading = input('');

  protected readonly headingId = `rl-verdict-card-${nextId++}`;
  protected readonly mark = computed(() => outcomeMarks[this.verdict().outcome]);
  protected readonly words = computed(() => outcomeLabels[this.verdict().outcome]);
  protected readonly used = computed(() => this.verdict().used.map((value) => ({ ...value, sourceText: usedValueSource(value) })));
  protected readonly decidesLine = decidesLine;
}
