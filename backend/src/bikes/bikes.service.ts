import { ConflictException, Injectable, NotFoundException } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import type { Repository } from 'typeorm';
import type { Bike as BikeView, ForkInput, ShockInput } from '@loamline/shared-types';
import type { RequestUser } from '../common/decorators/current-user.decorator';
import { Bike } from './bike.entity';
import type { CreateBikeDto, UpdateBikeDto } from './dto/create-bike.dto';

/** A garage holds at most this many bikes. */
export const MAX_BIKES = 50;

const notFound = (): NotFoundException => new NotFoundException('No such bike in your garage.');

/** Class instances from the ValidationPipe, as plain JSON for the column (undefined fields dropped). */
const plain = <T>(v: T | null | undefined): T | null => (v ? (JSON.parse(JSON.stringify(v)) as T) : null);

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
      fork: plain<ForkInput>(dto.fork),
      shock: plain<ShockInput>(dto.shock),
    });
    await this.bikes.insert(bike);
    return this.get(user, bike.id);
  }

  async update(user: RequestUser, id: string, dto: UpdateBikeDto): Promise<BikeView> {
    const bike = await this.load(user, id);
    if (dto.name !== undefined) bike.name = dto.name;
    if (dto.fork !== undefined) bike.fork = plain<ForkInput>(dto.fork);
    if (dto.shock !== undefined) bike.shock = plain<ShockInput>(dto.shock);
    await this.bikes.update(
      { id: bike.id, ownerId: user.id },
      { name: bike.name, fork: bike.fork, shock: bike.shock },
    );
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
