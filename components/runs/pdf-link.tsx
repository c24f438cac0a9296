/** Opens the run's debrief as a PDF (made on the server) in a new tab. */
export function PdfLink({ runId, label = "Debrief as PDF" }: { runId: number; label?: string }) {
  return (
    <a href={`/api/runs/${runId}/report.pdf`} className="btn-quiet" target="_blank" rel="noopener" type="application/pdf">
      {label}
    </a>
  );
}
