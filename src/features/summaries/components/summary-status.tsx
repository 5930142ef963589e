import { useEffect, useState } from 'react';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { ErrorView } from '../../../components/errors/error-view';
import { Loading } from '../../../components/ui/loading';
import { errorMessage } from '../../../lib/error-messages';
import { formatDateTime } from '../../../lib/labels';
import type { SummaryInfo } from '../../../shared/api/summaries';
import { useSummary } from '../api/get-summary';
import { useRetrySummary } from '../api/retry-summary';

/** Bytes in kB / MB with one decimal (1 kB = 1024 bytes, common practice for file sizes). */
export function formatBytes(bytes: number): string {
  if (bytes < 1024) return `${bytes} bytes`;
  if (bytes < 1024 * 1024) return `${(bytes / 1024).toFixed(1)} kB`;
  return `${(bytes / (1024 * 1024)).toFixed(1)} MB`;
}

function useSecondsSince(iso: string, running: boolean): number {
  const [now, setNow] = useState(() => Date.now());
  useEffect(() => {
    if (!running) return;
    const timer = window.setInterval(() => setNow(Date.now()), 1000);
    return () => window.clearInterval(timer);
  }, [running]);
  return Math.max(0, Math.round((now - new Date(iso).getTime()) / 1000));
}

function Pending({ summary }: { summary: SummaryInfo }) {
  const seconds = useSecondsSince(summary.createdAt, true);
  return (
    <div role="status" className="flex flex-col gap-2" data-testid="summary-pending">
      <p className="font-semibold">Making the summary PDF…</p>
      <progress className="h-2 w-full max-w-md accent-standpipe" aria-label="Making the summary PDF" />
      <p className="text-sm text-ink-soft">Started {seconds} s ago. This page checks every second and shows the PDF as soon as it is ready.</p>
    </div>
  );
}

export function DownloadPdfLink({ summary, label = 'Download the PDF' }: { summary: SummaryInfo; label?: string }) {
  return (
    <a
      href={summary.pdfUrl}
      download={summary.fileName}
      className="inline-flex items-center gap-2 rounded-md border-2 border-standpipe bg-standpipe px-4 py-2 text-sm font-semibold text-paper no-underline hover:bg-standpipe-strong hover:text-paper"
    >
      <svg width="16" height="16" viewBox="0 0 16 16" aria-hidden="true">
        <path d="M8 2v8m-3.5-3.5L8 10l3.5-3.5M2.5 13.5h11" fill="none" stroke="currentColor" strokeWidth="2" strokeLinecap="round" strokeLinejoin="round" />
      </svg>
      {label}
    </a>
  );
}

function Ready({ summary }: { summary: SummaryInfo }) {
  return (
    <div className="flex flex-col gap-3" data-testid="summary-ready">
      <p>
        <span className="font-semibold">Ready</span>
        {summary.readyAt ? ` since ${formatDateTime(summary.readyAt)}` : ''} · {summary.pageCount ?? '?'} page(s) ·{' '}
        {summary.byteLength !== null ? formatBytes(summary.byteLength) : 'size unknown'}
        {summary.generationMs !== null ? ` · made in ${summary.generationMs} ms` : ''}
      </p>
      <div>
        <DownloadPdfLink summary={summary} label={`Download the PDF (${summary.fileName})`} />
      </div>
      {summary.sha256 ? (
        <p className="text-sm text-ink-soft">
          The PDF never changes once made. Its SHA-256 fingerprint: <code className="break-all text-xs">{summary.sha256}</code>
        </p>
      ) : null}
    </div>
  );
}

function Failed({ summary, ids, canRetry }: { summary: SummaryInfo; ids: { projectId: string; systemId: string; revisionId: string }; canRetry: boolean }) {
  const retry = useRetrySummary();
  return (
    <div className="flex flex-col gap-2" data-testid="summary-failed">
      <Alert
        tone="fault"
        title="The summary PDF could not be made"
        actions={
          canRetry ? (
            <Button onClick={() => retry.mutate(ids)} pending={retry.isPending} pendingLabel="Making it again…">
              Make the PDF again
            </Button>
          ) : null
        }
      >
        {summary.error ?? 'No reason was given.'}
        {canRetry ? null : ' A designer of the project can make it again.'}
      </Alert>
      <div aria-live="assertive">
        {retry.isError ? (
          <Alert tone="fault" title="Not made again">
            {errorMessage(retry.error)}
          </Alert>
        ) : null}
      </div>
    </div>
  );
}

/** An issued revision's summary PDF: progress while it is being made, then the download, or the reason it failed. */
export function SummaryStatus({ projectId, systemId, revisionId, canRetry }: { projectId: string; systemId: string; revisionId: string; canRetry: boolean }) {
  const summary = useSummary(projectId, systemId, revisionId);
  if (summary.isPending) return <Loading label="Loading the summary…" />;
  if (summary.isError) return <ErrorView error={summary.error} onRetry={() => void summary.refetch()} what="the summary" />;
  const s = summary.data;
  if (s.status === 'pending') return <Pending summary={s} />;
  if (s.status === 'failed') return <Failed summary={s} ids={{ projectId, systemId, revisionId }} canRetry={canRetry} />;
  return <Ready summary={s} />;
}
