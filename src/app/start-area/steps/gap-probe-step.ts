import { ChangeDetectionStrategy, Component, computed, input, linkedSignal, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { gapProbeResultLabels, gapProbeResults, judgeGapProbe, type GapProbeResult } from '../../../../shared/rules/gap-probe';
import type { RulesProfile } from '../../../../shared/rules/rules-profile';
import { outcomeMarks } from '../verdict/verdict-words';
import { feelerThicknessText, gapProbeJudgement } from './gap-probe-judgement';
import { StepJudgementView } from './step-judgement-view';
import { attempt } from './step-judgement';

/**
 * The runner-to-steel gap probe at an artificial-track start: the official picks how far the feeler
 * went into the joint, the rules engine judges it. The host saves each `probed` and passes it back in.
 */
@Component({
  selector: 'rl-gap-probe-step',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, StepJudgementView],
  templateUrl: './gap-probe-step.html',
  styleUrl: './gap-probe-step.scss',
  host: { class: 'gap-probe-step' },
})
export class GapProbeStep {
  readonly profile = input.required<RulesProfile>();
  readonly saved = input<GapProbeResult | null>(null);
  readonly probed = output<GapProbeResult>();

  /** The choice made here, kept until the host passes a saved result back in. */
  protected readonly chosen = linkedSignal(() => this.saved());

  protected readonly how = computed(() => {
    const thickness = feelerThicknessText(this.profile());
    const feeler = thickness === null ? 'the feeler' : `the ${thickness} feeler`;
    return `Recline the sled; nobody touches the steels. Run ${feeler} along the joint between runner and steel.`;
  });

  // Each button's mark is the outcome the engine gives that result, so no rule is repeated here.
  protected readonly options = computed(() => {
    const profile = this.profile();
    return gapProbeResults.map((result) => {
      const judged = attempt(() => judgeGapProbe({ profile, probe: result }));
      return { result, label: gapProbeResultLabels[result], mark: judged.value ? outcomeMarks[judged.value.outcome] : '?' };
    });
  });

  protected readonly chosenWords = computed(() => {
    const chosen = this.chosen();
    return chosen === null ? 'Nothing chosen yet.' : `Chosen: ${gapProbeResultLabels[chosen]}.`;
  });

  protected readonly judgement = computed(() => gapProbeJudgement(this.profile(), this.chosen()));

  protected choose(result: GapProbeResult): void {
    if (this.chosen() === result) return;
    this.chosen.set(result);
    this.probed.emit(result);
  }
}
