// What a client report is drawn from: the comparison, the consultant's text, problem bands and,
// when it is shown, the plan.
import type { PlanReport } from '../../plans/report';
import type { ComparisonModel, ProblemBandView } from '../../results/types';
import type { UnitSystem } from '../../format/room';

/** The engine's quality notes on one capture of the comparison, when they are shown. */
export interface ReportQualityNote {
	condition: string;
	positionLabel: string;
	messages: string[];
}

/** A plan in the report: what is planned and, optionally, the predicted times per band. */
export type ReportPlan = Pick<PlanReport, 'title' | 'lines'> & Partial<Pick<PlanReport, 'bands' | 'method' | 'cost'>>;

export interface ReportDocument {
	practiceName: string;
	projectName: string;
	clientName: string;
	publishedAt: Date;
	title: string;
	comparison: ComparisonModel;
	/** The consultant's text, paragraphs separated by blank lines. */
	advice: string;
	problemBands: ProblemBandView[];
	plan?: ReportPlan | null;
	/** Where the target comes from, named in the method (default ITU-R BS.1116-3). */
	targetBasis?: string;
	/** Quality notes per capture: always for staff, for a client only where the consultant shares them. */
	qualityNotes?: ReportQualityNote[];
	/** The reader's unit system for room dimensions (default metric). */
	unitSystem?: UnitSystem;
}

/** The document with its defaults filled in, as the sections draw it. */
export type ReportContent = Required<ReportDocument>;
