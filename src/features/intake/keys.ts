/**
 * Query keys of intake: a cruise's upload history, one upload, and the cruise's remembered column
 * mapping, each on its own branch so a mutation names exactly what it changes.
 */
export const intakeKeys = {
  all: ['intake'] as const,
  uploads: (cruiseId: string) => [...intakeKeys.all, 'uploads', cruiseId] as const,
  upload: (uploadId: string) => [...intakeKeys.all, 'upload', uploadId] as const,
  mapping: (cruiseId: string) => [...intakeKeys.all, 'mapping', cruiseId] as const,
  answers: (cruiseId: string) => [...intakeKeys.all, 'answers', cruiseId] as const,
  preview: (uploadId: string, answers: unknown) => [...intakeKeys.all, 'preview', uploadId, answers] as const,
};
