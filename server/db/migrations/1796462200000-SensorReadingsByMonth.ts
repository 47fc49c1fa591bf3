import { MigrationInterface, QueryRunner } from "typeorm";

/**
 * `sensor_readings` partitioned by calendar month (UTC) of `taken_at`: one partition a month from the
 * oldest reading held (or two months back, whichever is earlier: a reading may arrive up to 30 days
 * late) through three months ahead, and `pmax` for anything later. The partition upkeep adds next
 * months' partitions from then on (reading-partitions.service.ts); the archive command takes old months
 * out whole. The primary key (sensor_id, taken_at) already holds the partitioning column, as every
 * unique key of a partitioned table must; the table has no foreign keys (partitioned InnoDB tables
 * cannot have any).
 *
 * Self-contained on purpose (its own month arithmetic): a landed migration must not change with the app.
 * On a big table this copies every row once (ALTER TABLE … PARTITION BY rebuilds the table, and writes
 * wait meanwhile): run it in a quiet hour.
 */
export class SensorReadingsByMonth1796462200000 implements MigrationInterface {
    name = 'SensorReadingsByMonth1796462200000'

    public async up(queryRunner: QueryRunner): Promise<void> {
        // The oldest reading: the smallest per sensor, read along the (sensor_id, taken_at) key one sensor
        // at a time (a loose index scan), not a scan of the whole table.
        const [oldest] = (await queryRunner.query(
            "SELECT MIN(first) AS first FROM (SELECT MIN(taken_at) AS first FROM `sensor_readings` GROUP BY sensor_id) f",
        )) as { first: Date | string | null }[];
        const [now] = (await queryRunner.query("SELECT YEAR(UTC_TIMESTAMP()) AS y, MONTH(UTC_TIMESTAMP()) AS m")) as {
            y: number;
            m: number;
        }[];
        const current = Number(now.y) * 12 + Number(now.m) - 1;
        let from = current - 2;
        if (oldest?.first) {
            const first = new Date(oldest.first);
            from = Math.min(from, first.getUTCFullYear() * 12 + first.getUTCMonth());
        }
        const text = (m: number) => `${Math.floor(m / 12)}-${String((m % 12) + 1).padStart(2, "0")}`;
        const parts: string[] = [];
        for (let m = from; m <= current + 3; m++) {
            parts.push(`PARTITION p${text(m).replace("-", "")} VALUES LESS THAN ('${text(m + 1)}-01 00:00:00')`);
        }
        parts.push("PARTITION pmax VALUES LESS THAN (MAXVALUE)");
        await queryRunner.query(`ALTER TABLE \`sensor_readings\` PARTITION BY RANGE COLUMNS(\`taken_at\`) (${parts.join(", ")})`);
    }

    public async down(queryRunner: QueryRunner): Promise<void> {
        await queryRunner.query("ALTER TABLE `sensor_readings` REMOVE PARTITIONING");
    }

}
