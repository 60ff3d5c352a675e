ALTER TABLE `games` ADD `range_kind` enum('label','number') DEFAULT 'label' NOT NULL;--> statement-breakpoint
ALTER TABLE `games` ADD `range_unit` varchar(12);