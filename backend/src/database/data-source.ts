import 'reflect-metadata';
import { DataSource } from 'typeorm';
import { databaseConfig } from '../config/app.config';
import { typeormOptions } from './typeorm-options';

/** The data source the TypeORM CLI uses for `migration:run|revert|generate`. */
export default new DataSource(typeormOptions(databaseConfig()));
