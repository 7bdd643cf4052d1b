/** Query keys for the member's shop (members, invitations, settings). */
export const shopKeys = {
  current: ['shop'] as const,
};
