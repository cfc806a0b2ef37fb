import { type Fixture, type FixtureBody, fixtureSchema } from "@shared/schemas/floors";
import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";
import { z } from "zod";

import { apiRequest } from "@/lib/api-client";

import { floorDetailChanged } from "./get-floor";

const fixtureReplySchema = z.object({ fixture: fixtureSchema });

export interface CreateFixtureInput {
  spaceId: string;
  body: FixtureBody;
}

/** Pins a fixture inside a space; the server refuses a point outside it (400, `fields.x`). */
export async function createFixture({ spaceId, body }: CreateFixtureInput): Promise<Fixture> {
  const { fixture } = await apiRequest(`/api/spaces/${encodeURIComponent(spaceId)}/fixtures`, {
    method: "POST",
    body,
    schema: fixtureReplySchema,
  });
  return fixture;
}

export function createFixtureMutationOptions(queryClient: QueryClient, floorId: string) {
  return mutationOptions({
    mutationKey: ["fixtures", "create", floorId],
    mutationFn: createFixture,
    onSuccess: (fixture) =>
      floorDetailChanged(queryClient, floorId, (detail) => ({
        ...detail,
        fixtures: [...detail.fixtures, fixture],
      })),
  });
}

export function useCreateFixture(floorId: string) {
  const queryClient = useQueryClient();
  return useMutation(createFixtureMutationOptions(queryClient, floorId));
}
