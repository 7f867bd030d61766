/**
 * The status of a job card: planned → in progress → done → signed off, one step forward at a
 * time. What each move needs:
 *
 * - to in progress: a technician is assigned (the one who starts it, when nobody is);
 * - to done: every step is ticked off, and the engine and separator hours are read (they are
 *   recorded with the move, see machine-hours.ts);
 * - to signed off: the sign-off checklist is complete (checklist.ts).
 */
export const JOB_STATUSES = ['planned', 'in_progress', 'done', 'signed_off'] as const;
export type JobStatus = (typeof JOB_STATUSES)[number];

export const STATUS_WORDS: Readonly<Record<JobStatus, string>> = {
  planned: 'Planned',
  in_progress: 'In progress',
  done: 'Done',
  signed_off: 'Signed off',
};

/** The one status a job card may move to from each, or null at the end. */
export const NEXT_STATUS: Readonly<Record<JobStatus, JobStatus | null>> = {
  planned: 'in_progress',
  in_progress: 'done',
  done: 'signed_off',
  signed_off: null,
};

export interface MoveProblem {
  field: string;
  message: string;
}

export interface MoveFacts {
  status: JobStatus;
  /** Someone is assigned, or the person moving it will be. */
  assigned: boolean;
  /** Steps not yet ticked off, by their number (1-based) and words. */
  openSteps: readonly { n: number; text: string }[];
  /** Hours are given with the move. */
  hoursGiven: boolean;
  /** Checklist items still missing (by label), for the sign-off. */
  missingChecklist?: readonly string[];
}

/** Whether a job card may move to `to`, and if not, every reason why (empty: allowed). */
export function moveProblems(facts: MoveFacts, to: JobStatus): MoveProblem[] {
  const next = NEXT_STATUS[facts.status];
  if (to === facts.status) return [{ field: 'status', message: `the job card is already ${STATUS_WORDS[to].toLowerCase()}` }];
  if (next !== to)
    return [
      {
        field: 'status',
        message: next
          ? `a job card that is ${STATUS_WORDS[facts.status].toLowerCase()} moves only to ${STATUS_WORDS[next].toLowerCase()}`
          : 'a signed-off job card does not move any more',
      },
    ];
  const problems: MoveProblem[] = [];
  if (to === 'in_progress' && !facts.assigned) problems.push({ field: 'assignedTo', message: 'assign a technician first' });
  if (to === 'done') {
    if (facts.openSteps.length)
      problems.push({
        field: 'steps',
        message: `tick off every step first; still open: ${facts.openSteps.map((s) => `step ${s.n}`).join(', ')}`,
      });
    if (!facts.hoursGiven) problems.push({ field: 'hours', message: 'read the engine and separator hours when the work is done' });
  }
  if (to === 'signed_off' && facts.missingChecklist?.length)
    problems.push({ field: 'checklist', message: `the sign-off checklist is not complete: ${facts.missingChecklist.join('; ')}` });
  return problems;
}

/** Steps, parts and the assignee may change until the work is done. */
export const editable = (status: JobStatus): boolean => status === 'planned' || status === 'in_progress';
