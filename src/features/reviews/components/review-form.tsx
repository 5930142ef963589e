import { useState } from 'react';
import { useFieldArray, useForm, useWatch } from 'react-hook-form';
import type { z } from 'zod';
import { zodResolver } from '@hookform/resolvers/zod';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { SelectField, TextAreaField } from '../../../components/ui/field';
import { errorMessage } from '../../../lib/error-messages';
import type { Review } from '../../../shared/api/summaries';
import { decideReviewInputSchema, toDecideReviewBody, useDecideReview } from '../api/decide-review';
import type { DecideReviewInput } from '../api/decide-review';
import { ITEM_TYPE_LABELS, ITEM_TYPE_OPTIONS } from './review-items';
import type { ItemCatalog, ReviewItemType } from './review-items';

type Values = z.output<typeof decideReviewInputSchema>;

const DECISIONS = [
  { value: 'accepted', label: 'Accept', hint: 'The summary meets the adopted code as you read it.' },
  { value: 'returned', label: 'Return with comments', hint: 'The designer corrects it and sends a new revision.' },
] as const;

function ItemRow({
  index,
  catalog,
  form,
  onRemove,
}: {
  index: number;
  catalog: ItemCatalog;
  form: ReturnType<typeof useForm<DecideReviewInput, unknown, Values>>;
  onRemove: () => void;
}) {
  const itemType = (useWatch({ control: form.control, name: `items.${index}.itemType` }) ?? 'general') as ReviewItemType;
  const errors = form.formState.errors.items?.[index];
  const n = index + 1;
  const choices = itemType === 'general' ? [] : catalog[itemType];
  return (
    <li className="rounded-md border-2 border-rule bg-paper p-3" data-testid={`review-item-row-${n}`}>
      <div className="grid items-start gap-3 sm:grid-cols-[12rem_1fr]">
        <SelectField
          label={`Comment ${n} is about`}
          options={ITEM_TYPE_OPTIONS}
          error={errors?.itemType?.message}
          {...form.register(`items.${index}.itemType`, { onChange: () => form.setValue(`items.${index}.itemId`, '') })}
        />
        {itemType === 'general' ? (
          <p className="text-sm text-ink-soft sm:mt-7">A comment on the summary as a whole.</p>
        ) : (
          <SelectField
            label={`Which ${ITEM_TYPE_LABELS[itemType].toLowerCase()} (comment ${n})`}
            options={[{ value: '', label: choices.length ? 'Choose…' : 'None in this revision' }, ...choices]}
            error={errors?.itemId?.message}
            {...form.register(`items.${index}.itemId`)}
          />
        )}
      </div>
      <TextAreaField className="mt-3" label={`Comment ${n}`} error={errors?.comment?.message} {...form.register(`items.${index}.comment`)} />
      <div className="mt-2">
        <Button variant="quiet" onClick={onRemove}>
          Remove comment {n}
        </Button>
      </div>
    </li>
  );
}

/**
 * The inspector's decision on a received summary: Accept, or Return with an overall comment
 * and comments on items (a segment, a checked fixture, a device, a node, an input). The
 * decision is final for the revision, so it is confirmed before it is recorded.
 */
export function ReviewForm({ review, catalog, onDecided }: { review: Review; catalog: ItemCatalog; onDecided?: (review: Review) => void }) {
  const decide = useDecideReview();
  const [confirming, setConfirming] = useState<Values | null>(null);
  const form = useForm<DecideReviewInput, unknown, Values>({
    resolver: zodResolver(decideReviewInputSchema),
    defaultValues: { decision: undefined, comment: '', items: [] },
  });
  const items = useFieldArray({ control: form.control, name: 'items' });
  const decision = useWatch({ control: form.control, name: 'decision' });
  const { errors } = form.formState;

  const onSubmit = form.handleSubmit((values) => {
    decide.reset();
    setConfirming(values);
  });

  const record = () => {
    if (!confirming) return;
    decide.mutate(
      { projectId: review.projectId, reviewId: review.id, body: toDecideReviewBody(confirming, review.version) },
      {
        onSuccess: (decided) => {
          setConfirming(null);
          onDecided?.(decided);
        },
        onError: () => setConfirming(null),
      },
    );
  };

  const count = confirming ? confirming.items.length + (confirming.comment ? 1 : 0) : 0;

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" aria-label={`Review of revision ${review.revisionNumber}`}>
      <fieldset className="flex flex-col gap-2" aria-describedby={errors.decision ? 'decision-error' : undefined}>
        <legend className="mb-1 text-sm font-semibold">Your decision on revision {review.revisionNumber}</legend>
        {DECISIONS.map((d) => (
          <label
            key={d.value}
            className="flex items-start gap-2 rounded-md border-2 border-rule bg-surface px-3 py-2 has-[:checked]:border-standpipe has-[:checked]:bg-standpipe-soft"
          >
            <input type="radio" value={d.value} className="mt-1 size-4 accent-standpipe" {...form.register('decision')} disabled={confirming !== null} />
            <span>
              <span className="font-semibold">{d.label}</span>
              <span className="block text-sm text-ink-soft">{d.hint}</span>
            </span>
          </label>
        ))}
        {errors.decision ? (
          <p id="decision-error" className="text-sm font-medium text-fault">
            <span aria-hidden="true">⚠ </span>
            {errors.decision.message}
          </p>
        ) : null}
      </fieldset>

      <TextAreaField
        label={decision === 'returned' ? 'Why it is returned' : 'Comment (optional)'}
        hint={decision === 'returned' ? 'Needed unless you comment on at least one item below.' : undefined}
        error={errors.comment?.message}
        readOnly={confirming !== null}
        {...form.register('comment')}
      />

      <div className="flex flex-col gap-2">
        <p className="text-sm font-semibold">Comments on items ({items.fields.length})</p>
        {items.fields.length > 0 ? (
          <ul className="flex flex-col gap-3" aria-label="Comments on items">
            {items.fields.map((field, index) => (
              <ItemRow key={field.id} index={index} catalog={catalog} form={form} onRemove={() => items.remove(index)} />
            ))}
          </ul>
        ) : (
          <p className="text-sm text-ink-soft">None yet. Add one to point at a segment, a checked fixture, a device, a node or an input.</p>
        )}
        <div>
          <Button
            variant="secondary"
            disabled={confirming !== null}
            onClick={() => items.append({ itemType: 'fixture', itemId: '', comment: '' }, { focusName: `items.${items.fields.length}.itemType` })}
          >
            Add a comment on an item
          </Button>
        </div>
      </div>

      {confirming ? (
        <Alert
          tone="caution"
          title={
            confirming.decision === 'accepted'
              ? `Accept revision ${review.revisionNumber}?`
              : `Return revision ${review.revisionNumber} with ${count} comment(s)?`
          }
          actions={
            <>
              <Button onClick={record} pending={decide.isPending} pendingLabel="Recording…" autoFocus>
                {confirming.decision === 'accepted' ? `Yes, accept revision ${review.revisionNumber}` : `Yes, return revision ${review.revisionNumber}`}
              </Button>
              <Button variant="secondary" onClick={() => setConfirming(null)} disabled={decide.isPending}>
                Go back
              </Button>
            </>
          }
        >
          The decision is final for this revision: it cannot be changed afterwards. A corrected design comes back as a new revision.
        </Alert>
      ) : (
        <div>
          <Button type="submit">Record decision…</Button>
        </div>
      )}
      <div aria-live="assertive">
        {decide.isError ? (
          <Alert tone="fault" title="Decision not recorded">
            {errorMessage(decide.error)}
          </Alert>
        ) : null}
      </div>
    </form>
  );
}
