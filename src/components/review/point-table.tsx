'use client';

import { Fragment, useState, type FormEvent } from 'react';
import { Alert } from '@/components/ui/alert';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { controlClasses } from '@/components/ui/field';
import { Select } from '@/components/ui/select';
import { Table, Td, Th } from '@/components/ui/table';
import { poseLabel } from '@/components/readings/pose-label';
import { fetchJson } from '@/lib/client/fetch-json';
import { REVIEW_QUANTITY_LABELS, type OutlierMark, type PlanReview, type ReviewObservation, type ReviewPose } from '@/lib/review/types';
import { METHOD_SPECS } from '@/physics/measurement/methods';
import { failureMessage } from './failure';
import { formatNormalized, formatReviewMeasured, formatReviewValue, formatSignedPercent } from './format-review';

/** Longest reason for setting a point aside (the API's limit). */
const REASON_MAX = 500;

interface PointTableProps {
  review: PlanReview;
  base: string;
  /** set aside and restore (review.analyse, while the plan is not accepted) */
  canMark: boolean;
  canComment: boolean;
  onComment: (pointId: number) => void;
  onChanged: () => void;
}

function SetAsideForm({ pose, marked, base, onDone, onCancel }: { pose: ReviewPose; marked: Set<number>; base: string; onDone: () => void; onCancel: () => void }) {
  const open = pose.pointIds.map((id, i) => ({ id, seq: pose.seqs[i] })).filter((p) => !marked.has(p.id));
  const [pointId, setPointId] = useState(String(open[0]?.id ?? ''));
  const [reason, setReason] = useState('');
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const submit = async (event: FormEvent) => {
    event.preventDefault();
    if (reason.trim().length === 0) {
      setError('Say why this point is set aside.');
      return;
    }
    setBusy(true);
    setError(null);
    try {
      await fetchJson(`${base}/marks`, { method: 'POST', body: { pointId: Number(pointId), reason: reason.trim() } });
      onDone();
    } catch (failure) {
      setError(failureMessage(failure));
      setBusy(false);
    }
  };
  return (
    <form onSubmit={submit} aria-label={`Set aside at ${poseLabel(pose.pose)}`} className="space-y-2 rounded-md border border-caution-500/40 bg-caution-50 p-3">
      <p className="text-sm text-ink-800">A point set aside leaves the means, the summary and the fits; its readings stay in the logbook.</p>
      <div className="flex flex-wrap items-end gap-3">
        {open.length > 1 && (
          <label className="text-sm font-medium text-ink-800">
            <span className="block">Point</span>
            <Select aria-label="Point" value={pointId} onChange={(e) => setPointId(e.target.value)} options={open.map((p) => ({ value: String(p.id), label: `#${p.seq}` }))} className="mt-1 w-28" />
          </label>
        )}
        <label className="min-w-64 flex-1 text-sm font-medium text-ink-800">
          <span className="block">Reason for setting it aside</span>
          <input value={reason} maxLength={REASON_MAX} onChange={(e) => setReason(e.target.value)} className={`${controlClasses(Boolean(error))} mt-1 h-8`} />
        </label>
        <Button type="submit" size="sm" variant="primary" disabled={busy}>
          {busy ? 'Saving…' : 'Set aside'}
        </Button>
        <Button size="sm" onClick={onCancel} disabled={busy}>
          Cancel
        </Button>
      </div>
      {error && <Alert tone="error">{error}</Alert>}
    </form>
  );
}

function ReadingsDetail({ observations, quantity }: { observations: ReviewObservation[]; quantity: PlanReview['quantity'] }) {
  return (
    <details className="mt-1 text-xs text-ink-600">
      <summary className="cursor-pointer">
        {observations.length} {observations.length === 1 ? 'reading' : 'readings'}
      </summary>
      <ul className="mt-1 space-y-0.5">
        {observations.map((o) => (
          <li key={`${o.readingId}`} className="tabular-nums">
            #{o.seq} · {METHOD_SPECS[o.method]?.label ?? o.method}: {formatReviewMeasured(o.value, o.uncertainty, quantity)} · {formatSignedPercent(o.relative)} · {formatNormalized(o.normalized)}
            {o.autoOutlier && ' · flagged'}
            {o.setAside && ' · set aside'}
          </li>
        ))}
      </ul>
    </details>
  );
}

/**
 * One row per measured pose (repeats and reference revisits of a pose share it), with its readings
 * under a disclosure. Set aside works on one point; a pose with several points asks which.
 */
export function PointTable({ review, base, canMark, canComment, onComment, onChanged }: PointTableProps) {
  const [marking, setMarking] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState<number | null>(null);
  const quantity = review.quantity;
  const marks = new Map(review.marks.map((m) => [m.pointId, m]));
  const observed = new Map<string, ReviewObservation[]>();
  for (const o of review.observations) observed.set(o.poseKey, [...(observed.get(o.poseKey) ?? []), o]);
  const rows = review.poses.filter((p) => observed.has(p.key) || p.pointIds.some((id) => marks.has(id)));
  const unmeasured = review.poses.length - rows.length;

  const restore = async (mark: OutlierMark) => {
    setBusy(mark.pointId);
    setError(null);
    try {
      await fetchJson(`${base}/marks/${mark.pointId}`, { method: 'DELETE' });
      onChanged();
    } catch (failure) {
      setError(failureMessage(failure));
    } finally {
      setBusy(null);
    }
  };

  return (
    <div>
      {error && <Alert tone="error" className="m-4">{error}</Alert>}
      <Table caption="Measured poses with predicted and measured values">
        <thead>
          <tr>
            <Th dense>Points</Th>
            <Th dense>Pose</Th>
            <Th dense className="text-right">Predicted</Th>
            <Th dense className="text-right">Measured ± u (n)</Th>
            <Th dense className="text-right">Relative error</Th>
            <Th dense className="text-right">Normalized</Th>
            <Th dense>Flags</Th>
            {(canMark || canComment) && <Th dense><span className="sr-only">Actions</span></Th>}
          </tr>
        </thead>
        <tbody>
          {rows.map((pose) => {
            const poseMarks = pose.pointIds.map((id) => marks.get(id)).filter((m): m is OutlierMark => m !== undefined);
            const marked = new Set(poseMarks.map((m) => m.pointId));
            const observations = observed.get(pose.key) ?? [];
            const flagged = observations.filter((o) => o.autoOutlier && !o.setAside).length;
            const firstMeasured = observations[0]?.pointId ?? pose.pointIds[0];
            return (
              <Fragment key={pose.key}>
                <tr data-pose={pose.key} aria-label={`Points ${pose.seqs.map((s) => `#${s}`).join(', ')}`}>
                  <Td dense className="whitespace-nowrap font-mono text-xs tabular-nums text-ink-600">{pose.seqs.map((s) => `#${s}`).join(', ')}</Td>
                  <Td dense>
                    <span className="whitespace-nowrap text-ink-900">{poseLabel(pose.pose)}</span>
                    {observations.length > 0 && <ReadingsDetail observations={observations} quantity={quantity} />}
                  </Td>
                  <Td dense className="whitespace-nowrap text-right tabular-nums">{formatReviewValue(pose.predicted, quantity)}</Td>
                  <Td dense className="whitespace-nowrap text-right tabular-nums">
                    {pose.measured ? `${formatReviewMeasured(pose.measured.mean, pose.measured.uncertainty, quantity)} (${pose.measured.n})` : '—'}
                  </Td>
                  <Td dense className="whitespace-nowrap text-right tabular-nums">{formatSignedPercent(pose.relative)}</Td>
                  <Td dense className="whitespace-nowrap text-right tabular-nums">{formatNormalized(pose.normalized)}</Td>
                  <Td dense className="max-w-64">
                    <div className="flex flex-col items-start gap-1">
                      {(pose.autoOutlier || flagged > 0) && (
                        <Badge tone="copper" className="whitespace-nowrap">
                          ▲ flagged, beyond 3 u
                        </Badge>
                      )}
                      {poseMarks.map((m) => (
                        <span key={m.pointId} className="text-xs text-ink-700">
                          <Badge className="whitespace-nowrap">◇ set aside #{m.seq}</Badge> “{m.reason}” ({m.markedBy.name})
                        </span>
                      ))}
                    </div>
                  </Td>
                  {(canMark || canComment) && (
                    <Td dense>
                      <div className="flex flex-col items-end gap-1">
                        {canMark && marked.size < pose.pointIds.length && (
                          <Button size="sm" onClick={() => setMarking(marking === pose.key ? null : pose.key)} aria-expanded={marking === pose.key}>
                            Set aside
                          </Button>
                        )}
                        {canMark &&
                          poseMarks.map((m) => (
                            <Button key={m.pointId} size="sm" disabled={busy === m.pointId} onClick={() => restore(m)}>
                              Restore{poseMarks.length > 1 || pose.pointIds.length > 1 ? ` #${m.seq}` : ''}
                            </Button>
                          ))}
                        {canComment && (
                          <Button size="sm" variant="ghost" onClick={() => onComment(firstMeasured)}>
                            Comment
                          </Button>
                        )}
                      </div>
                    </Td>
                  )}
                </tr>
                {marking === pose.key && (
                  <tr>
                    <td colSpan={8} className="border-b border-ink-100 px-5 py-3">
                      <SetAsideForm
                        pose={pose}
                        marked={marked}
                        base={base}
                        onCancel={() => setMarking(null)}
                        onDone={() => {
                          setMarking(null);
                          onChanged();
                        }}
                      />
                    </td>
                  </tr>
                )}
              </Fragment>
            );
          })}
        </tbody>
      </Table>
      {unmeasured > 0 && (
        <p className="px-5 py-3 text-xs text-ink-500">
          {unmeasured.toLocaleString('en')} {unmeasured === 1 ? 'pose has' : 'poses have'} no reading of {REVIEW_QUANTITY_LABELS[quantity].symbol} and {unmeasured === 1 ? 'is' : 'are'} not listed.
        </p>
      )}
    </div>
  );
}
