import { beforeAll, describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { MATRIX } from './api-matrix';
import { clientsByRole, loadFixtures, type Fixtures, type Role } from './matrix-fixtures';
import { mailbox } from './planner-helpers';
import type { Client } from './client';

/**
 * OWASP, "CSV Injection" (https://owasp.org/www-community/attacks/CSV_Injection): a cell that
 * begins with =, +, -, @, tab or carriage return is run as a formula by spreadsheets, so every
 * CSV the product writes prefixes such a cell with a single quote and quotes it. Proven here
 * through the real routes: the download and the e-mail attachment of a parts request whose parts
 * carry formula-like names (as a catalog editor could type them).
 */
const HOSTILE_NAMES = ['=HYPERLINK("http://example.invalid","x")', '+1+cmd|" /C calc"!A0', '-2+3', '@SUM(A1:A9)', '\t=1+1'];

describe('CSV exports cannot carry formulas', () => {
  let clients: Awaited<ReturnType<typeof clientsByRole>>;
  let f: Fixtures;
  const roleFor = (key: string): Role => {
    const allowed = MATRIX[key]!.allowed;
    return allowed === 'public' ? 'dealer_admin' : allowed.includes('dealer_admin') ? 'dealer_admin' : allowed[0]!;
  };
  let requestId: string;
  let number: string;
  const partNumbers = HOSTILE_NAMES.map((_, i) => `CW-CSV-INJ-${i + 1}`);

  beforeAll(async () => {
    clients = await clientsByRole();
    f = await loadFixtures(clients.own);
    const editor: Client = clients.own[roleFor('POST /api/catalog/parts')];
    for (const [i, name] of HOSTILE_NAMES.entries()) {
      const res = await editor.post('/api/catalog/parts', { familyId: f.familyId, part: { ...f.part, partNumber: partNumbers[i], name } });
      expect(res.status, JSON.stringify(res.body)).toBe(201);
    }
    const writer: Client = clients.own.operator;
    const pr = await writer.post('/api/parts-requests', {
      from: 'manual',
      machineId: f.machineId,
      lines: partNumbers.map((partNumber) => ({ partNumber, quantity: 1 })),
    });
    expect(pr.status, JSON.stringify(pr.body)).toBe(201);
    requestId = pr.body.id;
    number = pr.body.number;
  }, 120_000);

  /** The description cells of the parts rows, as a spreadsheet would read the file. */
  const descriptions = (csv: string) => {
    const rows = Papa.parse<string[]>(csv.trim()).data;
    return partNumbers.map((pn) => rows.find((r) => r[0] === pn)![1]);
  };

  it('the download neutralises every formula-like cell (quote prefix, quoted) and keeps the text', async () => {
    const res = await clients.own.operator.fetch(`/api/parts-requests/${requestId}?format=csv`);
    expect(res.status).toBe(200);
    const csv = await res.text();
    expect(descriptions(csv)).toEqual(HOSTILE_NAMES.map((n) => `'${n}`));
    expect(csv).toContain(`"'=HYPERLINK(""http://example.invalid"",""x"")"`);
    // No cell of the file, once read, begins with a formula character.
    for (const row of Papa.parse<string[]>(csv.trim()).data) for (const cell of row) expect(/^[=+\-@\t\r]/.test(cell), cell).toBe(false);
  });

  it('the e-mail attachment sent to the parts desk is neutralised the same way', async () => {
    const reader: Client = clients.own[roleFor('GET /api/admin/mailbox')];
    const res = await clients.own.operator.post(`/api/parts-requests/${requestId}/submit`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const mail = (await mailbox(reader)).messages.find((m) => m.subject.includes(number))!;
    expect(mail).toBeDefined();
    const attachment = (mail as unknown as { attachments: { filename: string; content: string }[] }).attachments[0]!;
    expect(attachment.filename).toBe(`${number.toLowerCase()}.csv`);
    expect(descriptions(attachment.content)).toEqual(HOSTILE_NAMES.map((n) => `'${n}`));
  });
});
