import { ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import type { Repository } from 'typeorm';
import type { Bike as BikeView, ForkInput, MeasuredSpring, ShockInput } from '@loamline/shared-types';
import type { RequestUser } from '../common/decorators/current-user.decorator';
import { InvalidInputError } from '../common/errors/domain-errors';
import { Bike } from './bike.entity';
import type { CreateBikeDto, UpdateBikeDto } from './dto/create-bike.dto';

/** A garage holds at most this many bikes. */
export const MAX_BIKES = 50;

const notFound = (): NotFoundException => new NotFoundException('No such bike in your garage.');

/** Class instances from the ValidationPipe, as plain JSON for the column (undefined fields dropped). */
const plain = <T>(v: T | null | undefined): T | null => (v ? (JSON.parse(JSON.stringify(v)) as T) : null);

const MEASURED_BY_SHOP =
  "only a shop's fit sets the measured spring: send it back unchanged, null to remove it, or leave it out";

/** Same measured spring (the fields stored, in any key order). */
function sameMeasured(a: MeasuredSpring, b: MeasuredSpring | null | undefined): boolean {
  if (!b) return false;
  const keys: (keyof MeasuredSpring)[] = [
    'positiveLengthMm',
    'negativeVolumeCm3',
    'endStrokeVolumeCm3',
    'frictionN',
    'label',
    'measuredAt',
    'shopName',
    'appointmentId',
  ];
  return keys.every((k) => a[k] === b[k]);
}

/**
 * A part as sent, with its measured spring settled: a part without `measured` keeps the stored one,
 * `measured: null` removes it, and the stored one sent back unchanged stays. Any other measured
 * spring is refused: only a shop's fit writes it (the Workshop's fit routes).
 */
function settleMeasured<T extends ForkInput | ShockInput>(
  field: 'fork' | 'shock',
  sent: T | null | undefined,
  stored: T | null,
): T | null {
  const part = plain<T>(sent);
  if (!part) return null;
  const given = sent?.measured;
  if (given === undefined) {
    if (stored?.measured) part.measured = stored.measured;
  } else if (given === null) {
    delete part.measured;
  } else if (!sameMeasured(given, stored?.measured)) {
    throw new InvalidInputError(`${field}.measured: ${MEASURED_BY_SHOP}`, {
      [`${field}.measured`]: MEASURED_BY_SHOP,
    });
  }
  return part;
}

/**
 * The rider's garage. Every query that loads a bike includes `owner_id = <the signed-in user>`:
 * another user's bike is simply not found (404), never "forbidden".
 */
@Injectable()
export class BikesService {
  constructor(@InjectRepository(Bike) private readonly bikes: Repository<Bike>) {}

  async list(user: RequestUser): Promise<BikeView[]> {
    const rows = await this.bikes.find({ where: { ownerId: user.id }, order: { createdAt: 'ASC' } });
    return rows.map(toView);
  }

  async get(user: RequestUser, id: string): Promise<BikeView> {
    return toView(await this.load(user, id));
  }

  async create(user: RequestUser, dto: CreateBikeDto): Promise<BikeView> {
    if ((await this.bikes.countBy({ ownerId: user.id })) >= MAX_BIKES) {
      throw new ConflictException(`A garage holds up to ${MAX_BIKES} bikes; delete one first.`);
    }
    const bike = this.bikes.create({
      ownerId: user.id,
      name: dto.name,
      fork: settleMeasured<ForkInput>('fork', dto.fork, null),
      shock: settleMeasured<ShockInput>('shock', dto.shock, null),
    });
    await this.bikes.insert(bike);
    return this.get(user, bike.id);
  }

  /**
   * A part sent replaces the stored one whole, except its measured spring (`settleMeasured`). The
   * row is locked while it is read and written, so a fit stored meanwhile is not lost.
   */
  async update(user: RequestUser, id: string, dto: UpdateBikeDto): Promise<BikeView> {
    await this.bikes.manager.transaction(async (em) => {
      const bike = await em
        .getRepository(Bike)
        .findOne({ where: { id, ownerId: user.id }, lock: { mode: 'pessimistic_write' } });
      if (!bike) throw notFound();
      if (dto.name !== undefined) bike.name = dto.name;
      if (dto.fork !== undefined) bike.fork = settleMeasured<ForkInput>('fork', dto.fork, bike.fork);
      if (dto.shock !== undefined) bike.shock = settleMeasured<ShockInput>('shock', dto.shock, bike.shock);
      await em
        .getRepository(Bike)
        .update({ id: bike.id, ownerId: user.id }, { name: bike.name, fork: bike.fork, shock: bike.shock });
    });
    return this.get(user, id);
  }

  async remove(user: RequestUser, id: string): Promise<void> {
    const result = await this.bikes.delete({ id, ownerId: user.id });
    if (!result.affected) throw notFound();
  }

  /** The ownership check lives in the query itself. */
  private async load(user: RequestUser, id: string): Promise<Bike> {
    const bike = await this.bikes.findOneBy({ id, ownerId: user.id });
    if (!bike) throw notFound();
    return bike;
  }
}

function toView(b: Bike): BikeView {
  return {
    id: b.id,
    name: b.name,
    fork: b.fork ?? null,
    shock: b.shock ?? null,
    createdAt: b.createdAt.toISOString(),
    updatedAt: b.updatedAt.toISOString(),
  };
}
