import { createRoot } from 'react-dom/client';
import './styles.css';

function Placeholder() {
  return <p className="p-4 font-sans text-glacier-700">Stanceline is starting.</p>;
}

createRoot(document.getElementById('root')!).render(<Placeholder />);
