// First: Dexie reads the global indexedDB once when it loads (each store still gets its own factory).
import 'fake-indexeddb/auto';
import { acceptDemoValues } from '../../../../../shared/rules/profile-values';
import { shippedProfile } from '../../../../../shared/rules/shipped-profiles';
import { bibNotConfirmedLine } from '../../steps/equipment-judgement';
import { checkFieldsOf, entry, openStep, untilStored, until, type CheckPage } from './testing/check-page-harness';
import type { DeviceStore } from '../../../core/sync/device-store';

// Natural track: the equipment list ships as trade practice (gloves, helmet, braking shoes, ankle braces, an
// attachment that releases by itself, the bib fixed). No limit is used by this step; the demo values only fill
// the profile's other gaps so the competition can open.
const natural = acceptDemoValues(shippedProfile('natural', 'international'));
const items = natural.equipment.map((item) => item.id);

async function openEquipment() {
  return openStep({ profile: natural, startList: [entry(7)], instruments: [] }, 'equipment');
}

/** Marks one row (the bib or an item) and waits until the check record holds the answer. */
async function answer(store: DeviceStore, page: CheckPage, id: string, row: string, isPresent: boolean) {
  page.click(`[data-item="${row}"] button[data-answer="${isPresent ? 'present' : 'missing'}"]`);
  return untilStored(
    () => checkFieldsOf(store, id),
    (fields) => (row === 'bib' ? fields['bibConfirmed'] === isPresent : (fields['equipment'] as Record<string, boolean> | null)?.[row] === isPresent),
    `${row} is saved as ${isPresent ? 'present' : 'missing'}`,
  );
}

describe('CheckEquipment on the check page', () => {
  it('when each answer is given, then the check record keeps the equipment and bib answers as they come, and the step moves from to do to within the limits', async () => {
    const { store, page, id } = await openEquipment();
    expect(await checkFieldsOf(store, id)).toMatchObject({ equipment: null, bibConfirmed: null });
    expect(page.summaryOf('equipment')).toBe('waiting');
    expect(page.text('button[data-step="equipment"]')).toContain('◌ to do');

    // An item before the bib: the bib stays unanswered (null), not "wrong".
    let fields = await answer(store, page, id, 'helmet', true);
    expect(fields).toMatchObject({ equipment: { helmet: true }, bibConfirmed: null });
    expect(page.summaryOf('equipment')).toBe('waiting');

    fields = await answer(store, page, id, 'bib', true);
    expect(fields).toMatchObject({ equipment: { helmet: true }, bibConfirmed: true });
    expect(page.summaryOf('equipment')).toBe('waiting');

    for (const item of items.filter((one) => one !== 'helmet')) fields = await answer(store, page, id, item, true);
    expect(fields['equipment']).toEqual(Object.fromEntries(items.map((item) => [item, true])));
    expect(fields['bibConfirmed']).toBe(true);

    // Every item of the profile's list present and the bib right: the engine passes the step.
    await until(() => page.summaryOf('equipment') === 'pass', 'the step is within the limits');
    expect(page.text('button[data-step="equipment"]')).toContain('✓ within the limits');
    expect(page.text('rl-equipment-step rl-verdict-card')).toContain(`All ${items.length} equipment items confirmed present.`);
    expect(page.text()).toContain('Equipment saved on this device');
  });

  it('when an item is marked missing, then the record says so and the step fails the check; marking it present again corrects the record', async () => {
    const { store, page, id } = await openEquipment();
    await answer(store, page, id, 'bib', true);
    for (const item of items) await answer(store, page, id, item, item !== 'braking-shoes');

    expect((await checkFieldsOf(store, id))['equipment']).toMatchObject({ 'braking-shoes': false, helmet: true });
    await until(() => page.summaryOf('equipment') === 'fail', 'the step fails the check');
    expect(page.text('button[data-step="equipment"]')).toContain('⚠ fails the check');
    expect(page.text('[data-section="check-result"]')).toContain('⚠ Fails the check: Equipment and bib.');
    expect(page.text('rl-equipment-step rl-verdict-card')).toContain('missing Braking shoes');

    await answer(store, page, id, 'braking-shoes', true);
    await until(() => page.summaryOf('equipment') === 'pass', 'the step is within the limits again');
  });

  it('when the bib is marked wrong, then bibConfirmed is false and the step fails even with every item present', async () => {
    const { store, page, id } = await openEquipment();
    for (const item of items) await answer(store, page, id, item, true);
    expect(page.summaryOf('equipment')).toBe('waiting');

    const fields = await answer(store, page, id, 'bib', false);
    expect(fields['bibConfirmed']).toBe(false);
    await until(() => page.summaryOf('equipment') === 'fail', 'the step fails the check');
    expect(page.text('[data-section="bib-missing"]')).toContain(bibNotConfirmedLine);
  });
});
