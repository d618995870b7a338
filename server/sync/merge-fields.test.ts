import { describe, expect, it } from 'vitest';
import { mergeFields } from './merge-fields';

const sourceA = { userId: 'a', deviceId: 'dev-a', opId: 'op-a', hlc: '1' };
const sourceB = { userId: 'b', deviceId: 'dev-b', opId: 'op-b', hlc: '2' };

describe('mergeFields (SPEC.md §5)', () => {
  const current = { status: 'in-progress', note: 'bridge checked' };
  const sources = { status: sourceA, note: sourceA };

  it('when the server still holds the base the device saw, then the new value applies', () => {
    const merge = mergeFields(current, sources, { fields: { status: 'cleared' }, base: { status: 'in-progress' } }, sourceB, sourceA);
    expect(merge).toEqual({ apply: { status: 'cleared' }, conflicts: [] });
  });

  it('when two devices changed the same field differently from the same base, then it is a conflict keeping base and both values', () => {
    const merge = mergeFields({ ...current, status: 'referred' }, sources, { fields: { status: 'cleared' }, base: { status: 'in-progress' } }, sourceB, sourceA);
    expect(merge.apply).toEqual({});
    expect(merge.conflicts).toEqual([
      { field: 'status', base: 'in-progress', kept: { value: 'referred', ...sourceA }, incoming: { value: 'cleared', ...sourceB } },
    ]);
  });

  it('when both devices made the same change, then nothing is applied and nothing clashes', () => {
    const merge = mergeFields({ ...current, status: 'cleared' }, sources, { fields: { status: 'cleared' }, base: { status: 'in-progress' } }, sourceB, sourceA);
    expect(merge).toEqual({ apply: {}, conflicts: [] });
  });

  it('when different fields were changed, then both apply without a conflict', () => {
    const merge = mergeFields(current, sources, { fields: { note: 'bridge and steels checked' }, base: { note: 'bridge checked' } }, sourceB, sourceA);
    expect(merge.apply).toEqual({ note: 'bridge and steels checked' });
  });

  it("when the device's own earlier op set the field and its next edit carries an older base, then the new value applies (its edits chain)", () => {
    const merge = mergeFields({ ...current, status: 'referred' }, { ...sources, status: sourceB }, { fields: { status: 'cleared' }, base: { status: 'in-progress' } }, { ...sourceB, opId: 'op-b2' }, sourceA);
    expect(merge).toEqual({ apply: { status: 'cleared' }, conflicts: [] });
  });

  it('when an edit carries no base for a field that differs, then it is kept as a conflict, never applied blindly', () => {
    const merge = mergeFields(current, sources, { fields: { status: 'cleared' }, base: {} }, sourceB, sourceA);
    expect(merge.conflicts).toHaveLength(1);
    expect(merge.conflicts[0]!.base).toBeNull();
  });
});
