import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { VerdictCard } from '../verdict/verdict-card';
import { decidesLine } from '../verdict/verdict-words';
import type { StepJudgement } from './step-judgement';

/**
 * Where a step stands, on screen: the verdict card once the engine has judged, otherwise what is still
 * to do (◌) or why there is no verdict (⚠) with who decides. `section` names the parts for tests.
 */
@Component({
  selector: 'rl-step-judgement',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [VerdictCard],
  template: `
    @if (judgement(); as shown) {
      @if (shown.kind === 'judged') {
        <rl-verdict-card [verdict]="shown.verdict" [heading]="heading()" [attr.data-section]="section() + 'verdict'" />
      } @else {
        <div class="notice" [attr.data-section]="section() + 'judgement'" [attr.data-state]="shown.kind" aria-live="polite">
          <p><span class="mark" aria-hidden="true">{{ shown.kind === 'waiting' ? '◌' : '⚠' }}</span> {{ shown.words }}</p>
          @if (shown.kind === 'no-verdict') {
            <p class="decides"><strong>{{ decidesLine }}</strong></p>
          }
        </div>
      }
    }
  `,
  styleUrl: './step-judgement-view.scss',
})
export class StepJudgementView {
  readonly judgement = input.required<StepJudgement | null>();
  /** What was judged, for the verdict card's heading; empty when the step says it already. */
  readonly heading = input('');
  /** Prefix of the parts' data-section names: "" gives "verdict" and "judgement". */
  readonly section = input('');
  protected readonly decidesLine = decidesLine;
}
