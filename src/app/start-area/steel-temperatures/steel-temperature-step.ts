import {
  afterNextRender,
  ChangeDetectionStrategy,
  Component,
  computed,
  ElementRef,
  inject,
  Injector,
  input,
  linkedSignal,
  output,
  signal,
  untracked,
  viewChild,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { steels } from '../../../../shared/rules/dimensions';
import type { RulesProfile } from '../../../../shared/rules/rules-profile';
import type { SteelPosition, TimedReading } from '../../../../shared/rules/temperature';
import { GloveKeypad } from '../../ui/glove-keypad/glove-keypad';
import { KEYPAD_DRAFT_CLOCK } from '../../ui/glove-keypad/keypad-draft-clock';
import { readKeypadDraft } from '../../ui/glove-keypad/keypad-drafts';
import { VerdictCard } from '../verdict/verdict-card';
import { decidesLine } from '../verdict/verdict-words';
import { SledDiagram, type SpotShown } from './sled-diagram';
import { STEEL_READING_CLOCK } from './steel-reading-clock';
import { describeSled } from './sled-summary';
import {
  celsius,
  currentReadings,
  judgeSpots,
  meaningOfTap,
  nextPresetSpot,
  presetPlan,
  shortSpotName,
  spotIndices,
  spotKey,
  type Spot,
  type SpotKey,
  type SpotPlan,
  type SpotReading,
} from './steel-spots';

/** The keypad takes steel readings in this range: a plausibility check of ours, not a rule value. */
export const steelReadingRange = { minTenths: -400, maxTenths: 400 } as const;

const positionWords: Record<SteelPosition, string> = {
  'left-front': 'front',
  'left-rear': 'rear',
  'right-front': 'front',
  'right-rear': 'rear',
};

/**
 * The steel temperatures of one sled: tap a spot on the sled, key its reading, see the verdict at once.
 * The host saves each `readingEntered` and passes the saved readings back in; it shows a new instance
 * for each sled.
 */
@Component({
  selector: 'rl-steel-temperature-step',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [GloveKeypad, MatButtonModule, SledDiagram, VerdictCard],
  templateUrl: './steel-temperature-step.html',
  styleUrl: './steel-temperature-step.scss',
  host: { class: 'steel-temperature-step' },
})
export class SteelTemperatureStep {
  readonly profile = input.required<RulesProfile>();
  /** Every control steel reading of the competition so far. */
  readonly controlReadings = input.required<readonly TimedReading[]>();
  /** Where this athlete's first sled in this run was read; null on the first sled. */
  readonly preset = input<SpotPlan | null>(null);
  /** The readings of this sled saved so far, so the screen comes back after a reload. */
  readonly readings = input<readonly SpotReading[]>([]);
  /**
   * Names this sled's check on the device (e.g. "check:<checkId>"), so a reading half keyed on a spot
   * comes back after the app is killed; null keeps no drafts.
   */
  readonly draftScope = input<string | null>(null);
  readonly readingEntered = output<SpotReading>();

  private readonly now = inject(STEEL_READING_CLOCK);
  private readonly injector = inject(Injector);
  private readonly entryPanel = viewChild.required<ElementRef<HTMLElement>>('entryPanel');
  /** Readings entered here that the host may not have passed back yet. */
  private readonly entered = signal<SpotReading[]>([]);
  private readonly all = computed(() => [...this.readings(), ...this.entered()]);
  protected readonly current = computed(() => currentReadings(this.all()));
  protected readonly plan = computed(() => presetPlan(this.preset()));

  private readonly draftNow = inject(KEYPAD_DRAFT_CLOCK);
  /**
   * Starts where a value was half keyed when the app was killed, else on the first preset spot not read
   * yet; the official may tap any other.
   */
  protected readonly selected = linkedSignal<Spot | null>(() => this.spotWithDraft() ?? nextPresetSpot(this.plan(), untracked(this.current)));
  /** A tap on a third spot of a steel read at two: the spots it could replace. */
  protected readonly question = signal<{ spot: Spot; readSpots: number[] } | null>(null);
  private readonly replacesSpot = signal<number | null>(null);
  /** Changes with every saved reading, so the keypad starts empty for the next one. */
  protected readonly keypadRound = signal(0);
  protected readonly lastEntered = signal('');

  protected readonly judgement = computed(() =>
    this.current().length === 0 ? null : judgeSpots(this.profile(), this.controlReadings(), this.all()),
  );

  protected readonly diagramReadings = computed(() => {
    const shown = new Map<SpotKey, SpotShown>();
    const judgement = this.judgement();
    const judged = judgement?.kind === 'judged' ? judgement.spots : [];
    for (const reading of this.current()) {
      const outcome = judged.find((j) => spotKey(j.reading) === spotKey(reading))?.verdict.outcome ?? 'not-judged';
      shown.set(spotKey(reading), { tenths: reading.tenths, outcome });
    }
    return shown;
  });

  protected readonly cards = computed(() => {
    const judgement = this.judgement();
    if (judgement?.kind !== 'judged') return [];
    return judgement.spots.map(({ reading, position, verdict }) => ({
      key: spotKey(reading),
      heading: `${shortSpotName(reading)} (${position ? positionWords[position] : 'front or rear: its other spot is not read yet'})`,
      verdict,
    }));
  });

  /** The spot whose keypad draft is the newest, when this sled has one. */
  private spotWithDraft(): Spot | null {
    const scope = this.draftScope();
    if (scope === null) return null;
    const now = this.draftNow();
    const drafts = steels.flatMap((steel) =>
      spotIndices.map((spot) => ({ spot: { steel, spot }, draft: readKeypadDraft(steelDraftKey(scope, { steel, spot }), now) })),
    );
    return drafts.filter((d) => d.draft !== null).sort((a, b) => (b.draft?.savedAt ?? 0) - (a.draft?.savedAt ?? 0))[0]?.spot ?? null;
  }

  protected readonly summary = computed(() => describeSled(this.judgement(), this.current()));

  protected readonly keypad = computed(() => {
    const spot = this.selected();
    if (!spot || this.question()) return null;
    const replaces = this.replacesSpot();
    const replacing = replaces === null ? '' : ` (replaces spot ${replaces + 1})`;
    const scope = this.draftScope();
    return {
      round: `${spotKey(spot)}#${this.keypadRound()}`,
      label: `${shortSpotName(spot)}${replacing}: steel temperature`,
      draftKey: scope === null ? null : steelDraftKey(scope, spot),
    };
  });

  /** When a preset exists and the selected spot is not one of it, say where the first sled was read. */
  protected readonly offPresetNote = computed(() => {
    const spot = this.selected();
    const plan = this.plan();
    if (!spot || !plan || plan[spot.steel].length === 0 || plan[spot.steel].includes(spot.spot)) return null;
    const spots = plan[spot.steel].map((s) => s + 1).join(' and ');
    return `This athlete’s first sled in this run was read at spot ${spots} of the ${spot.steel} steel. Read the same spots on every sled of the run.`;
  });

  protected readonly range = steelReadingRange;
  protected readonly decidesLine = decidesLine;

  protected selectSpot(spot: Spot): void {
    this.replacesSpot.set(null);
    this.selected.set(spot);
    const meaning = meaningOfTap(this.current(), spot);
    this.question.set(meaning.kind === 'ask-replace' ? { spot, readSpots: meaning.readSpots } : null);
    // On a phone held upright the keypad sits below the sled: bring it (or the question) into view.
    afterNextRender(() => this.entryPanel().nativeElement.scrollIntoView?.({ block: 'nearest' }), { injector: this.injector });
  }

  protected replace(readSpot: number): void {
    this.replacesSpot.set(readSpot);
    this.question.set(null);
  }

  protected keepReadings(): void {
    this.question.set(null);
    this.selected.set(null);
  }

  protected readingFor(steelSpot: Spot): string {
    const reading = this.current().find((r) => r.steel === steelSpot.steel && r.spot === steelSpot.spot);
    return reading ? celsius(reading.tenths) : '';
  }

  protected save(tenths: number): void {
    const spot = this.selected();
    if (!spot) return;
    const replaces = this.replacesSpot();
    const reading: SpotReading = {
      steel: spot.steel,
      spot: spot.spot,
      tenths,
      takenAt: new Date(this.now()).toISOString(),
      ...(replaces === null ? {} : { replacesSpot: replaces }),
    };
    this.entered.update((entered) => [...entered, reading]);
    this.readingEntered.emit(reading);
    this.lastEntered.set(`${shortSpotName(spot)}: ${celsius(tenths)} entered.`);
    this.replacesSpot.set(null);
    this.keypadRound.update((round) => round + 1);
    this.selected.set(nextPresetSpot(this.plan(), this.current()));
  }
}

/** Where a half-keyed reading of one spot is kept while the app may be killed. */
const steelDraftKey = (scope: string, { steel, spot }: Spot): string => `${scope}:steel:${steel}:${spot}`;
