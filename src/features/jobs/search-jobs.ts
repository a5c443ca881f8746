import type { BoardSummary } from '../../../shared/schemas/boards.ts';
import type { SiteWithJobs } from './api/get-jobs.ts';

/** The words of a search, lower case; empty for a blank search. */
export function searchTerms(search: string): string[] {
  return search.toLocaleLowerCase('en-GB').split(/\s+/).filter(Boolean);
}

/**
 * Narrows the tree to what matches every word of the search. A word may match the client, the
 * address, the job reference or the board reference, so "smith db2" finds board DB2 of the
 * Smith job. A site or job whose own words match keeps only the boards that match the rest.
 */
export function searchJobs(tree: SiteWithJobs[], search: string): SiteWithJobs[] {
  const terms = searchTerms(search);
  if (terms.length === 0) return tree;
  const has = (text: string, term: string) => text.toLocaleLowerCase('en-GB').includes(term);
  const result: SiteWithJobs[] = [];
  for (const entry of tree) {
    const siteText = [entry.site.client, entry.site.address];
    const jobs = [];
    for (const { job, boards } of entry.jobs) {
      const jobText = [...siteText, job.reference];
      const unmatched = terms.filter((term) => !jobText.some((text) => has(text, term)));
      if (unmatched.length === 0) {
        jobs.push({ job, boards });
        continue;
      }
      const matching = boards.filter((board) => unmatched.every((term) => has(board.reference, term)));
      if (matching.length > 0) jobs.push({ job, boards: matching });
    }
    if (jobs.length > 0 || (entry.jobs.length === 0 && terms.every((term) => siteText.some((text) => has(text, term))))) {
      result.push({ site: entry.site, jobs });
    }
  }
  return result;
}

/** The boards in the order they are shown: the order ArrowUp and ArrowDown move through. */
export function visibleBoards(tree: SiteWithJobs[]): BoardSummary[] {
  return tree.flatMap((entry) => entry.jobs.flatMap((job) => job.boards));
}
