/** Invalid input to a pure computation; the message is written for the person who entered it. */
export class ComputeError extends Error {
  constructor(
    message: string,
    public field?: string,
  ) {
    super(message);
    this.name = 'ComputeError';
  }
}
