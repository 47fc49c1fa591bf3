import { LogoMark } from "@/components/ui/logo";
import { TextLink } from "@/components/ui/text-link";

/** Reporting arrives in a later release; until then, say so plainly and point to what helps now. */
export function ReportComingSoon() {
  return (
    <section aria-labelledby="report-heading" className="rounded-lg border-2 border-dashed border-dew-300 bg-dew-50 p-5">
      <div className="flex flex-col items-start gap-3 sm:flex-row">
        <LogoMark className="size-10 shrink-0 text-dew-600" />
        <div className="flex flex-col gap-2">
          <h2 id="report-heading" className="text-xl font-bold">
            Report damp or mould
          </h2>
          <p className="inline-flex w-fit items-center rounded-pill bg-dew-100 px-3 py-0.5 text-sm font-semibold text-dew-800">Coming soon</p>
          <p>
            Soon you will be able to tell us about damp, condensation or mould here, with photos, and follow what happens next. Until
            then, please contact your landlord's repairs team in the usual way.
          </p>
          <div>
            <h3 className="font-bold">Until then, please keep safe</h3>
            <ul className="mt-1 list-disc space-y-1 pl-5">
              <li>If you smell gas, open windows, do not use switches or flames, leave the home and call the gas emergency number.</li>
              <li>If water is near lights, sockets or a fuse box, keep away from them and tell your landlord straight away.</li>
              <li>
                If mould is spreading fast, or someone at home has asthma or other breathing problems, tell your landlord now rather than
                waiting.
              </li>
              <li>
                If you wipe a small patch of mould, wear gloves, open a window and use a damp cloth. Do not brush it dry, which spreads
                spores. Larger areas are a job for your landlord.
              </li>
            </ul>
          </div>
          <p>
            Curious how cold surfaces and damp air lead to condensation?{" "}
            <TextLink to="/calculator">Try the dew point calculator</TextLink>.
          </p>
        </div>
      </div>
    </section>
  );
}
