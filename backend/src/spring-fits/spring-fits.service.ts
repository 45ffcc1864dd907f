import { Inject, Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DateTime } from 'luxon';
import { DataSource, type EntityManager, In } from 'typeorm';
import type { ForkInput, MeasuredSpring, ShockInput, SpringFit, SpringFitView } from '@loamline/shared-types';
import { AppointmentEntity } from '../appointments/appointment.entity';
import { fitSpring, type BenchRun, SpringModelInputError } from '../baselines/spring-model';
import { Bike } from '../bikes/bike.entity';
import { CLOCK, type Clock } from '../common/clock/clock';
import type { RequestUser } from '../common/decorators/current-user.decorator';
import { ConflictError, InvalidInputError, NotFoundError } from '../common/errors/domain-errors';
import { AppointmentAttachmentEntity } from '../service-reports/appointment-attachment.entity';
import { SpringFitEntity } from '../service-reports/spring-fit.entity';
import type { FitDto, StoreFitDto } from './dto/fit.dto';
import { benchKnown } from './run-comparison';

type Part = 'fork' | 'shock';

const noAppointment = () => new NotFoundError('No such appointment.');
const noFit = () => new NotFoundError('No such fit on this appointment.');

/** "measured on 2 December 2026 at <shop>": the day in the shop's zone. */
export function measuredLabel(at: Date, timeZone: string, shopName: string): string {
  const day = DateTime.fromJSDate(at, { zone: timeZone }).setLocale('en-GB').toFormat('d LLLL yyyy');
  return `measured on ${day} at ${shopName}`;
}

/**
 * The bike's measured spring, from Workshop: fit the geometry from an appointment's curve runs
 * (`fitSpring`), store it on the appointment's bike or reject it. Staff of the appointment's shop
 * only, owner and technicians alike; everyone else gets 404, as if it did not exist.
 */
@Injectable()
export class SpringFitsService {
  constructor(
    @InjectDataSource() private readonly db: DataSource,
    @Inject(CLOCK) private readonly clock: Clock,
  ) {}

  async list(user: RequestUser, appointmentId: string): Promise<SpringFitView[]> {
    const a = await this.appointment(user, appointmentId);
    const rows = await this.db
      .getRepository(SpringFitEntity)
      .find({ where: { appointmentId: a.id }, order: { createdAt: 'ASC' } });
    return rows.map(toView);
  }

  async fit(user: RequestUser, appointmentId: string, dto: FitDto): Promise<SpringFitView> {
    const a = await this.appointment(user, appointmentId);
    const { input } = await this.bikePart(this.db.manager, a, dto.part);
    const curves = await this.curves(a.id, dto.part, dto.attachmentIds);
    const runs: BenchRun[] = curves.map((c) => ({
      label: c.run!.label,
      mainPsi: c.run!.settings.mainPsi,
      endStrokePsi: dto.part === 'shock' ? null : c.run!.settings.endStrokePsi,
      spacers: c.run!.settings.spacers,
      points: c.run!.points,
    }));
    const start = input.measured
      ? {
          positiveLengthMm: input.measured.positiveLengthMm,
          negativeVolumeCm3: input.measured.negativeVolumeCm3,
          endStrokeVolumeCm3: input.measured.endStrokeVolumeCm3 ?? undefined,
          frictionN: input.measured.frictionN,
        }
      : undefined;
    let r: ReturnType<typeof fitSpring>;
    try {
      r = fitSpring({ part: dto.part, known: benchKnown(dto.part, input), runs, start });
    } catch (e) {
      if (e instanceof SpringModelInputError) {
        // name the run by its attachment, not by its index in the model's list
        const m = /^runs\[(\d+)\](.*)$/.exec(e.field);
        const field = m ? `attachments.${curves[Number(m[1])].id}${m[2]}` : e.field;
        const message = `These runs cannot be fitted: ${field}: ${e.message}`;
        throw new InvalidInputError(message, { [field]: e.message });
      }
      throw e;
    }
    const result: SpringFit = {
      part: dto.part,
      geometry: r.geometry,
      frictionN: r.frictionN,
      rmsN: r.rmsN,
      relativeRms: r.relativeRms,
      identified: r.identified,
      quality: r.quality,
      reasons: r.reasons,
      notes: r.notes,
      runIds: curves.map((c) => c.id),
    };
    const repo = this.db.getRepository(SpringFitEntity);
    const row = repo.create({
      appointmentId: a.id,
      part: dto.part,
      result,
      status: 'proposed',
      createdById: user.id,
      decidedAt: null,
    });
    await repo.insert(row);
    return toView(await repo.findOneByOrFail({ id: row.id }));
  }

  /**
   * Writes the fit on the appointment's bike as the part's `measured` spring (the only field staff
   * may write on a rider's bike) and marks it the stored fit of its appointment and part.
   */
  async store(
    user: RequestUser,
    appointmentId: string,
    fitId: string,
    dto: StoreFitDto,
  ): Promise<SpringFitView> {
    const a = await this.appointment(user, appointmentId);
    const now = this.clock.now();
    await this.db.transaction(async (em) => {
      const fit = await em
        .getRepository(SpringFitEntity)
        .findOne({ where: { id: fitId, appointmentId: a.id }, lock: { mode: 'pessimistic_write' } });
      if (!fit) throw noFit();
      if (fit.status === 'rejected')
        throw new ConflictError('This fit was rejected; fit the runs again to store one.');
      if (fit.result.quality === 'poor' && dto.confirmPoor !== true) {
        throw new ConflictError(
          `This fit is poor (${fit.result.reasons.join('; ')}). Send confirmPoor: true to store it anyway, or reject it.`,
        );
      }
      const { bike, input } = await this.bikePart(em, a, fit.part, true);
      const g = fit.result.geometry;
      const measured: MeasuredSpring = {
        positiveLengthMm: g.positiveLengthMm,
        negativeVolumeCm3: g.negativeVolumeCm3,
        endStrokeVolumeCm3: g.endStrokeVolumeCm3,
        frictionN: fit.result.frictionN,
        label: measuredLabel(now, a.shop!.timeZone, a.shop!.name),
        measuredAt: now.toISOString(),
        shopName: a.shop!.name,
        appointmentId: a.id,
      };
      const next = { ...input, measured };
      await em
        .getRepository(Bike)
        .update({ id: bike.id, ownerId: a.riderId }, fit.part === 'fork' ? { fork: next } : { shock: next });
      await em
        .getRepository(SpringFitEntity)
        .update({ appointmentId: a.id, part: fit.part, status: 'stored' }, { status: 'proposed' });
      await em.getRepository(SpringFitEntity).update({ id: fit.id }, { status: 'stored', decidedAt: now });
    });
    return toView(await this.db.getRepository(SpringFitEntity).findOneByOrFail({ id: fitId }));
  }

  /** Sets a fit aside. A fit already on the bike is not taken off it: store another, or the rider removes it. */
  async reject(user: RequestUser, appointmentId: string, fitId: string): Promise<SpringFitView> {
    const a = await this.appointment(user, appointmentId);
    const repo = this.db.getRepository(SpringFitEntity);
    const fit = await repo.findOneBy({ id: fitId, appointmentId: a.id });
    if (!fit) throw noFit();
    if (fit.status === 'stored') {
      throw new ConflictError(
        "This fit is stored on the rider's bike; store another fit to replace it (the rider can remove it in the garage).",
      );
    }
    if (fit.status !== 'rejected') {
      await repo.update(
        { id: fit.id, status: 'proposed' },
        { status: 'rejected', decidedAt: this.clock.now() },
      );
    }
    return toView(await repo.findOneByOrFail({ id: fit.id }));
  }

  /* ---------------------------------------------------------------- loading */

  /** The appointment if `user` is staff of its shop; 404 for anyone else (riders included). */
  private async appointment(user: RequestUser, id: string): Promise<AppointmentEntity> {
    const staff = (user.role === 'owner' || user.role === 'technician') && !!user.shopId;
    if (!staff) throw noAppointment();
    const a = await this.db
      .getRepository(AppointmentEntity)
      .findOne({ where: { id, shopId: user.shopId! }, relations: { shop: true } });
    if (!a) throw noAppointment();
    return a;
  }

  /** The appointment's bike (the rider's) and its air fork or shock; 409 when there is none to fit. */
  private async bikePart(
    em: EntityManager,
    a: AppointmentEntity,
    part: Part,
    lock = false,
  ): Promise<{ bike: Bike; input: ForkInput | ShockInput }> {
    const what = part === 'fork' ? 'fork' : 'shock';
    if (!a.bikeId) {
      throw new ConflictError(
        `This appointment has no bike from the rider's garage, so there is no ${what} to fit or store a measured spring on (the travel and stanchion come from the bike).`,
      );
    }
    const bike = await em.getRepository(Bike).findOne({
      where: { id: a.bikeId, ownerId: a.riderId },
      ...(lock ? { lock: { mode: 'pessimistic_write' as const } } : {}),
    });
    if (!bike) {
      throw new ConflictError(
        `The rider has removed this appointment's bike from their garage, so there is no ${what} to fit or store a measured spring on.`,
      );
    }
    const input = part === 'fork' ? bike.fork : bike.shock;
    if (!input) throw new ConflictError(`The rider's bike has no ${what} on record.`);
    if (input.spring !== 'air') {
      throw new ConflictError(`The rider's ${what} is a coil spring: there is no air spring to fit.`);
    }
    return { bike, input };
  }

  /** The curve runs of one part: the ones named (each must be a curve of that part here), else all. */
  private async curves(
    appointmentId: string,
    part: Part,
    ids: string[] | undefined,
  ): Promise<AppointmentAttachmentEntity[]> {
    const repo = this.db.getRepository(AppointmentAttachmentEntity);
    const rows = await repo.find({
      where: { appointmentId, kind: 'curve', ...(ids ? { id: In(ids) } : {}) },
      order: { createdAt: 'ASC' },
    });
    if (ids) {
      const byId = new Map(rows.map((r) => [r.id, r]));
      const fields: Record<string, string> = {};
      ids.forEach((id, i) => {
        const r = byId.get(id);
        if (!r?.run) fields[`attachmentIds.${i}`] = 'not a curve of this appointment';
        else if (r.run.settings.part !== part)
          fields[`attachmentIds.${i}`] = `a run of the ${r.run.settings.part}`;
      });
      if (Object.keys(fields).length > 0) {
        throw new InvalidInputError(`attachmentIds: ${Object.values(fields).join('; ')}`, fields);
      }
      return ids.map((id) => byId.get(id)!);
    }
    const mine = rows.filter((r) => r.run?.settings.part === part);
    if (mine.length === 0) {
      throw new ConflictError(`There are no curve runs of the ${part} on this appointment to fit.`);
    }
    return mine;
  }
}

function toView(row: SpringFitEntity): SpringFitView {
  return {
    ...row.result,
    notes: row.result.notes ?? [],
    id: row.id,
    stored: row.status === 'stored',
    rejected: row.status === 'rejected',
    createdAt: row.createdAt.toISOString(),
  };
}
