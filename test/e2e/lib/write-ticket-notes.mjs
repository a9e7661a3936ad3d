// Writes the folder of documents the "folder of .md documents" scenario reviews: the first 400
// tickets of fixtures/ticket-shards/part-0.jsonl (the project's own generated data), one .md file
// each, under a subfolder per topic. run.sh calls it before the editor starts, so the explorer
// lists the folder from the beginning. Usage: node write-ticket-notes.mjs WORKSPACE
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { pathToFileURL } from 'node:url';

export const NOTES_FOLDER = 'ticket-notes';

export function writeTicketNotes(workspace) {
  const lines = readFileSync(path.join(workspace, 'ticket-shards', 'part-0.jsonl'), 'utf8').trim().split('\n').slice(0, 400);
  lines.forEach((line, i) => {
    const { message, topic } = JSON.parse(line);
    mkdirSync(path.join(workspace, NOTES_FOLDER, topic), { recursive: true });
    writeFileSync(path.join(workspace, NOTES_FOLDER, topic, `note-${String(i).padStart(3, '0')}.md`), `${message}\n`);
  });
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) writeTicketNotes(process.argv[2]);
