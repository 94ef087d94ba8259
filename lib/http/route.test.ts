import { DatabaseError } from "pg";
import { z as mini } from "zod/mini";
import { z } from "zod";
import { afterEach, describe, expect, it, vi } from "vitest";
import { AppError, ERROR_STATUS, type ErrorCode } from "@/lib/errors";
import { InputError } from "@/lib/units";
import { errorResponse, route } from "./route";

/** A PostgreSQL error as the pg driver raises it, with the schema's names in its text and fields. */
function pgError(code: string, message: string, extra: Partial<DatabaseError> = {}): DatabaseError {
  const error = new DatabaseError(message, message.length, "error");
  Object.assign(error, { code, severity: "ERROR", ...extra });
  return error;
}

async function answer(error: unknown) {
  const response = errorResponse(error);
  const text = await response.text();
  return { status: response.status, text, body: JSON.parse(text) as { error: Record<string, unknown> } };
}

afterEach(() => {
  vi.restoreAllMocks();
});

describe("errorResponse: the one mapping from an error to an answer", () => {
  const cases: [ErrorCode, number][] = [
    ["UNAUTHENTICATED", 401],
    ["FORBIDDEN", 403],
    ["NOT_FOUND", 404],
    ["CONFLICT", 409],
    ["RATE_LIMITED", 429],
  ];
  it.each(cases)("answers AppError %s with %i, its code and its words", async (code, status) => {
    expect(ERROR_STATUS[code]).toBe(status);
    const { status: got, body } = await answer(new AppError(code as "CONFLICT", `words for ${code}`));
    expect(got).toBe(status);
    expect(body.error).toEqual({ code, message: `words for ${code}` });
  });

  it("answers bad input with 422 naming every field", async () => {
    const fields = { strandLotId: ["Not a lot of this project."], jackingForceN: ["Must be above zero."] };
    const { status, body } = await answer(new AppError("INVALID_INPUT", "Check the form.", fields));
    expect(status).toBe(422);
    expect(body.error).toEqual({ code: "INVALID_INPUT", message: "Check the form.", fields });
  });

  it("answers the units' InputError with 422 naming its field in fields, never in the words", async () => {
    const { status, body } = await answer(new InputError("segments[2].lengthMm", "negative", "must not be negative"));
    expect(status).toBe(422);
    expect(body.error).toEqual({
      code: "INVALID_INPUT",
      message: "Check the values: must not be negative.",
      fields: { "segments[2].lengthMm": ["must not be negative"] },
    });
  });

  const refusals: [string, string, Partial<DatabaseError>, number, string][] = [
    [
      "23505",
      'duplicate key value violates unique constraint "pours_project_id_code_key"',
      {
        constraint: "pours_project_id_code_key",
        table: "pours",
        detail: "Key (project_id, code)=(p1, L3-POUR-SECRET) already exists.",
      },
      409,
      "CONFLICT",
    ],
    [
      "23503",
      'insert or update on table "tendons" violates foreign key constraint "tendons_strand_lot_id_fkey"',
      {
        constraint: "tendons_strand_lot_id_fkey",
        table: "tendons",
        detail: 'Key (strand_lot_id)=(x) is not present in table "strand_lots".',
      },
      422,
      "INVALID_INPUT",
    ],
    [
      "23503",
      'update or delete on table "strand_lots" violates foreign key constraint "tendons_strand_lot_id_fkey" on table "tendons"',
      { constraint: "tendons_strand_lot_id_fkey", table: "strand_lots" },
      409,
      "CONFLICT",
    ],
    [
      "23514",
      'new row for relation "records" violates check constraint "records_elongation_mm_check"',
      { constraint: "records_elongation_mm_check", table: "records" },
      422,
      "INVALID_INPUT",
    ],
    [
      "23502",
      'null value in column "pour_id" of relation "tendons" violates not-null constraint',
      { column: "pour_id" },
      422,
      "INVALID_INPUT",
    ],
    [
      "23001",
      'update or delete on table "pours" violates RESTRICT setting of foreign key constraint "x_fkey"',
      { constraint: "x_fkey" },
      422,
      "INVALID_INPUT",
    ],
    ["22001", "value too long for type character varying(40)", {}, 422, "INVALID_INPUT"],
    ["22P05", "unsupported Unicode escape sequence", {}, 422, "INVALID_INPUT"],
    ["22P02", 'invalid input syntax for type uuid: "not-a-uuid"', {}, 422, "INVALID_INPUT"],
    ["TL423", 'pour 5f0c is released (trigger "records_released_pour")', {}, 409, "CONFLICT"],
  ];
  it.each(refusals)(
    "answers PostgreSQL's %s in words, never its text or names",
    async (code, message, extra, status, appCode) => {
      const { status: got, body, text } = await answer(pgError(code, message, extra));
      expect(got).toBe(status);
      expect(body.error.code).toBe(appCode);
      expect(typeof body.error.message).toBe("string");
      if (status === 422) expect(Object.keys(body.error.fields as object).length).toBeGreaterThan(0);
      // Nothing of PostgreSQL's own: not its text, the constraint, table or column, nor a quoted value.
      for (const leak of [
        message,
        extra.constraint,
        extra.table,
        extra.column,
        "SECRET",
        "violates",
        "constraint",
        "relation",
        "uuid",
        "trigger",
      ]) {
        if (leak) expect(text).not.toContain(leak);
      }
    },
  );

  it("answers the released-pour trigger with the released words", async () => {
    const { body } = await answer(pgError("TL423", "released"));
    expect(body.error.message).toMatch(/This pour is released/);
  });

  it("answers any other failure 500 with a reference logged beside the whole error, and nothing of the error", async () => {
    const log = vi.spyOn(console, "error").mockImplementation(() => undefined);
    const failures = [
      new Error('relation "secret_table" does not exist at select * from secret_table'),
      pgError("42P01", 'relation "secret_table" does not exist'),
      pgError("40P01", "deadlock detected on secret_table"),
      new TypeError("Cannot read properties of undefined (reading 'secret_table')"),
      "a thrown string secret_table",
      null,
    ];
    for (const failure of failures) {
      log.mockClear();
      const { status, body, text } = await answer(failure);
      expect(status).toBe(500);
      expect(body.error.code).toBe("INTERNAL");
      expect(body.error.reference).toMatch(/^[0-9a-f]{8}$/);
      expect(body.error.message).toContain(body.error.reference as string);
      expect(text).not.toContain("secret_table");
      expect(text).not.toMatch(/\bat \S+ \(|\.ts:\d+/); // no stack frames
      expect(log).toHaveBeenCalledTimes(1);
      expect(log.mock.calls[0]![0]).toContain(body.error.reference as string);
      expect(log.mock.calls[0]![1]).toBe(failure);
    }
  });

  it("gives each 500 its own reference", async () => {
    vi.spyOn(console, "error").mockImplementation(() => undefined);
    const a = await answer(new Error("x"));
    const b = await answer(new Error("x"));
    expect(a.body.error.reference).not.toBe(b.body.error.reference);
  });
});

describe("route(): what a handler throws goes through the same mapping", () => {
  const call = (handler: () => Promise<unknown>) =>
    route({ access: "public" }, handler)(new Request("http://localhost/api/x") as never, {
      params: Promise.resolve({}),
    });

  it("answers a unique violation escaping an operation with 409 and no SQL", async () => {
    const response = await call(async () => {
      throw pgError("23505", 'duplicate key value violates unique constraint "members_pkey"', {
        constraint: "members_pkey",
      });
    });
    expect(response.status).toBe(409);
    expect(await response.text()).not.toContain("members_pkey");
  });

  it("answers an InputError escaping an operation with 422 naming the field", async () => {
    const response = await call(async () => {
      throw new InputError("points", "too-few", "a calibration needs at least two points to fit a line");
    });
    expect(response.status).toBe(422);
    expect(await response.json()).toMatchObject({ error: { fields: { points: [expect.any(String)] } } });
  });

  it("answers a refused body with 422: the messages in words, the schema's names only in fields", async () => {
    const handler = route(
      {
        access: "public",
        body: z.strictObject({
          requiredConcreteMPa: z.number({ error: "Give the strength, or leave it empty." }).nullable(),
          areaM2: z.number().positive("The area must be above 0."),
          name: z.string().min(1, "Give the pour a name"),
        }),
      },
      async () => ({ saved: true }),
    );
    const response = await handler(
      new Request("http://localhost/api/x", {
        method: "POST",
        headers: { "content-type": "application/json", origin: "http://localhost" },
        body: JSON.stringify({ requiredConcreteMPa: "high", areaM2: -1, name: "" }),
      }) as never,
      { params: Promise.resolve({}) },
    );
    expect(response.status).toBe(422);
    const { error } = (await response.json()) as { error: { message: string; fields: Record<string, string[]> } };
    expect(error.message).toBe(
      "Check the form: Give the strength, or leave it empty. The area must be above 0. Give the pour a name.",
    );
    expect(error.message).not.toMatch(/requiredConcreteMPa|areaM2|name:/);
    expect(Object.keys(error.fields).sort()).toEqual(["areaM2", "name", "requiredConcreteMPa"]);
  });

  it("answers a handler's result as JSON 200", async () => {
    const response = await call(async () => ({ done: 1 }));
    expect(response.status).toBe(200);
    expect(await response.json()).toEqual({ done: 1 });
  });

  describe("a declared response schema", () => {
    const schema = mini.object({ results: mini.array(mini.object({ opId: mini.string() })) });
    const answerWith = (result: unknown) =>
      route({ access: "public", response: schema }, async () => result as { results: { opId: string }[] })(
        new Request("http://localhost/api/x") as never,
        { params: Promise.resolve({}) },
      );

    it("sends the answer parsed through it, without keys the contract does not name", async () => {
      const response = await answerWith({ results: [{ opId: "a", internal: "x" }], debug: true });
      expect(response.status).toBe(200);
      expect(await response.json()).toEqual({ results: [{ opId: "a" }] });
    });

    it("answers 500 with a reference, never the parse's words, when the handler's answer breaks it", async () => {
      const logged = vi.spyOn(console, "error").mockImplementation(() => undefined);
      const response = await answerWith({ results: [{ opId: 7 }] });
      expect(response.status).toBe(500);
      const text = await response.text();
      expect(text).toMatch(/reference [0-9a-f]{8}/);
      expect(text).not.toMatch(/opId|expected|invalid_type/i);
      expect(logged).toHaveBeenCalled();
    });
  });
});
