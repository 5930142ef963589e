import { Section } from '../../../components/ui/card';
import { SelectField } from '../../../components/ui/field';
import type { SystemDocument } from '../../../engine';
import { useColdSupply } from '../../systems/api/get-cold-supply';
import { useSystems } from '../../systems/api/get-systems';
import { useWalk } from '../draft/walk-context';
import { describedField } from '../lib/described';
import { FED_FROM } from '../../../engine/model/elements';
import { num } from '../../../shared/format/quantity';

/** The node id held until the designer chooses one: no cold system has it, so the verdict stays Incomplete meanwhile. */
const NO_NODE = '(not chosen)';

/** The source written back with `fedFrom` set (resolved at once by the walk's sync and by the server) or removed. */
export function withFedFrom(doc: SystemDocument, fedFrom: { systemId: string; nodeId: string } | null): SystemDocument {
  const source = { ...doc.source };
  if (fedFrom) source.fedFrom = { systemId: fedFrom.systemId, nodeId: fedFrom.nodeId };
  else delete source.fedFrom;
  return { ...doc, source };
}

/**
 * A hot system's supply, read from the cold system that feeds its water heater: which cold system
 * and which of its nodes, and the pressure read there. The heater's own loss is its device's, on
 * the first segment (meter & devices step).
 */
export function FedFromSection() {
  const { document, draft, readOnlyReason, units, ids } = useWalk();
  const fedFrom = document.source.fedFrom;
  const systems = useSystems(ids.projectId);
  const cold = useColdSupply(ids.projectId, fedFrom?.systemId);
  const coldSystems = (systems.data ?? []).filter((s) => s.service === 'cold' && s.id !== ids.systemId);
  const analysis = cold.data?.revision?.analysis;
  const nodes = analysis?.ok ? analysis.analysis.nodes : [];
  const resolution = fedFrom?.resolution;
  const disabled = readOnlyReason !== null;

  return (
    <Section title="Fed from a cold-water system" headingLevel={3}>
      <p className="mb-3 max-w-prose text-sm text-ink-soft">
        A hot system takes its pressure from the cold system at the node that feeds the water heater: the cold system’s residual pressure there at its design
        flow, recomputed whenever either system changes. Enter the heater’s own loss as a water-heater device on the first segment.
      </p>
      <div className="grid gap-4 md:grid-cols-2">
        <SelectField
          {...describedField(FED_FROM, 'systemId', document.unitSystem)}
          disabled={disabled}
          value={fedFrom?.systemId ?? ''}
          onChange={(e) => {
            const systemId = e.target.value;
            draft.update((doc) =>
              withFedFrom(doc, systemId ? { systemId, nodeId: doc.source.fedFrom?.systemId === systemId ? doc.source.fedFrom.nodeId : NO_NODE } : null),
            );
          }}
          options={[
            { value: '', label: 'None: the supply pressures are typed below' },
            ...(fedFrom && !coldSystems.some((s) => s.id === fedFrom.systemId)
              ? [{ value: fedFrom.systemId, label: 'A system no longer in the project' }]
              : []),
            ...coldSystems.map((s) => ({ value: s.id, label: s.name })),
          ]}
        />
        {fedFrom ? (
          <SelectField
            {...describedField(FED_FROM, 'nodeId', document.unitSystem)}
            disabled={disabled}
            value={fedFrom.nodeId}
            onChange={(e) => {
              const nodeId = e.target.value;
              draft.update((doc) => withFedFrom(doc, { systemId: fedFrom.systemId, nodeId }));
            }}
            options={[
              ...(nodes.some((n) => n.id === fedFrom.nodeId)
                ? []
                : [{ value: fedFrom.nodeId, label: fedFrom.nodeId === NO_NODE ? 'Choose the node' : `${fedFrom.nodeId} (not in the cold system)` }]),
              ...nodes.map((n) => ({ value: n.id, label: n.label || n.id })),
            ]}
          />
        ) : null}
      </div>
      {fedFrom ? (
        <div className="mt-3 rounded-md bg-paper-deep p-3 text-sm" data-testid="fed-from-supply" role="status">
          {resolution?.status === 'resolved' ? (
            <p>
              Fed from <strong>{resolution.systemName}</strong> at <strong>{resolution.nodeLabel}</strong>:{' '}
              <strong data-testid="fed-from-pressure">
                {num(resolution.residualPressure, units.pressure)} {units.pressure}
              </strong>{' '}
              at its design flow (high static {num(resolution.staticPressureHigh, units.pressure)} {units.pressure}; revision {resolution.revisionNumber},{' '}
              {resolution.revisionStatus}).
            </p>
          ) : (
            <p className="font-semibold text-caution">
              <span aria-hidden="true">⚠ </span>
              {resolution?.status === 'unresolved'
                ? resolution.message
                : cold.isFetching
                  ? 'Reading the cold system…'
                  : 'The cold system has not been read yet.'}
            </p>
          )}
        </div>
      ) : null}
    </Section>
  );
}
