import { measurement } from '../../../../shared/rules/measurement';
import type { RulesProfile } from '../../../../shared/rules/rules-profile';
import { profileWith } from '../../../../shared/rules/test-profiles';
import type { LocalRecord } from '../../core/device-store/device-db';
import { localRecord } from '../../core/device-store/testing/local-record';
import {
  firstStartSeed,
  formOf,
  freshMountingForm,
  judgeMounting,
  latestMounting,
  mountingAsks,
  mountingFields,
  mountingInput,
  mountingItems,
  recheckReason,
  unansweredItems,
  type MountingForm,
} from './mounting-checklist';

const natural = profileWith('natural', 'international', { 'controlSteel.grace': 2 });
const artificial = profileWith('artificial', 'international', { 'controlSteel.grace': 2 });

/** A time on this device's own clock, so "09:20" holds in any time zone. */
const at = (day: number, hours: number, minutes: number) => new Date(2027, 0, day, hours, minutes).getTime();
const iso = (day: number, hours: number, minutes: number) => new Date(at(day, hours, minutes)).toISOString();
const id = (n: number) => `0190a7e2-0000-7000-8000-${n.toString(16).padStart(12, '0')}`;

const naturalForm: MountingForm = { heightTenths: 700, lengthTenths: null, inShade: true, awayFromDrafts: null, mountedAt: at(14, 9, 20), firstStartAt: at(14, 10, 0) };

describe('mountingItems and mountingAsks', () => {
  it('when the track is natural, then only the height is measured and drafts are not asked; artificial asks length and drafts, no height', () => {
    expect(mountingItems(natural)).toEqual({ asksHeight: true, asksLength: false, asksAwayFromDrafts: false });
    expect(mountingItems(artificial)).toEqual({ asksHeight: false, asksLength: true, asksAwayFromDrafts: true });
  });

  it('when the rules are shown, then their own values are named: 50.0 to 100.0 cm and 30 min on natural track; 20.0 cm and 240 min on artificial', () => {
    // trade practice, no published source: natural 0.5 m to 1.0 m, ≥ 30 min; artificial ≥ 20 cm, out of drafts, ≥ 4 h
    expect(mountingAsks(natural)).toEqual([
      'Height above the ground: 50.0 cm to 100.0 cm',
      'In the shade',
      'Mounted at least 30 min before the first start',
    ]);
    expect(mountingAsks(artificial)).toEqual(['Length: at least 20.0 cm', 'In the shade', 'Out of drafts', 'Mounted at least 240 min before the first start']);
  });
});

describe('building the mounting from the checklist', () => {
  it('when a fresh checklist opens, then "mounted at" is now to the minute and the rest waits to be answered', () => {
    const form = freshMountingForm(new Date(2027, 0, 14, 9, 20, 42).getTime());
    expect(form.mountedAt).toBe(at(14, 9, 20));
    expect(unansweredItems(mountingItems(natural), form)).toEqual(['the height above the ground', 'whether it is in the shade', 'the time of the first start']);
    expect(unansweredItems(mountingItems(artificial), form)).toEqual(['the length', 'whether it is in the shade', 'whether it is out of drafts', 'the time of the first start']);
    expect(mountingInput(mountingItems(natural), form)).toBeNull();
  });

  it('when every item is answered, then the mounting holds only what the rules ask for, and its record keeps the rest as null', () => {
    // A length left over from another profile is not passed on: natural track does not ask for it.
    const mounting = mountingInput(mountingItems(natural), { ...naturalForm, lengthTenths: 250, awayFromDrafts: false });
    expect(mounting).toEqual({ height: measurement(700, 'centimetre'), inShade: true, mountedAt: iso(14, 9, 20), firstStartAt: iso(14, 10, 0) });
    expect(mountingFields(mounting!)).toEqual({ height: { tenths: 700, unit: 'centimetre' }, length: null, inShade: true, awayFromDrafts: null, mountedAt: iso(14, 9, 20), firstStartAt: iso(14, 10, 0) });
    expect(formOf(mounting!)).toEqual({ ...naturalForm });
  });

  it('when the mounting is judged, then the engine decides pass or fail with its numbers; a gap in the profile is no verdict, never a pass', () => {
    const items = mountingItems(natural);
    const passing = judgeMounting(natural, mountingInput(items, naturalForm)!);
    expect(passing.kind === 'judged' && passing.verdict.outcome).toBe('pass');
    expect(passing.kind === 'judged' && passing.verdict.numbers).toContainEqual({ label: 'Mounted before the first start', text: '40 min' });

    // trade practice, no published source: at least 30 min before the first start
    const late = judgeMounting(natural, mountingInput(items, { ...naturalForm, mountedAt: at(14, 9, 31) })!);
    expect(late.kind === 'judged' && late.verdict.reason).toBe('The control steel is mounted 29 min before the first start, less than 30 min.');

    const gap: RulesProfile = structuredClone(natural);
    gap.controlSteel.mountedBeforeFirstStart.value = null;
    const refused = judgeMounting(gap, mountingInput(items, naturalForm)!);
    expect(refused.kind).toBe('no-verdict');
    expect(refused.kind === 'no-verdict' && refused.words).toMatch(/^No verdict: The rules profile has no value for ".*"\. The organiser must fill it in\. Refer to the technical delegate\.$/);
  });
});

describe('firstStartSeed', () => {
  it('when the first run day is still ahead, then the steppers begin on it; otherwise today; always at the next full hour', () => {
    const now = new Date(2027, 0, 14, 9, 20, 30).getTime();
    expect(firstStartSeed(now, null)).toBe(at(14, 10, 0));
    expect(firstStartSeed(now, '2027-01-15')).toBe(at(15, 10, 0));
    expect(firstStartSeed(now, '2027-01-14')).toBe(at(14, 10, 0));
    // Day two of a race that began yesterday: today.
    expect(firstStartSeed(now, '2027-01-13')).toBe(at(14, 10, 0));
  });
});

describe('latestMounting', () => {
  const mountingRecord = (n: number, hlc: string, fields: Record<string, unknown>, more: Partial<LocalRecord> = {}) =>
    localRecord('control-steel-mounting', id(n), { height: null, length: null, awayFromDrafts: null, mountedAt: iso(14, 9, 0), firstStartAt: iso(14, 10, 0), ...fields }, { hlc, version: 2, ...more });

  it('when a mounting was checked again, then the correction counts and the first one no longer does', () => {
    const first = mountingRecord(1, '000000000000001-00000-a', { height: { tenths: 450, unit: 'centimetre' }, inShade: true });
    const again = mountingRecord(2, '000000000000002-00000-a', { height: { tenths: 600, unit: 'centimetre' }, inShade: true, supersedes: id(1), reason: 'Checked again' }, { version: null });

    const { latest, others, unreadable } = latestMounting([again, first]);
    expect(latest).toEqual({
      id: id(2),
      mounting: { height: { tenths: 600, unit: 'centimetre' }, inShade: true, mountedAt: iso(14, 9, 0), firstStartAt: iso(14, 10, 0) },
      createdBy: 'official-one',
      isOnlyOnDevice: true,
      isRecheck: true,
    });
    expect([others, unreadable]).toEqual([0, 0]);
    // A removed re-check gives the first mounting back.
    expect(latestMounting([first, { ...again, deleted: true }]).latest?.id).toBe(id(1));
  });

  it('when two devices each saved a first mounting, then the newest counts and the other is counted; unreadable records are counted, not dropped', () => {
    const one = mountingRecord(1, '000000000000001-00000-a', { inShade: true });
    const two = mountingRecord(2, '000000000000005-00000-b', { inShade: false, awayFromDrafts: true }, { deviceId: 'device-2' });
    const odd = mountingRecord(3, '000000000000009-00000-a', { inShade: 'maybe' });
    const result = latestMounting([one, two, odd]);
    expect(result.latest?.id).toBe(id(2));
    expect(result.latest?.mounting).toMatchObject({ inShade: false, awayFromDrafts: true });
    expect([result.others, result.unreadable]).toEqual([1, 1]);
    expect(latestMounting([])).toEqual({ latest: null, others: 0, unreadable: 0 });
  });
});

describe('recheckReason', () => {
  it('when the mounting is checked again, then the reason says when and what changed, or that nothing did', () => {
    const before = mountingInput(mountingItems(natural), naturalForm)!;
    const after = { ...before, height: measurement(550, 'centimetre'), inShade: false };
    expect(recheckReason(before, after, at(14, 9, 40))).toBe('Checked again at 09:40: height 70.0 cm → 55.0 cm; in the shade yes → no.');
    expect(recheckReason(before, before, at(14, 9, 40))).toBe('Checked again at 09:40: nothing changed.');
  });
});
