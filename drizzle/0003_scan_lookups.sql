ALTER TABLE "parts" ADD COLUMN "gtin14" text GENERATED ALWAYS AS (lpad(gtin, 14, '0')) STORED;--> statement-breakpoint
CREATE INDEX "part_supplier_skus_upper_idx" ON "part_supplier_skus" USING btree (upper("supplier_sku"));--> statement-breakpoint
CREATE INDEX "parts_gtin14_idx" ON "parts" USING btree ("gtin14");