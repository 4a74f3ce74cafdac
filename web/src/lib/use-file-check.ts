import { useState } from 'react';

/**
 * A file that is checked by the server before it is saved: the file picked, the server's report
 * on it and what saving it gave. Picking another file forgets the report and the result, and
 * `forgetRequest` clears the last request's error.
 */
export function useFileCheck<Report, Saved>(forgetRequest: () => void) {
  const [file, setFile] = useState<File | null>(null);
  const [report, setReport] = useState<Report | null>(null);
  const [saved, setSaved] = useState<Saved | null>(null);
  const pick = (picked: File | null) => {
    setFile(picked);
    setReport(null);
    setSaved(null);
    forgetRequest();
  };
  return { file, report, setReport, saved, setSaved, pick };
}
