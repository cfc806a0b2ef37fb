ALTER TABLE "outbox" ADD COLUMN "recipient_id" uuid;--> statement-breakpoint
ALTER TABLE "outbox" ADD CONSTRAINT "outbox_recipient_id_users_id_fk" FOREIGN KEY ("recipient_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "outbox_recipient_idx" ON "outbox" USING btree ("recipient_id");--> statement-breakpoint
-- Mail queued before this column: the account that holds the address is the person it was for.
UPDATE "outbox" AS o SET "recipient_id" = u."id" FROM "users" AS u WHERE o."recipient_id" IS NULL AND lower(u."email") = lower(o."recipient") AND NOT u."held_elsewhere";
