import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { steels } from '../../../../shared/rules/dimensions';
import type { Outcome } from '../../../../shared/rules/verdict';
import { celsius, isPreset, isSameSpot, spotIndices, spotKey, spotName, type Spot, type SpotKey, type SpotPlan } from './steel-spots';

let nextId = 0;

/** What a spot shows once read: its value and, when judged, the outcome. */
export interface SpotShown {
  tenths: number;
  outcome?: Outcome;
}

/** Short words for a spot button; the verdict cards below say it in full. */
const spotOutcomeWords: Record<Outcome, { mark: string; words: string; spoken: string }> = {
  pass: { mark: '✓', words: 'within', spoken: 'within the limit' },
  fail: { mark: '⚠', words: 'over', spoken: 'over the limit' },
  'refer-to-delegate': { mark: '⚑', words: 'refer', spoken: 'refer to the technical delegate' },
  'not-judged': { mark: '?', words: 'not judged', spoken: 'not judged' },
};

/**
 * The sled seen from above, front at the top: each steel with its five spots as large buttons. Read
 * spots show their value, preset spots say "read here", the selected one is framed thick with "▶".
 */
@Component({
  selector: 'rl-sled-diagram',
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './sled-diagram.html',
  styleUrl: './sled-diagram.scss',
  host: { class: 'sled-diagram' },
})
export class SledDiagram {
  readonly readings = input<ReadonlyMap<SpotKey, SpotShown>>(new Map());
  readonly preset = input<SpotPlan | null>(null);
  readonly selected = input<Spot | null>(null);
  readonly spotSelected = output<Spot>();

  protected readonly captionId = `rl-sled-diagram-${nextId++}`;
  protected readonly steelColumns = computed(() =>
    steels.map((steel) => ({
      steel,
      name: steel === 'left' ? 'Left steel' : 'Right steel',
      spots: spotIndices.map((index) => this.spotView({ steel, spot: index })),
    })),
  );
  protected readonly hasPreset = computed(() => this.preset() !== null);

  private spotView(spot: Spot) {
    const reading = this.readings().get(spotKey(spot));
    const outcome = reading?.outcome ? spotOutcomeWords[reading.outcome] : null;
    const isSelected = isSameSpot(this.selected(), spot);
    const preset = isPreset(this.preset(), spot);
    const value = reading ? celsius(reading.tenths) : null;
    const spoken = [
      spotName(spot),
      value ? `read ${value}` : preset ? 'read here, as on the first sled' : 'not read',
      ...(outcome ? [outcome.spoken] : []),
      ...(value && preset ? ['as on the first sled'] : []),
    ];
    return { spot, key: spotKey(spot), number: spot.spot + 1, value, outcome, isSelected, isPreset: preset, label: spoken.join(', ') };
  }
}
