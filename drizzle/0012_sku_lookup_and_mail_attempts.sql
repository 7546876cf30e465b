ALTER TABLE "mail_outbox" ADD COLUMN "attempted_at" timestamp with time zone;--> statement-breakpoint
CREATE INDEX "price_list_rows_import_upper_sku_idx" ON "price_list_rows" USING btree ("import_id",upper("supplier_sku"));--> statement-breakpoint
UPDATE "mail_outbox" SET "attempted_at" = "created_at" WHERE "status" IN ('sending', 'retrying');
