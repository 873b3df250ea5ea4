/** The address of a run's page for an e-mail, from the lab's public address (QWELL_PUBLIC_URL). */
export function runLink(publicUrl: string, runId: number): string {
  return `${publicUrl.replace(/\/+$/, '')}/runs/${runId}`;
}
