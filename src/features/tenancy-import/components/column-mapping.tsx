import { Select } from "@/components/ui/field";
import { TENANCY_FIELDS, type TenancyField, type TenancyMapping } from "@/lib/contracts";

export const FIELD_LABELS: Record<TenancyField, string> = {
  reference: "Tenancy reference",
  uprn: "UPRN of the home",
  name: "Tenant's name",
  firstName: "First name (if the name is in two columns)",
  lastName: "Surname (if the name is in two columns)",
  email: "E-mail address",
  phone: "Phone",
  startDate: "Start date",
  endDate: "End date",
  language: "Preferred language (a code such as en or cy)",
  accessNeeds: "Access needs",
  vulnerability: "Household vulnerability",
  consent: "Consent held (yes or no)",
};

interface ColumnMappingProps {
  headers: string[];
  mapping: TenancyMapping;
  onChange: (mapping: TenancyMapping) => void;
}

/** One choice per field: which of the file's columns holds it, or none. */
export function ColumnMapping({ headers, mapping, onChange }: ColumnMappingProps) {
  return (
    <fieldset className="grid gap-3 sm:grid-cols-2">
      <legend className="mb-2 font-semibold text-ink">Which column holds what</legend>
      {TENANCY_FIELDS.map((field) => (
        <Select
          key={field}
          label={FIELD_LABELS[field]}
          value={mapping[field] === null ? "" : String(mapping[field])}
          onChange={(e) => onChange({ ...mapping, [field]: e.target.value === "" ? null : Number(e.target.value) })}
        >
          <option value="">Not in this file</option>
          {headers.map((h, i) => (
            <option key={i} value={i}>
              {h || `Column ${i + 1}`}
            </option>
          ))}
        </Select>
      ))}
    </fieldset>
  );
}
