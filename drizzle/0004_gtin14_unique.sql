ALTER TABLE "parts" DROP CONSTRAINT "parts_gtin_unique";--> statement-breakpoint
DROP INDEX "parts_gtin14_idx";--> statement-breakpoint
CREATE UNIQUE INDEX "parts_gtin14_unique" ON "parts" USING btree ("gtin14");