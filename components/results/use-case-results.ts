"use client";

import { useEffect, useRef } from "react";
import useSWR, { mutate } from "swr";
import { ApiError, getJson } from "@/lib/api/client";
import type { PageInfo, ResultsView, SampleInfo } from "@/lib/cases/results-view";
import type { ResultsDto } from "@/lib/services/cases";
import type { EvaluatePoint, EvaluateResult } from "@/lib/thermo/evaluate";
import { columnsToPoints } from "@/lib/thermo/columns";

/** Rows of the numbers table on screen; the case page asks for the first page with its results. */
export const TABLE_PAGE = 50;
/** Points the case page draws (the route's drawing sample). */
const DRAW_SAMPLE = 1200;

export type TablePage = { offset: number; limit: number; total: number; points: EvaluatePoint[] };
/** The case page's results: `result.points` is the drawing sample; `page` is the table's first page. */
export type CaseResults = Omit<ResultsDto, "result"> & { result: EvaluateResult; sample: SampleInfo; page: TablePage };

const base = (caseId: number) => `/api/v1/cases/${caseId}/results`;
const withRevision = (caseId: number, revision?: number) => `${base(caseId)}?${revision ? `revision=${revision}&` : ""}format=columns`;

/** The one results request of a case page view: the drawing sample and the table's first page. */
const caseResultsUrl = (caseId: number, revision?: number) => `${withRevision(caseId, revision)}&points=${DRAW_SAMPLE}&offset=0&limit=${TABLE_PAGE}`;
/** A later page of the numbers table, on its own. */
const tablePageUrl = (caseId: number, revision: number | undefined, offset: number) => `${withRevision(caseId, revision)}&offset=${offset}&limit=${TABLE_PAGE}`;

const pageOf = (page: PageInfo): TablePage => ({ offset: page.offset, limit: page.limit, total: page.total, points: columnsToPoints(page.columns) });

type Answer = Omit<ResultsDto, "result"> & { result: ResultsView };

async function fetchCaseResults(url: string): Promise<CaseResults> {
  const { result, ...rest } = await getJson<Answer>(url);
  const { columns, sample, page, ...others } = result;
  return { ...rest, result: { ...others, points: columnsToPoints(columns ?? {}) } as EvaluateResult, sample: sample!, page: pageOf(page!) };
}

const options = { revalidateOnFocus: false, keepPreviousData: true } as const;

/**
 * The results of a case for its page, keyed by their URL: the results view and the equilibrium
 * panel share the one request (the stored snapshot once submitted, a live evaluation of a draft).
 * `stamp` is the case's lockVersion as the page last rendered it (given by one of the two): every
 * write to a case moves it, and when the refreshed page brings a new one the results are asked
 * for again, in step with the rest of the page (status, inputs).
 */
export function useCaseResults(caseId: number, revision?: number, stamp?: number) {
  const swr = useSWR<CaseResults, ApiError>(caseResultsUrl(caseId, revision), fetchCaseResults, options);
  const seen = useRef(stamp);
  useEffect(() => {
    if (stamp === undefined || seen.current === stamp) return;
    seen.current = stamp;
    void refreshCaseResults(caseId);
  }, [caseId, stamp]);
  return swr;
}

/** One later page of the numbers table; `null` offset asks for nothing (the first page came with the results). */
export function useTablePage(caseId: number, revision: number | undefined, offset: number | null) {
  return useSWR<TablePage, ApiError>(
    offset === null ? null : tablePageUrl(caseId, revision, offset),
    async (url: string) => pageOf((await getJson<Answer>(url)).result.page!),
    options,
  );
}

/**
 * Drop every cached results answer of a case (the sample and any table page), so a mounted view
 * asks again once and a page opened later does not show the old numbers first: on a new stamp,
 * and from the builder before it opens the edited case.
 */
export function refreshCaseResults(caseId: number): Promise<unknown> {
  const prefix = `${base(caseId)}?`;
  return mutate((key) => typeof key === "string" && key.startsWith(prefix), undefined, { revalidate: true });
}
