import { measurementSchema, formatTenths } from '../../../../shared/rules/measurement';
import { recordKinds, type RecordKind } from '../../../../shared/sync/record-kinds';
import type { SyncOp } from '../../../../shared/sync/sync-api';

const kindNames: Record<RecordKind, { one: string; many: string }> = {
  'control-reading': { one: 'control steel reading', many: 'control steel readings' },
  'start-check': { one: 'start check', many: 'start checks' },
  measurement: { one: 'measurement', many: 'measurements' },
  violation: { one: 'violation', many: 'violations' },
  photo: { one: 'photo', many: 'photos' },
  'log-signature': { one: 'log signature', many: 'log signatures' },
  'courtesy-reading': { one: 'courtesy reading', many: 'courtesy readings' },
  'scale-proof': { one: 'scale proof', many: 'scale proofs' },
  'control-steel-mounting': { one: 'control steel mounting', many: 'control steel mountings' },
};

const actionWords: Record<SyncOp['action'], string> = {
  create: 'new',
  update: 'a change',
  delete: 'a removal',
  settle: 'a conflict settled',
};

/** "1 start check", "3 control steel readings". */
export function countOfKind(count: number, kind: RecordKind): string {
  const names = kindNames[kind];
  return `${count} ${count === 1 ? names.one : names.many}`;
}

/** "Start checks": a heading for a kind. */
export function kindHeading(kind: string): string {
  const names = isKind(kind) ? kindNames[kind].many : kind;
  return names.charAt(0).toUpperCase() + names.slice(1);
}

/** "Start check (a change): run 1, bib 12" — enough for an official to recognise the record. */
export function describeOp(op: SyncOp): string {
  const kind = isKind(op.recordKind) ? kindNames[op.recordKind].one : op.recordKind;
  const what = `${kind.charAt(0).toUpperCase()}${kind.slice(1)} (${actionWords[op.action]})`;
  const detail = isKind(op.recordKind) ? fieldSummary(op.recordKind, op.fields) : '';
  return detail ? `${what}: ${detail}` : what;
}

function fieldSummary(kind: RecordKind, fields: Record<string, unknown>): string {
  const parts: string[] = [];
  const number = (name: string) => (typeof fields[name] === 'number' ? fields[name] : null);
  const text = (name: string) => (typeof fields[name] === 'string' && fields[name] !== '' ? fields[name] : null);
  const measured = (name: string) => {
    const parsed = measurementSchema.safeParse(fields[name]);
    return parsed.success ? formatTenths(parsed.data.tenths, parsed.data.unit) : null;
  };
  const add = (label: string, value: string | number | null) => {
    if (value !== null) parts.push(label ? `${label} ${value}` : String(value));
  };
  switch (kind) {
    case 'start-check':
      add('run', number('run'));
      add('bib', number('bib'));
      add('status', text('status'));
      break;
    case 'control-reading':
      add('reading', measured('reading'));
      add('instrument', text('instrumentId'));
      break;
    case 'measurement':
      add('', text('what'));
      add('', measured('value'));
      break;
    case 'violation':
      add('rule', text('rule'));
      add('decision', text('decision'));
      break;
    case 'photo':
      add('', text('purpose'));
      add('', text('caption'));
      break;
    case 'courtesy-reading':
      add('bib', number('bib'));
      add('', text('what'));
      add('', measured('value'));
      break;
    case 'scale-proof':
      add('run', number('run'));
      add('known', measured('knownWeight'));
      add('read', measured('reading'));
      break;
    case 'control-steel-mounting':
      add('height', measured('height'));
      add('', fields['inShade'] === true ? 'in shade' : fields['inShade'] === false ? 'not in shade' : null);
      break;
    case 'log-signature': {
      add('', text('log') === 'control-steel' ? 'control steel log' : text('log'));
      const signed = Array.isArray(fields['readingIds']) ? fields['readingIds'].length : null;
      if (signed !== null) add('', `${signed} ${signed === 1 ? 'reading' : 'readings'}`);
      break;
    }
  }
  return parts.join(', ');
}

function isKind(kind: string): kind is RecordKind {
  return (recordKinds as string[]).includes(kind);
}
