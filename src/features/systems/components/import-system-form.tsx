import { useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/field';
// The schema module alone (zod only): the project page must not pull in the whole engine.
import { SystemDocumentSchema } from '../../../engine/model/schema';
import type { SystemDocument } from '../../../engine/model/schema';
import { errorMessage } from '../../../lib/error-messages';
import { useCreateSystem } from '../api/create-system';
import { walkPaths } from '../../walk/paths';

/** Reads a system document file and says, line by line, what does not match the format. */
export function readSystemFile(text: string): { document: SystemDocument } | { problems: string[] } {
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (error) {
    return { problems: [`The file is not JSON: ${error instanceof Error ? error.message : String(error)}`] };
  }
  const parsed = SystemDocumentSchema.safeParse(json);
  if (parsed.success) return { document: parsed.data };
  return { problems: parsed.error.issues.slice(0, 20).map((i) => `${i.path.join('.') || 'document'}: ${i.message}`) };
}

/** Creates a system from an exported JSON system document (the engine's documented format). */
export function ImportSystemForm({ projectId }: { projectId: string }) {
  const create = useCreateSystem();
  const navigate = useNavigate();
  const [document, setDocument] = useState<SystemDocument | null>(null);
  const [problems, setProblems] = useState<string[]>([]);
  const [name, setName] = useState('');

  const onFile = async (file: File | undefined) => {
    setDocument(null);
    setProblems([]);
    if (!file) return;
    const read = readSystemFile(await file.text());
    if ('problems' in read) setProblems(read.problems);
    else {
      setDocument(read.document);
      setName(read.document.name);
    }
  };

  const onSubmit = (ev: React.FormEvent) => {
    ev.preventDefault();
    if (!document || name.trim() === '') return;
    create.mutate(
      { projectId, body: { name: name.trim(), service: document.service, document } },
      { onSuccess: ({ system, revision }) => navigate(walkPaths.step.getHref(projectId, system.id, revision.id, 'result')) },
    );
  };

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" aria-label="Import a system">
      <label className="flex flex-col gap-1 text-sm font-semibold">
        System document (JSON)
        <input type="file" accept=".json,application/json" className="text-sm font-normal" onChange={(ev) => void onFile(ev.target.files?.[0])} />
      </label>
      <div aria-live="assertive">
        {problems.length ? (
          <Alert tone="fault" title="This file is not a system document">
            <ul className="list-disc pl-5">
              {problems.map((p) => (
                <li key={p}>{p}</li>
              ))}
            </ul>
          </Alert>
        ) : null}
        {create.isError ? (
          <Alert tone="fault" title="System not imported">
            {errorMessage(create.error)}
          </Alert>
        ) : null}
      </div>
      {document ? (
        <>
          <p className="text-sm">
            {document.segments.length} segments, {document.nodes.length} nodes, {document.devices.length} devices · {document.service} water · units{' '}
            {document.unitSystem}
          </p>
          <TextField
            label="Name of the imported system"
            value={name}
            onChange={(ev) => setName(ev.target.value)}
            error={name.trim() === '' ? 'Enter a system name' : undefined}
          />
          <div>
            <Button type="submit" pending={create.isPending} pendingLabel="Importing…" disabled={name.trim() === ''}>
              Import system
            </Button>
          </div>
        </>
      ) : null}
    </form>
  );
}
