"use client";

export default function GlobalError({ reset }: { error: Error; reset: () => void }) {
  return (
    <html lang="en">
      <body style={{ fontFamily: "system-ui, sans-serif", background: "#f6f3ec", color: "#23262b", padding: "4rem 1.5rem" }}>
        <h1>Chalkline is having trouble</h1>
        <p>Your saved work is safe. Try again in a few seconds.</p>
        <button type="button" onClick={reset}>
          Try again
        </button>
      </body>
    </html>
  );
}
