import { Badge, type BadgeTone } from '../../../components/ui/Badge'
import { FIRING_STATUS_LABELS, type FiringStatus } from '../../../../shared/workflow/firing-status'

const TONES: Record<FiringStatus, BadgeTone> = {
  open: 'celadon',
  full: 'ember',
  closed: 'neutral',
  loading: 'clay',
  firing: 'clay',
  cooling: 'clay',
  unloaded: 'neutral',
  cancelled: 'danger',
}

export function FiringStatusBadge({ status }: { status: FiringStatus }) {
  return (
    <span data-testid="firing-status" data-status={status}>
      <Badge tone={TONES[status]}>{FIRING_STATUS_LABELS[status]}</Badge>
    </span>
  )
}
