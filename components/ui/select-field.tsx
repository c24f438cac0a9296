import type { SelectHTMLAttributes } from "react";

export interface SelectFieldProps extends SelectHTMLAttributes<HTMLSelectElement> {
  name: string;
  label: string;
  options: { value: string; label: string }[];
  errors?: string[];
}

export function SelectField({ name, label, options, errors, id, ...select }: SelectFieldProps) {
  const selectId = id ?? `f-${name}`;
  const errorId = errors?.length ? `${selectId}-error` : undefined;
  return (
    <div>
      <label htmlFor={selectId} className="field-label">
        {label}
      </label>
      <select id={selectId} name={name} className="field-input" aria-invalid={errorId ? true : undefined} aria-describedby={errorId} {...select}>
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
      {errorId && (
        <p id={errorId} className="field-error" aria-live="polite">
          {errors!.join(" ")}
        </p>
      )}
    </div>
  );
}
