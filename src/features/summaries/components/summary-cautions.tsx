import { SUMMARY_CAUTIONS } from '../../../shared/api/summaries';

/** The cautions printed in every summary, in the same words as the PDF. */
export function SummaryCautions({ className }: { className?: string }) {
  return (
    <details className={className} data-testid="summary-cautions">
      <summary className="cursor-pointer text-sm font-semibold">Cautions printed in the summary ({SUMMARY_CAUTIONS.length})</summary>
      <ul className="mt-2 flex max-w-prose list-disc flex-col gap-1 pl-5 text-sm">
        {SUMMARY_CAUTIONS.map((c) => (
          <li key={c}>{c}</li>
        ))}
      </ul>
    </details>
  );
}
