import type { SystemDocument } from '../../../engine';
import { useWalk } from '../../walk/draft/walk-context';
import { StepIntro } from '../../walk/components/cells';
import { useSegmentFlags } from '../../walk/components/segment-flags';
import { useProjectEntries } from '../../catalog/api/get-project-catalog';
import { TreeEditor } from '../../tree-editor/components/tree-editor';
import { CONTRACTOR_POLICY, readOnlyPolicy } from '../../tree-editor/policy';
import { useFieldChangeFrame } from '../components/field-change-context';
import { SubstitutePanel } from '../../sizing/components/substitute-panel';

/**
 * The contractor's pipe substitutions: the walk's tree editor with the contractor's policy (material,
 * size, length and fittings; the tree stays as issued, shown locked with the reason), each row with
 * what was issued and the effect on its velocity and loss.
 */
export function PipeStep() {
  const { ids, document, draft, readOnlyReason, catalog, live } = useWalk();
  const { baseDocument, issuedLive } = useFieldChangeFrame();
  const project = useProjectEntries(ids.projectId);
  const flagsOf = useSegmentFlags();
  const policy = readOnlyReason ? readOnlyPolicy(readOnlyReason) : CONTRACTOR_POLICY;
  return (
    <div>
      <StepIntro title="Pipe and sizes">
        Another pipe material, another size, or more developed length for an offset. Each segment shows what was issued beside what goes in instead, and the
        effect on its velocity and on its loss (friction and fittings) at the design flow. Insert fittings of PEX narrow the bore further: add them on the
        fittings step.
      </StepIntro>
      <SubstitutePanel onChanged={() => undefined} />
      <form noValidate onSubmit={(ev) => ev.preventDefault()} aria-label="Pipe and sizes">
        <fieldset disabled={readOnlyReason !== null} className="min-w-0">
          <TreeEditor
            label="Pipe substitutions by segment"
            testIdPrefix="pipe"
            document={document}
            analysis={live.ok ? live.analysis : null}
            baseline={{ document: baseDocument as SystemDocument, analysis: issuedLive.ok ? issuedLive.analysis : null }}
            policy={policy}
            catalog={catalog}
            project={project}
            onChange={draft.update}
            reportHeld={draft.reportHeld}
            flagsOf={flagsOf}
            initialActive={null}
          />
        </fieldset>
      </form>
    </div>
  );
}
