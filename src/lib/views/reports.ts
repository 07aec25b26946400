/*
 * Content reports, as the editors' queue shows them. Types only.
 */
import type { ReportCategory, ReportState, ReportSubjectType } from '$lib/domain/content-reports';

/** What the queue and pages show about a reported item. */
export interface SubjectSummary {
	type: ReportSubjectType;
	id: string;
	title: string;
	/** Where an editor opens it (the owner and editors see hidden content there). */
	url: string;
	ownerName: string | null;
	hidden: { reason: string; at: string } | null;
}

export interface ReportView {
	id: number;
	category: ReportCategory;
	detail: string;
	state: ReportState;
	reporter: { name: string | null; email: string };
	/** ISO 8601, UTC. */
	createdAt: string;
	decidedAt: string | null;
	decidedBy: string | null;
}

/** One reported item with its reports (newest first, at most 10) and how many in all. */
export interface ReportGroup {
	subject: SubjectSummary;
	reportCount: number;
	latestAt: string;
	reports: ReportView[];
}
