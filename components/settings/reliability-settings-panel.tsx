import { getShopSettings } from "@/db/queries/shops";
import { requireShopPage } from "@/lib/auth/guards";
import { DEFAULT_RELIABILITY_SETTINGS, TECHNOLOGIES, type ReliabilitySettings } from "@/lib/bank";
import { TECHNOLOGY_LABELS } from "@/lib/vocabulary";

const pct = (x: number) => `${Number((x * 100).toPrecision(3))} %`;

/** "(default, common practice)" beside a value that is still the default, else "(the shop's)". */
function Origin({ isDefault }: { isDefault: boolean }) {
  return <span className="block text-xs text-ink-500">{isDefault ? "default, common practice" : "the shop's own"}</span>;
}

/**
 * The shop's failure, yield and life settings (`reliabilitySettings`, a group of its own beside
 * the design factors), shown read-only: the settings form edits them as their own group. Each
 * value says whether it is still the default, which is common practice recalled from memory.
 */
export async function ReliabilitySettingsPanel({ shopSlug }: { shopSlug: string }) {
  const ctx = await requireShopPage(shopSlug, "settings:write");
  const row = await getShopSettings(ctx.shop.id);
  const s: ReliabilitySettings = { ...DEFAULT_RELIABILITY_SETTINGS, ...row?.reliabilitySettings };
  const d = DEFAULT_RELIABILITY_SETTINGS;
  return (
    <section aria-labelledby="reliability-title" className="rounded-lg bg-white p-5 shadow-sm ring-1 ring-ink-100" data-testid="reliability-settings">
      <h2 id="reliability-title" className="text-lg font-semibold">
        Failure, yield and life
      </h2>
      <p className="mt-1 max-w-3xl text-sm text-ink-600">
        How options estimate expected life, how long a switched-off hybrid bank must stay above its cells&apos; minimum voltage, and how cell capacitances
        spread in the tolerance yield. The defaults are common practice recalled from memory, not a maker&apos;s data: set them from your suppliers&apos; life
        curves. Shown here read-only.
      </p>
      <dl className="mt-4 grid gap-x-8 gap-y-1 text-sm sm:grid-cols-2">
        {TECHNOLOGIES.map((t) => (
          <div key={t} className="flex justify-between gap-4 border-b border-ink-100 py-1.5">
            <dt className="text-ink-600">{TECHNOLOGY_LABELS[t]}: life doubles for each</dt>
            <dd className="num text-right text-ink-900">
              {pct(s.voltageDoublingStep[t])} below the rated voltage
              <Origin isDefault={s.voltageDoublingStep[t] === d.voltageDoublingStep[t]} />
            </dd>
          </div>
        ))}
        <div className="flex justify-between gap-4 border-b border-ink-100 py-1.5">
          <dt className="text-ink-600">Temperature</dt>
          <dd className="text-right text-ink-900">
            life doubles for each 10 °C below the rated temperature
            <Origin isDefault />
          </dd>
        </div>
        <div className="flex justify-between gap-4 border-b border-ink-100 py-1.5">
          <dt className="text-ink-600">Longest life shown</dt>
          <dd className="num text-right text-ink-900">
            {s.maxLifeYears} years
            <Origin isDefault={s.maxLifeYears === d.maxLifeYears} />
          </dd>
        </div>
        <div className="flex justify-between gap-4 border-b border-ink-100 py-1.5">
          <dt className="text-ink-600">Standby a hybrid bank must outlast</dt>
          <dd className="num text-right text-ink-900">
            {s.standbyDays} days
            <Origin isDefault={s.standbyDays === d.standbyDays} />
          </dd>
        </div>
        <div className="flex justify-between gap-4 border-b border-ink-100 py-1.5">
          <dt className="text-ink-600">Capacitance spread in the yield</dt>
          <dd className="text-right text-ink-900">
            {s.yieldDistribution === "uniform" ? "uniform over the graded band" : "normal, the tolerance as 3 standard deviations"}
            <Origin isDefault={s.yieldDistribution === d.yieldDistribution} />
          </dd>
        </div>
      </dl>
    </section>
  );
}
