import { lazy, Suspense } from 'react';
import { Loading } from '../../../components/query-state';
import { Section } from '../../../components/page';
import type { IngestReportResult } from '../types';

// Charts (recharts) and the player (three.js for 3D) load only on this page, after the report.
const ReportPlots = lazy(() => import('./report-plots'));
const QuickLookPlayer = lazy(() => import('./quick-look-player'));

/** The figures and the quick-look playback of one ingested trajectory file. */
export function IngestReport({ result }: { result: Record<string, unknown> }) {
  const r = result as IngestReportResult;
  if (r.status !== 'ok' || !r.series) return null;
  return (
    <>
      <Section title="Quick look">
        {r.quickLook?.frames?.length ? (
          <Suspense fallback={<Loading label="Loading the player…" />}>
            <QuickLookPlayer quickLook={r.quickLook} />
          </Suspense>
        ) : (
          <p className="text-sm text-ink/70">No playback sample was kept for this file.</p>
        )}
      </Section>
      <Section title="Figures">
        <Suspense fallback={<Loading label="Loading the figures…" />}>
          <ReportPlots result={r} />
        </Suspense>
      </Section>
    </>
  );
}
