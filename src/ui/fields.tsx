/**
 * Input fields. Each shows its label, the value in the unit the user picked (switchable per field,
 * SI and US customary), a short help text with the usual range and its source, and the engine's
 * message when the value is rejected. Text that is not a number never reaches the case: the field
 * keeps what was typed, says what is wrong, and the last good value stays saved.
 */
import { useState, useEffect } from 'preact/hooks';
import type { ComponentChildren } from 'preact';
import { UNITS, unitsOf, type Dimension } from '../core/units';
import { shownQuantity, withFieldUnit } from '../case/unitSystem';
import type { Quantity } from '../case/schema';
import { fieldIssue, fieldWarnings } from './validity';
import { CONVERTED_DIGITS, formatSig } from '../case/numbers';
import { currentCase, historyEpoch, updateCase } from './state';
import { fieldInfo } from '../case/fields';

/** The props with the label filled in from the field catalogue. */
function labelled<P extends BaseProps>(p: P): P & { label: string } {
  return { ...p, label: p.label ?? fieldInfo(p.field)?.label ?? p.field };
}

let uid = 0;
function useId(prefix: string): string {
  const [id] = useState(() => `${prefix}-${++uid}`);
  return id;
}

/** Up to 4 significant digits, no trailing zeros, plain notation where it reads well (one rule: src/case/numbers.ts). */
export const fmtNum = formatSig;

function parseNumber(text: string): number | null {
  const t = text.trim().replace(/\s/g, '').replace(',', '.');
  if (t === '' || !/^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i.test(t)) return null;
  const v = Number(t);
  return Number.isFinite(v) ? v : null;
}

interface BaseProps {
  /** default: the field's label in the catalogue (src/case/fields.ts), the words every message uses */
  label?: string;
  /** case field path, e.g. 'aquifer.hydraulicConductivity' (matches the engine's messages) */
  field: string;
  help?: ComponentChildren;
  /** extra message from the screen itself (e.g. a derived value) */
  note?: ComponentChildren;
}

function FieldShell(props: BaseProps & { label: string; id: string; localError: string | null; children: ComponentChildren }) {
  const issue = fieldIssue(props.field);
  const msg = props.localError ?? issue;
  const warnings = msg ? [] : fieldWarnings(props.field);
  const helpId = `${props.id}-help`;
  return (
    <div class={`dg-field${msg ? ' dg-invalid' : ''}`} data-field={props.field}>
      <label for={props.id}>{props.label}</label>
      <div class="dg-field-row">{props.children}</div>
      {msg && (
        <p class="dg-field-error" role="alert" id={`${props.id}-err`}>
          {msg}
        </p>
      )}
      {warnings.map((w) => (
        <p class="dg-field-warn" key={w}>
          {w}
        </p>
      ))}
      {props.note && <p class="dg-field-note">{props.note}</p>}
      {props.help && (
        <p class="dg-help" id={helpId}>
          {props.help}
        </p>
      )}
    </div>
  );
}

function useDraft(value: number | null, display: (v: number) => string) {
  const shown = value === null ? '' : display(value);
  const [text, setText] = useState(shown);
  const [focused, setFocused] = useState(false);
  // follow outside changes (map drags, presets, opening a case) unless the user is typing
  useEffect(() => {
    if (!focused) setText(shown);
  }, [shown, focused]);
  // an undo or redo rules over the text being typed: show the case's value
  const epoch = historyEpoch.value;
  useEffect(() => setText(shown), [epoch]);
  return { text, setText, focused, setFocused };
}

/** The text box of a number: keeps what was typed, passes on only finite numbers. */
function NumberInput(props: {
  id: string;
  label: string;
  field: string;
  value: number;
  /** how the last valid value is written in the message, e.g. "12 m/d" */
  kept: string;
  localError: string | null;
  setLocalError: (m: string | null) => void;
  onNumber: (v: number) => void;
  /** significant digits shown: 6 for a value as typed, CONVERTED_DIGITS for one converted to another unit */
  digits?: number;
}) {
  const d = useDraft(props.value, (v) => fmtNum(v, props.digits ?? 6));
  return (
    <input
      id={props.id}
      class="dg-num"
      type="text"
      inputMode="decimal"
      autoComplete="off"
      spellcheck={false}
      value={d.text}
      aria-invalid={props.localError || fieldIssue(props.field) ? true : undefined}
      onFocus={() => d.setFocused(true)}
      onBlur={() => d.setFocused(false)}
      onInput={(e) => {
        const t = (e.target as HTMLInputElement).value;
        d.setText(t);
        const v = parseNumber(t);
        if (v === null) {
          props.setLocalError(`${props.label}: enter a number (e.g. 12.5 or 1e-3); the last valid value (${props.kept}) is kept.`);
          return;
        }
        props.setLocalError(null);
        if (v !== props.value) props.onNumber(v);
      }}
    />
  );
}

export function QuantityField(
  raw: BaseProps & {
    dimension: Dimension;
    value: Quantity;
    onChange: (q: Quantity) => void;
  },
) {
  const props = labelled(raw);
  const id = useId('q');
  const { onChange } = props;
  // shown in the case's unit system or the field's own unit; the stored value stays as typed
  // until a new value is typed (src/case/unitSystem.ts), so switching units never rounds it
  const value = shownQuantity(currentCase.value, props.field, props.value);
  const [localError, setLocalError] = useState<string | null>(null);
  const units = unitsOf(props.dimension);
  return (
    <FieldShell {...props} id={id} localError={localError}>
      <NumberInput
        id={id}
        label={props.label}
        field={props.field}
        value={value.value}
        digits={value.unit === props.value.unit ? undefined : CONVERTED_DIGITS}
        kept={`${fmtNum(value.value)} ${unitLabel(value.unit)}`}
        localError={localError}
        setLocalError={setLocalError}
        onNumber={(v) => onChange({ value: v, unit: value.unit })}
      />
      {units.length > 1 ? (
        <select
          class="dg-unit"
          aria-label={`${props.label} unit`}
          value={value.unit}
          onChange={(e) => {
            const unit = (e.target as HTMLSelectElement).value;
            // only the way it is shown changes: the stored value stays exactly as typed
            setLocalError(null);
            updateCase((d) => void (d.units = withFieldUnit(d, props.field, unit)));
          }}
        >
          {units.map((u) => (
            <option value={u.id} key={u.id}>
              {u.label}
            </option>
          ))}
        </select>
      ) : (
        <span class="dg-unit-fixed">{units[0]?.label}</span>
      )}
    </FieldShell>
  );
}

export function unitLabel(id: string): string {
  return UNITS[id]?.label ?? id;
}

export function NumberField(
  raw: BaseProps & { value: number; onChange: (v: number) => void; suffix?: string },
) {
  const props = labelled(raw);
  const id = useId('n');
  const [localError, setLocalError] = useState<string | null>(null);
  return (
    <FieldShell {...props} id={id} localError={localError}>
      <NumberInput
        id={id}
        label={props.label}
        field={props.field}
        value={props.value}
        kept={fmtNum(props.value)}
        localError={localError}
        setLocalError={setLocalError}
        onNumber={props.onChange}
      />
      {props.suffix && <span class="dg-unit-fixed">{props.suffix}</span>}
    </FieldShell>
  );
}

/** An optional quantity (half-life, release duration): a switch plus the quantity when on. */
export function OptionalQuantityField(
  raw: BaseProps & {
    dimension: Dimension;
    value: Quantity | null;
    offLabel: string;
    onLabel: string;
    fallback: Quantity;
    onChange: (q: Quantity | null) => void;
  },
) {
  const props = labelled(raw);
  const on = props.value !== null;
  return (
    <div class="dg-optional">
      <Segmented
        label={props.label}
        value={on ? 'on' : 'off'}
        options={[
          { id: 'off', label: props.offLabel },
          { id: 'on', label: props.onLabel },
        ]}
        onChange={(v) => props.onChange(v === 'on' ? (props.value ?? props.fallback) : null)}
      />
      {on && <QuantityField {...props} value={props.value!} onChange={(q) => props.onChange(q)} />}
      {!on && props.help && <p class="dg-help">{props.help}</p>}
    </div>
  );
}

/** A row of mutually exclusive buttons (large touch targets, keyboard reachable). */
export function Segmented<T extends string>(props: {
  label: string;
  value: T;
  options: { id: T; label: string }[];
  onChange: (v: T) => void;
}) {
  return (
    <div class="dg-seg" role="radiogroup" aria-label={props.label}>
      <span class="dg-seg-label">{props.label}</span>
      <div class="dg-seg-row">
        {props.options.map((o) => (
          <button
            type="button"
            role="radio"
            aria-checked={props.value === o.id}
            class={props.value === o.id ? 'dg-on' : ''}
            key={o.id}
            data-value={o.id}
            onClick={() => props.onChange(o.id)}
          >
            {o.label}
          </button>
        ))}
      </div>
    </div>
  );
}
