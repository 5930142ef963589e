import { describe, expect, it } from 'vitest';
import { TRANSITIONS } from '../../server/services/fieldChangeWorkflow';
import { FIELD_CHANGE_STATUSES } from '../../src/shared/api/fieldChanges';

// The field change's transition table is the whole workflow: these check the table itself is whole
// (every state is reachable from a draft, every refusal has words), so a new state or action cannot
// be added half-way.
describe('field change transition table', () => {
  const all = Object.values(TRANSITIONS);

  it('when any action is tried from a state it does not start from, then the table says why in words', () => {
    for (const t of all) {
      for (const state of FIELD_CHANGE_STATUSES) {
        if (state === t.from) continue;
        expect(t.refusal[state], `${t.action} from ${state}`).toMatch(/\w+/);
      }
    }
  });

  it('when the states are walked from a draft, then every state is reached and only accepted and declined are final', () => {
    const reached = new Set<string>(['draft']);
    for (let changed = true; changed;) {
      changed = false;
      for (const t of all) {
        if (reached.has(t.from) && !reached.has(t.to)) {
          reached.add(t.to);
          changed = true;
        }
      }
    }
    expect([...reached].sort()).toEqual([...FIELD_CHANGE_STATUSES].sort());
    const final = FIELD_CHANGE_STATUSES.filter((s) => !all.some((t) => t.from === s));
    expect(final.sort()).toEqual(['accepted', 'declined']);
  });

  it('when a step is the contractor’s, then it tells the designers, and a designer’s decision tells the contractor', () => {
    for (const t of all) {
      if (t.action === 'save') expect(t.mail).toBeNull();
      else expect(t.mail).toBe(t.by === 'author' ? 'designers' : 'author');
      expect(t.audit).toBe(`field-change.${t.action === 'save' ? 'saved' : t.to}`);
    }
  });
});
