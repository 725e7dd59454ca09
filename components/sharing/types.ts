/** A share link as `GET /api/v1/takes/{takeId}/share-links` lists it (never its token). */
export type ShareLinkDto = {
  id: string;
  expiresAt: string;
  createdAt: string;
  createdBy?: string | { name: string } | null;
};
