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
  styles: `
    :host {
      display: contents;
    }
    p {
      margin: 0;
    }
    .mark {
      font-size: 1.3em;
      line-height: 1;
    }
    .notice {
      display: flex;
      flex-direction: column;
      gap: 12px;
      padding: 12px 16px;
      border: 3px dashed var(--mat-sys-on-surface);
      border-radius: 8px;
      font-weight: 700;
    }
  `,
})
export class StepJudgementView {
  readonly judgement = input.required<StepJudgement | null>();
  /** What was judged, for the verdict card's heading; empty when the step says it already. */
  readonly heading = input('');
  /** Prefix of the parts' data-section names: "" gives "verdict" and "judgement". */
  readonly section = input('');
  protected readonly decidesLine = decidesLine;
}
