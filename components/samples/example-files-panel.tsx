import { Panel } from '../panel';

export interface ExampleFileLink {
  name: string;
  holds: string;
  command: string;
}

/** Small input files to try the product with (public/examples/), each with the command that processes it. */
export function ExampleFilesPanel({ files }: { files: ExampleFileLink[] }) {
  return (
    <Panel title="No file at hand?" lead="Download an example made by Splitfield's own generators for the fictional Larkspur jet group, then upload it here.">
      <ul className="space-y-3 text-sm">
        {files.map((file) => (
          <li key={file.name}>
            <a href={`/examples/${file.name}`} download className="font-medium text-accent underline-offset-2 hover:underline">
              {file.name}
            </a>
            <span className="text-ink-soft">: {file.holds}.</span>
            <div className="mt-1 text-xs text-ink-soft">
              From a shell: <code className="break-all font-mono">{file.command}</code>
            </div>
          </li>
        ))}
      </ul>
    </Panel>
  );
}
