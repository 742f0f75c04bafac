ALTER TABLE `api_tokens` ADD `expires_at` datetime(3);--> statement-breakpoint
ALTER TABLE `api_tokens` ADD `revoked_reason` enum('owner','password_reset','account_disabled');--> statement-breakpoint
ALTER TABLE `access_links` ADD `revoked_reason` enum('revoked','creator_left','creator_demoted');--> statement-breakpoint
CREATE INDEX `access_links_creator` ON `access_links` (`project_id`,`created_by`);