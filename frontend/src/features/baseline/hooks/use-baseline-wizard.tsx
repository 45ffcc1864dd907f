import type { BaselineInput, BaselineResult } from '@loamline/shared-types';
import { zodResolver } from '@hookform/resolvers/zod';
import {
  createContext,
  useCallback,
  useContext,
  useEffect,
  useLayoutEffect,
  useMemo,
  useRef,
  useState,
  type ReactNode,
} from 'react';
import { useForm, type Resolver, type UseFormReturn } from 'react-hook-form';
import { NavigationType, useLocation, useNavigate, useNavigationType } from 'react-router';
import type { KeyedMutator } from 'swr';
import type { UnitPrefs } from '@/lib/units';
import type { StoredUnits } from './use-unit-prefs';
import { ApiRequestError } from '@/lib/api-client';
import { useComputeBaseline } from '../api/compute-baseline';
import {
  STEPS,
  STEP_FIELDS,
  baselineSchema,
  emptyFormValues,
  formValuesToInput,
  inputToFormValues,
  isAdvancedField,
  stepOfField,
  type BaselineField,
  type BaselineFormValues,
  type StepId,
} from '../form';
import { useUnitPrefs } from './use-unit-prefs';
import { clearDraft, readDraft, writeDraft } from '../utils/draft';

export interface BaselineWizard {
  form: UseFormReturn<BaselineFormValues>;
  units: UnitPrefs;
  setUnits: (change: Partial<StoredUnits>) => void;
  /** index into STEPS */
  step: number;
  stepId: StepId;
  goTo: (step: StepId) => void;
  /** checks the current step's fields, then moves on; false when something needs fixing */
  next: () => Promise<boolean>;
  back: () => void;
  /**
   * the input the Baseline step shows: set when the rider leaves the Bike step; null again (and
   * `result` undefined) as soon as the form no longer holds exactly this input
   */
  request: BaselineInput | null;
  /** the baseline for `request`; never one for other input than the form holds */
  result: BaselineResult | undefined;
  resultError: Error | undefined;
  computing: boolean;
  recompute: KeyedMutator<BaselineResult>;
  /** every field from a stored input (a baseline sheet, a garage bike); back to the first step */
  setFromInput: (input: BaselineInput, options?: { step?: StepId }) => void;
  /** the request body the form holds now (validate first) */
  currentInput: () => BaselineInput;
  advancedOpen: boolean;
  setAdvancedOpen: (open: boolean) => void;
  /** opens the Bike step's advanced panel at a field (an assumption's key) */
  editField: (name: string) => void;
  /** a blank wizard at the first step; what was kept for this tab is dropped */
  startOver: () => void;
  /**
   * true once after the rider moved to another step (not on a page load): the step's heading then
   * takes the focus, so a screen reader or keyboard user starts reading the new step
   */
  takeHeadingFocus: () => boolean;
}

const BaselineWizardContext = createContext<BaselineWizard | null>(null);

const stepIndex = (id: StepId): number => STEPS.findIndex((s) => s.id === id);

/** Where the step is kept in a history entry's state (beside whatever else others keep there). */
const STEP_STATE = 'baselineStep';
const asObject = (state: unknown): Record<string, unknown> =>
  state && typeof state === 'object' ? (state as Record<string, unknown>) : {};
const stepOf = (state: unknown): number | undefined => {
  const v = asObject(state)[STEP_STATE];
  return typeof v === 'number' && Number.isInteger(v) ? v : undefined;
};

const clampStep = (i: number): number => Math.min(STEPS.length - 1, Math.max(0, i));

/**
 * The step a page load shows for `values`: the one asked for (the history entry's, else the kept
 * draft's), or the first input step before it that does not pass its checks; from the Baseline step
 * on, the request the baseline is worked out for.
 */
function startingPoint(
  values: BaselineFormValues,
  wanted: number,
  units: UnitPrefs,
): { step: number; request: BaselineInput | null } {
  if (wanted <= 0) return { step: 0, request: null };
  const parsed = baselineSchema(values, units).safeParse(values);
  let step = wanted;
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
      step = Math.min(step, stepIndex(stepOfField(issue.path.map(String).join('.'))));
    }
  }
  const reachesBaseline = step >= stepIndex('baseline');
  return { step, request: reachesBaseline ? formValuesToInput(values) : null };
}

/** The same input (the request body, as sent). */
const sameInput = (a: BaselineInput, key: string): boolean => JSON.stringify(a) === key;

/**
 * The wizard's state in one place: the form (react-hook-form, zod schema), the step, the units, and
 * the computed baseline (SWR). Later features (saving a baseline sheet, a bike from the garage) use
 * `setFromInput` and `currentInput` from `useBaselineWizard()`.
 *
 * The form values and the step are kept for this tab (utils/draft.ts) on every change and read back
 * on a page load: a reload, a return from another page or from sign-in shows the same step with the
 * same input. `initialInput` (tests, a stored input) takes the place of the kept draft.
 */
export function BaselineWizardProvider({
  children,
  initialInput,
}: {
  children: ReactNode;
  initialInput?: BaselineInput;
}) {
  const [units, setUnits] = useUnitPrefs();
  const unitsRef = useRef(units);
  unitsRef.current = units;

  const navigate = useNavigate();
  const location = useLocation();
  const navigationType = useNavigationType();
  const locationRef = useRef(location);
  locationRef.current = location;

  // What this page load starts from: the kept draft (or `initialInput`), at the history entry's step.
  const [start] = useState(() => {
    const draft = initialInput ? null : readDraft();
    const values = initialInput ? inputToFormValues(initialInput) : (draft?.values ?? emptyFormValues());
    const wanted = clampStep(stepOf(location.state) ?? draft?.step ?? 0);
    return { values, ...startingPoint(values, wanted, units) };
  });

  // The schema depends on the values (a missing part is not checked) and on the units (messages).
  const resolver = useCallback<Resolver<BaselineFormValues>>(
    (values, context, options) =>
      zodResolver(baselineSchema(values, unitsRef.current), undefined, { raw: true })(
        values,
        context,
        options,
      ),
    [],
  );
  const form = useForm<BaselineFormValues>({
    defaultValues: start.values,
    resolver,
    mode: 'onTouched',
  });

  const [step, setStep] = useState(start.step);
  const stepRef = useRef(start.step);
  const [request, setRequest] = useState<BaselineInput | null>(start.request);
  const [advancedOpen, setAdvancedOpen] = useState(false);
  const compute = useComputeBaseline(request);

  // The result belongs to the exact request: as soon as the form holds anything else (a changed or
  // an invalid input), it is not shown; Next from the Bike step asks again.
  const requestKey = useMemo(() => (request ? JSON.stringify(request) : null), [request]);
  const [inputMatches, setInputMatches] = useState(true);

  // Keep the draft (values and step) on every change, and follow whether the input still matches.
  useEffect(() => {
    const kept = () => {
      const values = form.getValues();
      writeDraft({ values, step: stepRef.current });
      setInputMatches(requestKey !== null && sameInput(formValuesToInput(values), requestKey));
    };
    kept();
    const subscription = form.watch(kept);
    return () => subscription.unsubscribe();
  }, [form, requestKey, step]);

  // Each step is an entry in the browser's history (its index in `location.state`), so the phone's
  // back gesture goes to the step before instead of leaving the wizard with everything typed.
  const headingFocus = useRef(false);
  const show = useCallback(
    (i: number, history: 'push' | 'replace' | 'none' = 'push') => {
      if (i !== stepRef.current) headingFocus.current = true;
      setStep(i);
      stepRef.current = i;
      if (typeof window.scrollTo === 'function') window.scrollTo({ top: 0 });
      if (history === 'none') return;
      const { pathname, search, hash } = locationRef.current;
      const state: unknown = locationRef.current.state;
      if (history === 'push' && stepOf(state) === i) return;
      void navigate(
        { pathname, search, hash },
        { replace: history === 'replace', state: { ...asObject(state), [STEP_STATE]: i } },
      );
    },
    [navigate],
  );

  /** Checks the input steps from `from` up to `to` (not included); the first that fails is returned. */
  const advance = useCallback(
    async (from: number, to: number, focus: boolean): Promise<number> => {
      for (let i = from; i < to; i++) {
        const id = STEPS[i].id;
        if (id !== 'rider' && id !== 'riding' && id !== 'bike') continue;
        const ok = await form.trigger(STEP_FIELDS[id], { shouldFocus: focus });
        if (!ok) {
          const bad = Object.keys(flatErrors(form.formState.errors));
          if (bad.some(isAdvancedField)) setAdvancedOpen(true);
          return i;
        }
        if (id === 'bike') setRequest(formValuesToInput(form.getValues()));
      }
      return to;
    },
    [form],
  );

  const next = useCallback(async (): Promise<boolean> => {
    const from = stepRef.current;
    if (from >= STEPS.length - 1) return true;
    const reached = await advance(from, from + 1, true);
    if (reached === from) return false;
    show(reached);
    return true;
  }, [advance, show]);

  const back = useCallback(() => {
    if (stepRef.current > 0) show(stepRef.current - 1);
  }, [show]);

  const goTo = useCallback((id: StepId) => show(stepIndex(id)), [show]);

  // Back or forward in the browser: show that step; going forward checks the steps in between
  // (and works the baseline out again from what the form holds now).
  // A page load: the entry names the step shown (a reload, or a return with the kept draft). In a
  // layout effect, so that it comes before what children change in their effects (sign-in's
  // return drops ?resume= at once when the baseline is still in the cache).
  const loaded = useRef(false);
  useLayoutEffect(() => {
    if (loaded.current) return;
    loaded.current = true;
    const kept = stepOf(locationRef.current.state);
    if (kept !== stepRef.current && (kept !== undefined || stepRef.current > 0)) {
      show(stepRef.current, 'replace');
    }
  }, [show]);

  const firstEntry = useRef(true);
  useEffect(() => {
    const first = firstEntry.current;
    firstEntry.current = false;
    if (first) return; // the layout effect above has seen to it
    const kept = stepOf(location.state);
    if (navigationType === NavigationType.Replace && kept === undefined && stepRef.current > 0) {
      // someone else replaced the entry (e.g. its search params) without our state: put it back
      show(stepRef.current, 'replace');
      return;
    }
    if (navigationType !== NavigationType.Pop) return;
    const target = clampStep(kept ?? 0);
    const current = stepRef.current;
    if (target === current) return;
    if (target < current) {
      show(target, 'none');
      return;
    }
    void advance(current, target, false).then((reached) =>
      show(reached, reached === target ? 'none' : 'replace'),
    );
  }, [location.key, location.state, navigationType, advance, show]);

  const setFromInput = useCallback(
    (input: BaselineInput, options?: { step?: StepId }) => {
      form.reset(inputToFormValues(input));
      setRequest(null);
      show(stepIndex(options?.step ?? 'rider'));
    },
    [form, show],
  );

  const startOver = useCallback(() => {
    clearDraft();
    form.reset(emptyFormValues());
    setRequest(null);
    setAdvancedOpen(false);
    show(0);
  }, [form, show]);

  const currentInput = useCallback(() => formValuesToInput(form.getValues()), [form]);

  const editField = useCallback(
    (name: string) => {
      if (isAdvancedField(name)) setAdvancedOpen(true);
      show(stepIndex(stepOfField(name)));
      headingFocus.current = false; // the field takes the focus, not the heading
      // after the step has rendered
      window.setTimeout(() => {
        try {
          form.setFocus(name as BaselineField);
        } catch {
          // not a form field (an assumption the rider cannot change): the step alone is shown
        }
      }, 50);
    },
    [form, show],
  );

  const takeHeadingFocus = useCallback(() => {
    const take = headingFocus.current;
    headingFocus.current = false;
    return take;
  }, []);

  const current = inputMatches && request !== null;
  const value = useMemo<BaselineWizard>(
    () => ({
      form,
      units,
      setUnits,
      step,
      stepId: STEPS[step].id,
      goTo,
      next,
      back,
      request: current ? request : null,
      result: current ? compute.data : undefined,
      resultError: current ? compute.error : undefined,
      computing: current && (compute.isLoading || compute.isValidating),
      recompute: compute.mutate,
      setFromInput,
      currentInput,
      advancedOpen,
      setAdvancedOpen,
      editField,
      startOver,
      takeHeadingFocus,
    }),
    [
      form,
      units,
      setUnits,
      step,
      goTo,
      next,
      back,
      current,
      request,
      compute.data,
      compute.error,
      compute.isLoading,
      compute.isValidating,
      compute.mutate,
      setFromInput,
      currentInput,
      advancedOpen,
      editField,
      startOver,
      takeHeadingFocus,
    ],
  );
  return <BaselineWizardContext.Provider value={value}>{children}</BaselineWizardContext.Provider>;
}

export function useBaselineWizard(): BaselineWizard {
  const ctx = useContext(BaselineWizardContext);
  if (!ctx) throw new Error('useBaselineWizard needs a <BaselineWizardProvider> around it');
  return ctx;
}

/** `{ fork: { travelMm: { message } } }` → `{ 'fork.travelMm': message }` */
export function flatErrors(
  errors: object,
  prefix = '',
  out: Record<string, string> = {},
): Record<string, string> {
  for (const [k, v] of Object.entries(errors as Record<string, unknown>)) {
    if (!v || typeof v !== 'object' || k === 'ref') continue;
    const path = prefix ? `${prefix}.${k}` : k;
    const message = (v as { message?: unknown }).message;
    if (typeof message === 'string') out[path] = message;
    else flatErrors(v, path, out);
  }
  return out;
}

/** The server's 400 names fields in the contract's paths, which are the form's paths. */
export function serverFieldErrors(error: unknown): Record<string, string> {
  return error instanceof ApiRequestError && error.status === 400 && error.body.fields
    ? error.body.fields
    : {};
}
