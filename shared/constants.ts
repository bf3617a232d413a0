/** Limits both sides use. */
export const Limits = {
  pageSizeDefault: 50,
  pageSizeMax: 500,
  nameMax: 160,
  titleMax: 200,
  notesMax: 5000,
  passwordMin: 10,
  passwordMax: 200,
  invitationDays: 7,
  passwordResetMinutes: 60,
} as const;
