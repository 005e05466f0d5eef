import type { Issue } from '../../../src/scenario/types.js';
import { el } from './dom.js';

/** A list of problems, each with its field path, as text. */
export function issueList(issues: readonly Issue[], className = 'issue-list'): HTMLUListElement {
  return el(
    'ul',
    { class: className },
    ...issues.map((issue) =>
      el('li', {}, issue.path === '' ? null : el('code', { class: 'issue-path', text: issue.path }), issue.path === '' ? null : ' ', el('span', { class: 'issue-message', text: issue.message })),
    ),
  );
}

/** Whether an issue concerns a field: its own path, or something inside it ("range[1]"). */
export function issueConcerns(issue: Issue, fieldPath: string): boolean {
  return issue.path === fieldPath || issue.path.startsWith(`${fieldPath}.`) || issue.path.startsWith(`${fieldPath}[`);
}
