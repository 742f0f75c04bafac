ALTER TABLE `trajectories` ADD `frame_store_key` varchar(255);--> statement-breakpoint
ALTER TABLE `trajectories` ADD `frame_store_bytes` bigint DEFAULT 0 NOT NULL;