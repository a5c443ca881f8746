import { useParams } from 'react-router-dom';
import { useMe } from '../features/auth/api/get-me.ts';
import { JobPhotosPanel } from '../features/photos-on-job/components/job-photos-panel.tsx';
import { ReviewJobPage } from '../features/review/components/review-job-page.tsx';
import { ReviewQueuePage } from '../features/review/components/review-queue-page.tsx';
import { RequireRole } from './require-role.tsx';

const refusal = 'Only a reviewer or an admin reviews jobs. A tester submits a job for review from its job screen.';

/** `/review`: the jobs waiting for a reviewer. */
export function ReviewQueueRoute() {
  return (
    <RequireRole roles={['reviewer', 'admin']} refusal={refusal}>
      <ReviewQueuePage />
    </RequireRole>
  );
}

/** `/review/:jobId`: one job under review, with the signed-in person's role and the job's photos. */
export function ReviewJobRoute() {
  const { jobId: param } = useParams();
  const jobId = Number(param);
  const me = useMe();
  if (!Number.isSafeInteger(jobId) || jobId <= 0) {
    return (
      <p role="alert" className="p-4">
        “{param}” is not a job number.
      </p>
    );
  }
  return (
    <RequireRole roles={['reviewer', 'admin']} refusal={refusal}>
      <ReviewJobPage
        key={jobId}
        jobId={jobId}
        role={me.data?.role ?? null}
        recordPanels={<JobPhotosPanel jobId={jobId} role={me.data?.role ?? null} />}
      />
    </RequireRole>
  );
}
