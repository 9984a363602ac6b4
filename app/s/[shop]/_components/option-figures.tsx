import type { DesignFactors, Requirement } from "@/lib/bank";
import type { PricedOption } from "@/lib/quoting/types";
import { formatMoney } from "@/lib/pricing/currency";
import { formatDuration, formatQuantity as q } from "@/lib/quantities";
import { TECHNOLOGY_LABELS } from "@/lib/vocabulary";

function Row({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <div className="flex justify-between gap-4 py-1">
      <dt className="text-ink-600">{label}</dt>
      <dd className="num text-right font-medium text-ink-900">{children}</dd>
    </div>
  );
}

/** Cautions and warnings first, in hazard colours, then the figures of the option in focus. */
export function OptionCautions({ option }: { option: PricedOption }) {
  return (
    <div className="space-y-3">
      {option.cautions.length > 0 ? (
        <div role="note" aria-label="Safety cautions" className="rounded-md border-l-4 border-danger-500 bg-danger-100 px-4 py-3 text-sm text-danger-700">
          <p className="font-semibold">⚠ Cautions</p>
          <ul className="mt-1 list-disc space-y-1 pl-5">
            {option.cautions.map((c) => (
              <li key={c}>{c}</li>
            ))}
          </ul>
        </div>
      ) : null}
      {option.warnings.length > 0 ? (
        <div role="note" aria-label="Warnings" className="rounded-md border-l-4 border-hazard-500 bg-hazard-100 px-4 py-3 text-sm text-hazard-700">
          <ul className="list-disc space-y-1 pl-5">
            {option.warnings.map((w) => (
              <li key={w}>{w}</li>
            ))}
          </ul>
        </div>
      ) : null}
      {option.cautions.some((c) => c.includes("engineering estimate")) ? null : (
        <p className="text-xs text-ink-600">These figures are an engineering estimate; local electrical codes and licensed practice decide.</p>
      )}
    </div>
  );
}

export function OptionFigures({
  option,
  requirement,
  factors,
  currency,
  datasheetHref = null,
}: {
  option: PricedOption;
  requirement: Requirement;
  factors: DesignFactors;
  currency: string;
  /** the cell's datasheet, when the shop has one */
  datasheetHref?: string | null;
}) {
  const b = option.balancing;
  const bleeder = option.discharge.bleeder;
  return (
    <div className="grid gap-x-8 gap-y-4 text-sm sm:grid-cols-2" data-testid="option-figures">
      <div>
        <p className="mb-1 text-xs font-semibold uppercase tracking-wide text-ink-500">Bank</p>
        <dl>
          <Row label="Cell">
            {option.cell.sku} · {TECHNOLOGY_LABELS[option.cell.technology]}
          </Row>
          {datasheetHref ? (
            <Row label="Datasheet">
              <a href={datasheetHref} className="text-copper-600 hover:underline" data-testid="option-datasheet">
                PDF
              </a>
            </Row>
          ) : null}
          <Row label="Cell rating">
            {q(option.cell.capacitance, "F")} · {q(option.cell.ratedVoltage, "V")}
          </Row>
          <Row label="Capacitance nominal / design">
            {q(option.capacitance.nominal, "F")} / {q(option.capacitance.design, "F")}
          </Row>
          <Row label="Rated voltage (matched cells)">{q(option.maxVoltage, "V")}</Row>
          <Row label={`Stored energy at ${q(requirement.maxVoltage, "V")}`}>{q(option.storedEnergy, "J")}</Row>
          <Row label="Usable energy (end of life)">{q(option.usableEnergy, "J")}</Row>
          {option.backupSeconds !== undefined ? <Row label="Backup time (end of life)">{formatDuration(option.backupSeconds)}</Row> : null}
          <Row label="ESR new / end of life">
            {q(option.esr.new, "Ω")} / {q(option.esr.endOfLife, "Ω")}
          </Row>
          {option.peakDrop !== null ? <Row label="Voltage drop at peak current">{q(option.peakDrop, "V")}</Row> : null}
          <Row label="Mass · volume">
            {q(option.mass, "kg")} · {q(option.volume, "m³")}
          </Row>
          <Row label="Lead time">{option.leadTimeDays === 0 ? "from stock" : `${option.leadTimeDays} days`}</Row>
        </dl>
      </div>
      <div>
        <p className="mb-1 text-xs font-semibold uppercase tracking-wide text-ink-500">Balancing and discharge</p>
        <dl>
          <Row label="Worst-case cell voltage">
            <span className={option.worstCellVoltage > option.cell.ratedVoltage ? "text-danger-700" : undefined}>{q(option.worstCellVoltage, "V")}</span> of{" "}
            {q(option.cell.ratedVoltage, "V")} rated
          </Row>
          {b.resistance !== null ? (
            <>
              <Row label="Balancing resistor">
                {b.count} × {q(b.resistance, "Ω")}
                {b.powerRating !== null ? `, ${q(b.powerRating, "W")} rated` : ""}
              </Row>
              <Row label="Dissipation per resistor">{q(b.power, "W")}</Row>
              <Row label="Standby loss">{q(b.standbyLoss, "W")}</Row>
              <Row label="Balancing time constant">{formatDuration(b.timeConstant)}</Row>
            </>
          ) : (
            <Row label="Balancing resistors">none</Row>
          )}
          {b.activeBoard ? (
            <Row label="Active balancing boards">
              {b.activeBoard.count} × {b.activeBoard.sku}
            </Row>
          ) : null}
          <Row label={`Time to ${q(factors.safeVoltage, "V")} after switch-off`}>
            {requirement.maxVoltage <= factors.safeVoltage ? "never above it" : formatDuration(option.discharge.secondsToSafe)}
          </Row>
          {bleeder ? (
            <>
              <Row label={bleeder.switched ? "Switched discharge resistor" : "Bleeder"}>
                {q(bleeder.resistance, "Ω")}
                {bleeder.powerRating !== null ? `, ${q(bleeder.powerRating, "W")} rated` : ""}
              </Row>
              <Row label="Bleeder dissipation · energy to absorb">
                {q(bleeder.power, "W")} · {q(bleeder.energy, "J")}
              </Row>
            </>
          ) : (
            <Row label="Bleeder">not needed</Row>
          )}
        </dl>
        {option.price ? (
          <>
            <p className="mb-1 mt-4 text-xs font-semibold uppercase tracking-wide text-ink-500">Price</p>
            <dl>
              <Row label="Per bank">{formatMoney(option.price.perBank, currency)}</Row>
              <Row label={`Subtotal (${option.price.quantity})`}>{formatMoney(option.price.subtotal, currency)}</Row>
              <Row label="Tax">{formatMoney(option.price.tax, currency)}</Row>
              <Row label="Total">
                <span data-testid="option-total">{formatMoney(option.price.amount, currency)}</span>
              </Row>
            </dl>
          </>
        ) : null}
      </div>
    </div>
  );
}
