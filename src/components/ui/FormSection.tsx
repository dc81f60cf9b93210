import { useId, type ReactNode } from 'react'

/** One titled part of a long form, announced as a region by its heading. */
export function FormSection({
  title,
  lead,
  children,
  actions,
}: {
  title: string
  lead?: ReactNode
  children: ReactNode
  actions?: ReactNode
}) {
  const id = useId()
  return (
    <section aria-labelledby={id} className="rounded-card border border-slip-200 bg-white p-5 shadow-card">
      <div className="mb-4 flex flex-wrap items-start justify-between gap-2">
        <div>
          <h2 id={id} className="text-lg font-semibold text-slip-900">
            {title}
          </h2>
          {lead && <p className="mt-0.5 text-sm text-slip-600">{lead}</p>}
        </div>
        {actions}
      </div>
      {children}
    </section>
  )
}
