/**
 * Split one line of delimited text into cells, honouring double quotes ("a;b" and "" escapes).
 * Cells are trimmed. Complexity O(length).
 *
 * @example
 * splitDelimitedLine('2024-03-04 12:10;"I1 H5 [A]";1,5', ";") // ["2024-03-04 12:10", "I1 H5 [A]", "1,5"]
 */
export function splitDelimitedLine(line: string, delimiter: string): string[] {
  const cells: string[] = [];
  let cell = "";
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const c = line[i]!;
    if (quoted) {
      if (c === '"') {
        if (line[i + 1] === '"') {
          cell += '"';
          i++;
        } else quoted = false;
      } else cell += c;
    } else if (c === '"' && cell.trim() === "") {
      quoted = true;
      cell = "";
    } else if (c === delimiter) {
      cells.push(cell.trim());
      cell = "";
    } else cell += c;
  }
  cells.push(cell.trim());
  return cells;
}
