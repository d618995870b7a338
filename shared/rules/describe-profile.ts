import { formatProfileValue, sourceKindLabels } from './profile-value';
import { profileValues } from './profile-values';
import type { RulesProfile } from './rules-profile';

export interface ProfileRow {
  path: string;
  label: string;
  /** The value written out, or "Not set" for a gap. */
  text: string;
  source: string;
  verified: boolean;
}

export interface ProfileSection {
  title: string;
  rows: ProfileRow[];
}

const sectionTitles: Record<string, string> = {
  temperature: 'Steel temperature',
  controlSteel: 'Control steel',
  weights: 'Weights',
  scale: 'Scale and control weights',
  dimensions: 'Dimensions',
  gapProbe: 'Gap probe',
  startArea: 'Start area',
  finishPlan: 'Finish inspections',
};

/** Every value of a profile, grouped for reading aloud at a protest: label, value, and where it comes from. */
export function describeProfile(profile: RulesProfile): ProfileSection[] {
  const sections = new Map<string, ProfileRow[]>();
  for (const { path, item } of profileValues(profile)) {
    const section = path.split('.')[0]!;
    const rows = sections.get(section) ?? [];
    rows.push({
      path,
      label: item.label,
      text: item.value === null ? 'Not set' : formatProfileValue(item.value, item.unit),
      source: item.source.note ? `${sourceKindLabels[item.source.kind]}: ${item.source.note}` : sourceKindLabels[item.source.kind],
      verified: item.source.verified,
    });
    sections.set(section, rows);
  }
  return [...sections].map(([key, rows]) => ({ title: sectionTitles[key] ?? key, rows }));
}
