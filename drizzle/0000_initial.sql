CREATE TABLE `alerts` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`scanner_id` bigint unsigned NOT NULL,
	`test_id` bigint unsigned,
	`cause` enum('action','warning','overdue','drift') NOT NULL,
	`state` enum('open','acknowledged','resolved') NOT NULL,
	`open_key` varchar(80),
	`summary` text NOT NULL,
	`occurrences` int unsigned NOT NULL DEFAULT 1,
	`first_scan_id` bigint unsigned,
	`latest_scan_id` bigint unsigned,
	`opened_at` datetime(3) NOT NULL,
	`updated_at` datetime(3) NOT NULL,
	`acknowledged_by_id` bigint unsigned,
	`acknowledged_at` datetime(3),
	`resolution_proposed_at` datetime(3),
	`resolution_scan_id` bigint unsigned,
	`resolved_by_id` bigint unsigned,
	`resolved_at` datetime(3),
	`resolution_note` text,
	CONSTRAINT `alerts_id` PRIMARY KEY(`id`),
	CONSTRAINT `alerts_open_key_unique` UNIQUE(`open_key`)
);
--> statement-breakpoint
CREATE TABLE `analyses` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`scan_id` bigint unsigned NOT NULL,
	`revision` int unsigned NOT NULL,
	`is_current` boolean NOT NULL,
	`method` enum('point','line','edge','disk') NOT NULL,
	`options` json NOT NULL,
	`result` json NOT NULL,
	`analysis_version` varchar(64) NOT NULL,
	`status` enum('pass','warning','action','no-baseline') NOT NULL,
	`created_by_id` bigint unsigned NOT NULL,
	`created_at` datetime(3) NOT NULL,
	CONSTRAINT `analyses_id` PRIMARY KEY(`id`),
	CONSTRAINT `analyses_scan_revision_uq` UNIQUE(`scan_id`,`revision`)
);
--> statement-breakpoint
CREATE TABLE `api_tokens` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`user_id` bigint unsigned NOT NULL,
	`name` varchar(80) NOT NULL,
	`token_hash` varchar(64) NOT NULL,
	`prefix` varchar(16) NOT NULL,
	`last_used_at` datetime(3),
	`revoked_at` datetime(3),
	`created_at` datetime(3) NOT NULL,
	CONSTRAINT `api_tokens_id` PRIMARY KEY(`id`),
	CONSTRAINT `api_tokens_token_hash_unique` UNIQUE(`token_hash`)
);
--> statement-breakpoint
CREATE TABLE `audit_events` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`at` datetime(3) NOT NULL,
	`actor_user_id` bigint unsigned,
	`action` varchar(64) NOT NULL,
	`entity_type` varchar(32) NOT NULL,
	`entity_id` varchar(64) NOT NULL,
	`scanner_id` bigint unsigned,
	`details` json NOT NULL,
	CONSTRAINT `audit_events_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `baselines` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`scanner_id` bigint unsigned NOT NULL,
	`test_id` bigint unsigned NOT NULL,
	`metric` varchar(32) NOT NULL,
	`mean` double NOT NULL,
	`sd` double,
	`n` int unsigned NOT NULL,
	`scan_ids` json NOT NULL,
	`mtf_curve` json,
	`reason` text NOT NULL,
	`set_by_id` bigint unsigned NOT NULL,
	`set_at` datetime(3) NOT NULL,
	`superseded_at` datetime(3),
	CONSTRAINT `baselines_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `mail_outbox` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`kind` varchar(32) NOT NULL,
	`dedupe_key` varchar(160),
	`to_address` varchar(254) NOT NULL,
	`subject` varchar(255) NOT NULL,
	`text_body` text NOT NULL,
	`html_body` text NOT NULL,
	`state` enum('pending','sent','failed') NOT NULL DEFAULT 'pending',
	`attempts` int unsigned NOT NULL DEFAULT 0,
	`next_attempt_at` datetime(3) NOT NULL,
	`locked_until` datetime(3),
	`last_error` text,
	`sent_at` datetime(3),
	`created_at` datetime(3) NOT NULL,
	CONSTRAINT `mail_outbox_id` PRIMARY KEY(`id`),
	CONSTRAINT `mail_outbox_dedupe_key_unique` UNIQUE(`dedupe_key`)
);
--> statement-breakpoint
CREATE TABLE `metric_values` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`analysis_id` bigint unsigned NOT NULL,
	`scan_id` bigint unsigned NOT NULL,
	`scanner_id` bigint unsigned NOT NULL,
	`test_id` bigint unsigned,
	`metric` varchar(32) NOT NULL,
	`value` double,
	`status` enum('pass','warning','action','no-baseline') NOT NULL,
	`is_current` boolean NOT NULL,
	`measured_at` datetime(3) NOT NULL,
	CONSTRAINT `metric_values_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `qa_tests` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`scanner_id` bigint unsigned NOT NULL,
	`name` varchar(120) NOT NULL,
	`method` enum('point','line','edge','disk') NOT NULL,
	`phantom` varchar(200) NOT NULL DEFAULT '',
	`protocol` text NOT NULL,
	`frequency` enum('daily','weekly','monthly','quarterly','annual') NOT NULL,
	`active` boolean NOT NULL DEFAULT true,
	`created_at` datetime(3) NOT NULL,
	CONSTRAINT `qa_tests_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `scanner_engineers` (
	`scanner_id` bigint unsigned NOT NULL,
	`user_id` bigint unsigned NOT NULL,
	CONSTRAINT `scanner_engineers_scanner_id_user_id_pk` PRIMARY KEY(`scanner_id`,`user_id`)
);
--> statement-breakpoint
CREATE TABLE `scanners` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`site_id` bigint unsigned NOT NULL,
	`name` varchar(120) NOT NULL,
	`modality` enum('CT','PT','NM','DX','MG','CR','RF','US','MR','OT') NOT NULL,
	`manufacturer` varchar(120) NOT NULL DEFAULT '',
	`model` varchar(120) NOT NULL DEFAULT '',
	`serial_number` varchar(64) NOT NULL DEFAULT '',
	`location` varchar(120) NOT NULL DEFAULT '',
	`responsible_physicist_id` bigint unsigned,
	`alert_on_warning` boolean NOT NULL DEFAULT false,
	`active` boolean NOT NULL DEFAULT true,
	`created_at` datetime(3) NOT NULL,
	CONSTRAINT `scanners_id` PRIMARY KEY(`id`),
	CONSTRAINT `scanners_site_name_uq` UNIQUE(`site_id`,`name`)
);
--> statement-breakpoint
CREATE TABLE `scans` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`scanner_id` bigint unsigned NOT NULL,
	`test_id` bigint unsigned,
	`uploaded_by_id` bigint unsigned NOT NULL,
	`file_sha256` varchar(64) NOT NULL,
	`file_name` varchar(255) NOT NULL,
	`file_size` int unsigned NOT NULL,
	`format` varchar(16) NOT NULL,
	`storage_key` varchar(255) NOT NULL,
	`acquired_at` datetime(3) NOT NULL,
	`attributes` json NOT NULL,
	`note` text,
	`signed_off_by_id` bigint unsigned,
	`signed_off_at` datetime(3),
	`sign_off_note` text,
	`created_at` datetime(3) NOT NULL,
	CONSTRAINT `scans_id` PRIMARY KEY(`id`),
	CONSTRAINT `scans_scanner_sha_uq` UNIQUE(`scanner_id`,`file_sha256`)
);
--> statement-breakpoint
CREATE TABLE `service_events` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`scanner_id` bigint unsigned NOT NULL,
	`alert_id` bigint unsigned,
	`engineer_id` bigint unsigned NOT NULL,
	`performed_at` datetime(3) NOT NULL,
	`description` text NOT NULL,
	`parts` text NOT NULL,
	`created_at` datetime(3) NOT NULL,
	CONSTRAINT `service_events_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
CREATE TABLE `sites` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`name` varchar(120) NOT NULL,
	`city` varchar(120) NOT NULL DEFAULT '',
	`created_at` datetime(3) NOT NULL,
	CONSTRAINT `sites_id` PRIMARY KEY(`id`),
	CONSTRAINT `sites_name_unique` UNIQUE(`name`)
);
--> statement-breakpoint
CREATE TABLE `tolerances` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`scanner_id` bigint unsigned NOT NULL,
	`test_id` bigint unsigned NOT NULL,
	`metric` varchar(32) NOT NULL,
	`mode` enum('relative','absolute') NOT NULL,
	`warning` double NOT NULL,
	`action` double NOT NULL,
	`source` varchar(255) NOT NULL,
	`updated_by_id` bigint unsigned,
	`updated_at` datetime(3) NOT NULL,
	CONSTRAINT `tolerances_id` PRIMARY KEY(`id`),
	CONSTRAINT `tolerances_uq` UNIQUE(`scanner_id`,`test_id`,`metric`)
);
--> statement-breakpoint
CREATE TABLE `user_tokens` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`user_id` bigint unsigned NOT NULL,
	`kind` enum('invite','reset') NOT NULL,
	`token_hash` varchar(64) NOT NULL,
	`expires_at` datetime(3) NOT NULL,
	`used_at` datetime(3),
	`created_at` datetime(3) NOT NULL,
	CONSTRAINT `user_tokens_id` PRIMARY KEY(`id`),
	CONSTRAINT `user_tokens_token_hash_unique` UNIQUE(`token_hash`)
);
--> statement-breakpoint
CREATE TABLE `users` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`email` varchar(254) NOT NULL,
	`name` varchar(120) NOT NULL,
	`role` enum('admin','physicist','lead','engineer') NOT NULL,
	`password_hash` varchar(100),
	`active` boolean NOT NULL DEFAULT true,
	`mail_preference` enum('immediate','digest','off') NOT NULL DEFAULT 'immediate',
	`last_sign_in_at` datetime(3),
	`created_at` datetime(3) NOT NULL,
	CONSTRAINT `users_id` PRIMARY KEY(`id`),
	CONSTRAINT `users_email_unique` UNIQUE(`email`)
);
--> statement-breakpoint
ALTER TABLE `alerts` ADD CONSTRAINT `alerts_scanner_id_scanners_id_fk` FOREIGN KEY (`scanner_id`) REFERENCES `scanners`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `alerts` ADD CONSTRAINT `alerts_test_id_qa_tests_id_fk` FOREIGN KEY (`test_id`) REFERENCES `qa_tests`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `alerts` ADD CONSTRAINT `alerts_first_scan_id_scans_id_fk` FOREIGN KEY (`first_scan_id`) REFERENCES `scans`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `alerts` ADD CONSTRAINT `alerts_latest_scan_id_scans_id_fk` FOREIGN KEY (`latest_scan_id`) REFERENCES `scans`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `alerts` ADD CONSTRAINT `alerts_acknowledged_by_id_users_id_fk` FOREIGN KEY (`acknowledged_by_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `alerts` ADD CONSTRAINT `alerts_resolution_scan_id_scans_id_fk` FOREIGN KEY (`resolution_scan_id`) REFERENCES `scans`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `alerts` ADD CONSTRAINT `alerts_resolved_by_id_users_id_fk` FOREIGN KEY (`resolved_by_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `analyses` ADD CONSTRAINT `analyses_scan_id_scans_id_fk` FOREIGN KEY (`scan_id`) REFERENCES `scans`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `analyses` ADD CONSTRAINT `analyses_created_by_id_users_id_fk` FOREIGN KEY (`created_by_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `api_tokens` ADD CONSTRAINT `api_tokens_user_id_users_id_fk` FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `audit_events` ADD CONSTRAINT `audit_events_actor_user_id_users_id_fk` FOREIGN KEY (`actor_user_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `baselines` ADD CONSTRAINT `baselines_scanner_id_scanners_id_fk` FOREIGN KEY (`scanner_id`) REFERENCES `scanners`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `baselines` ADD CONSTRAINT `baselines_test_id_qa_tests_id_fk` FOREIGN KEY (`test_id`) REFERENCES `qa_tests`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `baselines` ADD CONSTRAINT `baselines_set_by_id_users_id_fk` FOREIGN KEY (`set_by_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `metric_values` ADD CONSTRAINT `metric_values_analysis_id_analyses_id_fk` FOREIGN KEY (`analysis_id`) REFERENCES `analyses`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `metric_values` ADD CONSTRAINT `metric_values_scan_id_scans_id_fk` FOREIGN KEY (`scan_id`) REFERENCES `scans`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `metric_values` ADD CONSTRAINT `metric_values_scanner_id_scanners_id_fk` FOREIGN KEY (`scanner_id`) REFERENCES `scanners`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `metric_values` ADD CONSTRAINT `metric_values_test_id_qa_tests_id_fk` FOREIGN KEY (`test_id`) REFERENCES `qa_tests`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `qa_tests` ADD CONSTRAINT `qa_tests_scanner_id_scanners_id_fk` FOREIGN KEY (`scanner_id`) REFERENCES `scanners`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `scanner_engineers` ADD CONSTRAINT `scanner_engineers_scanner_id_scanners_id_fk` FOREIGN KEY (`scanner_id`) REFERENCES `scanners`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `scanner_engineers` ADD CONSTRAINT `scanner_engineers_user_id_users_id_fk` FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `scanners` ADD CONSTRAINT `scanners_site_id_sites_id_fk` FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `scanners` ADD CONSTRAINT `scanners_responsible_physicist_id_users_id_fk` FOREIGN KEY (`responsible_physicist_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `scans` ADD CONSTRAINT `scans_scanner_id_scanners_id_fk` FOREIGN KEY (`scanner_id`) REFERENCES `scanners`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `scans` ADD CONSTRAINT `scans_test_id_qa_tests_id_fk` FOREIGN KEY (`test_id`) REFERENCES `qa_tests`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `scans` ADD CONSTRAINT `scans_uploaded_by_id_users_id_fk` FOREIGN KEY (`uploaded_by_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `scans` ADD CONSTRAINT `scans_signed_off_by_id_users_id_fk` FOREIGN KEY (`signed_off_by_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `service_events` ADD CONSTRAINT `service_events_scanner_id_scanners_id_fk` FOREIGN KEY (`scanner_id`) REFERENCES `scanners`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `service_events` ADD CONSTRAINT `service_events_alert_id_alerts_id_fk` FOREIGN KEY (`alert_id`) REFERENCES `alerts`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `service_events` ADD CONSTRAINT `service_events_engineer_id_users_id_fk` FOREIGN KEY (`engineer_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `tolerances` ADD CONSTRAINT `tolerances_scanner_id_scanners_id_fk` FOREIGN KEY (`scanner_id`) REFERENCES `scanners`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `tolerances` ADD CONSTRAINT `tolerances_test_id_qa_tests_id_fk` FOREIGN KEY (`test_id`) REFERENCES `qa_tests`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `tolerances` ADD CONSTRAINT `tolerances_updated_by_id_users_id_fk` FOREIGN KEY (`updated_by_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `user_tokens` ADD CONSTRAINT `user_tokens_user_id_users_id_fk` FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `alerts_scanner_state_idx` ON `alerts` (`scanner_id`,`state`);--> statement-breakpoint
CREATE INDEX `api_tokens_user_idx` ON `api_tokens` (`user_id`);--> statement-breakpoint
CREATE INDEX `audit_events_scanner_idx` ON `audit_events` (`scanner_id`,`at`);--> statement-breakpoint
CREATE INDEX `audit_events_at_idx` ON `audit_events` (`at`);--> statement-breakpoint
CREATE INDEX `baselines_lookup_idx` ON `baselines` (`scanner_id`,`test_id`,`metric`,`superseded_at`);--> statement-breakpoint
CREATE INDEX `mail_outbox_due_idx` ON `mail_outbox` (`state`,`next_attempt_at`);--> statement-breakpoint
CREATE INDEX `metric_values_trend_idx` ON `metric_values` (`scanner_id`,`metric`,`is_current`,`measured_at`);--> statement-breakpoint
CREATE INDEX `metric_values_analysis_idx` ON `metric_values` (`analysis_id`);--> statement-breakpoint
CREATE INDEX `qa_tests_scanner_idx` ON `qa_tests` (`scanner_id`);--> statement-breakpoint
CREATE INDEX `scans_scanner_acquired_idx` ON `scans` (`scanner_id`,`acquired_at`);--> statement-breakpoint
CREATE INDEX `service_events_scanner_idx` ON `service_events` (`scanner_id`,`performed_at`);