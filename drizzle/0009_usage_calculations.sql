ALTER TABLE `api_usage` ADD `calculations` integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE `api_usage` ADD `item_errors` text;--> statement-breakpoint
-- Rows written before: an item of a batch, or a call of a calculator route, was one calculation; a batch's
-- own row none (its items had rows of their own). The report sums this column from now on.
UPDATE `api_usage` SET `calculations` = 1 WHERE `batch_item` = 1 OR `route` IN ('POST /api/v1/calc/one-run', 'POST /api/v1/calc/single-plane', 'POST /api/v1/calc/multi-plane', 'POST /api/v1/calc/four-run', 'POST /api/v1/calc/split', 'POST /api/v1/calc/combine', 'POST /api/v1/calc/radius', 'POST /api/v1/calc/trial-weight', 'POST /api/v1/calc/tolerance', 'POST /api/v1/calc/severity');
