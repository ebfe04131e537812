import type { QueryInterface } from 'sequelize';

/**
 * Min/max per channel and minute of a closed run, so the overview of a week-long run reads
 * ~60 k rollup rows instead of millions of samples (QUALITY P3).
 */
export async function up(qi: QueryInterface): Promise<void> {
  await qi.sequelize.query(`CREATE TABLE sample_rollups (
      run_id INT UNSIGNED NOT NULL,
      bucket_ms INT UNSIGNED NOT NULL,
      channel TINYINT UNSIGNED NOT NULL,
      bucket BIGINT NOT NULL,
      lo INT NOT NULL,
      hi INT NOT NULL,
      PRIMARY KEY (run_id, bucket_ms, channel, bucket)
    ) ENGINE=InnoDB`);
}

export async function down(qi: QueryInterface): Promise<void> {
  await qi.dropTable('sample_rollups');
}
