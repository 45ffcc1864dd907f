import { Inject, Injectable, Logger, type OnModuleInit } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { InjectDataSource } from '@nestjs/typeorm';
import type { DataSource, EntityManager } from 'typeorm';
import {
  type Attachment,
  type CurveRun,
  REPORT_LIMITS,
  type ServiceReport,
  type ServiceReportInput,
} from '@loamline/shared-types';
import { AppointmentEntity } from '../appointments/appointment.entity';
import {
  type AppointmentChange,
  type AppointmentListener,
  AppointmentsService,
} from '../appointments/appointments.service';
import { ER_DUP_ENTRY, errno } from '../appointments/booking-errors';
import { Bike } from '../bikes/bike.entity';
import { CLOCK, type Clock } from '../common/clock/clock';
import type { RequestUser } from '../common/decorators/current-user.decorator';
import {
  ConflictError,
  InvalidInputError,
  NotFoundError,
  TooLargeError,
  UnavailableError,
} from '../common/errors/domain-errors';
import { staffShopId } from '../common/staff-shop';
import type { AppConfig } from '../config/app.config';
import { MailOutbox } from '../mail/outbox/mail-outbox';
import { ShopServiceEntity } from '../shop-services/shop-service.entity';
import { Shop } from '../shops/shop.entity';
import { runComparison } from '../spring-fits/run-comparison';
import { User } from '../users/user.entity';
import { AppointmentAttachmentEntity, type StoredRun } from './appointment-attachment.entity';
import { CurveFileError, parseCurveCsv } from './curve-csv';
import { DEFAULT_CHECKLIST } from './default-checklist';
import type { UploadAttachmentDto } from './dto/service-report.dto';
import { cleanFileName } from './file-names';
import { checkPhoto, PhotoError } from './images';
import { reportReadyMail } from './report-mails';
import { ServiceReportEntity } from './service-report.entity';
import { SpringFitEntity } from './spring-fit.entity';
import {
  newStorageKey,
  type StoredObject,
  UPLOAD_STORE,
  type UploadStore,
  UploadStoreError,
} from './upload-store';

type Side = 'staff' | 'rider';

/** The file part of a multipart upload, as multer's memory storage gives it. */
export interface UploadedFileBytes {
  originalname: string;
  size: number;
  buffer: Buffer;
}

/** Appointment states in which the technician works on the report (before it is completed). */
const OPEN_STATES = new Set(['requested', 'confirmed']);

const changedMeanwhile = () =>
  new ConflictError(
    'Someone else saved this report since you opened it, so your changes were not saved. Reload it to see theirs, then make your changes again.',
  );
const isFinal = () =>
  new ConflictError('This report is final: the appointment was completed, and it can no longer be changed.');

/**
 * Service reports (docs/service-reports.md): the technician's draft while they work, made final
 * when the appointment is completed (then the rider is mailed a link and sees it), and its
 * photos and bench curves, whose bytes live in the upload store under generated keys.
 */
@Injectable()
export class ServiceReportsService implements AppointmentListener, OnModuleInit {
  private readonly logger = new Logger(ServiceReportsService.name);

  constructor(
    @InjectDataSource() private readonly db: DataSource,
    @Inject(UPLOAD_STORE) private readonly store: UploadStore,
    private readonly appointments: AppointmentsService,
    private readonly outbox: MailOutbox,
    private readonly config: ConfigService,
    @Inject(CLOCK) private readonly clock: Clock,
  ) {}

  onModuleInit(): void {
    this.appointments.addListener(this);
  }

  /* ---------------------------------------------------------------- the report */

  async getForStaff(user: RequestUser, id: string): Promise<ServiceReport> {
    const a = await this.load(user, id, 'staff');
    return this.view(a, 'staff');
  }

  /** The rider's view: only once final (404 while a draft, as for someone else's). */
  async getForRider(user: RequestUser, id: string): Promise<ServiceReport> {
    const a = await this.load(user, id, 'rider');
    return this.view(a, 'rider');
  }

  /**
   * Saves the draft when `input.version` is the one stored (0: none yet); otherwise someone saved
   * meanwhile and this save is refused (409), never overwriting theirs. The appointment's row is
   * locked for the check, so two saves, or a save and the completion, take turns.
   */
  async save(user: RequestUser, id: string, input: ServiceReportInput): Promise<ServiceReport> {
    await this.load(user, id, 'staff');
    const values = {
      checklist: input.checklist.map((c) => ({ label: c.label, done: c.done })),
      notes: input.notes,
      fork: input.fork ? { ...input.fork } : null,
      shock: input.shock ? { ...input.shock } : null,
      updatedById: user.id,
    };
    try {
      await this.db.transaction(async (m) => {
        await this.lockOpen(m, user, id);
        const row = await m.findOneBy(ServiceReportEntity, { appointmentId: id });
        if (row?.status === 'final') throw isFinal();
        if ((row?.version ?? 0) !== input.version) throw changedMeanwhile();
        if (!row) {
          await m.insert(ServiceReportEntity, { appointmentId: id, status: 'draft', ...values });
          return;
        }
        const res = await m
          .createQueryBuilder()
          .update(ServiceReportEntity)
          .set(values)
          .where("appointment_id = :id AND version = :version AND status = 'draft'", {
            id,
            version: input.version,
          })
          .execute();
        if (!res.affected) throw changedMeanwhile();
      });
    } catch (e) {
      if (errno(e) === ER_DUP_ENTRY) throw changedMeanwhile();
      throw e;
    }
    return this.getForStaff(user, id);
  }

  /* ---------------------------------------------------------------- completion */

  /** Hears every appointment change; on `complete` makes the report final and mails the rider. */
  async changed(change: AppointmentChange, m: EntityManager): Promise<string[]> {
    if (change.event !== 'complete') return [];
    const a = change.appointment;
    const now = this.clock.now();
    const row = await m.findOne(ServiceReportEntity, {
      where: { appointmentId: a.id },
      lock: { mode: 'pessimistic_write' },
    });
    const [shop, service, rider] = await Promise.all([
      m.findOneByOrFail(Shop, { id: a.shopId }),
      m.findOneByOrFail(ShopServiceEntity, { id: a.serviceId }),
      m.findOneByOrFail(User, { id: a.riderId }),
    ]);
    if (row) {
      await m.update(ServiceReportEntity, { appointmentId: a.id }, { status: 'final', completedAt: now });
    } else {
      await m.insert(ServiceReportEntity, {
        appointmentId: a.id,
        checklist: checklistOf(service),
        notes: '',
        fork: null,
        shock: null,
        status: 'final',
        completedAt: now,
        updatedById: null,
      });
    }
    const base = this.config.getOrThrow<AppConfig>('app').url;
    const mail = reportReadyMail(rider.email, {
      shopName: shop.name,
      shopTown: shop.town,
      serviceName: service.name,
      riderName: rider.name,
      link: `${base}/appointments/${a.id}`,
    });
    return [await this.outbox.enqueue(m, mail, { kind: 'service-report-ready', refId: a.id })];
  }

  /** The notifier sends every mail id of the change once it committed (ours included). */
  afterCommit(): void {}

  /* ---------------------------------------------------------------- uploads */

  /**
   * A photo or a bench curve. Everything about the file is checked in memory first (type by
   * content, thumbnail, CSV rows); then, with the appointment's row locked (so two uploads at once
   * count photos one after the other), the report must be a draft and under the photo limit, the
   * bytes go to the store and the row is written. Any refusal removes what was stored.
   */
  async upload(
    user: RequestUser,
    id: string,
    dto: UploadAttachmentDto,
    file: UploadedFileBytes | undefined,
  ): Promise<Attachment> {
    await this.load(user, id, 'staff');
    if (!file?.buffer?.length)
      throw new InvalidInputError('file: choose a file to upload (the form field "file")', {
        file: 'choose a file to upload',
      });
    const bytes = file.buffer;
    const base: Pick<AppointmentAttachmentEntity, 'kind' | 'originalName' | 'sizeBytes' | 'uploadedById'> = {
      kind: dto.kind,
      originalName: cleanFileName(file.originalname, dto.kind === 'photo' ? 'photo' : 'curve.csv'),
      sizeBytes: bytes.length,
      uploadedById: user.id,
    };
    const puts: [key: string, bytes: Buffer, contentType: string][] = [];
    let row: Omit<AppointmentAttachmentEntity, 'id' | 'createdAt' | 'appointmentId'>;
    if (dto.kind === 'photo') {
      if (bytes.length > REPORT_LIMITS.photoMaxBytes) throw tooBig('photo', REPORT_LIMITS.photoMaxBytes);
      let photo;
      try {
        photo = await checkPhoto(bytes);
      } catch (e) {
        if (e instanceof PhotoError) throw refused(`The photo was refused: ${e.message}.`);
        throw e;
      }
      const key = newStorageKey(photo.ext);
      const thumb = newStorageKey('jpg', '-thumb');
      puts.push([key, photo.clean, photo.contentType], [thumb, photo.thumbnail, 'image/jpeg']);
      row = {
        ...base,
        sizeBytes: photo.clean.length,
        storageKey: key,
        thumbnailKey: thumb,
        contentType: photo.contentType,
        run: null,
      };
    } else {
      if (bytes.length > REPORT_LIMITS.curveMaxBytes) throw tooBig('curve', REPORT_LIMITS.curveMaxBytes);
      const missing: Record<string, string> = {};
      if (!dto.label) missing.label = 'name the run, e.g. "Fork at 85 psi, 2 spacers"';
      if (!dto.part) missing.part = 'fork or shock';
      if (dto.mainPsi === undefined) missing.mainPsi = 'the main chamber pressure the run was made at';
      if (dto.spacers === undefined) missing.spacers = 'the spacers the run was made with';
      const names = Object.keys(missing);
      if (names.length)
        throw new InvalidInputError(names.map((n) => `${n}: ${missing[n]}`).join('; '), missing);
      let parsed;
      try {
        parsed = parseCurveCsv(bytes);
      } catch (e) {
        if (e instanceof CurveFileError) throw refused(`The curve file was refused: ${e.message}.`);
        throw e;
      }
      const run: StoredRun = {
        label: dto.label!,
        settings: {
          part: dto.part!,
          mainPsi: dto.mainPsi!,
          endStrokePsi: dto.endStrokePsi ?? null,
          spacers: dto.spacers!,
        },
        units: parsed.units,
        points: parsed.points,
      };
      const key = newStorageKey('csv');
      puts.push([key, bytes, 'text/csv']);
      row = { ...base, storageKey: key, thumbnailKey: null, contentType: 'text/csv', run };
    }

    let saved: AppointmentAttachmentEntity;
    try {
      saved = await this.db.transaction(async (m) => {
        await this.lockOpen(m, user, id);
        if (dto.kind === 'photo') {
          const photos = await m.countBy(AppointmentAttachmentEntity, { appointmentId: id, kind: 'photo' });
          if (photos >= REPORT_LIMITS.photosPerAppointment)
            throw new ConflictError(
              `This appointment already has ${REPORT_LIMITS.photosPerAppointment} photos, the most it can hold. Delete one to add another.`,
            );
        }
        for (const [key, b, type] of puts) await this.store.put(key, b, type);
        const entity = m.create(AppointmentAttachmentEntity, { ...row, appointmentId: id });
        await m.insert(AppointmentAttachmentEntity, entity);
        return m.findOneByOrFail(AppointmentAttachmentEntity, { id: entity.id });
      });
    } catch (e) {
      // the row was not written (or rolled back): nothing of this upload may stay in the store
      await this.forget(puts.map(([k]) => k));
      if (e instanceof UploadStoreError) {
        this.logger.error(`upload to appointment ${id}: ${e.message}`);
        throw storageDown('The file could not be stored, so nothing was saved.');
      }
      throw e;
    }
    return attachmentView(saved, id, 'staff');
  }

  /** The bytes of a photo (or its thumbnail) or a curve's file, for staff, or the rider once final. */
  async file(
    user: RequestUser,
    id: string,
    attachmentId: string,
    side: Side,
    thumb: boolean,
  ): Promise<{ file: StoredObject; contentType: string; name: string }> {
    await this.load(user, id, side);
    const row = await this.db
      .getRepository(AppointmentAttachmentEntity)
      .findOneBy({ id: attachmentId, appointmentId: id });
    const key = thumb ? row?.thumbnailKey : row?.storageKey;
    if (!row || !key) throw new NotFoundError('No such file on this appointment.');
    let file: StoredObject | null;
    try {
      file = await this.store.open(key);
    } catch (e) {
      if (!(e instanceof UploadStoreError)) throw e;
      this.logger.error(`attachment ${row.id}: ${e.message}`);
      throw storageDown('The file cannot be shown right now.');
    }
    if (!file) {
      this.logger.error(`attachment ${row.id}: nothing in the upload store under ${key}`);
      throw new NotFoundError('No such file on this appointment.');
    }
    const name = thumb ? row.originalName.replace(/(\.[^.]*)?$/, '-thumbnail.jpg') : row.originalName;
    // the type detected at upload (the row) rules, whatever the store says
    return { file, contentType: thumb ? 'image/jpeg' : row.contentType, name };
  }

  /**
   * Removes an attachment while the report is a draft: the row, and its bytes before the row's
   * removal commits. A store that cannot delete rolls the row back (503, the file stays listed), so a
   * row never outlives its bytes by a store failure, and trying again works (deleting what is
   * already gone is fine).
   */
  async remove(user: RequestUser, id: string, attachmentId: string): Promise<void> {
    await this.load(user, id, 'staff');
    try {
      await this.db.transaction(async (m) => {
        await this.lockOpen(m, user, id);
        const row = await m.findOneBy(AppointmentAttachmentEntity, { id: attachmentId, appointmentId: id });
        if (!row) throw new NotFoundError('No such file on this appointment.');
        await m.delete(AppointmentAttachmentEntity, { id: row.id });
        for (const key of [row.storageKey, ...(row.thumbnailKey ? [row.thumbnailKey] : [])])
          await this.store.delete(key);
      });
    } catch (e) {
      if (!(e instanceof UploadStoreError)) throw e;
      this.logger.error(`removing attachment ${attachmentId}: ${e.message}`);
      throw storageDown('The file could not be removed: it is still on the report.');
    }
  }

  /* ---------------------------------------------------------------- helpers */

  private async forget(keys: string[]): Promise<void> {
    for (const k of keys)
      await this.store.delete(k).catch((e: unknown) => {
        this.logger.error(`could not remove ${k} from the upload store: ${String(e)}`);
      });
  }

  /**
   * The appointment, if `user` may see its report from that side: staff of its shop (any time),
   * or its rider once the report is final. Everyone else gets 404, as for a missing one.
   */
  private async load(user: RequestUser, id: string, side: Side): Promise<AppointmentEntity> {
    const where = side === 'staff' ? { id, shopId: staffShopId(user) } : { id, riderId: user.id };
    const a = await this.db.getRepository(AppointmentEntity).findOne({ where, relations: { service: true } });
    if (!a) throw new NotFoundError('No such appointment.');
    if (side === 'rider') {
      const final = await this.db
        .getRepository(ServiceReportEntity)
        .existsBy({ appointmentId: id, status: 'final' });
      if (!final) throw new NotFoundError('There is no service report for this appointment yet.');
    }
    return a;
  }

  /**
   * Locks the appointment's row (staff of its shop) for the rest of the transaction and checks
   * that its report can still change: the appointment is open and the report is not final.
   */
  private async lockOpen(m: EntityManager, user: RequestUser, id: string): Promise<void> {
    const a = await m.findOne(AppointmentEntity, {
      where: { id, shopId: staffShopId(user) },
      lock: { mode: 'pessimistic_write' },
    });
    if (!a) throw new NotFoundError('No such appointment.');
    const report = await m.findOneBy(ServiceReportEntity, { appointmentId: id });
    if (report?.status === 'final' || a.status === 'completed') throw isFinal();
    if (!OPEN_STATES.has(a.status))
      throw new ConflictError(`This appointment is ${a.status}; its report can no longer be changed.`);
  }

  private async view(a: AppointmentEntity, side: Side): Promise<ServiceReport> {
    const [row, files, fits, bike] = await Promise.all([
      this.db
        .getRepository(ServiceReportEntity)
        .findOne({ where: { appointmentId: a.id }, relations: { updatedBy: true } }),
      this.db
        .getRepository(AppointmentAttachmentEntity)
        .find({ where: { appointmentId: a.id }, order: { createdAt: 'ASC', id: 'ASC' } }),
      this.db
        .getRepository(SpringFitEntity)
        .find({ where: { appointmentId: a.id }, order: { createdAt: 'DESC' } }),
      a.bikeId ? this.db.getRepository(Bike).findOneBy({ id: a.bikeId }) : null,
    ]);
    // each curve read against the model of the bike's part (its measured spring when stored)
    const compare = (run: StoredRun) =>
      runComparison({
        run,
        part: bike?.[run.settings.part] ?? null,
        report: row?.[run.settings.part] ?? null,
      });
    const lastFits = (['fork', 'shock'] as const)
      // per part: the fit stored on the bike, else the newest
      .map((part) => {
        const mine = fits.filter((f) => f.part === part);
        return (
          mine.find((f) => f.status === 'stored') ??
          mine.sort((x, y) => y.createdAt.getTime() - x.createdAt.getTime())[0]
        );
      })
      .filter((f): f is SpringFitEntity => !!f)
      .map((f) => ({
        ...f.result,
        id: f.id,
        createdAt: f.createdAt.toISOString(),
        stored: f.status === 'stored',
        rejected: f.status === 'rejected',
      }));
    return {
      appointmentId: a.id,
      version: row?.version ?? 0,
      status: row?.status ?? 'draft',
      checklist: row?.checklist ?? checklistOf(a.service!),
      notes: row?.notes ?? '',
      fork: row?.fork ?? null,
      shock: row?.shock ?? null,
      updatedAt: row ? row.updatedAt.toISOString() : null,
      updatedBy: row?.updatedBy?.name ?? null,
      completedAt: row?.completedAt ? row.completedAt.toISOString() : null,
      attachments: files.map((f) => attachmentView(f, a.id, side, compare)),
      fits: lastFits,
    };
  }
}

function checklistOf(service: ShopServiceEntity) {
  return (service.checklist ?? DEFAULT_CHECKLIST).map((label) => ({ label, done: false }));
}

function attachmentView(
  f: AppointmentAttachmentEntity,
  appointmentId: string,
  side: Side,
  compare: (run: StoredRun) => CurveRun['comparison'] = () => null,
): Attachment {
  const url = `${side === 'staff' ? '/api/workshop/appointments' : '/api/appointments'}/${appointmentId}/attachments/${f.id}`;
  return {
    id: f.id,
    kind: f.kind,
    name: f.originalName,
    contentType: f.contentType,
    sizeBytes: f.sizeBytes,
    createdAt: f.createdAt.toISOString(),
    url,
    thumbnailUrl: f.thumbnailKey ? `${url}?thumb=1` : null,
    run: f.run ? { ...f.run, comparison: compare(f.run) } : null,
  };
}

const mb = (bytes: number) => `${bytes / (1024 * 1024)} MB`;
const tooBig = (what: 'photo' | 'curve', max: number) =>
  new TooLargeError(
    what === 'photo'
      ? `The photo is larger than ${mb(max)}, the most a photo may be.`
      : `The curve file is larger than ${mb(max)}, the most a curve's CSV may be.`,
    { file: `at most ${mb(max)}` },
  );
/** The upload store is down or refused: a 503 saying so, in the user's terms. */
const storageDown = (what: string) =>
  new UnavailableError(`Storage is unavailable right now. ${what} Try again in a few minutes.`);
const refused = (message: string) => new InvalidInputError(message, { file: message });
