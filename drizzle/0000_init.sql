CREATE TABLE `characters` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`game_id` bigint unsigned NOT NULL,
	`slug` varchar(64) NOT NULL,
	`name` varchar(120) NOT NULL,
	`summary` text,
	`created_at` datetime NOT NULL DEFAULT CURRENT_TIMESTAMP,
	CONSTRAINT `characters_id` PRIMARY KEY(`id`),
	CONSTRAINT `characters_game_slug_uq` UNIQUE(`game_id`,`slug`)
);
--> statement-breakpoint
CREATE TABLE `edges` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`edition_id` bigint unsigned NOT NULL,
	`character_id` bigint unsigned NOT NULL,
	`key` varchar(96) NOT NULL,
	`kind` enum('follow','cancel','enter') NOT NULL,
	`from_move_id` bigint unsigned,
	`from_stance_id` bigint unsigned,
	`to_move_id` bigint unsigned,
	`to_stance_id` bigint unsigned,
	`input` varchar(32) NOT NULL,
	`gap_on_block` smallint,
	`combo_on_hit` boolean,
	`combo_on_counter_hit` boolean,
	`on_block` json,
	`on_hit` json,
	`on_counter_hit` json,
	`auto_guard` json,
	CONSTRAINT `edges_id` PRIMARY KEY(`id`),
	CONSTRAINT `edges_edition_character_key_uq` UNIQUE(`edition_id`,`character_id`,`key`),
	CONSTRAINT `edges_follow_ends` CHECK(`edges`.`kind` <> 'follow' or (`edges`.`from_move_id` is not null and `edges`.`to_move_id` is not null and `edges`.`from_stance_id` is null and `edges`.`to_stance_id` is null and `edges`.`gap_on_block` is not null and `edges`.`combo_on_hit` is not null and `edges`.`combo_on_counter_hit` is not null)),
	CONSTRAINT `edges_cancel_ends` CHECK(`edges`.`kind` <> 'cancel' or (`edges`.`from_move_id` is not null and `edges`.`to_stance_id` is not null and `edges`.`from_stance_id` is null and `edges`.`to_move_id` is null and `edges`.`on_block` is not null and `edges`.`on_hit` is not null and `edges`.`on_counter_hit` is not null and `edges`.`auto_guard` is not null)),
	CONSTRAINT `edges_enter_ends` CHECK(`edges`.`kind` <> 'enter' or (`edges`.`from_stance_id` is not null and `edges`.`to_move_id` is not null and `edges`.`from_move_id` is null and `edges`.`to_stance_id` is null))
);
--> statement-breakpoint
CREATE TABLE `editions` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`game_id` bigint unsigned NOT NULL,
	`slug` varchar(32) NOT NULL,
	`name` varchar(120) NOT NULL,
	`released_on` datetime NOT NULL,
	`notes` text,
	`created_at` datetime NOT NULL DEFAULT CURRENT_TIMESTAMP,
	CONSTRAINT `editions_id` PRIMARY KEY(`id`),
	CONSTRAINT `editions_game_slug_uq` UNIQUE(`game_id`,`slug`)
);
--> statement-breakpoint
CREATE TABLE `games` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`slug` varchar(64) NOT NULL,
	`name` varchar(120) NOT NULL,
	`summary` text,
	`fps` smallint unsigned NOT NULL DEFAULT 60,
	`fastest` smallint unsigned NOT NULL DEFAULT 10,
	`launch_at` smallint unsigned NOT NULL DEFAULT 15,
	`created_at` datetime NOT NULL DEFAULT CURRENT_TIMESTAMP,
	CONSTRAINT `games_id` PRIMARY KEY(`id`),
	CONSTRAINT `games_slug_uq` UNIQUE(`slug`)
);
--> statement-breakpoint
CREATE TABLE `moves` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`edition_id` bigint unsigned NOT NULL,
	`character_id` bigint unsigned NOT NULL,
	`key` varchar(64) NOT NULL,
	`input` varchar(64) NOT NULL,
	`name` varchar(120) NOT NULL,
	`level` enum('high','mid','low','special-mid','throw','unblockable') NOT NULL,
	`damage` smallint unsigned NOT NULL,
	`startup` smallint unsigned,
	`on_block` json NOT NULL,
	`on_hit` json NOT NULL,
	`on_counter_hit` json NOT NULL,
	`range` varchar(16),
	`tags` json NOT NULL,
	`notes` text,
	`stance_id` bigint unsigned,
	`sort` int NOT NULL DEFAULT 0,
	CONSTRAINT `moves_id` PRIMARY KEY(`id`),
	CONSTRAINT `moves_edition_character_key_uq` UNIQUE(`edition_id`,`character_id`,`key`)
);
--> statement-breakpoint
CREATE TABLE `stances` (
	`id` bigint unsigned AUTO_INCREMENT NOT NULL,
	`edition_id` bigint unsigned NOT NULL,
	`character_id` bigint unsigned NOT NULL,
	`key` varchar(64) NOT NULL,
	`name` varchar(120) NOT NULL,
	`abbreviation` varchar(12) NOT NULL,
	`notes` text,
	CONSTRAINT `stances_id` PRIMARY KEY(`id`),
	CONSTRAINT `stances_edition_character_key_uq` UNIQUE(`edition_id`,`character_id`,`key`)
);
--> statement-breakpoint
ALTER TABLE `characters` ADD CONSTRAINT `characters_game_id_games_id_fk` FOREIGN KEY (`game_id`) REFERENCES `games`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `edges` ADD CONSTRAINT `edges_edition_id_editions_id_fk` FOREIGN KEY (`edition_id`) REFERENCES `editions`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `edges` ADD CONSTRAINT `edges_character_id_characters_id_fk` FOREIGN KEY (`character_id`) REFERENCES `characters`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `edges` ADD CONSTRAINT `edges_from_move_id_moves_id_fk` FOREIGN KEY (`from_move_id`) REFERENCES `moves`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `edges` ADD CONSTRAINT `edges_from_stance_id_stances_id_fk` FOREIGN KEY (`from_stance_id`) REFERENCES `stances`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `edges` ADD CONSTRAINT `edges_to_move_id_moves_id_fk` FOREIGN KEY (`to_move_id`) REFERENCES `moves`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `edges` ADD CONSTRAINT `edges_to_stance_id_stances_id_fk` FOREIGN KEY (`to_stance_id`) REFERENCES `stances`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `editions` ADD CONSTRAINT `editions_game_id_games_id_fk` FOREIGN KEY (`game_id`) REFERENCES `games`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `moves` ADD CONSTRAINT `moves_edition_id_editions_id_fk` FOREIGN KEY (`edition_id`) REFERENCES `editions`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `moves` ADD CONSTRAINT `moves_character_id_characters_id_fk` FOREIGN KEY (`character_id`) REFERENCES `characters`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `moves` ADD CONSTRAINT `moves_stance_id_stances_id_fk` FOREIGN KEY (`stance_id`) REFERENCES `stances`(`id`) ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `stances` ADD CONSTRAINT `stances_edition_id_editions_id_fk` FOREIGN KEY (`edition_id`) REFERENCES `editions`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `stances` ADD CONSTRAINT `stances_character_id_characters_id_fk` FOREIGN KEY (`character_id`) REFERENCES `characters`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `edges_character_edition_idx` ON `edges` (`character_id`,`edition_id`);--> statement-breakpoint
CREATE INDEX `editions_game_released_idx` ON `editions` (`game_id`,`released_on`);--> statement-breakpoint
CREATE INDEX `moves_character_edition_sort_idx` ON `moves` (`character_id`,`edition_id`,`sort`);