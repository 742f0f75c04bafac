ALTER TABLE `comments` MODIFY COLUMN `report_id` int;--> statement-breakpoint
ALTER TABLE `access_links` MODIFY COLUMN `report_id` int;--> statement-breakpoint
ALTER TABLE `comments` ADD `series_id` int;--> statement-breakpoint
ALTER TABLE `access_links` ADD `series_id` int;--> statement-breakpoint
ALTER TABLE `series` ADD `updated_at` datetime(3) DEFAULT CURRENT_TIMESTAMP(3) NOT NULL;--> statement-breakpoint
ALTER TABLE `series` ADD `results` json;--> statement-breakpoint
ALTER TABLE `series` ADD `results_basis` char(64);--> statement-breakpoint
ALTER TABLE `series` ADD `results_computed_at` datetime(3);--> statement-breakpoint
ALTER TABLE `series_members` ADD `position` int DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE `series_members` ADD `excluded_from_fit` boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE `series_members` ADD `branch` enum('heating','cooling');--> statement-breakpoint
ALTER TABLE `series_members` ADD `run_ids` json;--> statement-breakpoint
ALTER TABLE `series_members` ADD `problem` varchar(2000);--> statement-breakpoint
ALTER TABLE `comments` ADD CONSTRAINT `comments_series_id_series_id_fk` FOREIGN KEY (`series_id`) REFERENCES `series`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE `access_links` ADD CONSTRAINT `access_links_series_id_series_id_fk` FOREIGN KEY (`series_id`) REFERENCES `series`(`id`) ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX `comments_series` ON `comments` (`series_id`);--> statement-breakpoint
CREATE INDEX `access_links_series` ON `access_links` (`series_id`);--> statement-breakpoint
CREATE INDEX `series_members_trajectory` ON `series_members` (`trajectory_id`);