import type { ServerAnalysisDto } from '@shared/schemas/clip.schema';
import { Badge } from '@/components/ui/badge';

/**
 * Where a clip's whole-clip analysis stands, in two words: analysed, analysing on the server (with
 * its share done), queued, or failed. Nothing for a clip nobody analysed yet.
 */
export function AnalysisBadge(props: {
  storedFrames: number;
  frameCount: number | null;
  serverAnalysis: ServerAnalysisDto | null;
}) {
  const { serverAnalysis: server, storedFrames, frameCount } = props;
  if (server?.status === 'running') {
    const percent = server.total > 0 ? Math.round((server.done / server.total) * 100) : 0;
    return <Badge tone="info">Analysing {percent} %</Badge>;
  }
  if (server?.status === 'queued') return <Badge tone="info">Queued for analysis</Badge>;
  if (frameCount !== null && frameCount > 0 && storedFrames >= frameCount)
    return <Badge tone="good">Analysed</Badge>;
  if (server?.status === 'failed') return <Badge tone="bad">Analysis failed</Badge>;
  return null;
}
