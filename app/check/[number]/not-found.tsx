export default function UnknownCertificate() {
  return (
    <div>
      <h1 className="mb-2 text-2xl font-bold">No such certificate</h1>
      <p className="text-ink-soft">
        This laboratory has issued no certificate with that number. Check the number printed at the top of every page of the certificate (it looks like C-00012), or
        ask the laboratory.
      </p>
    </div>
  );
}
