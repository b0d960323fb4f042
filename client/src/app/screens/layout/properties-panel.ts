import { ChangeDetectionStrategy, Component, computed, DestroyRef, effect, inject, input, output, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { AbstractControl, FormControl, FormGroup, ReactiveFormsModule, ValidationErrors, ValidatorFn } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import type { NetworkDocument, NetworkLink, NetworkNode, OutletNode } from '../../../../../engine/network-document';
import type { SteadyResult } from '../../../../../engine/index';
import type { ServiceStates } from '../../../../../engine/service-state';
import { countFittings, minorLossAllowance } from '../../../../../engine/takeoff/index';
import { FITTINGS } from '../../../../../engine/pipe-catalogue';
import { fitPumpCurve } from '../../../../../engine/pump-curve/index';
import { ownResults } from './editor/own-results';
import { formatQuantity, fromDisplay, toDisplay, unitLabel, UnitSystem } from '../../../../../engine/units';
import { loadQuantityReader, readQuantity } from './editor/typed-quantity';
import { lengthSource } from './editor/document-store';
import { FieldSpec, fieldsFor, isNodeKind, LINK_KINDS, NODE_KINDS, patchForPath, readPath } from './kinds';
import { defaultDemandModel } from './kinds/outlet-kind';
import { DAYLIGHT_SCHEDULE } from './kinds/pump-kind';
import { catalogueSeries, catalogueSizes } from './pipe-catalogue';

/** A change the panel asks the screen to apply (one undo step each). */
export interface ElementPatch {
  id: string;
  patch: Record<string, unknown>;
}

/**
 * Properties of the selected element, built from its kind's field list. Values are shown and
 * typed in the project's units and stored SI; a field commits on blur (or on change for
 * selects and checkboxes), so each edit is one undo step.
 */
@Component({
  selector: 'rn-properties-panel',
  imports: [ReactiveFormsModule, MatFormFieldModule, MatInputModule, MatSelectModule, MatCheckboxModule, MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './properties-panel.html',
  styleUrl: './properties-panel.scss',
})
export class PropertiesPanel {
  readonly element = input<NetworkNode | NetworkLink | null>(null);
  readonly selectionCount = input(0);
  readonly doc = input.required<NetworkDocument>();
  readonly units = input<UnitSystem>('us');
  readonly readOnly = input(false);
  readonly surveyAvailable = input(false);
  readonly results = input<SteadyResult | null>(null);
  readonly service = input<ServiceStates | null>(null);
  readonly patch = output<ElementPatch>();
  readonly snapElevation = output<string>();
  readonly profileFromSurvey = output<string>();
  readonly deleteSelection = output<void>();

  private readonly destroyRef = inject(DestroyRef);
  form = new FormGroup<Record<string, FormControl<unknown>>>({});
  private formFor = '';

  readonly fields = computed(() => {
    const el = this.element();
    return el ? fieldsFor(el) : [];
  });
  readonly kindLabel = computed(() => {
    const el = this.element();
    if (!el) return '';
    return isNodeKind(el.kind) ? NODE_KINDS[el.kind as NetworkNode['kind']].label : LINK_KINDS[el.kind as NetworkLink['kind']].label;
  });
  readonly checks = computed(() => {
    const el = this.element();
    if (!el) return [];
    const def = isNodeKind(el.kind) ? NODE_KINDS[el.kind as NetworkNode['kind']] : LINK_KINDS[el.kind as NetworkLink['kind']];
    return (def.check as ((e: unknown, d: NetworkDocument) => string[]) | undefined)?.(el, this.doc()) ?? [];
  });
  /** The element's own results: its pressure, what it needs and its margin, its water, its flow. */
  readonly own = computed(() => {
    const el = this.element();
    return el ? ownResults(el, this.doc(), this.results(), this.service(), this.units()) : [];
  });
  /** The pipe's fittings as the takeoff counts them, and the loss allowance they add up to. */
  readonly fittings = computed(() => {
    const el = this.element();
    if (el?.kind !== 'pipe') return null;
    const doc = this.doc();
    const a = minorLossAllowance(doc, countFittings(doc))[el.id];
    if (!a) return null;
    const parts = a.parts.map((p) => `${p.count} × ${FITTINGS[p.fitting].label.toLowerCase()} (K ${p.k})`);
    return { k: a.k, text: parts.length ? `${parts.join(' + ')} = K ${a.k}` : 'No fittings counted on this pipe (K 0)' };
  });
  readonly series = computed(() => catalogueSeries());
  readonly sizes = computed(() => {
    const el = this.element();
    return el?.kind === 'pipe' && el.series ? catalogueSizes(el.series, this.doc().headloss, this.units()) : [];
  });
  readonly isPipe = computed(() => this.element()?.kind === 'pipe');
  readonly lengthFrom = computed(() => {
    const el = this.element();
    return el?.kind === 'pipe' ? lengthSource(el) : 'drawing';
  });
  readonly schedule = computed(() => {
    const el = this.element();
    return el?.kind === 'pump' ? (el.schedule ?? []) : [];
  });

  constructor() {
    void loadQuantityReader();
    // Rebuild the form when the element or its visible fields change; otherwise refresh values
    // (undo, drag) without emitting.
    effect(() => {
      const el = this.element();
      const fields = this.fields();
      const units = this.units();
      const ro = this.readOnly();
      const key = el ? `${el.id}|${units}|${ro}|${fields.map((f) => f.key).join(',')}` : '';
      if (key !== this.formFor) {
        this.formFor = key;
        this.buildForm(el, fields, units, ro);
      } else if (el) {
        for (const f of fields) this.form.controls[controlName(f)]?.setValue(this.shown(el, f, units), { emitEvent: false });
      }
    });
  }

  label(f: FieldSpec): string {
    const el = this.element();
    return el && f.labelFor ? f.labelFor(el) : f.label;
  }

  hint(f: FieldSpec): string {
    const el = this.element();
    return (el && f.hintFor?.(el)) || f.hint || '';
  }

  readonly flowUnit = computed(() => unitLabel('flow', this.units()));
  readonly headUnit = computed(() => unitLabel('head', this.units()));
  readonly curvePlaceholder = computed(() => (this.units() === 'us' ? '0, 160; 10, 140; 20, 95' : '0, 50; 0.6, 43; 1.2, 29'));
  /** The typed points of a pump's curve (editor-only `curve_points`, else the stored curve), in display units. */
  readonly curveText = computed(() => {
    const el = this.element();
    if (el?.kind !== 'pump') return '';
    const pts = el.curve_points ?? el.curve ?? [];
    const u = this.units();
    const n = (q: 'flow' | 'head', v: number) => Number(toDisplay(q, v, u).toPrecision(4));
    return pts.map(([q, h]) => `${n('flow', q)}, ${n('head', h)}`).join('; ');
  });
  readonly curveError = signal('');
  /** What the fit says: shut-off head, flow at run-out, how closely it follows the points. */
  readonly curveFit = computed(() => {
    const err = this.curveError();
    if (err) return err;
    const el = this.element();
    const pts = el?.kind === 'pump' ? (el.curve_points ?? el.curve) : undefined;
    if (!pts || pts.length < 2) return '';
    const fit = fitPumpCurve(pts);
    const u = this.units();
    const run = Number.isFinite(fit.runout_m3s) ? `, no flow above ${formatQuantity('flow', fit.runout_m3s, u)}` : '';
    const words = `Fitted: ${formatQuantity('head', fit.shutoff_m, u)} at shut-off${run}; follows the points within ${formatQuantity('head', fit.worst_m, u)}.`;
    return fit.problems.length ? `${words} ${fit.problems.join('; ')}.` : words;
  });

  commitCurve(text: string): void {
    const el = this.element();
    if (el?.kind !== 'pump' || this.readOnly()) return;
    const u = this.units();
    const rows = text
      .split(';')
      .map((r) => r.trim())
      .filter(Boolean)
      .map((r) =>
        r
          .split(/[,\s]+/)
          .filter(Boolean)
          .map(Number),
      );
    const bad = rows.findIndex((r) => r.length !== 2 || !r.every(Number.isFinite) || r[0] < 0);
    if (bad >= 0) return this.curveError.set(`Point ${bad + 1}: type a flow and a head, e.g. "${this.curvePlaceholder().split(';')[1].trim()}"`);
    if (rows.length < 2) return this.curveError.set('Type at least two points: the head at no flow and at one flow, or more.');
    this.curveError.set('');
    const pts = rows.map(([q, h]) => [fromDisplay('flow', q, u), fromDisplay('head', h, u)] as [number, number]);
    this.patch.emit({ id: el.id, patch: { curve_points: pts, curve: fitPumpCurve(pts).samples } });
  }

  clearCurve(): void {
    const el = this.element();
    this.curveError.set('');
    if (el) this.patch.emit({ id: el.id, patch: { curve: undefined, curve_points: undefined } });
  }

  useFittings(): void {
    const el = this.element();
    const f = this.fittings();
    if (el && f) this.patch.emit({ id: el.id, patch: { minor_loss: f.k } });
  }

  /** A value in the other unit system, to show that any unit may be typed ("12 ft" in a metre field). */
  example(f: FieldSpec): string {
    return f.quantity ? `12 ${unitLabel(f.quantity, this.units() === 'us' ? 'si' : 'us')}` : '';
  }

  unit(f: FieldSpec): string {
    return f.quantity ? unitLabel(f.quantity, this.units()) : (f.suffix ?? '');
  }

  errorText(f: FieldSpec): string {
    const c = this.form.controls[controlName(f)];
    if (!c?.errors) return '';
    if (c.errors['required']) return f.key === 'elevation_m' ? 'Not set yet: type the ground elevation here' : `${this.label(f)} is required`;
    if (c.errors['number']) return 'Enter a number';
    if (c.errors['quantity']) return sentence(c.errors['quantity'] as string);
    if (c.errors['min']) return `At least ${c.errors['min']}`;
    if (c.errors['max']) return `At most ${c.errors['max']}`;
    if (c.errors['schedule']) return c.errors['schedule'] as string;
    return 'Invalid value';
  }

  private shown(el: NetworkNode | NetworkLink, f: FieldSpec, units: UnitSystem): unknown {
    const v = f.read ? f.read(el) : readPath(el, f.key);
    if (f.type === 'checkbox') return f.key === 'open' ? v !== false : v === true;
    if (f.type === 'number' || f.type === 'length') {
      return typeof v === 'number' ? displayNumber(f, v, units) : '';
    }
    if (f.type === 'schedule') return Array.isArray(v) ? v.join(', ') : '';
    return v ?? f.fallback ?? '';
  }

  private buildForm(el: NetworkNode | NetworkLink | null, fields: FieldSpec[], units: UnitSystem, ro: boolean): void {
    const controls: Record<string, FormControl<unknown>> = {};
    if (el) {
      for (const f of fields) {
        if (f.type === 'pipe-size' || f.type === 'curve') continue;
        const text = f.type === 'text' || f.type === 'number' || f.type === 'length' || f.type === 'schedule';
        const c = new FormControl<unknown>(
          { value: this.shown(el, f, units), disabled: ro },
          { validators: [this.validator(f, units)], updateOn: text ? 'blur' : 'change' },
        );
        c.valueChanges.pipe(takeUntilDestroyed(this.destroyRef)).subscribe((v) => this.commit(f, c, v));
        // An unset elevation is asked for at once, not after the field is visited.
        if (c.invalid) c.markAsTouched();
        controls[controlName(f)] = c;
      }
    }
    this.form = new FormGroup<Record<string, FormControl<unknown>>>(controls);
  }

  private validator(f: FieldSpec, units: UnitSystem): ValidatorFn {
    return (c: AbstractControl): ValidationErrors | null => {
      const v = c.value;
      if (f.type === 'schedule') return scheduleError(String(v ?? ''));
      if (f.type !== 'number' && f.type !== 'length') return f.required && !v ? { required: true } : null;
      if (v === '' || v === null || v === undefined) return f.required ? { required: true } : null;
      const si = typedValue(f, v, units);
      if (typeof si === 'string') return f.quantity ? { quantity: si } : { number: true };
      const fmt = (x: number) => (f.quantity ? formatQuantity(f.quantity, x, units, 3).replace(/\.?0+ /, ' ') : String(x));
      if (f.min !== undefined && si < f.min - 1e-12) return { min: fmt(f.min) };
      if (f.max !== undefined && si > f.max + 1e-12) return { max: fmt(f.max) };
      return null;
    };
  }

  private commit(f: FieldSpec, c: AbstractControl, v: unknown): void {
    const el = this.element();
    if (!el || c.invalid || this.readOnly()) return;
    let value: unknown = v;
    if (f.type === 'number' || f.type === 'length') {
      const typed = v === '' || v === null ? undefined : typedValue(f, v, this.units());
      value = typeof typed === 'number' ? typed : undefined;
      // "150 ft" in a metre field reads back as the number in the field's own unit.
      if (typeof typed === 'number' && f.quantity && !isPlainNumber(v)) {
        c.setValue(displayNumber(f, typed, this.units()), { emitEvent: false });
      }
    } else if (f.type === 'text') {
      value = String(v ?? '').trim() || undefined;
    } else if (f.type === 'schedule') {
      value = String(v)
        .split(/[,\s]+/)
        .filter(Boolean)
        .map(Number);
    }
    if (f.key === 'demand_model.type') {
      this.patch.emit({ id: el.id, patch: { demand_model: defaultDemandModel(String(v), el as OutletNode) } });
      return;
    }
    const patch = f.choose ? f.choose(el, String(v)) : f.write ? f.write(el, value as number | undefined) : patchForPath(el, f.key, value);
    if (f.type === 'length') patch['length_source'] = 'typed';
    // A typed elevation is the designer's own: no longer unset or a guess.
    if (f.key === 'elevation_m') Object.assign(patch, { elevation_source: undefined, elevation_from: undefined });
    this.patch.emit({ id: el.id, patch });
  }

  chooseSeries(seriesId: string): void {
    const el = this.element();
    if (el?.kind !== 'pipe') return;
    const s = this.series().find((x) => x.id === seriesId);
    // Keep the nominal size when the new series has it, so switching class is one step.
    const same = el.nominal ? catalogueSizes(seriesId, this.doc().headloss).find((z) => z.nominal === el.nominal) : undefined;
    this.patch.emit({
      id: el.id,
      patch: same
        ? { series: seriesId, material: s?.material, nominal: same.nominal, diameter_m: same.diameter_m, roughness: same.roughness, rating_m: same.rating_m }
        : { series: seriesId, material: s?.material, nominal: undefined },
    });
  }

  chooseSize(nominal: string): void {
    const el = this.element();
    if (el?.kind !== 'pipe') return;
    const size = this.sizes().find((s) => s.nominal === nominal);
    if (!size) return;
    this.patch.emit({
      id: el.id,
      patch: { nominal, diameter_m: size.diameter_m, roughness: size.roughness, rating_m: size.rating_m },
    });
  }

  useDrawnLength(): void {
    const el = this.element();
    if (el) this.patch.emit({ id: el.id, patch: { length_source: undefined } });
  }

  setSchedule(values: readonly number[]): void {
    const el = this.element();
    if (el) this.patch.emit({ id: el.id, patch: { schedule: [...values] } });
  }

  control(f: FieldSpec): string {
    return controlName(f);
  }

  readonly daylight = DAYLIGHT_SCHEDULE;
  readonly alwaysOn: readonly number[] = Array.from({ length: 24 }, () => 1);
}

/**
 * What a number field holds, in SI: a field with a quantity takes "150 ft", "3/4 in", "40 psi" or a
 * bare number in its display unit (engine/quantity-input.ts); a plain count takes a number.
 * A string is the reason it cannot be read.
 */
function typedValue(f: FieldSpec, v: unknown, units: UnitSystem): number | string {
  if (f.quantity) {
    const r = readQuantity(String(v), f.quantity, units);
    return r.ok ? r.si : r.message;
  }
  const n = Number(v);
  return Number.isFinite(n) ? n : 'enter a number';
}

/** An SI value as its field shows it: one decimal more than the unit's usual display precision (engine/units.ts decides it). */
function displayNumber(f: FieldSpec, si: number, units: UnitSystem): number {
  if (!f.quantity) return Number(si.toPrecision(6));
  const usual = formatQuantity(f.quantity, si, units).split(' ')[0].split('.')[1]?.length ?? 0;
  return Number(toDisplay(f.quantity, si, units).toFixed(usual + 1));
}

function isPlainNumber(v: unknown): boolean {
  return typeof v === 'number' || (typeof v === 'string' && v.trim() !== '' && Number.isFinite(Number(v)));
}

function sentence(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}

/** Form control name of a field (FormGroup keys may not contain dots). */
function controlName(f: FieldSpec): string {
  return f.key.replace(/\./g, '__');
}

function scheduleError(text: string): ValidationErrors | null {
  const parts = text.split(/[,\s]+/).filter(Boolean);
  if (parts.length !== 24) return { schedule: `Enter 24 hourly factors (found ${parts.length})` };
  const bad = parts.findIndex((p) => !(Number(p) >= 0 && Number(p) <= 1));
  return bad >= 0 ? { schedule: `Hour ${bad}: factors run from 0 to 1` } : null;
}
