import { describe, expect, it } from 'vitest';
import {
  competitionListQuerySchema,
  competitionSummarySchema,
  trackTypeLabel,
} from './competition';

const valid = {
  id: '0193a5c0-0000-7000-8000-000000000001',
  name: 'Test Race',
  trackType: 'natural',
  level: 'national',
  venue: 'Test Road',
  firstRunOn: '2027-01-09',
  status: 'open',
};

describe('competitionSummarySchema', () => {
  it('when every field is well formed, then it parses unchanged', () => {
    expect(competitionSummarySchema.parse(valid)).toEqual(valid);
  });

  it.each([
    ['trackType', 'bobsleigh'],
    ['level', 'regional'],
    ['firstRunOn', '09.01.2027'],
    ['id', 'not-a-uuid'],
    ['name', ''],
  ])('when %s is %j, then it is refused', (field, value) => {
    expect(competitionSummarySchema.safeParse({ ...valid, [field]: value }).success).toBe(false);
  });
});

describe('competitionListQuerySchema', () => {
  it('when no filter is given, then the query is empty', () => {
    expect(competitionListQuerySchema.parse({})).toEqual({});
  });

  it('when the track type is unknown, then the message says what to choose', () => {
    const result = competitionListQuerySchema.safeParse({ trackType: 'bobsleigh' });
    expect(result.error?.issues[0]?.message).toBe('choose natural or artificial');
  });

  it('when an unknown parameter is sent, then it is refused rather than ignored', () => {
    expect(competitionListQuerySchema.safeParse({ sort: 'name' }).success).toBe(false);
  });
});

describe('trackTypeLabel', () => {
  it('names both track types in words', () => {
    expect(trackTypeLabel('natural')).toBe('Natural track');
    expect(trackTypeLabel('artificial')).toBe('Artificial track');
  });
});
