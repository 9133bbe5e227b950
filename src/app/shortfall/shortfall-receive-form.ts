import { ChangeDetectionStrategy, Component, computed, effect, inject, input, output, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';

import type { ReceiveLine, ReceiveShortfallResponse, ShortfallLine } from '../../../shared/api/builds.js';
import { apiErrorMessage } from '../api/api-error-message.js';
import { BuildClient } from '../builds/build-client.js';
import { buySpecText } from '../builds/build-words.js';

/** One row of the receipt as typed. */
interface ReceiptDraft {
  lineId: number;
  quantity: string;
  partNumber: string;
  location: string;
  srf: string;
}

/** Part number suggested for parts bought to a line: `RCV-C-6P8-0402` (kind, IEC 60062-style value code, package). */
export function suggestedPartNumber(line: Pick<ShortfallLine, 'kind' | 'buyValue' | 'package'>): string {
  const [scale, letter] = line.kind === 'capacitor' ? [1e-12, 'P'] : [1e-9, 'N'];
  const units = Number((line.buyValue / scale).toPrecision(3));
  const code = Number.isInteger(units) ? `${units}${letter}` : String(units).replace('.', letter);
  return ['RCV', line.kind === 'capacitor' ? 'C' : 'L', code, line.package ?? ''].filter(Boolean).join('-');
}

/**
 * Receiving bought parts: per line how many arrived and the stock code they go in under (an
 * existing part gains them; a new code is created to the line's spec, with its SRF if known).
 * The server enters them through the stock-list importer, so the import history shows the receipt.
 */
@Component({
  selector: 'sm-shortfall-receive-form',
  templateUrl: './shortfall-receive-form.html',
  styleUrl: './shortfall-receive-form.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule],
})
export class ShortfallReceiveForm {
  private readonly client = inject(BuildClient);

  /** The build whose list is received. */
  readonly buildId = input.required<number>();
  /** The list's lines. */
  readonly lines = input.required<readonly ShortfallLine[]>();
  /** Emits the server's answer once the parts are in stock. */
  readonly received = output<ReceiveShortfallResponse>();

  protected readonly drafts = signal<ReceiptDraft[]>([]);
  protected readonly busy = signal(false);
  protected readonly error = signal<string | null>(null);
  protected readonly buySpec = buySpecText;

  /** The rows with a quantity typed, as the API takes them, or a problem naming the row. */
  protected readonly receipt = computed((): { lines: ReceiveLine[]; problem: string | null } => {
    const lines: ReceiveLine[] = [];
    for (const [i, draft] of this.drafts().entries()) {
      const text = draft.quantity.trim();
      if (text === '' || text === '0') continue;
      if (!/^\d+$/.test(text)) return { lines, problem: `Line ${i + 1}: the quantity received must be a whole number.` };
      if (draft.partNumber.trim() === '') return { lines, problem: `Line ${i + 1}: give the part number the parts go in under.` };
      lines.push({ lineId: draft.lineId, quantity: Number(text), partNumber: draft.partNumber.trim(), location: draft.location.trim() || undefined, srfHz: draft.srf.trim() || null });
    }
    return { lines, problem: lines.length === 0 ? 'Type the quantity received on at least one line.' : null };
  });

  constructor() {
    effect(() => {
      this.drafts.set(
        this.lines().map((line) => ({
          lineId: line.id,
          quantity: String(Math.max(0, line.quantity - line.receivedQuantity)),
          partNumber: suggestedPartNumber(line),
          location: 'main',
          srf: '',
        })),
      );
    });
  }

  protected edit(index: number, field: keyof Omit<ReceiptDraft, 'lineId'>, value: string): void {
    this.drafts.update((rows) => rows.map((row, i) => (i === index ? { ...row, [field]: value } : row)));
  }

  protected receiveParts(): void {
    const { lines, problem } = this.receipt();
    if (problem) {
      this.error.set(problem);
      return;
    }
    this.busy.set(true);
    this.error.set(null);
    this.client.receiveShortfall(this.buildId(), lines).subscribe({
      next: (answer) => {
        this.busy.set(false);
        this.received.emit(answer);
      },
      error: (error: unknown) => {
        this.busy.set(false);
        this.error.set(apiErrorMessage(error, 'The parts could not be received.'));
      },
    });
  }
}
