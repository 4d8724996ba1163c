import { Badge, type BadgeTone } from '@/components/ui/badge';
import { PREDICTION_LABEL, STATE_LABEL, type PlanState, type PredictionStatus } from './plan-types';

const STATE_TONE: Record<PlanState, BadgeTone> = { draft: 'neutral', on_bench: 'copper', in_review: 'flux', accepted: 'dark' };
const PREDICTION_TONE: Record<PredictionStatus, BadgeTone> = { none: 'neutral', running: 'flux', done: 'flux', failed: 'danger', cancelled: 'neutral' };

/** A plan's state in our plain words: "draft", "on the bench", "in review", "accepted". */
export const PlanStateBadge = ({ state }: { state: PlanState }) => <Badge tone={STATE_TONE[state]}>{STATE_LABEL[state]}</Badge>;

export const PredictionBadge = ({ status }: { status: PredictionStatus }) => <Badge tone={PREDICTION_TONE[status]}>{PREDICTION_LABEL[status]}</Badge>;
