/**
 * The spec form: react-jsonschema-form driven by the schema the server serves, in Longtail's
 * templates and widgets. Quantities take engineering notation; problems show beside their
 * fields, whether the browser found them or the server answered 400; a failed save keeps
 * everything typed. Without `onSave` it shows the spec read-only.
 */
import Form, { type IChangeEvent } from '@rjsf/core';
import type { ErrorSchema, RegistryFieldsType, RJSFSchema, RJSFValidationError, UiSchema, ValidatorType } from '@rjsf/utils';
import { getDefaultFormState } from '@rjsf/utils';
import { useQuery } from '@tanstack/react-query';
import { useCallback, useEffect, useMemo, useRef, useState, type ReactNode } from 'react';
import type { FormContext } from '../../../components/forms/form-context';
import { FORM_TEMPLATES, FORM_WIDGETS } from '../../../components/forms/form-theme';
import { ErrorPanel, Loading } from '../../../components/ui/feedback';
import { ApiError } from '../../../lib/api';
import { specSchemaQuery } from '../api/spec-queries';
import { useDeviceLibrary } from '../hooks/use-device-library';
import { refOf, withDeviceChoice, withoutEmptyCard, type DeviceChoiceContext } from '../lib/device-choice';
import { errorCount, withoutEditedFieldErrors } from '../lib/edited-errors';
import { withoutUnsetGroups } from '../lib/optional-groups';
import type { SchemaNode } from '../lib/schema-nodes';
import { serverErrorsToErrorSchema } from '../lib/server-errors';
import { specChecks, withoutUnreadableFieldErrors } from '../lib/spec-checks';
import { SPEC_UI_SCHEMA, uiSchemaForFamily, withQuantityWidgets } from '../lib/spec-ui-schema';
import { specValidator } from '../lib/spec-validator';
import { stableJson } from '../lib/stable-json';
import { DeviceModelField } from './device-model-field';
import { CardModelField } from './card-model-field';
import { PnpDeviceField } from './pnp-device-field';
import { chosenTopologies, isPnpStage, tailsNeedingPnp, type PnpChoiceContext } from '../lib/pnp-choice';
import { familyIssues } from '#shared/validation/cross-field-rules';
import type { DeviceParams } from '#shared/engine/types';

export type SpecDraft = Record<string, unknown>;

export interface SpecFormProps {
  /** The document the form starts from (a saved version, or an example for a new spec). */
  initial: SpecDraft;
  /** Saves the document; throw ApiError to have its details shown by the fields. Absent: read-only. */
  onSave?: (draft: SpecDraft) => Promise<unknown>;
  saveLabel?: string;
  savingLabel?: string;
  /** Words beside the save button after a save ("Saved as version 3"). */
  note?: ReactNode;
  /** Told whenever the form starts or stops differing from `initial`. */
  onDirtyChange?: (dirty: boolean) => void;
  /** The project whose device library the Device card offers to fill the transistor model from, and resolves a recorded card in (absent: neither). */
  projectId?: number;
}

/** Fields of our own: the device-library picker (`deviceModel`), the card's model it fills (`device.model`, read-only), and the PNP section (`device.pnp`). */
const SPEC_FIELDS: RegistryFieldsType = { deviceModel: DeviceModelField, cardModel: CardModelField, pnpDevice: PnpDeviceField };

export function SpecForm(props: SpecFormProps) {
  const schemaQuery = useQuery(specSchemaQuery());
  const validator = useMemo(() => {
    if (!schemaQuery.data) return undefined;
    try {
      return specValidator(schemaQuery.data);
    } catch (error) {
      return error as Error;
    }
  }, [schemaQuery.data]);
  if (schemaQuery.isPending) return <Loading what="Loading the spec form" />;
  if (schemaQuery.isError) return <ErrorPanel error={schemaQuery.error} retry={() => void schemaQuery.refetch()} />;
  if (!validator || validator instanceof Error) return <ErrorPanel error={validator} />;
  return <SpecFormBody {...props} schema={schemaQuery.data} validator={validator} />;
}

const withDefaults = (validator: ValidatorType, schema: RJSFSchema, data: SpecDraft) => stableJson(getDefaultFormState(validator, schema, data));

function SpecFormBody({
  schema,
  validator,
  initial,
  onSave,
  saveLabel = 'Save',
  savingLabel = 'Saving…',
  note,
  onDirtyChange,
  projectId,
}: SpecFormProps & { schema: RJSFSchema; validator: ValidatorType }) {
  const [formData, setFormData] = useState<SpecDraft>(initial);
  const recordedName = refOf(formData.deviceModel)?.name;
  const recordedChecksum = refOf(formData.deviceModel)?.checksum;
  const recordedRef = useMemo(
    () => (recordedName !== undefined && recordedChecksum !== undefined ? { name: recordedName, checksum: recordedChecksum } : undefined),
    [recordedName, recordedChecksum],
  );
  const deviceLibrary = useDeviceLibrary(projectId, recordedRef, onSave !== undefined);
  const [serverErrors, setServerErrors] = useState<ErrorSchema>({});
  // What went wrong with the last save: the browser's checks, the server's field errors, or anything else
  const [problem, setProblem] = useState<{ kind: 'client' | 'server' | 'other'; text: string } | null>(null);
  const [submitted, setSubmitted] = useState(false);
  const [saving, setSaving] = useState(false);
  const unreadable = useRef(new Map<string, string>()).current;
  const container = useRef<HTMLDivElement>(null);
  const latest = useRef(formData);
  latest.current = formData;

  const reportUnreadable = useCallback(
    (id: string, message: string | null) => {
      if (message === null) unreadable.delete(id);
      else unreadable.set(id, message);
    },
    [unreadable],
  );
  const customValidate = useMemo(() => specChecks(unreadable), [unreadable]);
  const transformErrors = useMemo(() => withoutUnreadableFieldErrors(unreadable), [unreadable]);

  const baseline = useMemo(() => withDefaults(validator, schema, initial), [validator, schema, initial]);
  const dirty = useMemo(() => withDefaults(validator, schema, formData) !== baseline, [validator, schema, formData, baseline]);
  useEffect(() => onDirtyChange?.(dirty), [dirty, onDirtyChange]);

  // After the server refused the save, take the person to the first field it named
  useEffect(() => {
    if (errorCount(serverErrors) === 0) return;
    container.current?.querySelector<HTMLElement>('[aria-invalid="true"]')?.focus();
  }, [serverErrors]);

  // The device family decides which tails the picker offers (a PNP stage cannot take a tail that needs a PNP mirror)
  const pnpStage = isPnpStage(formData);
  const topologiesKey = chosenTopologies(formData).join(' ');
  const uiSchema = useMemo<UiSchema>(
    () => ({
      ...uiSchemaForFamily(withQuantityWidgets(schema as SchemaNode, SPEC_UI_SCHEMA), pnpStage ? 'pnp' : 'npn', topologiesKey.split(' ')),
      'ui:submitButtonOptions': { submitText: saving ? savingLabel : saveLabel, norender: !onSave, props: { disabled: saving } },
    }),
    [schema, saving, savingLabel, saveLabel, onSave, pnpStage, topologiesKey],
  );

  // A PNP stage with such a tail still chosen is refused at once, in the server's words, not only on saving
  // (after a save attempt the form's own checks say it)
  const familyMessage = submitted || !pnpStage ? undefined : familyIssues(formData.device as DeviceParams | undefined, chosenTopologies(formData), '/topologies', 'the tail options include')[0]?.message;
  const shownErrors = useMemo<ErrorSchema>(
    () => (familyMessage ? ({ ...serverErrors, topologies: { __errors: [...(serverErrors.topologies?.__errors ?? []), familyMessage] } } as unknown as ErrorSchema) : serverErrors),
    [serverErrors, familyMessage],
  );

  const submitNote: ReactNode = saving ? (
    savingLabel
  ) : problem ? (
    <span className="text-short dark:text-short-bright">
      <span aria-hidden="true">✕ </span>
      {problem.text}
    </span>
  ) : (
    note
  );
  const pnpTailsKey = tailsNeedingPnp(formData).join(' ');
  const pnpTails = useMemo(() => (pnpTailsKey === '' ? [] : pnpTailsKey.split(' ')), [pnpTailsKey]) as PnpChoiceContext['pnpTails'];
  const formContext = useMemo<FormContext & DeviceChoiceContext & PnpChoiceContext>(
    () => ({ reportUnreadable, submitNote, deviceLibrary, pnpTails, pnpStage }),
    [reportUnreadable, submitNote, deviceLibrary, pnpTails, pnpStage],
  );

  const onChange = (event: IChangeEvent<SpecDraft>) => {
    // A card chosen from the device library fills the device; editing its values drops the choice
    // An optional target emptied again (or never filled beyond its defaults) is no target
    const next = withoutUnsetGroups(withDeviceChoice(latest.current, event.formData ?? {}, deviceLibrary?.items));
    const remaining = withoutEditedFieldErrors(serverErrors, latest.current, next);
    setServerErrors(remaining);
    if (problem?.kind === 'client' || (problem?.kind === 'server' && errorCount(remaining) === 0)) setProblem(null);
    setFormData(next);
  };

  const onError = (errors: readonly RJSFValidationError[]) => {
    setSubmitted(true);
    const fields = new Set(errors.map((e) => e.property)).size;
    setProblem({ kind: 'client', text: fields === 1 ? 'One field needs attention: see the message beside it.' : `${fields} fields need attention: see the messages beside them.` });
  };

  const onSubmit = async (event: IChangeEvent<SpecDraft>) => {
    setSubmitted(true);
    if (!onSave || unreadable.size > 0) return;
    setSaving(true);
    setProblem(null);
    setServerErrors({});
    try {
      await onSave(withoutUnsetGroups(withoutEmptyCard(event.formData ?? {})));
    } catch (error) {
      if (error instanceof ApiError && error.details.length > 0) {
        const errors = serverErrorsToErrorSchema(error.details, schema as SchemaNode);
        const count = errorCount(errors);
        setServerErrors(errors);
        setProblem({ kind: 'server', text: `${error.message} ${count === 1 ? 'The problem is marked beside its field.' : `${count} problems are marked beside their fields.`}` });
      } else {
        setProblem({ kind: 'other', text: error instanceof Error ? error.message : 'The spec could not be saved.' });
      }
    } finally {
      setSaving(false);
    }
  };

  return (
    <div ref={container}>
      <Form
        schema={schema}
        uiSchema={uiSchema}
        validator={validator}
        formData={formData}
        formContext={formContext}
        templates={FORM_TEMPLATES}
        widgets={FORM_WIDGETS}
        fields={SPEC_FIELDS}
        extraErrors={shownErrors}
        customValidate={customValidate}
        transformErrors={transformErrors}
        liveValidate={submitted ? 'onChange' : undefined}
        showErrorList={false}
        noHtml5Validate
        focusOnFirstError
        readonly={!onSave}
        onChange={onChange}
        onError={onError}
        onSubmit={(event) => void onSubmit(event)}
      />
    </div>
  );
}
