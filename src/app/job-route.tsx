import { useNavigate, useParams } from 'react-router-dom';
import { useMe } from '../features/auth/api/get-me.ts';
import { useJobs } from '../features/jobs/api/get-jobs.ts';
import { EditJobForm } from '../features/jobs/components/forms/edit-job-form.tsx';
import { NewBoardForm } from '../features/jobs/components/forms/new-board-form.tsx';
import { SiteForm } from '../features/jobs/components/forms/site-form.tsx';
import { JobRecordPage } from '../features/job-record/components/job-record-page.tsx';
import { SendPanel } from '../features/mail/components/send-panel.tsx';
import { SigningPanel } from '../features/signing/components/signing-panel.tsx';
import type { JobScreenAction } from '../features/job-record/commands.ts';
import { JobPhotosPanel } from '../features/photos-on-job/components/job-photos-panel.tsx';
import { IssuePanel } from '../features/issue/components/issue-panel.tsx';
import { JobStatePanel } from '../features/review/components/job-state-panel.tsx';
import type { JobDetail } from '../../shared/schemas/jobs.ts';

/**
 * The job screen as the app composes it: the job record (src/features/job-record) with the forms
 * of the jobs feature as commands (new board, edit the site, edit the job), and the panels other
 * features add (review, signing, issue, mail, photos of the notes) — place them in `panels`.
 */
export function JobRoute() {
  return <JobRecordPage actions={jobActions} panels={<JobPanels />} />;
}

/** The job's state and gate, signing, issuing and sending to the client, beside the record. */
function JobPanels() {
  const jobId = Number(useParams().jobId);
  const { data: me } = useMe();
  if (!me || !Number.isSafeInteger(jobId) || jobId <= 0) return null;
  return (
    <>
      <SigningPanel jobId={jobId} person={{ role: me.role, name: me.name }} />
      <IssuePanel jobId={jobId} role={me.role} />
      <SendPanel jobId={jobId} personRole={me.role} />
      {/* Beside sending: which photos go with the document is chosen here. */}
      <JobPhotosPanel jobId={jobId} role={me.role} />
      {/* Last: its gate list arrives after the others and changes length as the record is
          filled, so above them it would move the signature box under a moving pen. */}
      <JobStatePanel jobId={jobId} role={me.role} />
    </>
  );
}

function NewBoardAction({ detail }: { detail: JobDetail }) {
  const jobs = useJobs();
  const navigate = useNavigate();
  if (jobs.isPending) return <p className="text-muted">Loading…</p>;
  if (jobs.isError) return <p role="alert">The jobs could not be loaded: {jobs.error.message}</p>;
  // A new board goes straight to its console: typing its circuits is what comes next.
  return <NewBoardForm tree={jobs.data} jobId={detail.job.id} fixedJob onCreated={(board) => void navigate(`/boards/${board.id}`)} />;
}

const jobActions: JobScreenAction[] = [
  {
    id: 'job.new-board',
    label: 'New board',
    keywords: ['add', 'distribution', 'consumer unit', 'ways', 'copy'],
    shortcut: 'Alt+Shift+KeyB',
    when: (detail) => (detail.job.state === 'approved' || detail.job.state === 'issued' ? 'The job is approved: no board can be added' : true),
    render: ({ detail }) => <NewBoardAction detail={detail} />,
  },
  {
    id: 'job.edit-site',
    label: 'Edit the site',
    keywords: ['client', 'address', 'contact', 'e-mail', 'earthing'],
    shortcut: 'Alt+Shift+KeyE',
    render: ({ detail, close }) => <SiteForm site={detail.site} onSaved={close} />,
  },
  {
    id: 'job.edit-job',
    label: 'Edit the job’s reference and dates',
    keywords: ['reference', 'visit', 'date'],
    shortcut: 'Alt+Shift+KeyD',
    render: ({ detail, close }) => <EditJobForm job={detail.job} onSaved={close} />,
  },
];
