import { Injectable, NotFoundException } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import type { Repository } from 'typeorm';
import type { ShopSummary } from '@loamline/shared-types';
import { Shop } from './shop.entity';

export type NewShop = Pick<Shop, 'slug' | 'name' | 'town' | 'timeZone' | 'currency'>;

@Injectable()
export class ShopsService {
  constructor(@InjectRepository(Shop) private readonly shops: Repository<Shop>) {}

  async getById(id: string): Promise<Shop> {
    const shop = await this.shops.findOneBy({ id });
    if (!shop) throw new NotFoundException('No such shop.');
    return shop;
  }

  listAll(): Promise<Shop[]> {
    return this.shops.find({ order: { name: 'ASC' } });
  }

  findBySlug(slug: string): Promise<Shop | null> {
    return this.shops.findOneBy({ slug });
  }

  async create(data: NewShop): Promise<Shop> {
    const shop = this.shops.create(data);
    await this.shops.insert(shop);
    return this.shops.findOneByOrFail({ id: shop.id });
  }

  toSummary(shop: Shop): ShopSummary {
    const { id, slug, name, town, timeZone, currency } = shop;
    return { id, slug, name, town, timeZone, currency };
  }
}
