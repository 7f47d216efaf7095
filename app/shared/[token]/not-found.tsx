export default function LinkNotValid() {
  return (
    <div className="mx-auto max-w-md py-16 text-center" data-testid="link-not-valid">
      <h1 className="text-xl font-semibold">This link is not valid</h1>
      <p className="mt-2 text-sm text-ink-soft">
        It was revoked, it expired, or it never existed. Ask the person who sent it for a new one.
      </p>
    </div>
  );
}
