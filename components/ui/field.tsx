import type { InputHTMLAttributes, Ref } from "react";

export interface FieldProps extends InputHTMLAttributes<HTMLInputElement> {
  name: string;
  label: string;
  hint?: string;
  errors?: string[];
  ref?: Ref<HTMLInputElement>;
}

/** A labelled input whose errors are announced and tied to it with aria-describedby. */
export function Field({ name, label, hint, errors, id, ref, ...input }: FieldProps) {
  const inputId = id ?? `f-${name}`;
  const hintId = hint ? `${inputId}-hint` : undefined;
  const errorId = errors?.length ? `${inputId}-error` : undefined;
  return (
    <div>
      <label htmlFor={inputId} className="field-label">
        {label}
      </label>
      <input
        id={inputId}
        ref={ref}
        name={name}
        className="field-input"
        aria-invalid={errors?.length ? true : undefined}
        aria-describedby={[hintId, errorId].filter(Boolean).join(" ") || undefined}
        {...input}
      />
      {hint && (
        <p id={hintId} className="mt-1 text-sm text-ink-soft">
          {hint}
        </p>
      )}
      {errorId && (
        <p id={errorId} className="field-error" aria-live="polite">
          {errors!.join(" ")}
        </p>
      )}
    </div>
  );
}
