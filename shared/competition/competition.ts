import { z } from 'zod';

export const trackTypes = ['natural', 'artificial'] as const;
export const competitionLevels = ['international', 'national', 'junior', 'youth'] as const;
export const competitionStatuses = ['planned', 'open', 'closed'] as const;

export const trackTypeSchema = z.enum(trackTypes, {
  error: 'choose natural or artificial',
});
export type TrackType = z.infer<typeof trackTypeSchema>;

export const competitionLevelSchema = z.enum(competitionLevels);
export type CompetitionLevel = z.infer<typeof competitionLevelSchema>;

export const competitionStatusSchema = z.enum(competitionStatuses);
export type CompetitionStatus = z.infer<typeof competitionStatusSchema>;

/** A competition as the home screen lists it. */
export const competitionSummarySchema = z.object({
  id: z.uuid(),
  name: z.string().min(1).max(120),
  trackType: trackTypeSchema,
  level: competitionLevelSchema,
  venue: z.string().min(1).max(120),
  firstRunOn: z.iso.date(),
  status: competitionStatusSchema,
});
export type CompetitionSummary = z.infer<typeof competitionSummarySchema>;

/** `GET /api/competitions` query: an optional track-type filter, nothing else. */
export const competitionListQuerySchema = z.strictObject({
  trackType: trackTypeSchema.optional(),
});
export type CompetitionListQuery = z.infer<typeof competitionListQuerySchema>;

/** `GET /api/competitions` answer. */
export const competitionListSchema = z.object({
  competitions: z.array(competitionSummarySchema),
});
export type CompetitionList = z.infer<typeof competitionListSchema>;

const trackTypeLabels: Record<TrackType, string> = {
  natural: 'Natural track',
  artificial: 'Artificial track',
};

export function trackTypeLabel(trackType: TrackType): string {
  return trackTypeLabels[trackType];
}
