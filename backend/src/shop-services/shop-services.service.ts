import { Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import type { Repository } from 'typeorm';
import type { ShopService } from '@loamline/shared-types';
import { GRID_MINUTES } from '../appointments/availability/availability';
import { InvalidInputError, NotFoundError } from '../common/errors/domain-errors';
import { AppointmentEntity } from '../appointments/appointment.entity';
import { AvailabilityCache } from '../shop-settings/availability-cache';
import type { CreateShopServiceDto, UpdateShopServiceDto } from './dto/shop-service.dto';
import { ShopServiceEntity } from './shop-service.entity';

export const toServiceView = (s: ShopServiceEntity): ShopService => ({
  id: s.id,
  name: s.name,
  description: s.description,
  durationMinutes: s.durationMinutes,
  bufferAfterMinutes: s.bufferAfterMinutes,
  priceMinor: s.priceMinor,
  depositMinor: s.depositMinor,
  active: s.active,
  checklist: s.checklist,
});

/** A shop's services (Workshop › Services); riders see the active ones. */
@Injectable()
export class ShopServicesService {
  constructor(
    @InjectRepository(ShopServiceEntity) private readonly services: Repository<ShopServiceEntity>,
    @InjectRepository(AppointmentEntity) private readonly appointments: Repository<AppointmentEntity>,
    private readonly availability: AvailabilityCache,
  ) {}

  async list(shopId: string, onlyActive: boolean): Promise<ShopService[]> {
    const rows = await this.services.find({
      where: onlyActive ? { shopId, active: true } : { shopId },
      order: { name: 'ASC' },
    });
    return rows.map(toServiceView);
  }

  /** A service of this shop (404 for another shop's, like a missing one). */
  async load(shopId: string, id: string): Promise<ShopServiceEntity> {
    const s = await this.services.findOneBy({ id, shopId });
    if (!s) throw new NotFoundError('No such service at this shop.');
    return s;
  }

  async create(shopId: string, dto: CreateShopServiceDto): Promise<ShopService> {
    const s = this.services.create({
      ...dto,
      description: dto.description ?? '',
      active: dto.active ?? true,
      checklist: cleanChecklist(dto.checklist),
      shopId,
    });
    check(s);
    await this.services.insert(s);
    this.availability.forgetShop(shopId);
    return toServiceView(await this.load(shopId, s.id));
  }

  async update(shopId: string, id: string, dto: UpdateShopServiceDto): Promise<ShopService> {
    const s = await this.load(shopId, id);
    Object.assign(s, Object.fromEntries(Object.entries(dto).filter(([, v]) => v !== undefined)));
    if (dto.checklist !== undefined) s.checklist = cleanChecklist(dto.checklist);
    check(s);
    await this.services.save(s);
    this.availability.forgetShop(shopId);
    return toServiceView(await this.load(shopId, id));
  }

  /** Deleted when never booked; otherwise only retired (inactive), so history keeps its name. */
  async remove(shopId: string, id: string): Promise<void> {
    await this.load(shopId, id);
    if (await this.appointments.existsBy({ serviceId: id })) {
      await this.services.update({ id, shopId }, { active: false });
    } else {
      await this.services.delete({ id, shopId });
    }
    this.availability.forgetShop(shopId);
  }
}

/** Items trimmed, blank ones dropped; an empty list is kept (a service with no checklist items). */
function cleanChecklist(list: string[] | null | undefined): string[] | null {
  if (!list) return null;
  return list.map((l) => l.normalize('NFC').trim()).filter(Boolean);
}

function check(s: ShopServiceEntity): void {
  const fields: Record<string, string> = {};
  if (s.durationMinutes % GRID_MINUTES)
    fields.durationMinutes = `must be a multiple of ${GRID_MINUTES} minutes`;
  if (s.bufferAfterMinutes % GRID_MINUTES)
    fields.bufferAfterMinutes = `must be a multiple of ${GRID_MINUTES} minutes`;
  if (s.depositMinor > s.priceMinor) fields.depositMinor = 'cannot be more than the price';
  if (!s.name.trim()) fields.name = 'must not be blank';
  const names = Object.keys(fields);
  if (names.length) throw new InvalidInputError(names.map((n) => `${n}: ${fields[n]}`).join('; '), fields);
}
