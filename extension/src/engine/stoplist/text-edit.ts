/** A position in a text document: 0-based line and UTF-16 character, as the editor counts them. */
export interface TextPosition {
  line: number;
  character: number;
}

/** Replace [start, end) with newText; the host turns it into a WorkspaceEdit, so it stays undoable. */
export interface TextEdit {
  start: TextPosition;
  end: TextPosition;
  newText: string;
}
