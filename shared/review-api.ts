/** Review comments as the API sends them: one wire type for server/review/comments.ts and the Review screen. */
export interface ReviewComment {
  id: string;
  version: number;
  parentId: string | null;
  element: string | null;
  /** A point on the plan in site metres, when the comment is pinned there rather than to an element. */
  x_m: number | null;
  y_m: number | null;
  body: string;
  resolved: boolean;
  resolvedAt: string | null;
  resolvedBy: string | null;
  createdAt: string;
  createdBy: string | null;
}

export interface ReviewThread extends ReviewComment {
  replies: ReviewComment[];
}
