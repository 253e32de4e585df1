/** The catalogue of errors the application reports; names are permanent, endpoints map them to status codes. */
export const errorCatalogue = {
  NotSignedIn: { status: 401, title: 'Not signed in', message: 'Sign in to use this part of Sheathwise.' },
  Forbidden: {
    status: 403,
    title: 'Not permitted',
    message: 'Your roles do not allow this. Ask a project admin if you need access.',
  },
  NotFound: { status: 404, title: 'Not found', message: 'Nothing exists at this address.' },
  InvalidInput: {
    status: 422,
    title: 'Input needs correcting',
    message: 'Some fields are missing or out of range; each is listed with what to fix.',
  },
  Conflict: {
    status: 409,
    title: 'Changed by someone else',
    message: 'The record changed since you loaded it. Reload and try again.',
  },
  StepRefused: {
    status: 422,
    title: 'This step cannot be taken yet',
    message: 'A condition for this step is not met; the message says which.',
  },
  ReadOnly: {
    status: 409,
    title: 'Read-only',
    message: 'This revision can no longer change. Start a new revision to make changes.',
  },
  RecordFailed: {
    status: 409,
    title: 'Record not rendered',
    message: 'The issued record could not be rendered. An approver can render it again once the cause is fixed.',
  },
  TooLarge: {
    status: 413,
    title: 'Too large',
    message: 'The upload is larger than the limit.',
  },
  Unavailable: {
    status: 503,
    title: 'Service unavailable',
    message: 'A service Sheathwise depends on is not answering. Try again shortly.',
  },
} as const;

export type ErrorName = keyof typeof errorCatalogue;

export interface FieldError {
  field: string;
  message: string;
}

export class AppError extends Error {
  readonly status: number;
  readonly title: string;

  constructor(
    readonly errorName: ErrorName,
    message?: string,
    readonly fields: FieldError[] = [],
  ) {
    const entry = errorCatalogue[errorName];
    super(message ?? entry.message);
    this.status = entry.status;
    this.title = entry.title;
  }

  toJSON() {
    return {
      error: this.errorName,
      title: this.title,
      message: this.message,
      ...(this.fields.length ? { fields: this.fields } : {}),
    };
  }
}
