CREATE TABLE `comparison_logs` (
	`comparison_id` integer NOT NULL,
	`log_id` integer NOT NULL,
	`side` text NOT NULL,
	PRIMARY KEY(`comparison_id`, `log_id`),
	FOREIGN KEY (`comparison_id`) REFERENCES `comparisons`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`log_id`) REFERENCES `logs`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `comparison_logs_log_idx` ON `comparison_logs` (`log_id`);--> statement-breakpoint
CREATE TABLE `dyno_runs` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`workshop_id` integer NOT NULL,
	`vehicle_id` integer NOT NULL,
	`label` text NOT NULL,
	`side` text,
	`core_id` integer,
	`power_kw` real NOT NULL,
	`torque_nm` real,
	`rpm` real,
	`ambient_temp_c` real NOT NULL,
	`baro_kpa` real NOT NULL,
	`humidity_pct` real,
	`run_on` text,
	`created_by_id` integer,
	`created_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL,
	FOREIGN KEY (`workshop_id`) REFERENCES `workshops`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`vehicle_id`) REFERENCES `vehicles`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`core_id`) REFERENCES `cores`(`id`) ON UPDATE no action ON DELETE set null,
	FOREIGN KEY (`created_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `dyno_runs_workshop_idx` ON `dyno_runs` (`workshop_id`);--> statement-breakpoint
CREATE INDEX `dyno_runs_vehicle_idx` ON `dyno_runs` (`vehicle_id`);--> statement-breakpoint
CREATE TABLE `payment_events` (
	`id` text PRIMARY KEY NOT NULL,
	`type` text NOT NULL,
	`created_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL
);
--> statement-breakpoint
CREATE TABLE `quote_numbers` (
	`workshop_id` integer NOT NULL,
	`year` integer NOT NULL,
	`last` integer NOT NULL,
	PRIMARY KEY(`workshop_id`, `year`),
	FOREIGN KEY (`workshop_id`) REFERENCES `workshops`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `sizings` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`workshop_id` integer NOT NULL,
	`vehicle_id` integer NOT NULL,
	`log_id` integer,
	`design` text NOT NULL,
	`result` text NOT NULL,
	`created_by_id` integer,
	`created_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL,
	FOREIGN KEY (`workshop_id`) REFERENCES `workshops`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`vehicle_id`) REFERENCES `vehicles`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`log_id`) REFERENCES `logs`(`id`) ON UPDATE no action ON DELETE set null,
	FOREIGN KEY (`created_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `sizings_workshop_idx` ON `sizings` (`workshop_id`);--> statement-breakpoint
CREATE INDEX `sizings_vehicle_idx` ON `sizings` (`vehicle_id`);--> statement-breakpoint
PRAGMA foreign_keys=OFF;--> statement-breakpoint
CREATE TABLE `__new_comparisons` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`workshop_id` integer NOT NULL,
	`vehicle_id` integer NOT NULL,
	`title` text DEFAULT '' NOT NULL,
	`reference_ambient_c` real DEFAULT 25 NOT NULL,
	`result` text NOT NULL,
	`recommendation` text DEFAULT '' NOT NULL,
	`stale_at` integer,
	`computed_at` integer NOT NULL,
	`created_by_id` integer,
	`created_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL,
	FOREIGN KEY (`workshop_id`) REFERENCES `workshops`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`vehicle_id`) REFERENCES `vehicles`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`created_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
-- Comparisons had no route before this migration, so the old table holds nothing to carry over.
SELECT 1;--> statement-breakpoint
DROP TABLE `comparisons`;--> statement-breakpoint
ALTER TABLE `__new_comparisons` RENAME TO `comparisons`;--> statement-breakpoint
PRAGMA foreign_keys=ON;--> statement-breakpoint
CREATE INDEX `comparisons_workshop_idx` ON `comparisons` (`workshop_id`);--> statement-breakpoint
CREATE INDEX `comparisons_vehicle_idx` ON `comparisons` (`vehicle_id`);--> statement-breakpoint
CREATE TABLE `__new_share_links` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`workshop_id` integer NOT NULL,
	`log_id` integer,
	`comparison_id` integer,
	`token_hash` text NOT NULL,
	`created_by_id` integer,
	`expires_at` integer,
	`revoked_at` integer,
	`created_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL,
	FOREIGN KEY (`workshop_id`) REFERENCES `workshops`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`log_id`) REFERENCES `logs`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`comparison_id`) REFERENCES `comparisons`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`created_by_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
INSERT INTO `__new_share_links`("id", "workshop_id", "log_id", "comparison_id", "token_hash", "created_by_id", "expires_at", "revoked_at", "created_at") SELECT "id", "workshop_id", "log_id", NULL, "token_hash", "created_by_id", "expires_at", "revoked_at", "created_at" FROM `share_links`;--> statement-breakpoint
DROP TABLE `share_links`;--> statement-breakpoint
ALTER TABLE `__new_share_links` RENAME TO `share_links`;--> statement-breakpoint
CREATE UNIQUE INDEX `share_links_token_hash_unique` ON `share_links` (`token_hash`);--> statement-breakpoint
ALTER TABLE `cores` ADD `construction` text;--> statement-breakpoint
ALTER TABLE `cores` ADD `fin_density` real;--> statement-breakpoint
ALTER TABLE `cores` ADD `fin_density_unit` text;--> statement-breakpoint
ALTER TABLE `cores` ADD `inlet_diameter_mm` integer;--> statement-breakpoint
ALTER TABLE `cores` ADD `outlet_diameter_mm` integer;--> statement-breakpoint
ALTER TABLE `cores` ADD `end_tank_layout` text;--> statement-breakpoint
ALTER TABLE `cores` ADD `weight_kg` real;--> statement-breakpoint
ALTER TABLE `cores` ADD `cost_cents` integer;--> statement-breakpoint
ALTER TABLE `cores` ADD `retired_at` integer;--> statement-breakpoint
ALTER TABLE `cores` ADD `updated_at` integer;--> statement-breakpoint
CREATE UNIQUE INDEX `cores_name_uq` ON `cores` (`workshop_id`,`name`);--> statement-breakpoint
ALTER TABLE `logs` ADD `core_id` integer REFERENCES cores(id);--> statement-breakpoint
ALTER TABLE `logs` ADD `drive_index` integer;--> statement-breakpoint
CREATE INDEX `logs_core_idx` ON `logs` (`core_id`);--> statement-breakpoint
ALTER TABLE `outbox` ADD `attachments` text DEFAULT '[]' NOT NULL;--> statement-breakpoint
ALTER TABLE `outbox` ADD `attempts` integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE `outbox` ADD `next_attempt_at` integer;--> statement-breakpoint
ALTER TABLE `outbox` ADD `message_id` text;--> statement-breakpoint
CREATE INDEX `outbox_status_idx` ON `outbox` (`status`);--> statement-breakpoint
ALTER TABLE `quotes` ADD `number` text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE `quotes` ADD `sizing_id` integer REFERENCES sizings(id);--> statement-breakpoint
ALTER TABLE `quotes` ADD `revision` integer DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE `quotes` ADD `subtotal_cents` integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE `quotes` ADD `tax_rate_pct` real DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE `quotes` ADD `tax_cents` integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE `quotes` ADD `deposit_pct` real DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE `quotes` ADD `valid_until` text;--> statement-breakpoint
ALTER TABLE `quotes` ADD `terms` text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE `quotes` ADD `declined_at` integer;--> statement-breakpoint
ALTER TABLE `quotes` ADD `paid_at` integer;--> statement-breakpoint
ALTER TABLE `quotes` ADD `updated_at` integer;--> statement-breakpoint
CREATE UNIQUE INDEX `quotes_number_uq` ON `quotes` (`workshop_id`,`number`);--> statement-breakpoint
ALTER TABLE `users` ADD `session_version` integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE `workshops` ADD `tax_rate_pct` real DEFAULT 20 NOT NULL;--> statement-breakpoint
ALTER TABLE `workshops` ADD `quote_validity_days` integer DEFAULT 30 NOT NULL;--> statement-breakpoint
ALTER TABLE `workshops` ADD `quote_terms` text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE `workshops` ADD `correction_standard` text DEFAULT 'sae-j1349-2004' NOT NULL;--> statement-breakpoint
CREATE INDEX `payments_quote_idx` ON `payments` (`quote_id`);--> statement-breakpoint
-- Existing logs take the core their car has now: the best that is known of what was fitted.
UPDATE `logs` SET `core_id` = (SELECT `fitted_core_id` FROM `vehicles` WHERE `vehicles`.`id` = `logs`.`vehicle_id`) WHERE `core_id` IS NULL;
