import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * PostgreSQL twin of the SQLite migration of the same name (decision 019).
 *
 * Jobs and checklists (issue 10): jobs on vehicles, their assignees, checklist templates, the
 * checklists started on jobs with their item records, owner sign-offs, special orders, labour and
 * photos. Every table is shop-owned (shop_id, index, FK); children point at their parent through
 * (shop_id, parent_id), and assignees and labour at (shop_id, user_id) of a membership, so the
 * database refuses a link across shops. Parts held and issued live in the stock ledger (its holds
 * and movements carry job_id).
 */
export class Jobs1765500000000Pg implements MigrationInterface {
  name = 'Jobs1765500000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      CREATE TABLE checklist_templates (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        name varchar(120) NOT NULL CHECK (length(name) > 0),
        description varchar(500) NOT NULL DEFAULT '',
        items text NOT NULL,
        archived bigint NOT NULL DEFAULT 0,
        created_at text NOT NULL,
        updated_at text NOT NULL,
        UNIQUE (shop_id, id)
      )`);
    await queryRunner.query(`CREATE INDEX idx_checklist_templates_shop_id ON checklist_templates (shop_id)`);
    await queryRunner.query(`
      CREATE TABLE jobs (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        number bigint NOT NULL CHECK (number > 0),
        vehicle_id varchar(36) NOT NULL,
        title varchar(120) NOT NULL CHECK (length(title) > 0),
        customer_request varchar(2000) NOT NULL,
        status varchar(20) NOT NULL CHECK (status IN ('open', 'in_progress', 'waiting_parts', 'done', 'cancelled')),
        due_on varchar(10) NULL,
        notes varchar(4000) NULL,
        created_by_user_id varchar(36) NULL REFERENCES users (id),
        created_at text NOT NULL,
        updated_at text NOT NULL,
        started_at text NULL,
        completed_at text NULL,
        UNIQUE (shop_id, id),
        UNIQUE (shop_id, number),
        FOREIGN KEY (shop_id, vehicle_id) REFERENCES vehicles (shop_id, id)
      )`);
    await queryRunner.query(`CREATE INDEX idx_jobs_shop_id ON jobs (shop_id)`);
    await queryRunner.query(`CREATE INDEX idx_jobs_shop_id_status ON jobs (shop_id, status)`);
    await queryRunner.query(`CREATE INDEX idx_jobs_shop_id_vehicle ON jobs (shop_id, vehicle_id)`);
    await queryRunner.query(`
      CREATE TABLE job_assignees (
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        job_id varchar(36) NOT NULL,
        user_id varchar(36) NOT NULL,
        assigned_at text NOT NULL,
        PRIMARY KEY (job_id, user_id),
        FOREIGN KEY (shop_id, job_id) REFERENCES jobs (shop_id, id),
        FOREIGN KEY (shop_id, user_id) REFERENCES memberships (shop_id, user_id)
      )`);
    await queryRunner.query(`CREATE INDEX idx_job_assignees_shop_user ON job_assignees (shop_id, user_id)`);
    await queryRunner.query(`
      CREATE TABLE job_checklists (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        job_id varchar(36) NOT NULL,
        template_id varchar(36) NULL,
        name varchar(120) NOT NULL,
        items text NOT NULL,
        completed_at text NULL,
        completed_by_user_id varchar(36) NULL REFERENCES users (id),
        created_at text NOT NULL,
        UNIQUE (shop_id, id),
        FOREIGN KEY (shop_id, job_id) REFERENCES jobs (shop_id, id),
        FOREIGN KEY (shop_id, template_id) REFERENCES checklist_templates (shop_id, id)
      )`);
    await queryRunner.query(`CREATE INDEX idx_job_checklists_shop_job ON job_checklists (shop_id, job_id)`);
    await queryRunner.query(`
      CREATE TABLE job_files (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        job_id varchar(36) NOT NULL,
        checklist_id varchar(36) NULL,
        item_key varchar(40) NULL,
        original_name varchar(200) NOT NULL,
        media_type varchar(60) NOT NULL,
        byte_size bigint NOT NULL CHECK (byte_size >= 0),
        storage_key varchar(200) NOT NULL UNIQUE,
        thumbnail_key varchar(200) NULL,
        caption varchar(200) NULL,
        by_user_id varchar(36) NULL REFERENCES users (id),
        created_at text NOT NULL,
        UNIQUE (shop_id, id),
        FOREIGN KEY (shop_id, job_id) REFERENCES jobs (shop_id, id),
        FOREIGN KEY (shop_id, checklist_id) REFERENCES job_checklists (shop_id, id)
      )`);
    await queryRunner.query(`CREATE INDEX idx_job_files_shop_job ON job_files (shop_id, job_id)`);
    await queryRunner.query(`
      CREATE TABLE checklist_item_records (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        checklist_id varchar(36) NOT NULL,
        item_key varchar(40) NOT NULL,
        result varchar(10) NOT NULL CHECK (result IN ('ok', 'advise', 'fail', 'na')),
        suggested varchar(10) NULL CHECK (suggested IS NULL OR suggested IN ('ok', 'advise', 'fail', 'na')),
        note varchar(1000) NULL,
        value double precision NULL,
        compression_kpa text NULL,
        tyres text NULL,
        photo_file_id varchar(36) NULL,
        recorded_by_user_id varchar(36) NULL REFERENCES users (id),
        recorded_at text NOT NULL,
        UNIQUE (shop_id, id),
        UNIQUE (checklist_id, item_key),
        FOREIGN KEY (shop_id, checklist_id) REFERENCES job_checklists (shop_id, id),
        FOREIGN KEY (shop_id, photo_file_id) REFERENCES job_files (shop_id, id)
      )`);
    await queryRunner.query(`CREATE INDEX idx_checklist_item_records_shop ON checklist_item_records (shop_id)`);
    await queryRunner.query(`
      CREATE TABLE checklist_sign_offs (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        job_id varchar(36) NOT NULL,
        checklist_id varchar(36) NOT NULL,
        item_key varchar(40) NOT NULL,
        reason varchar(1000) NOT NULL CHECK (length(reason) >= 10),
        customer_told_how varchar(500) NOT NULL CHECK (length(customer_told_how) > 0),
        signed_by_user_id varchar(36) NULL REFERENCES users (id),
        signed_at text NOT NULL,
        UNIQUE (shop_id, id),
        UNIQUE (checklist_id, item_key),
        FOREIGN KEY (shop_id, job_id) REFERENCES jobs (shop_id, id),
        FOREIGN KEY (shop_id, checklist_id) REFERENCES job_checklists (shop_id, id)
      )`);
    await queryRunner.query(`CREATE INDEX idx_checklist_sign_offs_shop_job ON checklist_sign_offs (shop_id, job_id)`);
    await queryRunner.query(`
      CREATE TABLE job_special_orders (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        job_id varchar(36) NOT NULL,
        part_id varchar(36) NOT NULL,
        quantity bigint NOT NULL CHECK (quantity > 0),
        note varchar(500) NULL,
        status varchar(10) NOT NULL CHECK (status IN ('open', 'ordered', 'received', 'cancelled')),
        created_by_user_id varchar(36) NULL REFERENCES users (id),
        created_at text NOT NULL,
        updated_at text NOT NULL,
        UNIQUE (shop_id, id),
        FOREIGN KEY (shop_id, job_id) REFERENCES jobs (shop_id, id),
        FOREIGN KEY (shop_id, part_id) REFERENCES parts (shop_id, id)
      )`);
    await queryRunner.query(`CREATE INDEX idx_job_special_orders_shop_status ON job_special_orders (shop_id, status)`);
    await queryRunner.query(`
      CREATE TABLE labour_entries (
        id varchar(36) PRIMARY KEY NOT NULL,
        shop_id varchar(36) NOT NULL REFERENCES shops (id),
        job_id varchar(36) NOT NULL,
        user_id varchar(36) NOT NULL,
        worked_on varchar(10) NOT NULL,
        minutes bigint NOT NULL CHECK (minutes > 0 AND minutes <= 1440),
        description varchar(500) NOT NULL,
        rate_minor_per_hour bigint NOT NULL CHECK (rate_minor_per_hour >= 0),
        created_by_user_id varchar(36) NULL REFERENCES users (id),
        created_at text NOT NULL,
        UNIQUE (shop_id, id),
        FOREIGN KEY (shop_id, job_id) REFERENCES jobs (shop_id, id),
        FOREIGN KEY (shop_id, user_id) REFERENCES memberships (shop_id, user_id)
      )`);
    await queryRunner.query(`CREATE INDEX idx_labour_entries_shop_job ON labour_entries (shop_id, job_id)`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    for (const table of ['labour_entries', 'job_special_orders', 'checklist_sign_offs', 'checklist_item_records', 'job_files', 'job_checklists', 'job_assignees', 'jobs', 'checklist_templates']) {
      await queryRunner.query(`DROP TABLE ${table}`);
    }
  }
}
