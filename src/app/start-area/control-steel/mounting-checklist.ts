import type { ControlSteelMounting } from '../../../../shared/rules/control-steel';
import { judgeControlSteelMounting } from '../../../../shared/rules/control-steel';
import { formatTenths, measurement, type Measurement } from '../../../../shared/rules/measurement';
import { formatProfileValue, type ProfileValue } from '../../../../shared/rules/profile-value';
import type { RulesProfile } from '../../../../shared/rules/rules-profile';
import { recordFieldSchemas } from '../../../../shared/sync/record-kinds';
import type { LocalRecord } from '../../core/device-store/device-db';
import { attempt, judged, type StepJudgement } from '../steps/step-judgement';
import { clockTime } from './clock-time';

const minute = 60_000;
const mountingFieldsSchema = recordFieldSchemas['control-steel-mounting'];

/** The keypads take heights and lengths in these ranges: a plausibility check of ours against mistyping, not a rule value. */
export const mountingRanges = {
  height: { minTenths: 0, maxTenths: 3000 },
  length: { minTenths: 1, maxTenths: 2000 },
} as const;

/** The items of the mounting checklist that the competition's rules ask for. */
export interface MountingItems {
  /** Height above the ground in cm, when the profile sets a lowest or a highest height. */
  asksHeight: boolean;
  /** Length in cm, when the profile sets a shortest length. */
  asksLength: boolean;
  /** Out of drafts (yes/no), when the profile asks for it. In the shade is always asked: every record says it. */
  asksAwayFromDrafts: boolean;
}

export function mountingItems(profile: RulesProfile): MountingItems {
  const rules = profile.controlSteel;
  return {
    asksHeight: rules.minHeight !== null || rules.maxHeight !== null,
    asksLength: rules.minLength !== null,
    asksAwayFromDrafts: rules.awayFromDrafts,
  };
}

const limitText = (value: ProfileValue | null): string =>
  value === null || value.value === null ? 'not set in the rules profile' : formatProfileValue(value.value, value.unit);

/** What the rules ask of the mounting, in words, so the official knows before answering. */
export function mountingAsks(profile: RulesProfile): string[] {
  const rules = profile.controlSteel;
  const asks: string[] = [];
  if (rules.minHeight && rules.maxHeight) asks.push(`Height above the ground: ${limitText(rules.minHeight)} to ${limitText(rules.maxHeight)}`);
  else if (rules.minHeight) asks.push(`Height above the ground: at least ${limitText(rules.minHeight)}`);
  else if (rules.maxHeight) asks.push(`Height above the ground: at most ${limitText(rules.maxHeight)}`);
  if (rules.minLength) asks.push(`Length: at least ${limitText(rules.minLength)}`);
  if (rules.inShade) asks.push('In the shade');
  if (rules.awayFromDrafts) asks.push('Out of drafts');
  asks.push(`Mounted at least ${limitText(rules.mountedBeforeFirstStart)} before the first start`);
  return asks;
}

/** What the official has answered so far; null = not answered yet. Times in ms on this device's clock. */
export interface MountingForm {
  heightTenths: number | null;
  lengthTenths: number | null;
  inShade: boolean | null;
  awayFromDrafts: boolean | null;
  mountedAt: number | null;
  firstStartAt: number | null;
}

/** A time to the whole minute (seconds dropped), as the steppers show and the record keeps it. */
export const wholeMinute = (ms: number): number => Math.floor(ms / minute) * minute;

/** A fresh checklist: mounted "now" (the usual case: it is recorded as it is mounted), the rest unanswered. */
export function freshMountingForm(nowMs: number): MountingForm {
  return { heightTenths: null, lengthTenths: null, inShade: null, awayFromDrafts: null, mountedAt: wholeMinute(nowMs), firstStartAt: null };
}

/**
 * Where the first-start steppers begin: the competition day (its first run day while that is still ahead,
 * otherwise today) at the next full hour. Only a starting point: the official sets the real time.
 */
export function firstStartSeed(nowMs: number, firstRunOn: string | null): number {
  const now = new Date(nowMs);
  const nextHour = new Date(now.getFullYear(), now.getMonth(), now.getDate(), now.getHours() + 1);
  const day = /^(\d{4})-(\d{2})-(\d{2})$/.exec(firstRunOn ?? '');
  if (!day) return nextHour.getTime();
  const onRunDay = new Date(Number(day[1]), Number(day[2]) - 1, Number(day[3]), nextHour.getHours());
  return Math.max(onRunDay.getTime(), nextHour.getTime());
}

/** The items still unanswered, in words, in the order the screen asks them. */
export function unansweredItems(items: MountingItems, form: MountingForm): string[] {
  const missing: string[] = [];
  if (items.asksHeight && form.heightTenths === null) missing.push('the height above the ground');
  if (items.asksLength && form.lengthTenths === null) missing.push('the length');
  if (form.inShade === null) missing.push('whether it is in the shade');
  if (items.asksAwayFromDrafts && form.awayFromDrafts === null) missing.push('whether it is out of drafts');
  if (form.mountedAt === null) missing.push('when it was mounted');
  if (form.firstStartAt === null) missing.push('the time of the first start');
  return missing;
}

/** The checklist as the rules engine takes it, with only the items the rules ask for; null while any is unanswered. */
export function mountingInput(items: MountingItems, form: MountingForm): ControlSteelMounting | null {
  if (unansweredItems(items, form).length > 0 || form.inShade === null || form.mountedAt === null || form.firstStartAt === null) return null;
  return {
    ...(items.asksHeight && form.heightTenths !== null ? { height: measurement(form.heightTenths, 'centimetre') } : {}),
    ...(items.asksLength && form.lengthTenths !== null ? { length: measurement(form.lengthTenths, 'centimetre') } : {}),
    inShade: form.inShade,
    ...(items.asksAwayFromDrafts && form.awayFromDrafts !== null ? { awayFromDrafts: form.awayFromDrafts } : {}),
    mountedAt: new Date(form.mountedAt).toISOString(),
    firstStartAt: new Date(form.firstStartAt).toISOString(),
  };
}

/** The fields of a `control-steel-mounting` record; items the rules do not ask for are kept as null. */
export function mountingFields(mounting: ControlSteelMounting): Record<string, unknown> {
  return {
    height: mounting.height ?? null,
    length: mounting.length ?? null,
    inShade: mounting.inShade,
    awayFromDrafts: mounting.awayFromDrafts ?? null,
    mountedAt: mounting.mountedAt,
    firstStartAt: mounting.firstStartAt,
  };
}

/** The mounting that counts, as the screen shows it. */
export interface SavedMounting {
  id: string;
  mounting: ControlSteelMounting;
  createdBy: string;
  /** The server has not confirmed it yet. */
  isOnlyOnDevice: boolean;
  /** It corrects an earlier mounting record (the mounting was checked again). */
  isRecheck: boolean;
}

export interface LatestMounting {
  latest: SavedMounting | null;
  /** Other records that no correction replaced (two devices each saved a first one): the newest counts. */
  others: number;
  /** Records this version of the app cannot read (never hidden without saying so). */
  unreadable: number;
}

/** The newest mounting record no correction replaced and nobody removed, from a competition's mounting records. */
export function latestMounting(records: readonly LocalRecord[]): LatestMounting {
  const live = records.filter((record) => !record.deleted && record.kind === 'control-steel-mounting');
  const corrected = new Set(live.map((record) => record.supersedes ?? record.fields['supersedes']).filter((id) => typeof id === 'string'));
  const heads: { saved: SavedMounting; hlc: string }[] = [];
  let unreadable = 0;
  for (const record of live) {
    const parsed = mountingFieldsSchema.safeParse(record.fields);
    if (!parsed.success) {
      unreadable++;
      continue;
    }
    if (corrected.has(record.id)) continue;
    const fields = parsed.data;
    const mounting: ControlSteelMounting = {
      ...(fields.height ? { height: fields.height } : {}),
      ...(fields.length ? { length: fields.length } : {}),
      inShade: fields.inShade,
      ...(fields.awayFromDrafts !== null ? { awayFromDrafts: fields.awayFromDrafts } : {}),
      mountedAt: fields.mountedAt,
      firstStartAt: fields.firstStartAt,
    };
    const isRecheck = (record.supersedes ?? fields.supersedes) !== null;
    heads.push({ saved: { id: record.id, mounting, createdBy: record.createdBy, isOnlyOnDevice: record.version === null, isRecheck }, hlc: record.hlc });
  }
  heads.sort((a, b) => (a.hlc < b.hlc ? 1 : a.hlc > b.hlc ? -1 : 0));
  return { latest: heads[0]?.saved ?? null, others: Math.max(0, heads.length - 1), unreadable };
}

/** The checklist filled in with a saved mounting, for checking it again. */
export function formOf(mounting: ControlSteelMounting): MountingForm {
  return {
    heightTenths: mounting.height?.tenths ?? null,
    lengthTenths: mounting.length?.tenths ?? null,
    inShade: mounting.inShade,
    awayFromDrafts: mounting.awayFromDrafts ?? null,
    mountedAt: Date.parse(mounting.mountedAt),
    firstStartAt: Date.parse(mounting.firstStartAt),
  };
}

const cm = (value: Measurement | undefined) => (value ? formatTenths(value.tenths, value.unit) : 'not asked');
const yesNo = (value: boolean | undefined) => (value === undefined ? 'not asked' : value ? 'yes' : 'no');

/**
 * The reason kept with a re-check (a correction needs one), written by the app so no keyboard opens:
 * when it was checked again and what changed.
 */
export function recheckReason(before: ControlSteelMounting, after: ControlSteelMounting, atMs: number): string {
  const changes: string[] = [];
  const note = (what: string, was: string, now: string) => {
    if (was !== now) changes.push(`${what} ${was} → ${now}`);
  };
  note('height', cm(before.height), cm(after.height));
  note('length', cm(before.length), cm(after.length));
  note('in the shade', yesNo(before.inShade), yesNo(after.inShade));
  note('out of drafts', yesNo(before.awayFromDrafts), yesNo(after.awayFromDrafts));
  note('mounted at', clockTime(before.mountedAt), clockTime(after.mountedAt));
  note('first start', clockTime(before.firstStartAt), clockTime(after.firstStartAt));
  return `Checked again at ${clockTime(atMs)}: ${changes.length === 0 ? 'nothing changed' : changes.join('; ')}.`;
}

/** The mounting judged by the rules engine, or its refusal in words (never a pass). */
export function judgeMounting(profile: RulesProfile, mounting: ControlSteelMounting): StepJudgement {
  return judged(attempt(() => judgeControlSteelMounting(profile, mounting)));
}
