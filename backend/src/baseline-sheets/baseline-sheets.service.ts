import { ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import type { Repository, SelectQueryBuilder } from 'typeorm';
import type {
  BaselineInput,
  BaselineResult,
  BaselineSheet as SheetView,
  BaselineSheetListItem,
  BaselineSheetPartSummary,
  PartResult,
} from '@loamline/shared-types';
import { BaselinesService } from '../baselines/baselines.service';
import type { RequestUser } from '../common/decorators/current-user.decorator';
import { BaselineSheet, type SheetSummary } from './baseline-sheet.entity';

/** A rider keeps at most this many sheets. */
export const MAX_SHEETS = 200;

const notFound = (): NotFoundException => new NotFoundException('No such baseline sheet.');

/**
 * Saved baselines. The result is computed here, by the same model as `POST /api/baselines/compute`,
 * and stored with the input: a sheet shows what was computed then, even after the model changes.
 * Every query that loads a sheet carries the access rule; anyone else's sheet is a 404.
 */
@Injectable()
export class BaselineSheetsService {
  constructor(
    @InjectRepository(BaselineSheet) private readonly sheets: Repository<BaselineSheet>,
    private readonly baselines: BaselinesService,
  ) {}

  async create(user: RequestUser, name: string, input: BaselineInput): Promise<SheetView> {
    const stored = JSON.parse(JSON.stringify(input)) as BaselineInput; // the validated DTO as plain JSON
    const result = this.baselines.compute(stored); // a model input error is a 400 naming the field
    if ((await this.sheets.countBy({ ownerId: user.id })) >= MAX_SHEETS) {
      throw new ConflictException(`You can keep up to ${MAX_SHEETS} baseline sheets; delete one first.`);
    }
    const sheet = this.sheets.create({
      ownerId: user.id,
      name,
      input: stored,
      result,
      summary: summarise(result),
    });
    await this.sheets.insert(sheet);
    return this.get(user, sheet.id);
  }

  /** Mine, newest first, with the key figures instead of the curves. */
  async list(user: RequestUser): Promise<BaselineSheetListItem[]> {
    const rows = await this.sheets.find({
      select: { id: true, name: true, input: true, summary: true, createdAt: true, updatedAt: true },
      where: { ownerId: user.id },
      order: { createdAt: 'DESC', id: 'ASC' },
    });
    return rows.map((s) => ({
      id: s.id,
      name: s.name,
      massKg: s.input.rider.massKg,
      style: s.input.riding.style,
      feel: s.input.riding.feel,
      fork: s.summary.fork,
      shock: s.summary.shock,
      createdAt: s.createdAt.toISOString(),
      updatedAt: s.updatedAt.toISOString(),
    }));
  }

  async get(user: RequestUser, id: string): Promise<SheetView> {
    const qb = this.sheets.createQueryBuilder('s').where('s.id = :id', { id });
    const sheet = await this.readableBy(qb, user).getOne();
    if (!sheet) throw notFound();
    return toView(sheet);
  }

  async rename(user: RequestUser, id: string, name: string): Promise<SheetView> {
    const result = await this.sheets.update({ id, ownerId: user.id }, { name });
    if (!result.affected) throw notFound();
    return this.get(user, id);
  }

  async remove(user: RequestUser, id: string): Promise<void> {
    const result = await this.sheets.delete({ id, ownerId: user.id });
    if (!result.affected) throw notFound();
  }

  /**
   * Who may READ a sheet: its owner, and the staff of a shop that has it attached to one of its
   * appointments. Nobody else (404). Renaming and deleting stay with the owner (their own queries).
   */
  private readableBy(
    qb: SelectQueryBuilder<BaselineSheet>,
    user: RequestUser,
  ): SelectQueryBuilder<BaselineSheet> {
    const staff = (user.role === 'technician' || user.role === 'owner') && user.shopId;
    if (!staff) return qb.andWhere('s.owner_id = :userId', { userId: user.id });
    return qb.andWhere(
      '(s.owner_id = :userId OR EXISTS (SELECT 1 FROM appointments a WHERE a.baseline_sheet_id = s.id AND a.shop_id = :shopId))',
      { userId: user.id, shopId: user.shopId },
    );
  }
}

function partSummary(p: PartResult | null): BaselineSheetPartSummary | null {
  if (!p) return null;
  return {
    targetSagPct: p.targetSagPct,
    targetSagMm: p.targetSagMm,
    pressurePsi: p.pressure?.psi ?? null,
    rangePsi: p.pressure?.rangePsi ?? null,
    coilLbPerIn: p.coilRate?.suggestedLbPerIn ?? null,
    warnings: p.warnings.length,
  };
}

export function summarise(result: BaselineResult): SheetSummary {
  return { fork: partSummary(result.fork), shock: partSummary(result.shock) };
}

function toView(s: BaselineSheet): SheetView {
  return {
    id: s.id,
    name: s.name,
    input: s.input,
    result: s.result,
    createdAt: s.createdAt.toISOString(),
    updatedAt: s.updatedAt.toISOString(),
  };
}
