import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, DestroyRef, computed, effect, inject, input, linkedSignal, signal, untracked } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { RouterLink } from '@angular/router';
import { z } from 'zod';
import { keep, readKept } from '../../auth/local-json';
import { FieldDataStore } from '../../core/field-data/field-data-store';
import { LastScreen } from '../last-screen';
import { keepScreenAwake } from '../screen-awake';
import { CheckPhotos } from './check-photos';
import { resultAdvice, summaryWords, type CheckStepId, type StepState } from './check-plan';
import { CheckSession } from './check-session';
import { decisionWords, violationsOfCheck } from './check-steel';
import { reportViolations } from './check-step-writers';
import { checkStatusWords, type CheckStatus } from './check-words';
import { CheckDimensions } from './hosts/check-dimensions';
import { CheckEquipment } from './hosts/check-equipment';
import { CheckGapProbe } from './hosts/check-gap-probe';
import { CheckScaleProof } from './hosts/check-scale-proof';
import { CheckSteelTemperatures } from './hosts/check-steel-temperatures';
import { CheckWeight } from './hosts/check-weight';
import { SaveNotice, SaveNoticeView } from './hosts/save-notice';

type Outcome = Exclude<CheckStatus, 'in-progress'>;

const stepKey = (checkId: string) => `rimelog.check-step.${checkId}`;
const stepIdSchema = z.enum(['equipment', 'scale-proof', 'weight', 'dimensions', 'gap-probe', 'steel']);

/**
 * One sled's start check: the steps that apply on this track in working order (each saved on this device as
 * it is entered), photos, a note, and the result. A failed step is reported as a violation record, never
 * cleared. While the check is open, an app update waits (DeviceStore.openChecks).
 */
@Component({
  selector: 'rl-start-check-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    DatePipe,
    MatButtonModule,
    RouterLink,
    CheckPhotos,
    CheckDimensions,
    CheckEquipment,
    CheckGapProbe,
    CheckScaleProof,
    CheckSteelTemperatures,
    CheckWeight,
    SaveNoticeView,
  ],
  providers: [CheckSession],
  templateUrl: './start-check-page.html',
  styleUrls: ['./start-checks.scss', './start-check-page.scss'],
})
export class StartCheckPage {
  protected readonly session = inject(CheckSession);
  private readonly fieldDataStore = inject(FieldDataStore);
  /** The competition and the check, from the route. */
  readonly id = input.required<string>();
  readonly checkId = input.required<string>();

  readonly check = this.session.check;
  readonly isLoading = computed(() => this.session.checks() === null);
  readonly statusWords = checkStatusWords;
  readonly decisionWords = decisionWords;
  readonly summaryWords = summaryWords;
  readonly steps = this.session.steps;
  readonly advice = computed(() => resultAdvice(this.steps()));
  readonly violations = computed(() => violationsOfCheck(this.session.violationRecords() ?? [], this.checkId()));
  readonly confirming = signal<Outcome | null>(null);
  readonly confirmingFailed = signal(false);
  readonly notice = new SaveNotice();

  /** The step on screen: the one chosen last on this device for this check, else the first still to do. */
  private readonly chosenStep = linkedSignal<string, CheckStepId | null>({ source: this.checkId, computation: (id) => readKept(stepKey(id), stepIdSchema) });
  readonly currentStep = computed<StepState | null>(() => {
    const steps = this.steps();
    return steps.find((s) => s.id === this.chosenStep()) ?? steps.find((s) => s.summary === 'waiting') ?? steps[0] ?? null;
  });
  readonly nextStep = computed(() => {
    const steps = this.steps();
    const at = steps.findIndex((s) => s.id === this.currentStep()?.id);
    return at >= 0 ? (steps[at + 1] ?? null) : null;
  });

  readonly screenAwake = keepScreenAwake();

  constructor() {
    effect(() => this.session.bind(this.id(), this.checkId()));
    // The step first shown stays on screen (and comes back after a reload) until the official moves on, so a
    // verdict just given is never swapped for the next step under their glove.
    effect(() => {
      const step = this.currentStep();
      if (step && this.chosenStep() === null) untracked(() => this.showStep(step.id));
    });
    this.countOpenCheck();
    this.askForMissingFieldData();
    inject(LastScreen).rememberWhileShown();
  }

  /** "Weight, Steel temperatures": the steps behind the advice. */
  labelsOf(kind: 'report' | 'refer' | 'waiting'): string {
    const advice = this.advice();
    const steps = advice.kind === 'report' ? advice.failed : advice.kind === 'refer' ? advice.unsure : advice.kind === 'waiting' ? advice.left : [];
    return kind === advice.kind ? steps.map((step) => step.label).join(', ') : '';
  }

  showStep(id: CheckStepId): void {
    this.chosenStep.set(id);
    keep(stepKey(this.checkId()), id);
  }

  async saveNote(note: string): Promise<void> {
    const check = this.check();
    if (!check || note === check.note) return;
    await this.notice.run(() => this.session.store.updateRecord(this.checkId(), { note }), 'Note saved on this device');
  }

  readonly unsureSteps = computed(() => {
    const advice = this.advice();
    return advice.kind === 'refer' ? advice.unsure : [];
  });
  readonly confirmAnswer: Record<Outcome, string> = {
    cleared: 'Yes, cleared to start',
    referred: 'Yes, refer to the delegate',
    violation: 'Yes, report the violation',
    withdrawn: 'Yes, withdrawn',
  };

  confirmQuestion(outcome: Outcome, bib: number): string {
    if (outcome === 'violation') return `Report a violation for bib ${bib}?`;
    if (outcome === 'cleared') return `Clear bib ${bib} to start with steps still to do: ${this.labelsOf('waiting')}?`;
    return `Refer bib ${bib} to the technical delegate?`;
  }

  choose(outcome: Outcome): void {
    this.confirmingFailed.set(false);
    // Clearing a sled is the everyday result; the others go to the delegate, so they are asked twice, and so
    // is clearing a sled with steps still to do.
    if (outcome === 'cleared' && this.advice().kind !== 'waiting') void this.finish(outcome);
    else this.confirming.set(outcome);
  }

  askToReportFailed(): void {
    this.confirming.set(null);
    this.confirmingFailed.set(true);
  }

  async finish(outcome: Outcome): Promise<void> {
    this.confirming.set(null);
    await this.notice.run(() => this.session.store.updateRecord(this.checkId(), { status: outcome }), `${checkStatusWords[outcome]}: saved on this device`);
  }

  async reportFailed(): Promise<void> {
    this.confirmingFailed.set(false);
    const advice = this.advice();
    if (advice.kind !== 'report') return;
    const steel = this.session.steel();
    const failedSpots = steel.kind === 'fail' ? steel.failed : [];
    await this.notice.run(
      () => reportViolations(this.session.store, this.id(), this.checkId(), advice.failed, failedSpots),
      `${checkStatusWords.violation}: saved on this device`,
    );
  }

  async reopen(): Promise<void> {
    await this.notice.run(() => this.session.store.updateRecord(this.checkId(), { status: 'in-progress' }), 'Check open again');
  }

  /** With no copy on the device, asks the server once (it never throws; with no signal the notice stays). */
  private askForMissingFieldData(): void {
    const asked = new Set<string>();
    effect(() => {
      const id = this.id();
      if (this.session.fieldData() !== null || asked.has(id)) return;
      asked.add(id);
      untracked(() => void this.fieldDataStore.refresh(id));
    });
  }

  /** Counts this check as open on a screen while it is under way, so an app update never reloads over it. */
  private countOpenCheck(): void {
    let counted = false;
    const count = (open: boolean) => {
      if (open === counted) return;
      counted = open;
      this.session.store.openChecks.update((n) => n + (open ? 1 : -1));
    };
    effect(() => {
      const open = this.session.isOpen();
      untracked(() => count(open));
    });
    inject(DestroyRef).onDestroy(() => count(false));
  }
}
