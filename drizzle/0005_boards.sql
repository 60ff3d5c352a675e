CREATE TABLE `boards` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`team_id` bigint unsigned NOT NULL,
	`edition_id` bigint unsigned NOT NULL,
	`character_id` bigint unsigned NOT NULL,
	`opponent_id` bigint unsigned,
	`title` varchar(120) NOT NULL,
	`document` json NOT NULL,
	`origin` json,
	`version` int NOT NULL DEFAULT 1,
	`created_by` varchar(255),
	`updated_by` varchar(255),
	`created_at` datetime NOT NULL DEFAULT CURRENT_TIMESTAMP,
	`updated_at` datetime(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
	CONSTRAINT `boards_id` PRIMARY KEY(`id`)
);
--> statement-breakpoint
ALTER TABLE `boards` ADD CONSTRAINT `boards_team_id_teams_id_fk` FOREIGN KEY (`team_id`) REFERENCES `teams`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `boards` ADD CONSTRAINT `boards_edition_id_editions_id_fk` FOREIGN KEY (`edition_id`) REFERENCES `editions`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `boards` ADD CONSTRAINT `boards_character_id_characters_id_fk` FOREIGN KEY (`character_id`) REFERENCES `characters`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `boards` ADD CONSTRAINT `boards_opponent_id_characters_id_fk` FOREIGN KEY (`opponent_id`) REFERENCES `characters`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `boards` ADD CONSTRAINT `boards_created_by_users_id_fk` FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `boards` ADD CONSTRAINT `boards_updated_by_users_id_fk` FOREIGN KEY (`updated_by`) REFERENCES `users`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `boards_team_updated_idx` ON `boards` (`team_id`,`updated_at`);