ALTER TABLE `characters` ADD `version` int DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE `edges` ADD `version` int DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE `editions` ADD `status` enum('draft','published') DEFAULT 'draft' NOT NULL;--> statement-breakpoint
ALTER TABLE `editions` ADD `published_at` datetime;--> statement-breakpoint
ALTER TABLE `editions` ADD `version` int DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE `games` ADD `version` int DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE `moves` ADD `version` int DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE `stances` ADD `version` int DEFAULT 1 NOT NULL;--> statement-breakpoint
-- Every Edition that existed before drafts did was published.
UPDATE `editions` SET `status` = 'published', `published_at` = `released_on`;--> statement-breakpoint
CREATE TRIGGER `stances_published_insert` BEFORE INSERT ON `stances` FOR EACH ROW
IF (SELECT `status` FROM `editions` WHERE `id` = NEW.`edition_id`) = 'published' THEN
  SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'FRAMEFORK_EDITION_PUBLISHED: this Edition is published and cannot change';
END IF;--> statement-breakpoint
CREATE TRIGGER `stances_published_update` BEFORE UPDATE ON `stances` FOR EACH ROW
IF (SELECT `status` FROM `editions` WHERE `id` = OLD.`edition_id`) = 'published'
  OR (SELECT `status` FROM `editions` WHERE `id` = NEW.`edition_id`) = 'published' THEN
  SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'FRAMEFORK_EDITION_PUBLISHED: this Edition is published and cannot change';
END IF;--> statement-breakpoint
CREATE TRIGGER `stances_published_delete` BEFORE DELETE ON `stances` FOR EACH ROW
IF (SELECT `status` FROM `editions` WHERE `id` = OLD.`edition_id`) = 'published' THEN
  SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'FRAMEFORK_EDITION_PUBLISHED: this Edition is published and cannot change';
END IF;--> statement-breakpoint
CREATE TRIGGER `moves_published_insert` BEFORE INSERT ON `moves` FOR EACH ROW
IF (SELECT `status` FROM `editions` WHERE `id` = NEW.`edition_id`) = 'published' THEN
  SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'FRAMEFORK_EDITION_PUBLISHED: this Edition is published and cannot change';
END IF;--> statement-breakpoint
CREATE TRIGGER `moves_published_update` BEFORE UPDATE ON `moves` FOR EACH ROW
IF (SELECT `status` FROM `editions` WHERE `id` = OLD.`edition_id`) = 'published'
  OR (SELECT `status` FROM `editions` WHERE `id` = NEW.`edition_id`) = 'published' THEN
  SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'FRAMEFORK_EDITION_PUBLISHED: this Edition is published and cannot change';
END IF;--> statement-breakpoint
CREATE TRIGGER `moves_published_delete` BEFORE DELETE ON `moves` FOR EACH ROW
IF (SELECT `status` FROM `editions` WHERE `id` = OLD.`edition_id`) = 'published' THEN
  SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'FRAMEFORK_EDITION_PUBLISHED: this Edition is published and cannot change';
END IF;--> statement-breakpoint
CREATE TRIGGER `edges_published_insert` BEFORE INSERT ON `edges` FOR EACH ROW
IF (SELECT `status` FROM `editions` WHERE `id` = NEW.`edition_id`) = 'published' THEN
  SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'FRAMEFORK_EDITION_PUBLISHED: this Edition is published and cannot change';
END IF;--> statement-breakpoint
CREATE TRIGGER `edges_published_update` BEFORE UPDATE ON `edges` FOR EACH ROW
IF (SELECT `status` FROM `editions` WHERE `id` = OLD.`edition_id`) = 'published'
  OR (SELECT `status` FROM `editions` WHERE `id` = NEW.`edition_id`) = 'published' THEN
  SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'FRAMEFORK_EDITION_PUBLISHED: this Edition is published and cannot change';
END IF;--> statement-breakpoint
CREATE TRIGGER `edges_published_delete` BEFORE DELETE ON `edges` FOR EACH ROW
IF (SELECT `status` FROM `editions` WHERE `id` = OLD.`edition_id`) = 'published' THEN
  SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'FRAMEFORK_EDITION_PUBLISHED: this Edition is published and cannot change';
END IF;--> statement-breakpoint
CREATE TRIGGER `editions_published_update` BEFORE UPDATE ON `editions` FOR EACH ROW
IF OLD.`status` = 'published' THEN
  SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'FRAMEFORK_EDITION_PUBLISHED: this Edition is published and cannot change';
END IF;--> statement-breakpoint
CREATE TRIGGER `editions_published_delete` BEFORE DELETE ON `editions` FOR EACH ROW
IF OLD.`status` = 'published' THEN
  SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'FRAMEFORK_EDITION_PUBLISHED: this Edition is published and cannot change';
END IF;
