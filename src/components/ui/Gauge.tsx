interface GaugeProps {
  value: number
  max: number
  /** What is measured, e.g. "Space held". */
  label: string
  /** The reading in words, e.g. "40 of 100 litres held". */
  valueText: string
  className?: string
}

/** A horizontal fill bar (role meter): calm while there is room, warmer as it fills. */
export function Gauge({ value, max, label, valueText, className = '' }: GaugeProps) {
  const share = max > 0 ? Math.min(1, Math.max(0, value / max)) : 0
  const tone = share >= 1 ? 'bg-clay-600' : share >= 0.75 ? 'bg-ember-500' : 'bg-celadon-500'
  return (
    <div
      role="meter"
      aria-label={label}
      aria-valuemin={0}
      aria-valuemax={max}
      aria-valuenow={Math.min(value, max)}
      aria-valuetext={valueText}
      className={`h-2 w-full overflow-hidden rounded-full bg-slip-200 ${className}`}
    >
      <div className={`h-full rounded-full ${tone}`} style={{ width: `${share * 100}%` }} />
    </div>
  )
}
