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

/** POST /api/projects/:id/comments: a thread (pinned to an element or a plan point) or, with parentId, a reply. */
export interface NewComment {
  version: number;
  body: string;
  element?: string;
  x_m?: number;
  y_m?: number;
  parentId?: string;
}
