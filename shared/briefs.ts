import { z } from 'zod';

/**
 * Team briefs: what a manager sees of their own teams. Every figure about 1 to k − 1 employees,
 * and every figure from which such a group could be worked out, arrives as `{ withheld: true }`.
 */
export type Withheld = { withheld: true };
export type OrWithheld<T> = T | Withheld;

/**
 * The caution of PRODUCT.md, carried by every brief and every export. The frontend's Caution shows
 * the same words (a test keeps the two equal).
 */
export const BRIEF_CAUTION =
  'This brief describes groups of employees, not any one person. It is a starting point for conversation and must not be used for decisions about individuals (such as dismissal, promotion or pay). Local employment and data-protection law and agreements with employee representatives take precedence.';

export const RISK_BANDS = ['low', 'medium', 'high'] as const;
export type RiskBandName = (typeof RISK_BANDS)[number];

/** Headcount, leavers and attrition rate (leavers ÷ headcount, as a share) of one group. */
export type GroupFigures = {
  headcount: OrWithheld<number>;
  leavers: OrWithheld<number>;
  attritionRate: OrWithheld<number>;
};

export type BriefDriver = {
  feature: string;
  /** against the organisation: this factor raises or lowers the team's expected leaver share */
  direction: 'raises' | 'lowers' | 'about the same';
  /** the size of that difference in percentage points, rounded to whole points */
  points: number;
  /** the same in plain words */
  sentence: string;
  /** the analyst's suggestion for this driver, when there is one */
  suggestedAction: string | null;
};

export type BriefSegment = {
  /** the segment's path in the tree, stable within one publication */
  id: string;
  rule: string;
  /** the team's employees in this segment (at least k) */
  employees: number;
  /** the segment's share of leavers across the organisation, rounded to whole percent */
  leaverShare: number;
};

export type TeamRef = { id: string; name: string; department: string | null };

export type TeamBrief = {
  withheld: false;
  team: TeamRef;
  k: number;
  /** the data window of the dataset, when the outcome has one */
  window: { start: string; end: string } | null;
  publishedAt: string;
  figures: {
    team: GroupFigures;
    /** null when the dataset has no department column */
    department: (GroupFigures & { name: string }) | null;
    organisation: GroupFigures;
  };
  /** the model's mean expected leaver share, rounded to whole percent */
  expectedLeaverShare: { team: number; organisation: number };
  riskBands: {
    /** how employees are put into bands, in words */
    rule: string;
    bands: { band: RiskBandName; employees: OrWithheld<number> }[];
  };
  drivers: BriefDriver[];
  segments: BriefSegment[];
  caution: string;
};

export type WithheldTeamBrief = {
  withheld: true;
  team: TeamRef;
  k: number;
  publishedAt: string;
  message: string;
  caution: string;
};

export type TeamBriefResponse = TeamBrief | WithheldTeamBrief;

/** One row of `GET /api/teams`. */
export type TeamSummary = {
  id: string;
  name: string;
  department: string | null;
  headcount: number | null;
  withheld: boolean;
  /** absent for withheld teams */
  attritionRate?: OrWithheld<number>;
  organisationRate?: OrWithheld<number>;
  publishedAt: string;
};

export const publishBodySchema = z
  .object({
    /** a note kept in the audit trail */
    comment: z.string().trim().max(500, 'A comment is at most 500 characters').optional(),
  })
  .strict();
export type PublishBody = z.infer<typeof publishBodySchema>;

export type PublicationStatus = 'computing' | 'published' | 'failed' | 'replaced' | 'withdrawn';

export type PublicationResponse = {
  id: string;
  modelRunId: string;
  datasetId: string;
  status: PublicationStatus;
  teamCount: number | null;
  withheldTeamCount: number | null;
  publishedAt: string | null;
  withdrawnReason: string | null;
};
